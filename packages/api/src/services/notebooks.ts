/**
 * Notebooks: the list, one notebook with its cells and lineage, create, rename and describe,
 * link sharing, soft delete and restore. Every read and change goes through `loadNotebookFor`, which asks
 * the policy module.
 */
import type { EntityManager } from 'typeorm';
import type { Cell as CellBody } from '../contract/cells.js';
import type { DiagnosticCounts } from '../contract/common.js';
import type { ForkOrigin, LineageEntry, Notebook as NotebookBody, NotebookList, NotebookScope, NotebookSort, SortOrder } from '../contract/notebooks.js';
import { Notebook } from '../db/entities/notebook.js';
import { can } from '../policy.js';
import type { Actor } from '../policy.js';
import { presentCell } from '../presenters/cell.js';
import { accessOf, presentNotebook, presentNotebookSummary } from '../presenters/notebook.js';
import { presentVersionRef } from '../presenters/version.js';
import { checkCells } from '../cell-check-pool.js';
import { cellsOf, insertCell } from './cells.js';
import { loadNotebookFor, notebookRow, notebookSelect } from './access.js';
import { encodeCursor, listOrder } from './notebook-order.js';
import { reviewStatusOf } from './reviews.js';
import { inTransaction, likeContains, managerOf } from './db.js';
import type { Database } from './db.js';
import { newNotebookId } from './ids.js';
import type { NotebookRow } from './access.js';
import type { Once } from './idempotency.js';

export interface NotebookListOptions {
  scope: NotebookScope;
  q?: string;
  sort: NotebookSort;
  order: SortOrder;
  cursor?: string;
  limit: number;
}

/** `GET /api/notebooks`: the caller's notebooks in `scope`, in the order asked for, one page. */
export async function listNotebooks(db: Database, actor: Actor, query: NotebookListOptions): Promise<NotebookList> {
  const where: string[] = [];
  const params: unknown[] = [actor.id];
  switch (query.scope) {
    case 'mine':
      where.push('n.ownerId = ?', 'n.deletedAt IS NULL');
      params.push(actor.id);
      break;
    case 'shared':
      where.push('m.userId IS NOT NULL', 'n.deletedAt IS NULL');
      break;
    case 'deleted':
      where.push('n.ownerId = ?', 'n.deletedAt IS NOT NULL');
      params.push(actor.id);
      break;
    case 'all':
      where.push('n.deletedAt IS NULL');
      // A site admin may read every notebook; anyone else sees their own and their memberships.
      if (!can(actor, 'manage-users')) {
        where.push('(n.ownerId = ? OR m.userId IS NOT NULL)');
        params.push(actor.id);
      }
      break;
  }
  if (query.q) {
    where.push('n.title LIKE ?');
    params.push(likeContains(query.q));
  }
  const order = listOrder(query.sort, query.order, query.cursor || undefined);
  if (order.after) {
    where.push(order.after.sql);
    params.push(...order.after.params);
  }
  params.push(query.limit + 1);
  const rows: NotebookRow[] = await db.query(`${notebookSelect} WHERE ${where.join(' AND ')} ORDER BY ${order.orderBy} LIMIT ?`, params);
  const page = rows.slice(0, query.limit);
  const last = page[page.length - 1];
  return {
    items: page.map((row) => presentNotebookSummary(row, actor)),
    nextCursor: rows.length > query.limit && last ? encodeCursor(last, query.sort, query.order) : null,
  };
}

async function versionRef(manager: EntityManager, versionId: number | null) {
  if (versionId === null) return null;
  const rows: { number: number; label: string }[] = await manager.query('SELECT number, label FROM notebook_versions WHERE id = ?', [versionId]);
  return rows[0] ? presentVersionRef(rows[0]) : null;
}

/** Where a fork came from, hiding a source the caller may not read. */
async function forkOrigin(manager: EntityManager, actor: Actor, row: NotebookRow): Promise<ForkOrigin | null> {
  if (!row.forkedFromId) return null;
  const source = await notebookRow(manager, row.forkedFromId, actor.id);
  if (!source || !can(actor, 'read', accessOf(source))) return { notebook: null, version: null };
  return { notebook: { id: source.id, title: source.title }, version: await versionRef(manager, row.forkedFromVersionId) };
}

/** Readable ancestors, nearest first. A cap keeps a pathological chain from running long. */
async function lineageOf(manager: EntityManager, actor: Actor, row: NotebookRow): Promise<LineageEntry[]> {
  const lineage: LineageEntry[] = [];
  let current = row;
  const seen = new Set([row.id]);
  while (current.forkedFromId && lineage.length < 50 && !seen.has(current.forkedFromId)) {
    const source = await notebookRow(manager, current.forkedFromId, actor.id);
    if (!source || !can(actor, 'read', accessOf(source))) break;
    lineage.push({
      id: source.id,
      title: source.title,
      owner: { id: source.ownerId, login: source.ownerLogin, name: source.ownerName },
      version: await versionRef(manager, current.forkedFromVersionId),
    });
    seen.add(source.id);
    current = source;
  }
  return lineage;
}

/** The full notebook for a caller who may read it. */
export async function presentNotebookFor(manager: EntityManager, actor: Actor, row: NotebookRow): Promise<NotebookBody> {
  const cells = (await cellsOf(manager, row.id)).map(presentCell);
  const mayEdit = can(actor, 'edit', accessOf(row));
  return presentNotebook(row, actor, {
    cells: cells.filter((cell: CellBody) => cell.deletedAt === null),
    deletedCells: mayEdit ? cells.filter((cell: CellBody) => cell.deletedAt !== null) : [],
    forkedFrom: await forkOrigin(manager, actor, row),
    lineage: await lineageOf(manager, actor, row),
    review: await reviewStatusOf(manager, row.id),
  });
}

/** `GET /api/notebooks/:id`. */
export async function getNotebook(db: Database, actor: Actor, id: string): Promise<NotebookBody> {
  const row = await loadNotebookFor(managerOf(db), actor, id, 'read');
  return presentNotebookFor(managerOf(db), actor, row);
}

export interface NotebookSeed {
  title: string;
  /** Plain text under the title; empty when left out. */
  description?: string;
  /** A fork's cells keep their titles. */
  cells: { kind: 'circuit' | 'note'; text: string; title?: string | null }[];
}

/** The origin a new notebook records when it is a fork. */
export interface ForkSource {
  notebookId: string;
  versionId: number | null;
}

/**
 * Inserts a notebook owned by `actor` with its cells, inside the caller's transaction.
 * `afterCell` runs after each copied cell (the fork service's test hook uses it).
 */
export async function insertNotebook(
  manager: EntityManager,
  actor: Actor,
  seed: NotebookSeed & { diagnostics: (DiagnosticCounts | null)[] },
  forkedFrom: ForkSource | null = null,
  afterCell?: (index: number) => void | Promise<void>,
): Promise<string> {
  const id = newNotebookId();
  const now = new Date();
  await manager.insert(Notebook, {
    id,
    title: seed.title,
    description: seed.description ?? '',
    ownerId: actor.id,
    visibility: 'private',
    forkedFromId: forkedFrom?.notebookId ?? null,
    forkedFromVersionId: forkedFrom?.versionId ?? null,
    createdAt: now,
    updatedAt: now,
    deletedAt: null,
  });
  for (const [position, cell] of seed.cells.entries()) {
    await insertCell(manager, {
      notebookId: id,
      kind: cell.kind,
      title: cell.title ?? null,
      position,
      text: cell.text,
      authorId: actor.id,
      diagnostics: seed.diagnostics[position] ?? null,
      now,
    });
    await afterCell?.(position);
  }
  return id;
}

/** `POST /api/notebooks`: a new private notebook owned by the caller; `once` records the answer in the same transaction. */
export async function createNotebook(db: Database, actor: Actor, seed: NotebookSeed, once: Once | null = null): Promise<NotebookBody> {
  const diagnostics = await checkCells(seed.cells);
  return inTransaction(db, async (manager) => {
    const id = await insertNotebook(manager, actor, { ...seed, diagnostics });
    const row = await notebookRow(manager, id, actor.id);
    const body = await presentNotebookFor(manager, actor, row!);
    await once?.record(manager, 201, body);
    return body;
  });
}

/**
 * `PATCH /api/notebooks/:id`: a new title or description needs `edit` (and counts as a
 * change of the notebook), a new visibility needs `share`.
 */
export async function updateNotebook(
  db: Database,
  actor: Actor,
  id: string,
  input: { title?: string; description?: string; visibility?: 'private' | 'link' },
): Promise<NotebookBody> {
  return inTransaction(db, async (manager) => {
    const edits = input.title !== undefined || input.description !== undefined;
    if (edits) await loadNotebookFor(manager, actor, id, 'edit', { lock: true });
    if (input.visibility !== undefined) await loadNotebookFor(manager, actor, id, 'share', { lock: true });
    const changes: Partial<Notebook> = {};
    if (input.title !== undefined) changes.title = input.title;
    if (input.description !== undefined) changes.description = input.description;
    if (edits) changes.updatedAt = new Date();
    if (input.visibility !== undefined) changes.visibility = input.visibility;
    await manager.update(Notebook, { id }, changes);
    const row = await notebookRow(manager, id, actor.id);
    return presentNotebookFor(manager, actor, row!);
  });
}

/** `DELETE /api/notebooks/:id`: a soft delete; the owner can restore it. */
export async function deleteNotebook(db: Database, actor: Actor, id: string): Promise<void> {
  await inTransaction(db, async (manager) => {
    const row = await loadNotebookFor(manager, actor, id, 'delete', { lock: true });
    if (!row.deletedAt) await manager.update(Notebook, { id }, { deletedAt: new Date() });
  });
}

/** `POST /api/notebooks/:id/restore`: undoes a delete (a live notebook is left as it is). */
export async function restoreNotebook(db: Database, actor: Actor, id: string): Promise<NotebookBody> {
  return inTransaction(db, async (manager) => {
    const row = await loadNotebookFor(manager, actor, id, 'delete', { lock: true });
    if (row.deletedAt) await manager.update(Notebook, { id }, { deletedAt: null });
    const restored = await notebookRow(manager, id, actor.id);
    return presentNotebookFor(manager, actor, restored!);
  });
}
