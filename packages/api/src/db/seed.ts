/**
 * The demo data, loaded once per database by `npm start` (through seed-cli.ts). A marker row in app_state records
 * that it ran, so it never runs again, and it never touches a database that has users.
 */
import type { DataSource } from 'typeorm';
import { User } from './entities/user.js';
import { demoUsers } from './seed/demo-users.js';

const marker = 'demo-data-loaded';

/** Loads the demo data unless it was loaded before or real users exist; returns what it did. */
export async function seedDemoData(db: DataSource): Promise<'loaded' | 'already-loaded' | 'has-user-data'> {
  return db.transaction(async (manager) => {
    const done = await manager.query('SELECT value FROM app_state WHERE name = ? FOR UPDATE', [marker]);
    if (done.length > 0) return 'already-loaded';
    if ((await manager.count(User)) > 0) return 'has-user-data';
    await manager.insert(User, demoUsers.map((user) => ({ ...user })));
    await manager.query('INSERT INTO app_state (name, value) VALUES (?, ?)', [marker, new Date().toISOString()]);
    return 'loaded';
  });
}
