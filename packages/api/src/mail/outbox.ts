/**
 * The durable mail outbox. `queueMail` writes a message (its mail_log row and its text) in
 * the caller's transaction, so mail exists exactly when the action that caused it committed.
 * `createOutbox` is each server process's sender loop: it claims due messages with
 * `FOR UPDATE SKIP LOCKED` and a lease (any number of processes send each message once),
 * sends them, retries temporary failures with exponential backoff, gives up at once on a
 * permanent one (5xx) and records why. Once the relay could not be reached, it asks it now and
 * then whether it is back, and sends what waits as soon as it is.
 */
import type { DataSource, EntityManager } from 'typeorm';
import type { OutboxTiming } from '../config.js';
import type { MailKind } from '../contract/settings.js';
import type { MailStatus } from '../contract/mail-status.js';
import { MailLogEntry } from '../db/entities/mail-log-entry.js';
import { runAgainIfRefused } from '../db/retryable.js';
import type { Relay, SendOutcome } from './mailer.js';

export interface QueuedMail {
  to: string;
  userId: number | null;
  kind: MailKind;
  notebookId: string | null;
  subject: string;
  text: string;
}

/** Queues one message in the transaction of `manager`; the sender loop sends it once that commits. */
export async function queueMail(manager: EntityManager, mail: QueuedMail): Promise<void> {
  const inserted = await manager.insert(MailLogEntry, {
    toAddress: mail.to,
    userId: mail.userId,
    subject: mail.subject.slice(0, 300),
    kind: mail.kind,
    notebookId: mail.notebookId,
    status: 'queued',
    attempts: 0,
    error: null,
    createdAt: new Date(),
    finishedAt: null,
  });
  await manager.query('INSERT INTO mail_outbox (mailLogId, body, nextAttemptAt) VALUES (?, ?, UTC_TIMESTAMP(3))', [
    Number(inserted.identifiers[0]?.id),
    mail.text,
  ]);
}

export interface Outbox {
  /** Starts the loop: a pass every `pollMs`, and one whenever `wake()` is called. */
  start(): void;
  /** Sends what is due now (called after an action queued mail). */
  wake(): void;
  /** One pass: claims and sends every message that is due; never rejects (failures are logged). */
  sendDue(): Promise<void>;
  /** Passes until the outbox is empty; rejects, naming what is left, after `timeoutMs`. */
  drain(timeoutMs?: number): Promise<void>;
  /** The relay's state and the outbox counts, for the admin page. */
  status(): Promise<MailStatus>;
  /** Stops the loop and waits for the pass in progress. */
  stop(): Promise<void>;
}

export interface OutboxOptions {
  database: () => Promise<DataSource>;
  relay: Relay;
  timing: OutboxTiming;
}

interface Claimed {
  id: number;
  toAddress: string;
  subject: string;
  attempts: number;
  createdAt: Date;
  body: string;
}

/** Messages claimed per round trip; a pass takes rounds until nothing is due. */
const batch = 20;
const day = 24 * 60 * 60 * 1000;
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** The wait before try `attempts + 1`: doubling from `firstRetryMs`, at most `maxRetryMs`. */
export function retryDelay(timing: OutboxTiming, attempts: number): number {
  return Math.min(timing.maxRetryMs, timing.firstRetryMs * 2 ** Math.max(0, attempts - 1));
}

export function createOutbox({ database, relay, timing }: OutboxOptions): Outbox {
  let running: Promise<void> | null = null;
  let next: Promise<void> | null = null;
  let timer: NodeJS.Timeout | null = null;
  let stopped = true;
  let lastProbe = 0;
  /**
   * Whether the relay was last seen unreachable: logged once per outage, and the cue to ask it
   * whether it is back. A new process asks once, for mail an earlier one left waiting.
   */
  let relayDown = true;
  let saidDown = false;
  /** The last failure of a pass (the database away, say), logged once until a pass succeeds. */
  let lastPassError = '';

  async function claim(db: DataSource): Promise<Claimed[]> {
    // READ COMMITTED: the claim locks only the rows it takes, no gaps that would hold up new mail.
    return runAgainIfRefused(() =>
      db.transaction('READ COMMITTED', async (manager) => {
        const due: { id: number }[] = await manager.query(
          `SELECT mailLogId AS id FROM mail_outbox
          WHERE nextAttemptAt <= UTC_TIMESTAMP(3) AND (claimedUntil IS NULL OR claimedUntil <= UTC_TIMESTAMP(3))
          ORDER BY nextAttemptAt LIMIT ? FOR UPDATE SKIP LOCKED`,
          [batch],
        );
        if (due.length === 0) return [];
        const ids = due.map((row) => row.id);
        await manager.query('UPDATE mail_outbox SET claimedUntil = DATE_ADD(UTC_TIMESTAMP(3), INTERVAL ? MICROSECOND) WHERE mailLogId IN (?)', [
          timing.leaseMs * 1000,
          ids,
        ]);
        return manager.query(
          `SELECT l.id, l.toAddress, l.subject, l.attempts, l.createdAt, o.body
           FROM mail_outbox o JOIN mail_log l ON l.id = o.mailLogId WHERE o.mailLogId IN (?) ORDER BY o.nextAttemptAt`,
          [ids],
        );
      }),
    );
  }

  /** Records one attempt: sent or given up on (the outbox row goes), or scheduled again. */
  async function finish(db: DataSource, mail: Claimed, outcome: SendOutcome): Promise<void> {
    const attempts = mail.attempts + 1;
    // Each branch writes the same rows whatever ran before, so a transaction refused as a
    // deadlock (or by a Galera cluster at commit) is simply run again: a claim left in place
    // would send the message a second time once its lease ran out.
    await runAgainIfRefused(() =>
      db.transaction(async (manager) => {
        if (outcome.ok) {
          await manager.query('DELETE FROM mail_outbox WHERE mailLogId = ?', [mail.id]);
          await manager.update(MailLogEntry, { id: mail.id }, { status: 'sent', attempts, error: null, finishedAt: new Date() });
          return;
        }
        const expired = Date.now() - new Date(mail.createdAt).getTime() >= timing.giveUpAfterMs;
        if (outcome.permanent || expired) {
          const why = outcome.permanent ? `refused: ${outcome.error}` : `gave up after ${attempts} attempts: ${outcome.error}`;
          await manager.query('DELETE FROM mail_outbox WHERE mailLogId = ?', [mail.id]);
          await manager.update(MailLogEntry, { id: mail.id }, { status: 'failed', attempts, error: why.slice(0, 1000), finishedAt: new Date() });
          return;
        }
        await manager.query(
          'UPDATE mail_outbox SET claimedUntil = NULL, nextAttemptAt = DATE_ADD(UTC_TIMESTAMP(3), INTERVAL ? MICROSECOND) WHERE mailLogId = ?',
          [retryDelay(timing, attempts) * 1000, mail.id],
        );
        await manager.update(MailLogEntry, { id: mail.id }, { attempts, error: outcome.error.slice(0, 1000) });
      }),
    );
  }

  function noteRelay(down: boolean, error = ''): void {
    if (down && !saidDown) console.warn(`mail: the relay ${relay.address} cannot be reached (${error}); mail waits in the outbox.`);
    if (!down && saidDown) console.log(`mail: the relay ${relay.address} answers again.`);
    relayDown = down;
    saidDown = down;
  }

  /** After the relay was unreachable, asks it now and then whether it is back; if so, what waits is due now. */
  async function probe(db: DataSource): Promise<boolean> {
    if (!relayDown || Date.now() - lastProbe < timing.probeMs) return false;
    const waiting: unknown[] = await db.query('SELECT 1 FROM mail_outbox WHERE claimedUntil IS NULL AND nextAttemptAt > UTC_TIMESTAMP(3) LIMIT 1');
    if (waiting.length === 0) return false;
    lastProbe = Date.now();
    const checked = await relay.check();
    noteRelay(checked.state === 'down', checked.state === 'down' ? checked.error : '');
    if (checked.state === 'down') return false;
    const moved: { affectedRows?: number } = await db.query(
      'UPDATE mail_outbox SET nextAttemptAt = UTC_TIMESTAMP(3) WHERE claimedUntil IS NULL AND nextAttemptAt > UTC_TIMESTAMP(3)',
    );
    return (moved.affectedRows ?? 0) > 0;
  }

  async function pass(): Promise<void> {
    try {
      const db = await database();
      for (;;) {
        const claimed = await claim(db);
        for (const mail of claimed) {
          const outcome = await relay.send({ to: mail.toAddress, subject: mail.subject, text: mail.body });
          noteRelay(!outcome.ok && outcome.unreachable, outcome.ok ? '' : outcome.error);
          await finish(db, mail, outcome);
        }
        if (claimed.length < batch && !(await probe(db))) break;
      }
      lastPassError = '';
    } catch (error) {
      const { message, code, driverError } = error as Error & { code?: string; driverError?: { code?: string } };
      // Another process took the same rows at the same moment (a Galera cluster refuses one claim at commit): the next pass tries again.
      if ((code ?? driverError?.code) === 'ER_LOCK_DEADLOCK') return;
      if (message !== lastPassError) console.error('mail: the outbox pass failed (it is tried again on the next one):', message);
      lastPassError = message;
    } finally {
      relay.release();
    }
  }

  function sendDue(): Promise<void> {
    if (next) return next;
    if (!running) {
      running = pass().finally(() => {
        running = null;
      });
      return running;
    }
    // A pass is under way: one more after it sees what was queued meanwhile.
    next = running.then(() => {
      next = null;
      return sendDue();
    });
    return next;
  }

  function schedule(): void {
    if (stopped) return;
    timer = setTimeout(() => {
      void sendDue().then(schedule);
    }, timing.pollMs);
  }

  return {
    start() {
      if (!stopped) return;
      stopped = false;
      void sendDue().then(schedule);
    },
    wake() {
      void sendDue();
    },
    sendDue,
    async drain(timeoutMs = 10_000) {
      const deadline = Date.now() + timeoutMs;
      const db = await database();
      for (;;) {
        await sendDue();
        const left: { id: number; toAddress: string; error: string | null }[] = await db.query(
          'SELECT l.id, l.toAddress, l.error FROM mail_outbox o JOIN mail_log l ON l.id = o.mailLogId ORDER BY l.id LIMIT 5',
        );
        if (left.length === 0) return;
        if (Date.now() > deadline) {
          throw new Error(
            `mail is still queued after ${timeoutMs} ms: ${left.map((m) => `#${m.id} to ${m.toAddress} (${m.error ?? 'not tried yet'})`).join('; ')}`,
          );
        }
        await sleep(Math.min(50, timing.firstRetryMs));
      }
    },
    async status() {
      const db = await database();
      const since = new Date(Date.now() - day);
      const [counts]: { queued: string; oldestQueuedAt: Date | null; sent: string; failed: string }[] = await db.query(
        `SELECT (SELECT COUNT(*) FROM mail_outbox) AS queued,
                (SELECT MIN(l.createdAt) FROM mail_outbox o JOIN mail_log l ON l.id = o.mailLogId) AS oldestQueuedAt,
                (SELECT COUNT(*) FROM mail_log WHERE status = 'sent' AND finishedAt >= ?) AS sent,
                (SELECT COUNT(*) FROM mail_log WHERE status = 'failed' AND finishedAt >= ?) AS failed`,
        [since, since],
      );
      const [lastFailure]: { subject: string; error: string | null; finishedAt: Date }[] = await db.query(
        "SELECT subject, error, finishedAt FROM mail_log WHERE status = 'failed' AND finishedAt >= ? ORDER BY finishedAt DESC LIMIT 1",
        [since],
      );
      const relayState = await relay.check();
      return {
        relay: { address: relay.address, up: relayState.state === 'up', error: relayState.state === 'down' ? relayState.error : null },
        queued: Number(counts!.queued),
        oldestQueuedAt: counts!.oldestQueuedAt ? new Date(counts!.oldestQueuedAt).toISOString() : null,
        sentLastDay: Number(counts!.sent),
        failedLastDay: Number(counts!.failed),
        lastFailure: lastFailure ? { subject: lastFailure.subject, error: lastFailure.error ?? '', at: new Date(lastFailure.finishedAt).toISOString() } : null,
      };
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await (next ?? running);
    },
  };
}
