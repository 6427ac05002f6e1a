/**
 * The API's connection to MariaDB. The server starts even when MariaDB is down and keeps
 * trying, so a restarted database is picked up without restarting the API.
 */
import type { DataSource } from 'typeorm';
import type { MysqlDriver } from 'typeorm/driver/mysql/MysqlDriver.js';
import { createDataSource } from './data-source.js';
import { limitPool } from './request-timeouts.js';

const dataSource = createDataSource(process.env, { forRequests: true });
let initializing: Promise<DataSource> | null = null;

/** Resolves with an initialised DataSource, retrying the first connection on each call. */
export function connect(): Promise<DataSource> {
  if (dataSource.isInitialized) return Promise.resolve(dataSource);
  initializing ??= dataSource
    .initialize()
    .then((db) => {
      limitPool((db.driver as MysqlDriver).pool);
      return db;
    })
    .finally(() => {
      initializing = null;
    });
  return initializing;
}

/** How long health waits for MariaDB: it answers in under a second whatever the database does. */
const pingBudgetMs = 500;

/** True when a real query answers within the health check's budget. */
export async function pingDatabase(): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), pingBudgetMs);
  });
  const ping = connect()
    .then((db) => db.query('SELECT 1'))
    .then(() => true)
    .catch(() => false);
  try {
    return await Promise.race([ping, late]);
  } finally {
    clearTimeout(timer);
  }
}

export async function disconnect(): Promise<void> {
  if (dataSource.isInitialized) await dataSource.destroy();
}
