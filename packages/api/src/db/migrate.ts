/** `npm run migration:run`: applies every pending migration, then exits. */
import { dataSource } from './data-source.js';

await dataSource.initialize();
const applied = await dataSource.runMigrations({ transaction: 'each' });
for (const migration of applied) console.log(`applied ${migration.name}`);
if (applied.length === 0) console.log('database schema is up to date');
await dataSource.destroy();
