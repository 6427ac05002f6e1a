/**
 * Migrations that rewrite stored data: each test undoes the migrations back to the one under
 * test, stores rows the way the older code wrote them, migrates again and reads what changed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createScratchDb } from './scratch-db.js';
import type { ScratchDb } from './scratch-db.js';

/** Undoes the applied migrations down to and including `name`, leaving the database as it was before it. */
async function undoThrough(db: DataSource, name: string): Promise<void> {
  for (;;) {
    const [last]: { name: string }[] = await db.query('SELECT name FROM migrations ORDER BY id DESC LIMIT 1');
    if (!last) throw new Error(`${name} was never applied`);
    await db.undoLastMigration({ transaction: 'each' });
    if (last.name === name) return;
  }
}

const now = new Date('2026-11-30T09:00:00.000Z');

async function insertUser(db: DataSource, login: string): Promise<number> {
  await db.query('INSERT INTO users (login, name) VALUES (?, ?)', [login, login]);
  return (await db.query('SELECT id FROM users WHERE login = ?', [login]))[0].id;
}

async function insertNotebook(db: DataSource, id: string, ownerId: number): Promise<void> {
  await db.query('INSERT INTO notebooks (id, title, ownerId, createdAt, updatedAt) VALUES (?, ?, ?, ?, ?)', [id, `Notebook ${id}`, ownerId, now, now]);
}

describe('the data migrations', () => {
  let scratch: ScratchDb;
  beforeAll(async () => {
    scratch = await createScratchDb('data_migrations');
  });
  afterAll(async () => {
    await scratch.drop();
  });

  it('rename the review state "changes asked" to needs_changes in every assignment and decision, and back on undo', async () => {
    const { db } = scratch;
    await undoThrough(db, 'RenameChangesAsked1764633600011');
    const owner = await insertUser(db, 'rename-owner');
    const reviewer = await insertUser(db, 'rename-reviewer');
    await insertNotebook(db, 'renamecheck1', owner);
    await db.query("INSERT INTO notebook_versions (notebookId, number, label, createdAt) VALUES ('renamecheck1', 1, 'v1', ?)", [now]);
    const [version] = await db.query("SELECT id FROM notebook_versions WHERE notebookId = 'renamecheck1'");
    await db.query("INSERT INTO reviews (notebookId, round, versionId, message, createdAt) VALUES ('renamecheck1', 1, ?, '', ?)", [version.id, now]);
    const [review] = await db.query("SELECT id FROM reviews WHERE notebookId = 'renamecheck1'");
    await db.query("INSERT INTO review_assignments (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'changes_asked', 'Raise C1.', ?)", [review.id, reviewer, now]);
    await db.query("INSERT INTO review_assignments (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'signed_off', '', ?)", [review.id, owner, now]);
    await db.query("INSERT INTO review_decisions (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'changes_asked', 'Raise C1.', ?)", [review.id, reviewer, now]);

    await db.runMigrations({ transaction: 'each' });
    const states = async () => ({
      assignments: (await db.query('SELECT state FROM review_assignments WHERE reviewId = ? ORDER BY reviewerId', [review.id])).map((r: { state: string }) => r.state),
      decisions: (await db.query('SELECT state FROM review_decisions WHERE reviewId = ?', [review.id])).map((r: { state: string }) => r.state),
    });
    expect(await states()).toEqual({ assignments: ['signed_off', 'needs_changes'], decisions: ['needs_changes'] });
    await expect(
      db.query("INSERT INTO review_decisions (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'changes_asked', '', ?)", [review.id, reviewer, now]),
    ).rejects.toThrow(/chk_review_decisions_state/);

    await undoThrough(db, 'RenameChangesAsked1764633600011');
    expect(await states()).toEqual({ assignments: ['signed_off', 'changes_asked'], decisions: ['changes_asked'] });
    await db.runMigrations({ transaction: 'each' });
    expect(await db.showMigrations()).toBe(false);
  });
});
