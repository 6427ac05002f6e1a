/**
 * Idempotency keys: the first answer to a creating write sent with an `Idempotency-Key`, kept
 * for a day per user. A write records its answer in its own transaction (`Once.record`), so a
 * save whose COMMIT went through but whose answer was lost is answered, not done again.
 */
import type { EntityManager } from 'typeorm';
import { managerOf } from './db.js';
import type { Database } from './db.js';

/** How long a key's answer counts. */
export const KEY_LIFETIME_MS = 24 * 3_600_000;

/** One keyed request: who sent it, its key, and a hash of what it asked. */
export interface KeyedRequest {
  userId: number;
  key: string;
  fingerprint: string;
}

/** An answer as it went out. */
export interface StoredAnswer {
  status: number;
  body: unknown;
  fingerprint: string;
}

/** What a service is handed to record its answer inside its transaction. */
export interface Once {
  record(manager: EntityManager, status: number, body: unknown): Promise<void>;
}

/** The answer stored for the request's key (within its lifetime), or null. */
export async function storedAnswer(db: Database, request: KeyedRequest): Promise<StoredAnswer | null> {
  const rows: { status: number; response: string; fingerprint: string }[] = await managerOf(db).query(
    'SELECT status, response, fingerprint FROM idempotency_keys WHERE userId = ? AND idempotencyKey = ? AND createdAt > ?',
    [request.userId, request.key, new Date(Date.now() - KEY_LIFETIME_MS)],
  );
  const row = rows[0];
  return row ? { status: Number(row.status), body: JSON.parse(row.response), fingerprint: row.fingerprint } : null;
}

/**
 * Stores the answer to the request's key. A second request with the same key that gets here
 * while the first is still open waits on the row, then fails with a duplicate key, rolling
 * back its transaction: the caller then answers what the first stored.
 */
export async function recordAnswer(manager: EntityManager, request: KeyedRequest, status: number, body: unknown): Promise<void> {
  const expired = new Date(Date.now() - KEY_LIFETIME_MS);
  await manager.query('DELETE FROM idempotency_keys WHERE userId = ? AND idempotencyKey = ? AND createdAt <= ?', [request.userId, request.key, expired]);
  await manager.query('INSERT INTO idempotency_keys (userId, idempotencyKey, fingerprint, status, response, createdAt) VALUES (?, ?, ?, ?, ?, ?)', [
    request.userId,
    request.key,
    request.fingerprint,
    status,
    JSON.stringify(body),
    new Date(),
  ]);
}

/** Removes keys past their lifetime, a batch at a time (each keyed write calls it). */
export async function removeExpiredKeys(db: Database): Promise<void> {
  await managerOf(db).query('DELETE FROM idempotency_keys WHERE createdAt <= ? LIMIT 500', [new Date(Date.now() - KEY_LIFETIME_MS)]);
}
