/**
 * Pins: comments at a frequency on a trace of one circuit cell revision, each with a thread.
 * A pin stays on the revision it was made on however the cell moves on. Anyone who may read
 * the notebook reads its pins; pinning, replying, resolving and reopening need `review`.
 */
import type { EntityManager } from 'typeorm';
import { shownTraces } from '../cell-check-pool.js';
import { cellName } from '../contract/cells.js';
import type { Pin, PinComment, PinList } from '../contract/pins.js';
import { Pin as PinEntity, PinComment as PinCommentEntity } from '../db/entities/pin.js';
import { notFound, validation } from '../errors.js';
import type { Actor } from '../policy.js';
import { presentPin, presentPinComment } from '../presenters/pin.js';
import { loadNotebookFor } from './access.js';
import { inTransaction, managerOf } from './db.js';
import type { Database } from './db.js';

/** A pin with its creator, who resolved it, and its cell's current revision number. */
export interface PinRow {
  id: number;
  notebookId: string;
  cellId: number;
  revisionNumber: number;
  currentRevisionNumber: number;
  trace: string;
  frequency: number;
  createdById: number | null;
  createdByLogin: string | null;
  createdByName: string | null;
  createdAt: Date;
  resolvedAt: Date | null;
  resolvedById: number | null;
  resolvedByLogin: string | null;
  resolvedByName: string | null;
}

/** One comment of a pin's thread, with its author. */
export interface PinCommentRow {
  id: number;
  pinId: number;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  body: string;
  createdAt: Date;
}

const pinSelect = `
  SELECT p.id, p.notebookId, p.cellId, p.revisionNumber, c.revision AS currentRevisionNumber, p.trace, p.frequency,
         p.createdById, cu.login AS createdByLogin, cu.name AS createdByName, p.createdAt,
         p.resolvedAt, p.resolvedById, ru.login AS resolvedByLogin, ru.name AS resolvedByName
    FROM pins p
    JOIN cells c ON c.id = p.cellId
    LEFT JOIN users cu ON cu.id = p.createdById
    LEFT JOIN users ru ON ru.id = p.resolvedById`;

const commentSelect = `
  SELECT pc.id, pc.pinId, pc.authorId, u.login AS authorLogin, u.name AS authorName, pc.body, pc.createdAt
    FROM pin_comments pc LEFT JOIN users u ON u.id = pc.authorId`;

async function present(manager: EntityManager, rows: PinRow[]): Promise<Pin[]> {
  if (rows.length === 0) return [];
  const comments: PinCommentRow[] = await manager.query(`${commentSelect} WHERE pc.pinId IN (?) ORDER BY pc.createdAt, pc.id`, [rows.map((row) => row.id)]);
  return rows.map((row) =>
    presentPin(
      row,
      comments.filter((comment) => comment.pinId === row.id),
    ),
  );
}

async function pinOf(manager: EntityManager, notebookId: string, pinId: number): Promise<Pin> {
  const rows: PinRow[] = await manager.query(`${pinSelect} WHERE p.notebookId = ? AND p.id = ?`, [notebookId, pinId]);
  if (!rows[0]) throw notFound('That pin');
  const [pin] = await present(manager, rows);
  return pin!;
}

/** `GET /api/notebooks/:id/pins[?cellId=]`: oldest first, each with its thread. */
export async function listPins(db: Database, actor: Actor, notebookId: string, query: { cellId?: number }): Promise<PinList> {
  const manager = managerOf(db);
  await loadNotebookFor(manager, actor, notebookId, 'read');
  const rows: PinRow[] =
    query.cellId === undefined
      ? await manager.query(`${pinSelect} WHERE p.notebookId = ? ORDER BY p.createdAt, p.id`, [notebookId])
      : await manager.query(`${pinSelect} WHERE p.notebookId = ? AND p.cellId = ? ORDER BY p.createdAt, p.id`, [notebookId, query.cellId]);
  return { items: await present(manager, rows) };
}

const fieldError = (path: string, message: string) => validation(`${path}: ${message}`, { issues: [{ path, message }] });

/** `POST /api/notebooks/:id/pins`: a pin on a circuit cell's revision (default: its current one). */
export async function createPin(
  db: Database,
  actor: Actor,
  notebookId: string,
  input: { cellId: number; revisionNumber?: number; trace: string; frequency: number; body: string },
): Promise<Pin> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'review', { lock: true });
    const cells: { kind: 'circuit' | 'note'; title: string | null; position: number; revision: number; deletedAt: Date | null }[] = await manager.query(
      'SELECT kind, title, position, revision, deletedAt FROM cells WHERE id = ? AND notebookId = ?',
      [input.cellId, notebookId],
    );
    const cell = cells[0];
    if (!cell) throw fieldError('cellId', `This notebook has no cell with id ${input.cellId}.`);
    const name = cellName({ ...cell, deleted: cell.deletedAt !== null });
    if (cell.kind !== 'circuit') throw fieldError('cellId', `${name} is a note cell; pins go on the plot of a circuit cell.`);
    const revisionNumber = input.revisionNumber ?? cell.revision;
    if (revisionNumber > cell.revision) {
      throw fieldError('revisionNumber', `${name} has no revision ${revisionNumber}; its latest is revision ${cell.revision}.`);
    }
    const revisions: { text: string }[] = await manager.query('SELECT text FROM cell_revisions WHERE cellId = ? AND number = ?', [
      input.cellId,
      revisionNumber,
    ]);
    const traces = await shownTraces(revisions[0]?.text ?? '');
    if (!traces) throw fieldError('revisionNumber', `Revision ${revisionNumber} of ${name} has errors, so it shows no trace to pin on.`);
    if (!traces.includes(input.trace)) {
      const shown = traces.length > 0 ? `it shows ${traces.map((t) => `“${t}”`).join(', ')}` : 'it shows no trace';
      throw fieldError('trace', `Revision ${revisionNumber} of ${name} does not show a trace “${input.trace}”; ${shown}.`);
    }
    const now = new Date();
    const inserted = await manager.insert(PinEntity, {
      notebookId,
      cellId: input.cellId,
      revisionNumber,
      trace: input.trace,
      frequency: input.frequency,
      createdById: actor.id,
      createdAt: now,
      resolvedAt: null,
      resolvedById: null,
    });
    const pinId = Number(inserted.identifiers[0]?.id);
    await manager.insert(PinCommentEntity, { pinId, authorId: actor.id, body: input.body, createdAt: now });
    return pinOf(manager, notebookId, pinId);
  });
}

/** What a reply changed: the pin with its whole thread, and the new comment. */
export interface PinReplied {
  pin: Pin;
  comment: PinComment;
}

/** `POST …/pins/:pinId/comments`: a reply (a resolved pin takes replies too and stays resolved). */
export async function addPinComment(db: Database, actor: Actor, notebookId: string, pinId: number, body: string): Promise<PinReplied> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'review', { lock: true });
    await pinOf(manager, notebookId, pinId);
    const inserted = await manager.insert(PinCommentEntity, { pinId, authorId: actor.id, body, createdAt: new Date() });
    const commentId = Number(inserted.identifiers[0]?.id);
    const rows: PinCommentRow[] = await manager.query(`${commentSelect} WHERE pc.id = ?`, [commentId]);
    return { pin: await pinOf(manager, notebookId, pinId), comment: presentPinComment(rows[0]!) };
  });
}

/** `POST …/pins/:pinId/resolve` and `…/reopen`; asking for the state a pin is in changes nothing. */
export async function setPinResolved(db: Database, actor: Actor, notebookId: string, pinId: number, resolved: boolean): Promise<Pin> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'review', { lock: true });
    const pin = await pinOf(manager, notebookId, pinId);
    if (pin.resolved === resolved) return pin;
    await manager.update(PinEntity, { id: pinId }, resolved ? { resolvedAt: new Date(), resolvedById: actor.id } : { resolvedAt: null, resolvedById: null });
    return pinOf(manager, notebookId, pinId);
  });
}
