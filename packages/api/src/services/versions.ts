/** Notebook versions: a labelled snapshot of the current revision of every live cell. */
import type { EntityManager } from 'typeorm';
import type { Version, VersionList } from '../contract/versions.js';
import { NotebookVersion } from '../db/entities/notebook-version.js';
import { notFound } from '../errors.js';
import type { Actor } from '../policy.js';
import { presentVersion, presentVersionSummary } from '../presenters/version.js';
import { loadNotebookFor } from './access.js';
import { inTransaction, managerOf, toInt } from './db.js';
import type { Database } from './db.js';

export interface VersionRow {
  id: number;
  notebookId: string;
  number: number;
  label: string;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  createdAt: Date;
  cellCount: number | string;
}

export interface VersionCellRow {
  cellId: number;
  kind: 'circuit' | 'note';
  title: string | null;
  position: number;
  revision: number;
  text: string;
  diagnosticErrors: number | null;
  diagnosticWarnings: number | null;
}

const versionSelect = `
  SELECT v.id, v.notebookId, v.number, v.label, v.authorId, u.login AS authorLogin, u.name AS authorName, v.createdAt,
         (SELECT COUNT(*) FROM notebook_version_cells vc WHERE vc.versionId = v.id) AS cellCount
    FROM notebook_versions v
    LEFT JOIN users u ON u.id = v.authorId`;

/** The cells of a version in order, each with the text of the revision it had then. */
export async function versionCells(manager: EntityManager, versionId: number): Promise<VersionCellRow[]> {
  return manager.query(
    `SELECT vc.cellId, c.kind, c.title, vc.position, r.number AS revision, r.text, r.diagnosticErrors, r.diagnosticWarnings
       FROM notebook_version_cells vc
       JOIN cells c ON c.id = vc.cellId
       JOIN cell_revisions r ON r.id = vc.revisionId
      WHERE vc.versionId = ?
      ORDER BY vc.position, vc.cellId`,
    [versionId],
  );
}

/** The version row of `notebookId` numbered `number`, or 404. */
export async function versionRow(manager: EntityManager, notebookId: string, number: number): Promise<VersionRow> {
  const rows: VersionRow[] = await manager.query(`${versionSelect} WHERE v.notebookId = ? AND v.number = ?`, [notebookId, number]);
  if (!rows[0]) throw notFound('That version');
  return rows[0];
}

/**
 * Snapshots every live cell of the notebook at its current revision as the next version,
 * inside the caller's transaction (which holds the notebook's lock); returns its number.
 */
export async function insertVersion(manager: EntityManager, actor: Actor, notebookId: string, label: string): Promise<number> {
  const [last] = await manager.query('SELECT COALESCE(MAX(number), 0) AS n FROM notebook_versions WHERE notebookId = ?', [notebookId]);
  const number = toInt(last?.n) + 1;
  const inserted = await manager.insert(NotebookVersion, { notebookId, number, label, authorId: actor.id, createdAt: new Date() });
  const versionId = Number(inserted.identifiers[0]?.id);
  await manager.query(
    `INSERT INTO notebook_version_cells (versionId, cellId, revisionId, position)
     SELECT ?, c.id, r.id, c.position
       FROM cells c JOIN cell_revisions r ON r.cellId = c.id AND r.number = c.revision
      WHERE c.notebookId = ? AND c.deletedAt IS NULL`,
    [versionId, notebookId],
  );
  return number;
}

/**
 * True when the notebook's live cells differ from version `versionId`: a cell saved, added,
 * deleted or moved since.
 */
export async function changedSinceVersion(manager: EntityManager, notebookId: string, versionId: number): Promise<boolean> {
  const key = (row: { cellId: number; revisionId: number; position: number }) => `${row.cellId}:${row.revisionId}:${row.position}`;
  const now: { cellId: number; revisionId: number; position: number }[] = await manager.query(
    `SELECT c.id AS cellId, r.id AS revisionId, c.position
       FROM cells c JOIN cell_revisions r ON r.cellId = c.id AND r.number = c.revision
      WHERE c.notebookId = ? AND c.deletedAt IS NULL`,
    [notebookId],
  );
  const then: { cellId: number; revisionId: number; position: number }[] = await manager.query(
    'SELECT cellId, revisionId, position FROM notebook_version_cells WHERE versionId = ?',
    [versionId],
  );
  const before = new Set(then.map(key));
  return now.length !== then.length || now.some((row) => !before.has(key(row)));
}

/** `POST /api/notebooks/:id/versions` (editor or owner). */
export async function createVersion(db: Database, actor: Actor, notebookId: string, label: string): Promise<Version> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const number = await insertVersion(manager, actor, notebookId, label);
    const row = await versionRow(manager, notebookId, number);
    return presentVersion(row, await versionCells(manager, row.id));
  });
}

/** `GET /api/notebooks/:id/versions`: newest first. */
export async function listVersions(db: Database, actor: Actor, notebookId: string): Promise<VersionList> {
  await loadNotebookFor(managerOf(db), actor, notebookId, 'read');
  const rows: VersionRow[] = await db.query(`${versionSelect} WHERE v.notebookId = ? ORDER BY v.number DESC`, [notebookId]);
  return { items: rows.map(presentVersionSummary) };
}

/** `GET /api/notebooks/:id/versions/:number`: the version with every cell's text as it was. */
export async function getVersion(db: Database, actor: Actor, notebookId: string, number: number): Promise<Version> {
  await loadNotebookFor(managerOf(db), actor, notebookId, 'read');
  const row = await versionRow(managerOf(db), notebookId, number);
  return presentVersion(row, await versionCells(managerOf(db), row.id));
}
