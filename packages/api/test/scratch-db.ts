/**
 * A scratch database beside the test database (same server, name `<test db>_<suffix>`),
 * migrated from empty, for tests that need a database of their own.
 */
import type { DataSource } from 'typeorm';
import { dbConfig } from '../src/config.js';
import { createDataSource } from '../src/db/data-source.js';

export interface ScratchDb {
  db: DataSource;
  drop(): Promise<void>;
}

export async function createScratchDb(suffix: string): Promise<ScratchDb> {
  const base = dbConfig();
  const name = `${base.database}_${suffix}`;
  const admin = createDataSource({ ...process.env, DATABASE_URL: '' });
  await admin.initialize();
  await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const db = createDataSource({
    ...process.env,
    DATABASE_URL: '',
    DB_HOST: base.host,
    DB_PORT: String(base.port),
    DB_USER: base.username,
    DB_PASSWORD: base.password,
    DB_NAME: name,
  });
  await db.initialize();
  await db.runMigrations({ transaction: 'each' });
  return {
    db,
    async drop() {
      await db.destroy();
      await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await admin.destroy();
    },
  };
}
