/**
 * Runs the migrations on the test database once before the API tests. The test command
 * (`npm test`) starts a private MariaDB and sets DB_* for it.
 */
import { createDataSource } from '../src/db/data-source.js';

export default async function setup(): Promise<void> {
  if (!process.env.DB_NAME && !process.env.DATABASE_URL) {
    throw new Error('The API tests need a MariaDB database: run them with `npm test` from the repository root, or set DB_* / DATABASE_URL.');
  }
  const db = createDataSource();
  await db.initialize();
  await db.runMigrations({ transaction: 'each' });
  await db.destroy();
}
