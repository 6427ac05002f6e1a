/**
 * Migrations that rewrite stored data: each test undoes the migrations back to the one under
 * test, stores rows the way the older code wrote them, migrates again and reads what changed.
 */
import { modernizeCellText } from '@rolloff/solver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { SYSTEM_USER } from '../src/db/entities/user.js';
import { listActivity } from '../src/services/activity.js';
import { listRevisions } from '../src/services/cells.js';
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

/** Inserts a cell with its revisions, as the older code stored them; returns its id. */
async function insertCell(
  db: DataSource,
  notebookId: string,
  authorId: number,
  cell: { kind: 'circuit' | 'note'; position: number; texts: string[]; deleted?: boolean },
): Promise<number> {
  await db.query('INSERT INTO cells (notebookId, kind, position, revision, createdAt, updatedAt, deletedAt) VALUES (?, ?, ?, ?, ?, ?, ?)', [
    notebookId,
    cell.kind,
    cell.position,
    cell.texts.length,
    now,
    now,
    cell.deleted ? now : null,
  ]);
  const [{ id }] = await db.query('SELECT MAX(id) AS id FROM cells');
  for (const [index, text] of cell.texts.entries()) {
    await db.query(
      'INSERT INTO cell_revisions (cellId, number, text, authorId, diagnosticErrors, diagnosticWarnings, createdAt) VALUES (?, ?, ?, ?, 0, 0, ?)',
      [id, index + 1, text, authorId, now],
    );
  }
  return id;
}

// Cells in the language's earlier forms: 0 as ground, digit nodes, free-form designators,
// `noiseless`, the op-amp's `en`/`in`, `tolerance montecarlo … seed …` and `tolerance worstcase`.
const integratorFirst = `# inverting integrator
drive in
Rin [in 1] 10k
C1 [1 out] 10n
U1 [0 1 out] opamp
show out
`;
const integratorOld = `# inverting integrator, with a resistor across C1 so it has a DC gain
drive in
Rin [in 1] 10k noiseless
Rfb [1 out] 100k ±1%
C1 [1 out] 10n ±5%
U1 [0 1 out] opamp gain 100dB gbw 1M en 10n in 1p
show out
tolerance montecarlo 200 seed 7
`;
const dividerOld = `drive in
Rtop [in 2] 10k ±1%
Rbot [2 0] 10k ±1%
show 2
tolerance worstcase
`;
const modern = `drive in
R1 [in out] 1k
C1 [out gnd] 100n
show out
`;
const oldForms = [/\[0 |\s0\]/, /\[\d+ |\s\d+\]/, /^R(in|fb|top|bot)\b/m, /noiseless/, /\ben 10n\b/, /\bin 1p\b/, /tolerance/];

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
    await db.query("INSERT INTO review_assignments (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'changes_asked', 'Raise C1.', ?)", [
      review.id,
      reviewer,
      now,
    ]);
    await db.query("INSERT INTO review_assignments (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'signed_off', '', ?)", [
      review.id,
      owner,
      now,
    ]);
    await db.query("INSERT INTO review_decisions (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'changes_asked', 'Raise C1.', ?)", [
      review.id,
      reviewer,
      now,
    ]);

    await db.runMigrations({ transaction: 'each' });
    const states = async () => ({
      assignments: (await db.query('SELECT state FROM review_assignments WHERE reviewId = ? ORDER BY reviewerId', [review.id])).map(
        (r: { state: string }) => r.state,
      ),
      decisions: (await db.query('SELECT state FROM review_decisions WHERE reviewId = ?', [review.id])).map((r: { state: string }) => r.state),
    });
    expect(await states()).toEqual({ assignments: ['signed_off', 'needs_changes'], decisions: ['needs_changes'] });
    await expect(
      db.query("INSERT INTO review_decisions (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'changes_asked', '', ?)", [
        review.id,
        reviewer,
        now,
      ]),
    ).rejects.toThrow(/chk_review_decisions_state/);

    await undoThrough(db, 'RenameChangesAsked1764633600011');
    expect(await states()).toEqual({ assignments: ['signed_off', 'changes_asked'], decisions: ['changes_asked'] });
    await db.runMigrations({ transaction: 'each' });
    expect(await db.showMigrations()).toBe(false);
  });

  it('rewrite the current text of every circuit cell to the new forms as a revision by the system user, leaving history as it was', async () => {
    const { db } = scratch;
    await undoThrough(db, 'LanguageUpdate1764633600013');
    const owner = await insertUser(db, 'language-owner');
    await insertNotebook(db, 'languagechk1', owner);
    const integrator = await insertCell(db, 'languagechk1', owner, { kind: 'circuit', position: 0, texts: [integratorFirst, integratorOld] });
    const divider = await insertCell(db, 'languagechk1', owner, { kind: 'circuit', position: 1, texts: [dividerOld], deleted: true });
    const current = await insertCell(db, 'languagechk1', owner, { kind: 'circuit', position: 1, texts: [modern] });
    const note = await insertCell(db, 'languagechk1', owner, {
      kind: 'note',
      position: 2,
      texts: ['Ground is node 0 in the old sketches; en and in are the noise options.'],
    });

    await db.runMigrations({ transaction: 'each' });

    const revisions = async (cellId: number) =>
      (await db.query('SELECT number, text, authorId, message, diagnosticErrors FROM cell_revisions WHERE cellId = ? ORDER BY number', [cellId])) as {
        number: number;
        text: string;
        authorId: number | null;
        message: string | null;
        diagnosticErrors: number | null;
      }[];
    const [system] = await db.query('SELECT id, name, disabled FROM users WHERE login = ?', [SYSTEM_USER.login]);
    expect(system).toMatchObject({ name: 'Rolloff', disabled: 1 });

    for (const [cellId, texts] of [
      [integrator, [integratorFirst, integratorOld]],
      [divider, [dividerOld]],
    ] as const) {
      const after = await revisions(cellId);
      // History untouched: the same texts, by the same author, without a message.
      expect(after.slice(0, -1).map((r) => [r.text, r.authorId, r.message])).toEqual(texts.map((text) => [text, owner, null]));
      const update = after[after.length - 1]!;
      expect(update).toMatchObject({ number: texts.length + 1, authorId: system.id, message: 'language update', diagnosticErrors: 0 });
      expect(update.text).toBe(modernizeCellText(texts[texts.length - 1]!).text);
      for (const form of oldForms) expect(update.text, String(form)).not.toMatch(form);
      expect((await db.query('SELECT revision FROM cells WHERE id = ?', [cellId]))[0].revision).toBe(texts.length + 1);
    }
    const integratorNow = (await revisions(integrator))[2]!.text;
    for (const word of ['gnd', 'noise off', 'vnoise 10n', 'inoise 1p', 'spread 200 draws seed 7', '# inverting integrator, with a resistor'])
      expect(integratorNow).toContain(word);
    expect((await revisions(divider))[1]!.text).toContain('spread extremes');
    // Nothing to rewrite in today's forms or in a note.
    expect((await revisions(current)).map((r) => r.number)).toEqual([1]);
    expect((await revisions(note)).map((r) => r.number)).toEqual([1]);

    // The history the screens read names the system user and the message.
    const actor = { id: owner, siteRole: 'member' as const, disabled: false };
    const history = await listRevisions(db, actor, 'languagechk1', integrator, { limit: 10 });
    expect(history.items[0]).toMatchObject({ number: 3, author: { login: SYSTEM_USER.login, name: 'Rolloff' }, message: 'language update' });
    expect(history.items[1]).toMatchObject({ number: 2, author: { id: owner }, message: null });
    const activity = await listActivity(db, actor, 'languagechk1', { limit: 20 });
    const updates = activity.items.filter((item) => item.kind === 'revision' && item.message === 'language update');
    expect(updates.map((item) => item.actor?.name)).toEqual(['Rolloff', 'Rolloff']);

    // Undone, each update that nothing built on goes, and the system user with it.
    await undoThrough(db, 'LanguageUpdate1764633600013');
    expect((await revisions(integrator)).map((r) => r.text)).toEqual([integratorFirst, integratorOld]);
    expect((await db.query('SELECT revision FROM cells WHERE id = ?', [integrator]))[0].revision).toBe(2);
    expect(await db.query('SELECT id FROM users WHERE login = ?', [SYSTEM_USER.login])).toEqual([]);
    await db.runMigrations({ transaction: 'each' });
    expect(await db.showMigrations()).toBe(false);
  });
});
