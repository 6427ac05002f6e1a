/**
 * The API's connection to MariaDB. The server starts even when MariaDB is down and keeps
 * trying, so a restarted database is picked up without restarting the API.
 */
import type { DataSource } from 'typeorm';
import { dataSource } from './data-source.js';

let initializing: Promise<DataSource> | null = null;

/** Resolves with an initialised DataSource, retrying the first connection on each call. */
export function connect(): Promise<DataSource> {
  if (dataSource.isInitialized) return Promise.resolve(dataSource);
  initializing ??= dataSource.initialize().finally(() => {
    initializing = null;
  });
  return initializing;
}

/** True when a real query answers. */
export async function pingDatabase(): Promise<boolean> {
  try {
    const db = await connect();
    await db.query('SELECT 1');
    return true;
  } catch {
    return false;
  }
}

export async function disconnect(): Promise<void> {
  if (dataSource.isInitialized) await dataSource.destroy();
}
