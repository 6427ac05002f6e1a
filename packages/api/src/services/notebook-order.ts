/**
 * The order of the notebook list and its keyset cursors. A page ends at a (sort key, id)
 * pair; the next page starts strictly after it in the same order, so paging stays correct
 * while notebooks are added or changed, whichever column the list is sorted by.
 */
import { z } from 'zod';
import { LIMITS, NotebookIdSchema } from '../contract/common.js';
import { NotebookSortSchema, SortOrderSchema } from '../contract/notebooks.js';
import type { NotebookSort, SortOrder } from '../contract/notebooks.js';
import { validation } from '../errors.js';
import type { NotebookRow } from './access.js';

/** The column behind each sort. Titles compare in the column's collation (case-insensitive). */
const columns: Record<NotebookSort, 'n.updatedAt' | 'n.title' | 'n.createdAt'> = {
  changed: 'n.updatedAt',
  title: 'n.title',
  created: 'n.createdAt',
};

/** The last row of a page, as a cursor holds it: dates as epoch milliseconds. */
type SortKey = number | string;

const CursorSchema = z.tuple([
  NotebookSortSchema,
  SortOrderSchema,
  z.union([z.number().int().min(0).max(8.64e15), z.string().max(LIMITS.titleLength)]),
  NotebookIdSchema,
]);

function keyOf(row: NotebookRow, sort: NotebookSort): SortKey {
  switch (sort) {
    case 'changed':
      return row.updatedAt.getTime();
    case 'created':
      return row.createdAt.getTime();
    case 'title':
      return row.title;
  }
}

function refused(message: string): Error {
  return validation(`query.cursor: ${message}`, { issues: [{ path: 'query.cursor', message }] });
}

/** The cursor that continues a list of this sort and order after `row`. */
export function encodeCursor(row: NotebookRow, sort: NotebookSort, order: SortOrder): string {
  return Buffer.from(JSON.stringify([sort, order, keyOf(row, sort), row.id])).toString('base64url');
}

function decodeCursor(cursor: string, sort: NotebookSort, order: SortOrder): { key: SortKey; id: string } {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8'));
  } catch {
    parsed = undefined;
  }
  const result = CursorSchema.safeParse(parsed);
  if (!result.success) throw refused('not a cursor of this list (pass back the nextCursor of the previous page).');
  const [cursorSort, cursorOrder, key, id] = result.data;
  if (cursorSort !== sort || cursorOrder !== order) {
    throw refused(`this cursor continues a list sorted by ${cursorSort} (${cursorOrder}), not by ${sort} (${order}); start again without a cursor.`);
  }
  if (typeof key !== (sort === 'title' ? 'string' : 'number')) throw refused('not a cursor of this list (pass back the nextCursor of the previous page).');
  return { key, id };
}

/**
 * The SQL of one sort: the ORDER BY clause and, after a cursor, the condition that keeps
 * only rows past it (with its parameters). Ties on the sort key fall back to the id, in the
 * same direction, so every row has exactly one place.
 */
export function listOrder(
  sort: NotebookSort,
  order: SortOrder,
  cursor: string | undefined,
): { orderBy: string; after: { sql: string; params: unknown[] } | null } {
  const column = columns[sort];
  const direction = order === 'asc' ? 'ASC' : 'DESC';
  const orderBy = `${column} ${direction}, n.id ${direction}`;
  if (cursor === undefined) return { orderBy, after: null };
  const { key, id } = decodeCursor(cursor, sort, order);
  const value = typeof key === 'number' ? new Date(key) : key;
  const past = order === 'asc' ? '>' : '<';
  return { orderBy, after: { sql: `(${column} ${past} ? OR (${column} = ? AND n.id ${past} ?))`, params: [value, value, id] } };
}
