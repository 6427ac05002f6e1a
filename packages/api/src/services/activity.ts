/**
 * A notebook's timeline: saves, versions, forks, pins, replies, resolved pins, review
 * requests and decisions, newest first. One query finds the page, each source sorted and
 * cut to the page size on its own index, then one query per kind on the page loads details.
 */
import type { EntityManager } from 'typeorm';
import type { ActivityItem, ActivityKind, ActivityPage } from '../contract/activity.js';
import type { UserRef } from '../contract/common.js';
import type { DecisionState } from '../contract/reviews.js';
import { validation } from '../errors.js';
import { can } from '../policy.js';
import type { Actor } from '../policy.js';
import { accessOf } from '../presenters/notebook.js';
import { iso, presentAuthor } from '../presenters/common.js';
import { loadNotebookFor, notebookRow } from './access.js';
import { managerOf } from './db.js';
import type { Database } from './db.js';

/** Every row of a source is keyed by `sortKey`, a fixed-width ASCII id, so the sources sort together. */
const key = (column: string) => `CONVERT(LPAD(${column}, 12, '0') USING ascii) COLLATE ascii_bin`;

/**
 * Each source of entries: the rows of one notebook (`?`) with their time, their key in the
 * timeline and the id of the row they come from. A fork's key is a digest of its id, so
 * neither an entry nor a cursor gives away the address of a fork the caller may not read.
 */
const sources: Record<ActivityKind, { from: string; at: string; sortKey: string; ref: string }> = {
  comment: {
    at: 'pc.createdAt',
    sortKey: key('pc.id'),
    ref: 'pc.id',
    // A pin's first comment is the pin itself; the rest are replies.
    from: `pin_comments pc JOIN pins p ON p.id = pc.pinId
           WHERE p.notebookId = ? AND pc.id > (SELECT MIN(f.id) FROM pin_comments f WHERE f.pinId = pc.pinId)`,
  },
  fork: {
    at: 'f.createdAt',
    sortKey: 'CONVERT(LEFT(SHA2(f.id, 256), 12) USING ascii) COLLATE ascii_bin',
    ref: 'f.id',
    from: 'notebooks f WHERE f.forkedFromId = ?',
  },
  pin: { at: 'p.createdAt', sortKey: key('p.id'), ref: 'p.id', from: 'pins p WHERE p.notebookId = ?' },
  pin_resolved: { at: 'p.resolvedAt', sortKey: key('p.id'), ref: 'p.id', from: 'pins p WHERE p.notebookId = ? AND p.resolvedAt IS NOT NULL' },
  review_decision: {
    at: 'd.createdAt',
    sortKey: key('d.id'),
    ref: 'd.id',
    from: 'review_decisions d JOIN reviews rv ON rv.id = d.reviewId WHERE rv.notebookId = ?',
  },
  review_requested: { at: 'rv.createdAt', sortKey: key('rv.id'), ref: 'rv.id', from: 'reviews rv WHERE rv.notebookId = ?' },
  revision: { at: 'r.createdAt', sortKey: key('r.id'), ref: 'r.id', from: 'cell_revisions r JOIN cells c ON c.id = r.cellId WHERE c.notebookId = ?' },
  version: { at: 'v.createdAt', sortKey: key('v.id'), ref: 'v.id', from: 'notebook_versions v WHERE v.notebookId = ?' },
};
const kinds = Object.keys(sources) as ActivityKind[];

interface Position {
  at: Date;
  kind: ActivityKind;
  sortKey: string;
}

function encodeCursor(position: Position): string {
  return Buffer.from(`${position.at.getTime()}.${position.kind}.${position.sortKey}`).toString('base64url');
}

function decodeCursor(cursor: string): Position {
  const [ms, kind, sortKey] = Buffer.from(cursor, 'base64url').toString('utf8').split('.');
  if (!ms || !/^\d{1,15}$/.test(ms) || !kinds.includes(kind as ActivityKind) || !sortKey || !/^[A-Za-z0-9_-]{12}$/.test(sortKey)) {
    throw validation('query.cursor: not a cursor of this list (pass back the nextCursor of the previous page).', {
      issues: [{ path: 'query.cursor', message: 'not a cursor of this list' }],
    });
  }
  return { at: new Date(Number(ms)), kind: kind as ActivityKind, sortKey };
}

/**
 * One source's part of the page: its rows after the cursor in (at, kind, sortKey) order,
 * newest first. The kind is constant within a source, so "after" reduces to a time test
 * unless the cursor is on this very kind.
 */
function branch(kind: ActivityKind, after: Position | null, limit: number): { sql: string; params: unknown[] } {
  const source = sources[kind];
  const params: unknown[] = [];
  let where = '';
  if (after) {
    if (kind < after.kind) where = ` AND ${source.at} <= ?`;
    else if (kind > after.kind) where = ` AND ${source.at} < ?`;
    else where = ` AND (${source.at} < ? OR (${source.at} = ? AND ${source.sortKey} < ?))`;
    params.push(after.at);
    if (kind === after.kind) params.push(after.at, after.sortKey);
  }
  return {
    sql: `(SELECT CONVERT('${kind}' USING ascii) COLLATE ascii_bin AS kind, ${source.sortKey} AS sortKey, CONVERT(${source.ref} USING ascii) AS ref, ${source.at} AS at FROM ${source.from}${where} ORDER BY at DESC, sortKey DESC LIMIT ${limit})`,
    params,
  };
}

interface PageRow {
  kind: ActivityKind;
  sortKey: string;
  /** The id of the row the entry comes from (a fork's notebook id: never sent as is). */
  ref: string;
  at: Date;
}
const excerptOf = (text: string) => (text.length > 200 ? `${text.slice(0, 199)}…` : text);
const author = (row: { actorId: number | null; actorLogin: string | null; actorName: string | null }): UserRef | null =>
  presentAuthor(row.actorId, row.actorLogin, row.actorName);

async function rowsById<T extends { id: number | string }>(manager: EntityManager, sql: string, ids: (number | string)[]): Promise<Map<string, T>> {
  if (ids.length === 0) return new Map();
  const rows: T[] = await manager.query(sql, [ids]);
  return new Map(rows.map((row) => [String(row.id), row]));
}

interface ActorColumns {
  actorId: number | null;
  actorLogin: string | null;
  actorName: string | null;
}
interface PinRefColumns {
  pinId: number;
  cellId: number;
  revisionNumber: number;
  trace: string;
  frequency: number;
}
const pinRef = (row: PinRefColumns) => ({
  id: row.pinId,
  cellId: row.cellId,
  revisionNumber: row.revisionNumber,
  trace: row.trace,
  frequency: Number(row.frequency),
});

/** Loads what each entry of the page is about, kind by kind, and builds the entries in page order. */
async function details(manager: EntityManager, actor: Actor, page: PageRow[]): Promise<ActivityItem[]> {
  const idsOf = (kind: ActivityKind) => page.filter((row) => row.kind === kind).map((row) => (kind === 'fork' ? row.ref : Number(row.ref)));
  const users = 'LEFT JOIN users u ON u.id';
  const actorCols = 'u.id AS actorId, u.login AS actorLogin, u.name AS actorName';
  const pinCols = 'p.id AS pinId, p.cellId, p.revisionNumber, p.trace, p.frequency';

  const revisions = await rowsById<ActorColumns & { id: number; cellId: number; cellKind: 'circuit' | 'note'; number: number; message: string | null }>(
    manager,
    `SELECT r.id, r.cellId, c.kind AS cellKind, r.number, r.message, ${actorCols} FROM cell_revisions r JOIN cells c ON c.id = r.cellId ${users} = r.authorId WHERE r.id IN (?)`,
    idsOf('revision'),
  );
  const versions = await rowsById<ActorColumns & { id: number; number: number; label: string }>(
    manager,
    `SELECT v.id, v.number, v.label, ${actorCols} FROM notebook_versions v ${users} = v.authorId WHERE v.id IN (?)`,
    idsOf('version'),
  );
  const pins = await rowsById<
    ActorColumns & PinRefColumns & { id: number; body: string; resolvedById: number | null; resolverLogin: string | null; resolverName: string | null }
  >(
    manager,
    `SELECT p.id, ${pinCols}, ${actorCols}, fc.body, p.resolvedById, ru.login AS resolverLogin, ru.name AS resolverName
       FROM pins p ${users} = p.createdById LEFT JOIN users ru ON ru.id = p.resolvedById
       JOIN pin_comments fc ON fc.id = (SELECT MIN(f.id) FROM pin_comments f WHERE f.pinId = p.id)
      WHERE p.id IN (?)`,
    [...new Set([...idsOf('pin'), ...idsOf('pin_resolved')])],
  );
  const comments = await rowsById<ActorColumns & PinRefColumns & { id: number; body: string }>(
    manager,
    `SELECT pc.id, pc.body, ${pinCols}, ${actorCols} FROM pin_comments pc JOIN pins p ON p.id = pc.pinId ${users} = pc.authorId WHERE pc.id IN (?)`,
    idsOf('comment'),
  );
  const reviewCols = 'rv.id AS reviewId, rv.round, v.number AS versionNumber';
  const requests = await rowsById<ActorColumns & { id: number; reviewId: number; round: number; versionNumber: number; message: string }>(
    manager,
    `SELECT rv.id, ${reviewCols}, rv.message, ${actorCols} FROM reviews rv JOIN notebook_versions v ON v.id = rv.versionId ${users} = rv.requestedById WHERE rv.id IN (?)`,
    idsOf('review_requested'),
  );
  const askedRows: { reviewId: number; id: number; login: string; name: string }[] =
    requests.size === 0
      ? []
      : await manager.query(
          `SELECT a.reviewId, u.id, u.login, u.name FROM review_assignments a JOIN users u ON u.id = a.reviewerId WHERE a.reviewId IN (?) ORDER BY a.createdAt, a.reviewerId`,
          [[...requests.keys()].map(Number)],
        );
  const decisions = await rowsById<
    ActorColumns & { id: number; reviewId: number; round: number; versionNumber: number; state: DecisionState; summary: string }
  >(
    manager,
    `SELECT d.id, ${reviewCols}, d.state, d.summary, ${actorCols}
       FROM review_decisions d JOIN reviews rv ON rv.id = d.reviewId JOIN notebook_versions v ON v.id = rv.versionId ${users} = d.reviewerId
      WHERE d.id IN (?)`,
    idsOf('review_decision'),
  );
  const forks = new Map<string, { id: string; title: string; ownerId: number; ownerLogin: string; ownerName: string } | null>();
  for (const id of idsOf('fork') as string[]) {
    const fork = await notebookRow(manager, id, actor.id);
    forks.set(id, fork && can(actor, 'read', accessOf(fork)) ? fork : null);
  }

  const items: ActivityItem[] = [];
  for (const row of page) {
    const id = row.kind === 'fork' ? row.ref : String(Number(row.ref));
    const base = { id: `${row.kind}:${row.kind === 'fork' ? row.sortKey : id}`, at: iso(row.at) };
    switch (row.kind) {
      case 'revision': {
        const r = revisions.get(id)!;
        items.push({ ...base, kind: 'revision', actor: author(r), cell: { id: r.cellId, kind: r.cellKind }, revisionNumber: r.number, message: r.message });
        break;
      }
      case 'version': {
        const v = versions.get(id)!;
        items.push({ ...base, kind: 'version', actor: author(v), version: { number: v.number, label: v.label } });
        break;
      }
      case 'fork': {
        const f = forks.get(id) ?? null;
        items.push({
          ...base,
          kind: 'fork',
          actor: f ? { id: f.ownerId, login: f.ownerLogin, name: f.ownerName } : null,
          fork: f ? { id: f.id, title: f.title } : null,
        });
        break;
      }
      case 'pin': {
        const p = pins.get(id)!;
        items.push({ ...base, kind: 'pin', actor: author(p), pin: pinRef(p), excerpt: excerptOf(p.body) });
        break;
      }
      case 'pin_resolved': {
        const p = pins.get(id)!;
        items.push({ ...base, kind: 'pin_resolved', actor: presentAuthor(p.resolvedById, p.resolverLogin, p.resolverName), pin: pinRef(p) });
        break;
      }
      case 'comment': {
        const c = comments.get(id)!;
        items.push({ ...base, kind: 'comment', actor: author(c), pin: pinRef(c), excerpt: excerptOf(c.body) });
        break;
      }
      case 'review_requested': {
        const q = requests.get(id)!;
        const reviewers = askedRows.filter((a) => a.reviewId === q.reviewId).map((a) => ({ id: a.id, login: a.login, name: a.name }));
        items.push({
          ...base,
          kind: 'review_requested',
          actor: author(q),
          review: { id: q.reviewId, round: q.round, versionNumber: q.versionNumber },
          reviewers,
          excerpt: excerptOf(q.message),
        });
        break;
      }
      case 'review_decision': {
        const d = decisions.get(id)!;
        items.push({
          ...base,
          kind: 'review_decision',
          actor: author(d),
          review: { id: d.reviewId, round: d.round, versionNumber: d.versionNumber },
          state: d.state,
          excerpt: excerptOf(d.summary),
        });
        break;
      }
    }
  }
  return items;
}

/** `GET /api/notebooks/:id/activity?cursor=&limit=`: newest first, `limit` at a time. */
export async function listActivity(db: Database, actor: Actor, notebookId: string, query: { cursor?: string; limit: number }): Promise<ActivityPage> {
  const after = query.cursor === undefined ? null : decodeCursor(query.cursor);
  const manager = managerOf(db);
  await loadNotebookFor(manager, actor, notebookId, 'read');
  const parts = kinds.map((kind) => branch(kind, after, query.limit + 1));
  const rows: PageRow[] = await manager.query(
    `SELECT kind, sortKey, ref, at FROM (${parts.map((part) => part.sql).join(' UNION ALL ')}) entries
      ORDER BY at DESC, kind DESC, sortKey DESC LIMIT ${query.limit + 1}`,
    parts.flatMap((part) => [notebookId, ...part.params]),
  );
  const page = rows.slice(0, query.limit);
  const last = page[page.length - 1];
  return {
    items: await details(manager, actor, page),
    nextCursor: rows.length > query.limit && last ? encodeCursor(last) : null,
  };
}
