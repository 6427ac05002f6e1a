/**
 * Limits on how long the server's requests wait for MariaDB, so a database that hangs
 * (frozen, overloaded, cut off without a reset) costs a request a few seconds and a clear 503
 * instead of holding it, and everyone queued behind it, for as long as TCP takes to give up.
 * Only the server's own DataSource (connection.ts) gets them: migrations and the seed run
 * without a query limit, as a long migration must not be cut short.
 */
import type { Pool, PoolConnection } from 'mysql2';

export const requestTimeouts = {
  /** Opening a connection, up to MariaDB's handshake. */
  connectMs: 3000,
  /** Waiting for a free connection from the pool. */
  acquireMs: 3000,
  /** One statement, timed by the driver: it answers even when MariaDB sends nothing at all. */
  queryMs: 5000,
  /** One statement, timed by MariaDB itself, a little sooner, so that on a live server the
   * statement is stopped there and its connection stays usable. */
  serverStatementSeconds: 4.5,
};

/** The code of the error a request gets when no connection came free in time. */
export const ACQUIRE_TIMEOUT = 'POOL_ACQUIRE_TIMEOUT';

/**
 * Adds to a mysql2 pool what it lacks: a time limit on waiting for a connection, and
 * MariaDB's own statement time limit on each new connection.
 */
export function limitPool(pool: Pool): void {
  pool.on('connection', (connection: PoolConnection) => {
    connection.query(`SET SESSION max_statement_time = ${requestTimeouts.serverStatementSeconds}`);
  });
  const getConnection = pool.getConnection.bind(pool);
  pool.getConnection = (callback: (error: NodeJS.ErrnoException | null, connection: PoolConnection) => void) => {
    let settled = false;
    const timer = setTimeout(() => {
      settled = true;
      const error: NodeJS.ErrnoException = new Error(`No database connection came free within ${requestTimeouts.acquireMs} ms.`);
      error.code = ACQUIRE_TIMEOUT;
      callback(error, undefined as unknown as PoolConnection);
    }, requestTimeouts.acquireMs);
    getConnection((error, connection) => {
      if (settled) {
        // The request has been answered already: hand the late connection back.
        connection?.release();
        return;
      }
      settled = true;
      clearTimeout(timer);
      callback(error, connection);
    });
  };
}
