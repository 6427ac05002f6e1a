/**
 * Cells and their immutable revisions. Every change runs in one transaction that first locks
 * the notebook row, so changes to one notebook queue up in a fixed lock order (notebook, then
 * cells) and never deadlock; a save compares `baseRevision` under that lock, so of two saves on
 * the same revision exactly one wins and the other gets 409 with the winner's text.
 */
import { modernizeCellText } from '@rolloff/solver';
import type { EntityManager } from 'typeorm';
import type { CellRevisionList, CellRevision as CellRevisionBody, CellSaved } from '../contract/cells.js';
import { LIMITS } from '../contract/common.js';
import type { DiagnosticCounts } from '../contract/common.js';
import { Cell } from '../db/entities/cell.js';
import { CellRevision } from '../db/entities/cell-revision.js';
import { Notebook } from '../db/entities/notebook.js';
import { ApiError, notFound, tooLarge, validation } from '../errors.js';
import { can } from '../policy.js';
import type { Actor } from '../policy.js';
import { presentCell, presentCurrentRevision, presentRevision, presentRevisionSummary } from '../presenters/cell.js';
import { accessOf } from '../presenters/notebook.js';
import { presentDiagnostics } from '../presenters/common.js';
import { checkCell } from '../cell-check-pool.js';
import { inTransaction, managerOf, toInt } from './db.js';
import type { Database } from './db.js';
import { loadNotebookFor } from './access.js';
import type { Once } from './idempotency.js';
import type { NotebookRow } from './access.js';

/** A cell joined with its current revision and that revision's author. */
export interface CellRow {
  id: number;
  notebookId: string;
  kind: 'circuit' | 'note';
  title: string | null;
  position: number;
  revision: number;
  updatedAt: Date;
  deletedAt: Date | null;
  revisionId: number;
  text: string;
  diagnosticErrors: number | null;
  diagnosticWarnings: number | null;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  revisionMessage: string | null;
  revisionCreatedAt: Date;
}

/** A revision with its author; `text` only when one revision is read, `size` in lists. */
export interface RevisionRow {
  cellId: number;
  number: number;
  text?: string;
  size?: number | string;
  diagnosticErrors: number | null;
  diagnosticWarnings: number | null;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  message: string | null;
  createdAt: Date;
}

/** A cell with its current revision and that revision's author. */
export const cellSelect = `
  SELECT c.id, c.notebookId, c.kind, c.title, c.position, c.revision, c.updatedAt, c.deletedAt,
         r.id AS revisionId, r.text, r.diagnosticErrors, r.diagnosticWarnings, r.authorId,
         u.login AS authorLogin, u.name AS authorName, r.message AS revisionMessage, r.createdAt AS revisionCreatedAt
    FROM cells c
    JOIN cell_revisions r ON r.cellId = c.id AND r.number = c.revision
    LEFT JOIN users u ON u.id = r.authorId`;

const revisionColumns = `
  r.cellId, r.number, r.diagnosticErrors, r.diagnosticWarnings, r.authorId,
  u.login AS authorLogin, u.name AS authorName, r.message, r.createdAt`;

/** Live and deleted cells of a notebook: live ones in order first, then deleted, newest first. */
export async function cellsOf(manager: EntityManager, notebookId: string): Promise<CellRow[]> {
  return manager.query(`${cellSelect} WHERE c.notebookId = ? ORDER BY c.deletedAt IS NOT NULL, c.position, c.deletedAt DESC, c.id`, [notebookId]);
}

async function cellRow(manager: EntityManager, notebookId: string, cellId: number): Promise<CellRow | null> {
  const rows: CellRow[] = await manager.query(`${cellSelect} WHERE c.id = ? AND c.notebookId = ?`, [cellId, notebookId]);
  return rows[0] ?? null;
}

async function liveCount(manager: EntityManager, notebookId: string): Promise<number> {
  const [row] = await manager.query('SELECT COUNT(*) AS n FROM cells WHERE notebookId = ? AND deletedAt IS NULL', [notebookId]);
  return toInt(row?.n);
}

function requireRoom(count: number, adding: number): void {
  if (count + adding > LIMITS.cellsPerNotebook) {
    throw tooLarge(`A notebook holds at most ${LIMITS.cellsPerNotebook} cells; this one has ${count}.`);
  }
}

export interface NewCell {
  notebookId: string;
  kind: 'circuit' | 'note';
  title?: string | null;
  position: number;
  text: string;
  authorId: number | null;
  diagnostics: DiagnosticCounts | null;
  now: Date;
}

/** Inserts a cell with its first revision (inside the caller's transaction); returns its id. */
export async function insertCell(manager: EntityManager, cell: NewCell): Promise<number> {
  const inserted = await manager.insert(Cell, {
    notebookId: cell.notebookId,
    kind: cell.kind,
    title: cell.title ?? null,
    position: cell.position,
    revision: 1,
    createdAt: cell.now,
    updatedAt: cell.now,
    deletedAt: null,
  });
  const cellId = Number(inserted.identifiers[0]?.id);
  await manager.insert(CellRevision, {
    cellId,
    number: 1,
    text: cell.text,
    authorId: cell.authorId,
    diagnosticErrors: cell.diagnostics?.errors ?? null,
    diagnosticWarnings: cell.diagnostics?.warnings ?? null,
    createdAt: cell.now,
  });
  return cellId;
}

async function touchNotebook(manager: EntityManager, notebookId: string, now: Date): Promise<void> {
  await manager.update(Notebook, { id: notebookId }, { updatedAt: now });
}

function saved(row: CellRow, diagnostics: DiagnosticCounts | null = presentDiagnostics(row.diagnosticErrors, row.diagnosticWarnings)): CellSaved {
  return { cell: presentCell(row), revision: presentCurrentRevision(row), diagnostics };
}

async function mustFindCell(manager: EntityManager, notebookId: string, cellId: number): Promise<CellRow> {
  const row = await cellRow(manager, notebookId, cellId);
  if (!row) throw notFound('The cell');
  return row;
}

/**
 * The cell whose history `actor` reads: a deleted cell's history only for those who may
 * edit, as only they see deleted cells in the notebook; to anyone else it is not there.
 */
async function cellWithHistory(manager: EntityManager, actor: Actor, notebook: NotebookRow, cellId: number): Promise<CellRow> {
  const cell = await mustFindCell(manager, notebook.id, cellId);
  if (cell.deletedAt !== null && !can(actor, 'edit', accessOf(notebook))) throw notFound('The cell');
  return cell;
}

/**
 * `POST …/cells`: a new cell at `position` (default: the end), shifting the cells after it.
 * `once` records the answer in the same transaction (an Idempotency-Key).
 */
export async function createCell(
  db: Database,
  actor: Actor,
  notebookId: string,
  input: { kind: 'circuit' | 'note'; position?: number; text: string },
  once: Once | null = null,
): Promise<CellSaved> {
  const diagnostics = await checkCell(input.kind, input.text);
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const count = await liveCount(manager, notebookId);
    requireRoom(count, 1);
    const position = Math.min(input.position ?? count, count);
    await manager.query('UPDATE cells SET position = position + 1 WHERE notebookId = ? AND deletedAt IS NULL AND position >= ?', [notebookId, position]);
    const now = new Date();
    const cellId = await insertCell(manager, { notebookId, kind: input.kind, position, text: input.text, authorId: actor.id, diagnostics, now });
    await touchNotebook(manager, notebookId, now);
    const body = saved(await mustFindCell(manager, notebookId, cellId), diagnostics);
    await once?.record(manager, 201, body);
    return body;
  });
}

/** The outcome of a save: a new revision (201), or nothing new because the text is unchanged (200). */
export interface SaveOutcome {
  created: boolean;
  body: CellSaved;
}

/**
 * `PUT …/cells/:cellId`: stores `text` as a new revision if `baseRevision` is still current;
 * otherwise 409 with the current revision and the refused text, so nothing typed is lost.
 * `message` says why a revision nobody typed was made (a restore); `once` records the answer
 * in the same transaction (an Idempotency-Key).
 */
export async function saveCell(
  db: Database,
  actor: Actor,
  notebookId: string,
  cellId: number,
  input: { text: string; baseRevision: number },
  message: string | null = null,
  once: Once | null = null,
): Promise<SaveOutcome> {
  const kindRows: { kind: 'circuit' | 'note' }[] = await db.query('SELECT kind FROM cells WHERE id = ? AND notebookId = ?', [cellId, notebookId]);
  // The kind never changes, so the solver can run before the transaction holds any lock.
  const diagnostics = kindRows[0] ? await checkCell(kindRows[0].kind, input.text) : null;
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const locked: Pick<Cell, 'id' | 'revision' | 'deletedAt'>[] = await manager.query(
      'SELECT id, revision, deletedAt FROM cells WHERE id = ? AND notebookId = ? FOR UPDATE',
      [cellId, notebookId],
    );
    if (!locked[0]) throw notFound('The cell');
    const current = await mustFindCell(manager, notebookId, cellId);
    if (current.deletedAt || input.baseRevision !== locked[0].revision) {
      const why = current.deletedAt
        ? 'This cell was deleted; restore it to keep editing. Your text is returned in details.submitted.'
        : `This cell changed since revision ${input.baseRevision}: revision ${current.revision} is current. Merge and save again on it; your text is returned in details.submitted.`;
      throw new ApiError('conflict', why, {
        current: presentRevision({
          cellId,
          number: current.revision,
          text: current.text,
          diagnosticErrors: current.diagnosticErrors,
          diagnosticWarnings: current.diagnosticWarnings,
          authorId: current.authorId,
          authorLogin: current.authorLogin,
          authorName: current.authorName,
          message: current.revisionMessage,
          createdAt: current.revisionCreatedAt,
        }),
        submitted: { text: input.text, baseRevision: input.baseRevision },
      });
    }
    if (current.text === input.text) {
      const body = saved(current, diagnostics);
      await once?.record(manager, 200, body);
      return { created: false, body };
    }
    const now = new Date();
    const number = current.revision + 1;
    await manager.insert(CellRevision, {
      cellId,
      number,
      text: input.text,
      authorId: actor.id,
      message,
      diagnosticErrors: diagnostics?.errors ?? null,
      diagnosticWarnings: diagnostics?.warnings ?? null,
      createdAt: now,
    });
    await manager.update(Cell, { id: cellId }, { revision: number, updatedAt: now });
    await touchNotebook(manager, notebookId, now);
    const body = saved(await mustFindCell(manager, notebookId, cellId), diagnostics);
    await once?.record(manager, 201, body);
    return { created: true, body };
  });
}

/** `PATCH …/cells/:cellId`: sets or clears the cell's title (no revision: titles have no history). */
export async function setCellTitle(db: Database, actor: Actor, notebookId: string, cellId: number, title: string | null): Promise<CellSaved> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    await mustFindCell(manager, notebookId, cellId);
    await manager.update(Cell, { id: cellId }, { title });
    return saved(await mustFindCell(manager, notebookId, cellId));
  });
}

/** Renumbers live cells 0..n-1 in the given order, writing only the ones that moved. */
async function renumber(manager: EntityManager, order: { id: number; position: number }[], now: Date): Promise<void> {
  for (const [index, cell] of order.entries()) {
    if (cell.position !== index) await manager.update(Cell, { id: cell.id }, { position: index, updatedAt: now });
  }
}

async function liveOrder(manager: EntityManager, notebookId: string): Promise<{ id: number; position: number }[]> {
  return manager.query('SELECT id, position FROM cells WHERE notebookId = ? AND deletedAt IS NULL ORDER BY position, id FOR UPDATE', [notebookId]);
}

/** `POST …/cells/:cellId/move`: puts a live cell at `position` (clamped to the end). */
export async function moveCell(db: Database, actor: Actor, notebookId: string, cellId: number, position: number): Promise<CellSaved> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const order = await liveOrder(manager, notebookId);
    const from = order.findIndex((cell) => cell.id === cellId);
    if (from < 0) {
      await mustFindCell(manager, notebookId, cellId);
      throw validation('A deleted cell cannot be moved; restore it first.');
    }
    const [moving] = order.splice(from, 1);
    order.splice(Math.min(position, order.length), 0, moving!);
    const now = new Date();
    await renumber(manager, order, now);
    await touchNotebook(manager, notebookId, now);
    return saved(await mustFindCell(manager, notebookId, cellId));
  });
}

/** `DELETE …/cells/:cellId`: marks the cell deleted (restorable) and closes the gap it leaves. */
export async function deleteCell(db: Database, actor: Actor, notebookId: string, cellId: number): Promise<CellSaved> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const cell = await mustFindCell(manager, notebookId, cellId);
    if (cell.deletedAt) return saved(cell);
    const now = new Date();
    await manager.update(Cell, { id: cellId }, { deletedAt: now, updatedAt: now });
    await renumber(manager, await liveOrder(manager, notebookId), now);
    await touchNotebook(manager, notebookId, now);
    return saved(await mustFindCell(manager, notebookId, cellId));
  });
}

/** `POST …/cells/:cellId/restore`: brings a deleted cell back where it stood (or at the end). */
export async function restoreCell(db: Database, actor: Actor, notebookId: string, cellId: number): Promise<CellSaved> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const cell = await mustFindCell(manager, notebookId, cellId);
    if (!cell.deletedAt) return saved(cell);
    const order = await liveOrder(manager, notebookId);
    requireRoom(order.length, 1);
    const now = new Date();
    order.splice(Math.min(cell.position, order.length), 0, { id: cellId, position: -1 });
    await manager.update(Cell, { id: cellId }, { deletedAt: null, updatedAt: now });
    await renumber(manager, order, now);
    await touchNotebook(manager, notebookId, now);
    return saved(await mustFindCell(manager, notebookId, cellId));
  });
}

function revisionCursor(cursor: string | undefined): number | null {
  if (cursor === undefined) return null;
  if (!/^[1-9]\d{0,9}$/.test(cursor))
    throw validation('query.cursor: not a cursor of this list.', { issues: [{ path: 'query.cursor', message: 'not a cursor of this list' }] });
  return Number(cursor);
}

/** `GET …/cells/:cellId/revisions`: newest first, `limit` at a time. */
export async function listRevisions(
  db: Database,
  actor: Actor,
  notebookId: string,
  cellId: number,
  page: { cursor?: string; limit: number },
): Promise<CellRevisionList> {
  const before = revisionCursor(page.cursor);
  const manager = managerOf(db);
  const notebook = await loadNotebookFor(manager, actor, notebookId, 'read');
  await cellWithHistory(manager, actor, notebook, cellId);
  const rows: RevisionRow[] = await manager.query(
    `SELECT ${revisionColumns}, OCTET_LENGTH(r.text) AS size
       FROM cell_revisions r LEFT JOIN users u ON u.id = r.authorId
      WHERE r.cellId = ? ${before === null ? '' : 'AND r.number < ?'}
      ORDER BY r.number DESC LIMIT ?`,
    before === null ? [cellId, page.limit + 1] : [cellId, before, page.limit + 1],
  );
  const items = rows.slice(0, page.limit).map(presentRevisionSummary);
  const last = items[items.length - 1];
  return { items, nextCursor: rows.length > page.limit && last ? String(last.number) : null };
}

/** `GET …/cells/:cellId/revisions/:number`: one revision with its text. */
export async function getRevision(db: Database, actor: Actor, notebookId: string, cellId: number, number: number): Promise<CellRevisionBody> {
  const manager = managerOf(db);
  const notebook = await loadNotebookFor(manager, actor, notebookId, 'read');
  await cellWithHistory(manager, actor, notebook, cellId);
  const rows: (RevisionRow & { text: string })[] = await manager.query(
    `SELECT ${revisionColumns}, r.text FROM cell_revisions r LEFT JOIN users u ON u.id = r.authorId WHERE r.cellId = ? AND r.number = ?`,
    [cellId, number],
  );
  if (!rows[0]) throw notFound('That revision');
  return presentRevision(rows[0]);
}

/**
 * `POST …/cells/:cellId/revisions/:number/restore`: saves an old revision's text as a new
 * revision on `baseRevision`, so history only grows. A circuit cell's old text is brought to
 * today's language forms on the way, as the language update did for every current text.
 */
export async function restoreRevision(
  db: Database,
  actor: Actor,
  notebookId: string,
  cellId: number,
  number: number,
  input: { baseRevision: number },
  once: Once | null = null,
): Promise<SaveOutcome> {
  const manager = managerOf(db);
  await loadNotebookFor(manager, actor, notebookId, 'edit');
  const old: { kind: 'circuit' | 'note'; text: string }[] = await manager.query(
    'SELECT c.kind, r.text FROM cells c JOIN cell_revisions r ON r.cellId = c.id WHERE c.id = ? AND c.notebookId = ? AND r.number = ?',
    [cellId, notebookId, number],
  );
  if (!old[0]) {
    await mustFindCell(manager, notebookId, cellId);
    throw notFound('That revision');
  }
  const modern = old[0].kind === 'circuit' ? modernizeCellText(old[0].text) : { text: old[0].text, changed: false };
  const message = `restored from revision ${number}${modern.changed ? ', with the language update' : ''}`;
  return saveCell(db, actor, notebookId, cellId, { text: modern.text, baseRevision: input.baseRevision }, message, once);
}
