/**
 * Errors after which MariaDB has given up the whole transaction and running it again may
 * succeed: a deadlock victim — which is also how a Galera cluster reports a commit its
 * certification refused, or a transaction a replicated one aborted — and a lock wait that ran
 * out. `runAgainIfRefused` runs such a transaction again (for the services through
 * `inTransaction` in services/db.ts, and for the mail outbox's sender); one that keeps being
 * refused answers 503 (errors.ts), as nothing of it was stored.
 */
const retryable = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);

export function isRetryable(error: unknown): boolean {
  const e = error as { code?: string; driverError?: { code?: string } } | null;
  return retryable.has(e?.code ?? '') || retryable.has(e?.driverError?.code ?? '');
}

/**
 * How often a refused transaction is tried in all, and the longest pause between tries. On one
 * server a deadlock is rare; on a Galera cluster every commit that loses the race for a row
 * another node changed first is refused the same way, so a busy notebook sees several in a row.
 */
export const transactionRetry = { attempts: 8, maxPauseMs: 250 };

/**
 * Runs `transaction` (one whole transaction) and, when MariaDB refused it as above, runs it
 * again after a random pause that grows with each try.
 */
export async function runAgainIfRefused<T>(transaction: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await transaction();
    } catch (error) {
      if (attempt >= transactionRetry.attempts || !isRetryable(error)) throw error;
      const ceiling = Math.min(transactionRetry.maxPauseMs, 10 * 2 ** attempt);
      await new Promise((resolve) => setTimeout(resolve, Math.random() * ceiling));
    }
  }
}
