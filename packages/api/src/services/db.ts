/** The database handle services take, and transactions with a retry on deadlock. */
import { DataSource } from 'typeorm';
import type { EntityManager } from 'typeorm';
import { runAgainIfRefused } from '../db/retryable.js';

/**
 * What a service runs on: the DataSource (each service call is its own transaction), or the
 * EntityManager of a transaction already open (the demo data loads in one transaction).
 */
export type Database = DataSource | EntityManager;

/** The EntityManager for plain reads. */
export function managerOf(db: Database): EntityManager {
  return db instanceof DataSource ? db.manager : db;
}

/**
 * Runs `work` in one transaction. A transaction refused as a deadlock victim (or, on a Galera
 * cluster, by certification at commit, which reports the same error) was rolled back whole,
 * so it is run again, whole, after a random pause that grows with each try. Inside a
 * transaction that is already open, `work` simply joins it (and the outer one is retried).
 */
export async function inTransaction<T>(db: Database, work: (manager: EntityManager) => Promise<T>): Promise<T> {
  if (!(db instanceof DataSource)) {
    return db.queryRunner?.isTransactionActive ? work(db) : db.transaction(work);
  }
  return runAgainIfRefused(() => db.transaction(work));
}

/** mysql2 returns COUNT(*) and other BIGINTs as strings under TypeORM's settings. */
export const toInt = (value: unknown): number => Number(value ?? 0);

/** Escapes LIKE's wildcards so a search for `50%` finds "50%". */
export const likeContains = (text: string): string => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
