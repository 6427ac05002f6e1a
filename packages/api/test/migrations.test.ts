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
    expect(tables.map((t) => t.name)).toEqual(
      expect.arrayContaining([
        'app_state',
        'migrations',
        'users',
        'sessions',
        'notebooks',
        'notebook_members',
        'cells',
        'cell_revisions',
        'notebook_versions',
        'notebook_version_cells',
        'reviews',
        'review_assignments',
        'review_decisions',
        'pins',
        'pin_comments',
        'user_mail_settings',
        'mail_log',
        'idempotency_keys',
        'mail_outbox',
        'rate_limits',
      ]),
    );
  });

  it('link the tables with foreign keys', async () => {
    const keys: { child: string; columnName: string; parent: string; parentColumn: string; onDelete: string }[] = await scratch.db.query(
      `SELECT k.table_name AS child, k.column_name AS columnName, k.referenced_table_name AS parent,
              k.referenced_column_name AS parentColumn, r.delete_rule AS onDelete
         FROM information_schema.key_column_usage k
         JOIN information_schema.referential_constraints r
           ON r.constraint_schema = k.constraint_schema AND r.constraint_name = k.constraint_name
        WHERE k.table_schema = DATABASE() AND k.referenced_table_name IS NOT NULL`,
    );
    const found = keys.map((k) => `${k.child}.${k.columnName} -> ${k.parent}.${k.parentColumn} ${k.onDelete}`).sort();
    expect(found).toEqual(
      [
        'cell_revisions.authorId -> users.id SET NULL',
        'cell_revisions.cellId -> cells.id CASCADE',
        'idempotency_keys.userId -> users.id CASCADE',
        'cells.notebookId -> notebooks.id CASCADE',
        'notebook_members.notebookId -> notebooks.id CASCADE',
        'notebook_members.userId -> users.id CASCADE',
        'notebook_version_cells.cellId -> cells.id CASCADE',
        'notebook_version_cells.revisionId -> cell_revisions.id CASCADE',
        'notebook_version_cells.versionId -> notebook_versions.id CASCADE',
        'notebook_versions.authorId -> users.id SET NULL',
        'notebook_versions.notebookId -> notebooks.id CASCADE',
        'notebooks.forkedFromId -> notebooks.id SET NULL',
        'notebooks.forkedFromVersionId -> notebook_versions.id SET NULL',
        'notebooks.ownerId -> users.id RESTRICT',
        'sessions.userId -> users.id CASCADE',
        'reviews.notebookId -> notebooks.id CASCADE',
        'reviews.versionId -> notebook_versions.id CASCADE',
        'reviews.requestedById -> users.id SET NULL',
        'review_assignments.reviewId -> reviews.id CASCADE',
        'review_assignments.reviewerId -> users.id CASCADE',
        'review_decisions.reviewId -> reviews.id CASCADE',
        'review_decisions.reviewerId -> users.id SET NULL',
        'pins.notebookId -> notebooks.id CASCADE',
        // One key on two columns: a pin names a revision of its own cell.
        'pins.cellId -> cell_revisions.cellId CASCADE',
        'pins.revisionNumber -> cell_revisions.number CASCADE',
        'pins.createdById -> users.id SET NULL',
        'pins.resolvedById -> users.id SET NULL',
        'pin_comments.pinId -> pins.id CASCADE',
        'pin_comments.authorId -> users.id SET NULL',
        'user_mail_settings.userId -> users.id CASCADE',
        'mail_log.userId -> users.id SET NULL',
        'mail_log.notebookId -> notebooks.id SET NULL',
        'mail_outbox.mailLogId -> mail_log.id CASCADE',
      ].sort(),
    );
  });

  it('have the indexes the list and lookup queries use', async () => {
    const rows: { tableName: string; indexName: string; columns: string; nonUnique: number | string }[] = await scratch.db.query(
      `SELECT table_name AS tableName, index_name AS indexName, MAX(non_unique) AS nonUnique,
              GROUP_CONCAT(column_name ORDER BY seq_in_index) AS columns
         FROM information_schema.statistics
        WHERE table_schema = DATABASE()
        GROUP BY table_name, index_name`,
    );
    const index = (table: string, columns: string) => rows.find((r) => r.tableName === table && r.columns === columns);
    // scope=mine and an admin's scope=all, newest change first, paged by (updatedAt, id)
    expect(index('notebooks', 'ownerId,deletedAt,updatedAt,id')).toBeDefined();
    expect(index('notebooks', 'deletedAt,updatedAt,id')).toBeDefined();
    // scope=shared, and the caller's role in every notebook read
    expect(index('notebook_members', 'userId,notebookId')).toBeDefined();
    expect(index('notebook_members', 'notebookId,userId')).toMatchObject({ indexName: 'PRIMARY' });
    // forks of a notebook and fork counts
    expect(index('notebooks', 'forkedFromId,createdAt')).toBeDefined();
    // a notebook's cells in order; a cell's current revision by number (unique)
    expect(index('cells', 'notebookId,deletedAt,position')).toBeDefined();
    expect(Number(index('cell_revisions', 'cellId,number')?.nonUnique)).toBe(0);
    expect(Number(index('notebook_versions', 'notebookId,number')?.nonUnique)).toBe(0);
    // sign-in by GitHub id or login; a disabled user's sessions; expired sessions
    expect(Number(index('users', 'githubId')?.nonUnique)).toBe(0);
    expect(Number(index('users', 'login')?.nonUnique)).toBe(0);
    expect(index('sessions', 'userId')).toBeDefined();
    expect(index('sessions', 'expiresAt')).toBeDefined();
    // a user's Idempotency-Key; keys past their day
    expect(index('idempotency_keys', 'userId,idempotencyKey')).toMatchObject({ indexName: 'PRIMARY' });
    expect(index('idempotency_keys', 'createdAt')).toBeDefined();
    // a notebook's review rounds by number (unique), newest first in the timeline; a round's people and history
    expect(Number(index('reviews', 'notebookId,round')?.nonUnique)).toBe(0);
    expect(index('reviews', 'notebookId,createdAt')).toBeDefined();
    expect(index('review_assignments', 'reviewId,reviewerId')).toMatchObject({ indexName: 'PRIMARY' });
    expect(index('review_decisions', 'reviewId,createdAt')).toBeDefined();
    // a notebook's pins (all, or one cell's), a pin's thread in order
    expect(index('pins', 'notebookId,cellId,createdAt')).toBeDefined();
    expect(index('pins', 'notebookId,createdAt')).toBeDefined();
    expect(index('pin_comments', 'pinId,createdAt')).toBeDefined();
    // one row of mail settings per person; the mail log newest first and by status
    expect(index('user_mail_settings', 'userId')).toMatchObject({ indexName: 'PRIMARY' });
    expect(index('mail_log', 'createdAt')).toBeDefined();
    expect(index('mail_log', 'status,createdAt')).toBeDefined();
    // the outbox's due messages in order; what was sent or failed in the last day
    expect(index('mail_outbox', 'nextAttemptAt')).toBeDefined();
    expect(index('mail_log', 'status,finishedAt')).toBeDefined();
    // one rate-limit counter per limiter and client; a limiter's windows long past, to prune
    expect(index('rate_limits', 'limiter,clientKey')).toMatchObject({ indexName: 'PRIMARY' });
    expect(index('rate_limits', 'limiter,windowStart')).toBeDefined();
  });

  it('refuse what the API never writes: a pin at 0 Hz, on a revision its cell does not have, an unknown review state', async () => {
    const { db } = scratch;
    await db.query("INSERT INTO users (login, name) VALUES ('schema-check', 'Schema Check')");
    const [user] = await db.query("SELECT id FROM users WHERE login = 'schema-check'");
    const now = new Date();
    await db.query('INSERT INTO notebooks (id, title, ownerId, createdAt, updatedAt) VALUES (?, ?, ?, ?, ?)', [
      'schemacheck1',
      'Schema check',
      user.id,
      now,
      now,
    ]);
    await db.query("INSERT INTO cells (notebookId, kind, position, revision, createdAt, updatedAt) VALUES ('schemacheck1', 'circuit', 0, 1, ?, ?)", [now, now]);
    const [cell] = await db.query("SELECT id FROM cells WHERE notebookId = 'schemacheck1'");
    await db.query("INSERT INTO cell_revisions (cellId, number, text, createdAt) VALUES (?, 1, 'R1 [in out] 1k', ?)", [cell.id, now]);
    const pin = (revision: number, frequency: number) =>
      db.query("INSERT INTO pins (notebookId, cellId, revisionNumber, trace, frequency, createdAt) VALUES ('schemacheck1', ?, ?, 'out', ?, ?)", [
        cell.id,
        revision,
        frequency,
        now,
      ]);
    await expect(pin(1, 0)).rejects.toThrow(/chk_pins_frequency/);
    await expect(pin(2, 1000)).rejects.toThrow(/fk_pins_revision/);
    await pin(1, 1591.5);
    await db.query("INSERT INTO notebook_versions (notebookId, number, label, createdAt) VALUES ('schemacheck1', 1, 'v1', ?)", [now]);
    const [version] = await db.query("SELECT id FROM notebook_versions WHERE notebookId = 'schemacheck1'");
    await db.query("INSERT INTO reviews (notebookId, round, versionId, message, createdAt) VALUES ('schemacheck1', 1, ?, '', ?)", [version.id, now]);
    const [review] = await db.query("SELECT id FROM reviews WHERE notebookId = 'schemacheck1'");
    await expect(
      db.query("INSERT INTO review_assignments (reviewId, reviewerId, state, summary, createdAt) VALUES (?, ?, 'approved', '', ?)", [review.id, user.id, now]),
    ).rejects.toThrow(/chk_review_assignments_state/);
    // Deleting the notebook takes its reviews and pins with it.
    await db.query("DELETE FROM notebooks WHERE id = 'schemacheck1'");
    expect(await db.query("SELECT id FROM pins WHERE notebookId = 'schemacheck1'")).toEqual([]);
    expect(await db.query("SELECT id FROM reviews WHERE notebookId = 'schemacheck1'")).toEqual([]);
    await db.query("DELETE FROM users WHERE login = 'schema-check'");
  });

  it('plan the notebook list with the owner index rather than a table scan', async () => {
    const plan: { key: string | null; type: string }[] = await scratch.db.query(
      `EXPLAIN SELECT id FROM notebooks WHERE ownerId = 1 AND deletedAt IS NULL ORDER BY updatedAt DESC, id DESC LIMIT 21`,
    );
    expect(plan[0]!.key).toBe('idx_notebooks_owner_changed');
    expect(plan[0]!.type).not.toBe('ALL');
  });

  it("plan a cell's pins with the pins index rather than a table scan", async () => {
    const plan: { key: string | null; type: string }[] = await scratch.db.query(
      `EXPLAIN SELECT id FROM pins WHERE notebookId = 'AAAAAAAAAAAA' AND cellId = 1 ORDER BY createdAt, id`,
    );
    expect(plan[0]!.key).toBe('idx_pins_notebook_cell');
    expect(plan[0]!.type).not.toBe('ALL');
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
