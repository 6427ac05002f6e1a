import { afterEach, describe, expect, it } from 'vitest';
import { Not } from 'typeorm';
import type { DataSource } from 'typeorm';
import { SYSTEM_USER, User } from '../src/db/entities/user.js';
import { seedDemoData } from '../src/seed/demo-data.js';
import { demoNotebooks } from '../src/seed/demo-notebooks.js';
import { demoUsers } from '../src/seed/demo-users.js';
import { checkCircuitText } from '../src/cell-check.js';
import { createScratchDb } from './scratch-db.js';
import type { ScratchDb } from './scratch-db.js';

/** People other than the system user, which the migrations make in every database. */
const people = (db: DataSource) => db.getRepository(User).count({ where: { login: Not(SYSTEM_USER.login) } });

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
    expect(await people(db)).toBe(demoUsers.length);
    const notebooks = Number((await db.query('SELECT COUNT(*) AS n FROM notebooks'))[0].n);
    expect(notebooks).toBe(demoNotebooks.length + 1);
    expect(await seedDemoData(db)).toBe('already-loaded');
    expect(await people(db)).toBe(demoUsers.length);
    expect(Number((await db.query('SELECT COUNT(*) AS n FROM notebooks'))[0].n)).toBe(notebooks);

    // A team that removed the demo people and notebooks does not get them back on the next start.
    await db.query('DELETE FROM notebooks');
    await db.query('DELETE FROM users');
    expect(await seedDemoData(db)).toBe('already-loaded');
    expect(await db.getRepository(User).count()).toBe(0);
  });

  it('is not loaded over a database that already has users', async () => {
    scratch = await createScratchDb('seed_users');
    const { db } = scratch;
    await db.getRepository(User).insert({ login: 'someone-real', name: 'Someone Real', email: null });
    expect(await seedDemoData(db)).toBe('has-user-data');
    const logins = (await db.getRepository(User).find({ order: { login: 'ASC' } })).map((user) => user.login);
    expect(logins).toEqual([SYSTEM_USER.login, 'someone-real']);
    expect(await db.query('SELECT id FROM notebooks')).toEqual([]);
  });

  it('tells the product.md story: four notebooks with notes, circuits, versions, a fork and every role', async () => {
    scratch = await createScratchDb('seed_story');
    const { db } = scratch;
    await seedDemoData(db);
    const titles: { title: string; forkedFromId: string | null }[] = await db.query('SELECT title, forkedFromId FROM notebooks ORDER BY createdAt');
    expect(titles.filter((n) => !n.forkedFromId).map((n) => n.title)).toEqual([
      'Anti-alias filter for the vibration-sensor converter',
      'Tone network for the bench audio amplifier',
      'Decoupling network for the mixed-signal board',
      'Compensation of the 3.3 V regulator loop',
    ]);
    expect(titles.filter((n) => n.forkedFromId)).toHaveLength(1);

    const perNotebook: { title: string; notes: string; circuits: string; versions: string }[] = await db.query(
      `SELECT n.title,
              (SELECT COUNT(*) FROM cells c WHERE c.notebookId = n.id AND c.kind = 'note') AS notes,
              (SELECT COUNT(*) FROM cells c WHERE c.notebookId = n.id AND c.kind = 'circuit') AS circuits,
              (SELECT COUNT(*) FROM notebook_versions v WHERE v.notebookId = n.id) AS versions
         FROM notebooks n WHERE n.forkedFromId IS NULL`,
    );
    for (const notebook of perNotebook) {
      expect(Number(notebook.notes), notebook.title).toBeGreaterThan(0);
      expect(Number(notebook.circuits), notebook.title).toBeGreaterThan(0);
      expect(Number(notebook.versions), notebook.title).toBeGreaterThan(0);
    }
    const fork: { versionId: number | null }[] = await db.query('SELECT forkedFromVersionId AS versionId FROM notebooks WHERE forkedFromId IS NOT NULL');
    expect(fork[0]!.versionId).not.toBeNull();

    const roles: { role: string }[] = await db.query('SELECT DISTINCT role FROM notebook_members ORDER BY role');
    expect(roles.map((r) => r.role)).toEqual(['editor', 'reviewer', 'viewer']);
    const owners: { n: string }[] = await db.query('SELECT COUNT(DISTINCT ownerId) AS n FROM notebooks');
    expect(Number(owners[0]!.n)).toBeGreaterThanOrEqual(4);
    expect(await db.query("SELECT id FROM notebooks WHERE visibility = 'link'")).toHaveLength(1);

    // Every circuit revision ever saved compiles without errors, checked again here.
    const circuits: { text: string; diagnosticErrors: number }[] = await db.query(
      `SELECT r.text, r.diagnosticErrors FROM cell_revisions r JOIN cells c ON c.id = r.cellId WHERE c.kind = 'circuit'`,
    );
    expect(circuits.length).toBeGreaterThan(10);
    for (const circuit of circuits) {
      expect(checkCircuitText(circuit.text).errors, circuit.text).toBe(0);
      expect(circuit.diagnosticErrors).toBe(0);
    }
    expect(circuits.some((c) => /^show loop /m.test(c.text))).toBe(true);
    const revised: { n: string }[] = await db.query('SELECT COUNT(*) AS n FROM cells WHERE revision > 1');
    expect(Number(revised[0]!.n)).toBeGreaterThan(0);

    // A review round in progress: asked, pinned with a reply, and a reviewer who wants changes.
    const rounds: { state: string; title: string }[] = await db.query(
      'SELECT a.state, n.title FROM review_assignments a JOIN reviews rv ON rv.id = a.reviewId JOIN notebooks n ON n.id = rv.notebookId',
    );
    expect(rounds).toEqual([{ state: 'needs_changes', title: 'Anti-alias filter for the vibration-sensor converter' }]);
    expect(await db.query('SELECT id FROM review_decisions')).toHaveLength(1);
    const threads: { comments: string }[] = await db.query(
      'SELECT COUNT(c.id) AS comments FROM pins p JOIN pin_comments c ON c.pinId = p.id GROUP BY p.id ORDER BY p.id',
    );
    expect(threads.map((thread) => Number(thread.comments))).toEqual([2, 1]);
  });
});
