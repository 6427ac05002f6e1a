/** The database handle services take, and transactions with a retry on deadlock. */
import { DataSource } from 'typeorm';
import type { EntityManager } from 'typeorm';

/**
 * What a service runs on: the DataSource (each service call is its own transaction), or the
 * EntityManager of a transaction already open (the demo data loads in one transaction).
 */
export type Database = DataSource | EntityManager;

/** The EntityManager for plain reads. */
export function managerOf(db: Database): EntityManager {
  return db instanceof DataSource ? db.manager : db;
}

const retryable = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);

function isRetryable(error: unknown): boolean {
  const e = error as { code?: string; driverError?: { code?: string } };
  return retryable.has(e?.code ?? '') || retryable.has(e?.driverError?.code ?? '');
}

/**
 * Runs `work` in one transaction; a deadlock victim is retried a few times. Inside a
 * transaction that is already open, `work` simply joins it.
 */
export async function inTransaction<T>(db: Database, work: (manager: EntityManager) => Promise<T>): Promise<T> {
  if (!(db instanceof DataSource)) {
    return db.queryRunner?.isTransactionActive ? work(db) : db.transaction(work);
  }
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.transaction(work);
    } catch (error) {
      if (attempt >= 4 || !isRetryable(error)) throw error;
      await new Promise((resolve) => setTimeout(resolve, 5 + Math.random() * 20 * attempt));
    }
  }
}

/** mysql2 returns COUNT(*) and other BIGINTs as strings under TypeORM's settings. */
export const toInt = (value: unknown): number => Number(value ?? 0);

/** Escapes LIKE's wildcards so a search for `50%` finds "50%". */
export const likeContains = (text: string): string => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
