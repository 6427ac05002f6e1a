/**
 * Loading a notebook for an action: the one path from a route to the policy module.
 */
import type { EntityManager } from 'typeorm';
import { NotebookIdSchema } from '../contract/common.js';
import { notFound } from '../errors.js';
import { authorize } from '../policy.js';
import type { Actor, NotebookAction } from '../policy.js';
import { accessOf } from '../presenters/notebook.js';

/** A notebook with its owner, the caller's member role and three counts. */
export interface NotebookRow {
  id: string;
  title: string;
  description: string;
  ownerId: number;
  ownerLogin: string;
  ownerName: string;
  visibility: 'private' | 'link';
  forkedFromId: string | null;
  forkedFromVersionId: number | null;
  memberRole: 'editor' | 'reviewer' | 'viewer' | null;
  cellCount: number | string;
  forkCount: number | string;
  versionCount: number | string;
  createdAt: Date;
  updatedAt: Date;
  deletedAt: Date | null;
}

/**
 * A notebook with its owner, the caller's member role (the `?`), and its counts of live cells,
 * live forks and versions. The counts are correlated subqueries, each read from an index on
 * the notebook id, so a page of notebooks is still one query.
 */
export const notebookSelect = `
  SELECT n.id, n.title, n.description, n.ownerId, o.login AS ownerLogin, o.name AS ownerName, n.visibility,
         n.forkedFromId, n.forkedFromVersionId, m.role AS memberRole,
         (SELECT COUNT(*) FROM cells c WHERE c.notebookId = n.id AND c.deletedAt IS NULL) AS cellCount,
         (SELECT COUNT(*) FROM notebooks f WHERE f.forkedFromId = n.id AND f.deletedAt IS NULL) AS forkCount,
         (SELECT COUNT(*) FROM notebook_versions v WHERE v.notebookId = n.id) AS versionCount,
         n.createdAt, n.updatedAt, n.deletedAt
    FROM notebooks n
    JOIN users o ON o.id = n.ownerId
    LEFT JOIN notebook_members m ON m.notebookId = n.id AND m.userId = ?`;

/** One notebook as seen by `actorId`, or null when there is no such notebook. */
export async function notebookRow(manager: EntityManager, id: string, actorId: number): Promise<NotebookRow | null> {
  if (!NotebookIdSchema.safeParse(id).success) return null;
  const rows: NotebookRow[] = await manager.query(`${notebookSelect} WHERE n.id = ?`, [actorId, id]);
  return rows[0] ?? null;
}

/** Takes the notebook's row lock; every change to a notebook or its cells takes it first. */
export async function lockNotebook(manager: EntityManager, id: string): Promise<void> {
  await manager.query('SELECT id FROM notebooks WHERE id = ? FOR UPDATE', [id]);
}

/**
 * Loads the notebook and checks that `actor` may do `action` (404 when they may not read it,
 * 403 when they may read but not do this). With `lock`, the row lock is taken first, so the
 * rest of the transaction sees every change committed before it.
 */
export async function loadNotebookFor(
  manager: EntityManager,
  actor: Actor,
  id: string,
  action: NotebookAction,
  options: { lock?: boolean } = {},
): Promise<NotebookRow> {
  if (!NotebookIdSchema.safeParse(id).success) throw notFound('The notebook');
  if (options.lock) await lockNotebook(manager, id);
  const row = await notebookRow(manager, id, actor.id);
  if (!row) throw notFound('The notebook');
  authorize(actor, action, accessOf(row));
  return row;
}
