/**
 * The one TypeORM DataSource (the TypeORM CLI wants exactly one exported from a module).
 * Schema changes go through migrations only; `synchronize` stays off.
 */
import { DataSource } from 'typeorm';
import { dbConfig } from '../config.js';
import { entities } from './entities/index.js';
import { migrations } from './migrations/index.js';
import { requestTimeouts } from './request-timeouts.js';

/**
 * A DataSource on the database of `env`. `forRequests`: the server's own, with the time
 * limits of request-timeouts.ts (the pool's share is added once it exists, in connection.ts).
 */
export function createDataSource(env: NodeJS.ProcessEnv = process.env, { forRequests = false } = {}): DataSource {
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
    ...(forRequests ? { enableQueryTimeout: true, maxQueryExecutionTime: requestTimeouts.queryMs } : {}),
    extra: { connectionLimit: 20, connectTimeout: forRequests ? requestTimeouts.connectMs : 5000 },
  });
}

/** The DataSource of the TypeORM CLI, the migrations and the seed. */
export const dataSource = createDataSource();
