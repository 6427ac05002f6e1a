/**
 * An express-session store on the `sessions` table (connect-typeorm does not accept TypeORM
 * 1.x). Each row carries the signed-in user's id, so disabling a user can delete their
 * sessions at once.
 */
import session from 'express-session';
import type { SessionData } from 'express-session';
import type { DataSource } from 'typeorm';
import { LessThan } from 'typeorm';
import { Session } from '../db/entities/session.js';

type Callback<T = void> = (error?: unknown, value?: T) => void;

/**
 * How far a session's expiry must have moved before a request writes it again. express-session
 * touches the session at the end of every signed-in request; writing each time cost one UPDATE
 * and one fsync per read, for an expiry two weeks away that a few minutes do not change.
 */
export const TOUCH_EVERY_MS = 5 * 60_000;

/** The user id passport keeps in a session, if any. */
function userIdOf(data: SessionData): number | null {
  const user = (data as { passport?: { user?: unknown } }).passport?.user;
  return typeof user === 'number' && Number.isInteger(user) ? user : null;
}

export class DatabaseSessionStore extends session.Store {
  private lastPrune = 0;

  /** `database` resolves the DataSource when first needed, so the API can start before MariaDB. */
  constructor(
    private readonly database: () => Promise<DataSource>,
    private readonly ttlMs: number,
  ) {
    super();
  }

  private expiryOf(data: SessionData): Date {
    const expires = data.cookie?.expires;
    return expires ? new Date(expires) : new Date(Date.now() + this.ttlMs);
  }

  /** Deletes expired rows, at most once an hour, on the back of ordinary writes. */
  private async pruneNow(db: DataSource): Promise<void> {
    if (Date.now() - this.lastPrune < 3_600_000) return;
    this.lastPrune = Date.now();
    await db.getRepository(Session).delete({ expiresAt: LessThan(new Date()) });
  }

  override get(sid: string, callback: Callback<SessionData | null>): void {
    void (async () => {
      const db = await this.database();
      const row = await db.getRepository(Session).findOneBy({ id: sid });
      if (!row) return null;
      if (row.expiresAt.getTime() <= Date.now()) {
        await db.getRepository(Session).delete({ id: sid });
        return null;
      }
      // The stored expiry rides along (never saved: see set) for touch to compare against.
      return { ...(JSON.parse(row.data) as SessionData), storedExpiry: row.expiresAt.getTime() };
    })().then(
      (data) => callback(null, data),
      (error: unknown) => callback(error),
    );
  }

  override set(sid: string, data: SessionData, callback?: Callback): void {
    void (async () => {
      const db = await this.database();
      const userId = userIdOf(data);
      await db.query(
        `INSERT INTO sessions (id, userId, data, expiresAt) VALUES (?, ?, ?, ?)
         ON DUPLICATE KEY UPDATE userId = VALUES(userId), data = VALUES(data), expiresAt = VALUES(expiresAt)`,
        [sid, userId, JSON.stringify({ ...data, storedExpiry: undefined }), this.expiryOf(data)],
      );
      await this.pruneNow(db);
    })().then(
      () => callback?.(),
      (error: unknown) => callback?.(error),
    );
  }

  override touch(sid: string, data: SessionData, callback?: Callback): void {
    const expiry = this.expiryOf(data);
    if (data.storedExpiry !== undefined && expiry.getTime() - data.storedExpiry < TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    void this.database()
      .then((db) => db.getRepository(Session).update({ id: sid }, { expiresAt: expiry }))
      .then(
        () => callback?.(),
        (error: unknown) => callback?.(error),
      );
  }

  override destroy(sid: string, callback?: Callback): void {
    void this.database()
      .then((db) => db.getRepository(Session).delete({ id: sid }))
      .then(
        () => callback?.(),
        (error: unknown) => callback?.(error),
      );
  }
}
