/**
 * Forks: a new notebook owned by the caller, holding copies of another notebook's cells (its
 * current ones, or those of a version), made in one transaction, so a failure half-way
 * leaves no partial notebook behind.
 */
import { LIMITS } from '../contract/common.js';
import type { ForkList } from '../contract/forks.js';
import type { Notebook as NotebookBody } from '../contract/notebooks.js';
import { can } from '../policy.js';
import type { Actor } from '../policy.js';
import { accessOf, presentForkSummary } from '../presenters/notebook.js';
import { presentVersionRef } from '../presenters/version.js';
import { loadNotebookFor, notebookRow, notebookSelect } from './access.js';
import { cellsOf } from './cells.js';
import { inTransaction, managerOf, toInt } from './db.js';
import type { Database } from './db.js';
import { insertNotebook, presentNotebookFor } from './notebooks.js';
import { versionCells, versionRow } from './versions.js';
import type { NotebookRow } from './access.js';

/**
 * A test's way to make a fork fail part-way: called after each copied cell, inside the
 * transaction. Nothing in the product sets it.
 */
export const forkHooks: { afterCell: ((index: number) => void | Promise<void>) | null } = { afterCell: null };

function forkTitle(title: string): string {
  const suffix = ' (fork)';
  return title.length + suffix.length <= LIMITS.titleLength ? `${title}${suffix}` : title;
}

/** `POST /api/notebooks/:id/forks`: anyone who may read a notebook may fork it. */
export async function forkNotebook(db: Database, actor: Actor, sourceId: string, input: { version?: number; title?: string }): Promise<NotebookBody> {
  return inTransaction(db, async (manager) => {
    const source = await loadNotebookFor(manager, actor, sourceId, 'fork');
    let versionId: number | null = null;
    let cells: { kind: 'circuit' | 'note'; title: string | null; text: string; diagnostics: { errors: number; warnings: number } | null }[];
    const counts = (e: number | null, w: number | null) => (e === null || w === null ? null : { errors: e, warnings: w });
    if (input.version !== undefined) {
      const version = await versionRow(manager, sourceId, input.version);
      versionId = version.id;
      cells = (await versionCells(manager, version.id)).map((c) => ({
        kind: c.kind,
        title: c.title,
        text: c.text,
        diagnostics: counts(c.diagnosticErrors, c.diagnosticWarnings),
      }));
    } else {
      cells = (await cellsOf(manager, sourceId))
        .filter((c) => c.deletedAt === null)
        .map((c) => ({ kind: c.kind, title: c.title, text: c.text, diagnostics: counts(c.diagnosticErrors, c.diagnosticWarnings) }));
    }
    const id = await insertNotebook(
      manager,
      actor,
      // A version holds cells only, so a fork of a version takes the source's description as it is now.
      { title: input.title ?? forkTitle(source.title), description: source.description, cells, diagnostics: cells.map((c) => c.diagnostics) },
      { notebookId: sourceId, versionId },
      forkHooks.afterCell ?? undefined,
    );
    const row = await notebookRow(manager, id, actor.id);
    return presentNotebookFor(manager, actor, row!);
  });
}

/** `GET /api/notebooks/:id/forks`: the live forks the caller may read, newest first. */
export async function listForks(db: Database, actor: Actor, sourceId: string): Promise<ForkList> {
  await loadNotebookFor(managerOf(db), actor, sourceId, 'read');
  const rows: (NotebookRow & { versionNumber: number | null; versionLabel: string | null })[] = await db.query(
    `SELECT sub.*, v.number AS versionNumber, v.label AS versionLabel
       FROM (${notebookSelect} WHERE n.forkedFromId = ? AND n.deletedAt IS NULL) sub
       LEFT JOIN notebook_versions v ON v.id = sub.forkedFromVersionId
      ORDER BY sub.createdAt DESC, sub.id DESC`,
    [actor.id, sourceId],
  );
  const [total] = await db.query('SELECT COUNT(*) AS n FROM notebooks WHERE forkedFromId = ? AND deletedAt IS NULL', [sourceId]);
  return {
    items: rows
      .filter((row) => can(actor, 'read', accessOf(row)))
      .map((row) =>
        presentForkSummary(row, actor, row.versionNumber === null ? null : presentVersionRef({ number: row.versionNumber, label: row.versionLabel ?? '' })),
      ),
    total: toInt(total?.n),
  };
}
