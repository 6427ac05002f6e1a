/**
 * Errors after which MariaDB has given up the whole transaction and running it again may
 * succeed: a deadlock victim — which is also how a Galera cluster reports a commit its
 * certification refused, or a transaction a replicated one aborted — and a lock wait that ran
 * out. `inTransaction` (services/db.ts) runs such a transaction again; one that keeps being
 * refused answers 503 (errors.ts), as nothing of it was stored.
 */
const retryable = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);

export function isRetryable(error: unknown): boolean {
  const e = error as { code?: string; driverError?: { code?: string } } | null;
  return retryable.has(e?.code ?? '') || retryable.has(e?.driverError?.code ?? '');
}
