import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createScratchDb } from './scratch-db.js';
import type { ScratchDb } from './scratch-db.js';

describe('the migrations', () => {
  let scratch: ScratchDb;
  beforeAll(async () => {
    scratch = await createScratchDb('migrations');
  });
  afterAll(async () => {
    await scratch.drop();
  });

  it('run from an empty database and leave nothing pending', async () => {
    expect(await scratch.db.showMigrations()).toBe(false);
    const tables: { name: string }[] = await scratch.db.query(
      'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY table_name',
    );
    expect(tables.map((t) => t.name)).toEqual(expect.arrayContaining(['app_state', 'migrations', 'users']));
  });

  it('undo cleanly, one by one', async () => {
    const { db } = scratch;
    for (let i = 0; i < db.migrations.length; i++) await db.undoLastMigration({ transaction: 'each' });
    const tables: { name: string }[] = await db.query(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name <> 'migrations'",
    );
    expect(tables).toEqual([]);
    await db.runMigrations({ transaction: 'each' });
    expect(await db.showMigrations()).toBe(false);
  });
});
