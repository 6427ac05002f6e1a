/** Notebook versions: a labelled snapshot of the current revision of every live cell. */
import type { EntityManager } from 'typeorm';
import type { Version, VersionList } from '../contract/versions.js';
import { NotebookVersion } from '../db/entities/notebook-version.js';
import { notFound } from '../errors.js';
import type { Actor } from '../policy.js';
import { presentVersion, presentVersionSummary } from '../presenters/version.js';
import type { VersionCellRow, VersionRow } from '../presenters/rows.js';
import { loadNotebookFor } from './access.js';
import { inTransaction, managerOf, toInt } from './db.js';
import type { Database } from './db.js';

const versionSelect = `
  SELECT v.id, v.notebookId, v.number, v.label, v.authorId, u.login AS authorLogin, u.name AS authorName, v.createdAt,
         (SELECT COUNT(*) FROM notebook_version_cells vc WHERE vc.versionId = v.id) AS cellCount
    FROM notebook_versions v
    LEFT JOIN users u ON u.id = v.authorId`;

/** The cells of a version in order, each with the text of the revision it had then. */
export async function versionCells(manager: EntityManager, versionId: number): Promise<VersionCellRow[]> {
  return manager.query(
    `SELECT vc.cellId, c.kind, vc.position, r.number AS revision, r.text, r.diagnosticErrors, r.diagnosticWarnings
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

/** `POST /api/notebooks/:id/versions` (editor or owner). */
export async function createVersion(db: Database, actor: Actor, notebookId: string, label: string): Promise<Version> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
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
    return presentVersion(await versionRow(manager, notebookId, number), await versionCells(manager, versionId));
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
