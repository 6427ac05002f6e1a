/**
 * The one TypeORM DataSource (the TypeORM CLI wants exactly one exported from a module).
 * Schema changes go through migrations only; `synchronize` stays off.
 */
import { DataSource } from 'typeorm';
import { dbConfig } from '../config.js';
import { entities } from './entities/index.js';
import { migrations } from './migrations/index.js';

export function createDataSource(env: NodeJS.ProcessEnv = process.env): DataSource {
  const db = dbConfig(env);
  return new DataSource({
    type: 'mariadb',
    ...db,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    entities,
    migrations,
    migrationsTableName: 'migrations',
    synchronize: false,
    logging: ['error'],
    extra: { connectionLimit: 20, connectTimeout: 5000 },
  });
}

export const dataSource = createDataSource();
