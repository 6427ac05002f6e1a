import { afterEach, describe, expect, it } from 'vitest';
import { User } from '../src/db/entities/user.js';
import { seedDemoData } from '../src/db/seed.js';
import { demoUsers } from '../src/db/seed/demo-users.js';
import { createScratchDb } from './scratch-db.js';
import type { ScratchDb } from './scratch-db.js';

describe('the demo data', () => {
  let scratch: ScratchDb | null = null;
  afterEach(async () => {
    await scratch?.drop();
    scratch = null;
  });

  it('loads once into an empty database, and never again', async () => {
    scratch = await createScratchDb('seed_once');
    const { db } = scratch;
    expect(await seedDemoData(db)).toBe('loaded');
    expect(await db.getRepository(User).count()).toBe(demoUsers.length);
    expect(await seedDemoData(db)).toBe('already-loaded');
    expect(await db.getRepository(User).count()).toBe(demoUsers.length);

    // A team that removed the demo people does not get them back on the next start.
    await db.getRepository(User).clear();
    expect(await seedDemoData(db)).toBe('already-loaded');
    expect(await db.getRepository(User).count()).toBe(0);
  });

  it('is not loaded over a database that already has users', async () => {
    scratch = await createScratchDb('seed_users');
    const { db } = scratch;
    await db.getRepository(User).insert({ login: 'someone-real', name: 'Someone Real', email: null });
    expect(await seedDemoData(db)).toBe('has-user-data');
    const logins = (await db.getRepository(User).find()).map((user) => user.login);
    expect(logins).toEqual(['someone-real']);
  });
});
