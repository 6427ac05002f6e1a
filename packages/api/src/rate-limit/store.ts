/**
 * An express-rate-limit Store on MariaDB, so every server process (and machine) counts the
 * same hits: a fixed window per limiter and client, started by the client's first hit. A hit
 * is one atomic `INSERT … ON DUPLICATE KEY UPDATE` that starts a new window when the last one
 * is over; the windows of clients long gone are pruned now and then.
 */
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';

interface CounterRow {
  hits: number;
  windowStart: Date;
}

export class MariaDbStore implements Store {
  /** Hits counted here count in every process. */
  readonly localKeys = false;
  readonly prefix: string;
  private windowMs = 60_000;
  private lastPrune = 0;

  constructor(
    private readonly limiter: string,
    private readonly database: () => Promise<DataSource>,
  ) {
    this.prefix = `${limiter}:`;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const db = await this.database();
    // MariaDB applies the assignments left to right (`hits` must read the old window start),
    // and RETURNING gives the row as this statement left it: one round trip, exact under load.
    const [row]: CounterRow[] = await db.query(
      `INSERT INTO rate_limits (limiter, clientKey, windowStart, hits) VALUES (?, ?, UTC_TIMESTAMP(3), 1)
       ON DUPLICATE KEY UPDATE
         hits = IF(windowStart <= DATE_SUB(UTC_TIMESTAMP(3), INTERVAL ? MICROSECOND), 1, hits + 1),
         windowStart = IF(windowStart <= DATE_SUB(UTC_TIMESTAMP(3), INTERVAL ? MICROSECOND), UTC_TIMESTAMP(3), windowStart)
       RETURNING hits, windowStart`,
      [this.limiter, key, this.windowMs * 1000, this.windowMs * 1000],
    );
    this.prune(db);
    return this.info(row!);
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const db = await this.database();
    const [row]: CounterRow[] = await db.query('SELECT hits, windowStart FROM rate_limits WHERE limiter = ? AND clientKey = ?', [this.limiter, key]);
    return row ? this.info(row) : undefined;
  }

  private info(row: CounterRow): ClientRateLimitInfo {
    return { totalHits: Number(row.hits), resetTime: new Date(new Date(row.windowStart).getTime() + this.windowMs) };
  }

  async decrement(key: string): Promise<void> {
    const db = await this.database();
    await db.query('UPDATE rate_limits SET hits = hits - 1 WHERE limiter = ? AND clientKey = ? AND hits > 0', [this.limiter, key]);
  }

  async resetKey(key: string): Promise<void> {
    const db = await this.database();
    await db.query('DELETE FROM rate_limits WHERE limiter = ? AND clientKey = ?', [this.limiter, key]);
  }

  /** At most once a window per process: rows whose window ended a window ago or more go. */
  private prune(db: DataSource): void {
    if (Date.now() - this.lastPrune < this.windowMs) return;
    this.lastPrune = Date.now();
    db.query('DELETE FROM rate_limits WHERE limiter = ? AND windowStart < DATE_SUB(UTC_TIMESTAMP(3), INTERVAL ? MICROSECOND)', [
      this.limiter,
      this.windowMs * 2000,
    ]).catch((error: Error) => console.error(`rate limits: pruning ${this.limiter} failed:`, error.message));
  }
}
