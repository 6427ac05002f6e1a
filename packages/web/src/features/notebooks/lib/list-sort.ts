/**
 * How the notebooks table is sorted. The server sorts and pages (by last change, title or
 * creation), so the table keeps the choice in the address (`?sort=&order=`) and sends it
 * with every page it asks for.
 */
import { NotebookSortSchema, SortOrderSchema } from '@rolloff/api/contract';
import type { NotebookSort, SortOrder } from '@rolloff/api/contract';

export interface ListSort {
  sort: NotebookSort;
  order: SortOrder;
}

/** The API's default, and the table's: newest change first. */
export const DEFAULT_SORT: ListSort = { sort: 'changed', order: 'desc' };

/** Titles read A to Z first; times newest first. */
const FIRST_ORDER: Record<NotebookSort, SortOrder> = { title: 'asc', changed: 'desc', created: 'desc' };

/** The sort named in the address; anything unknown falls back to the default. */
export function sortFromParams(params: URLSearchParams): ListSort {
  const sort = NotebookSortSchema.safeParse(params.get('sort'));
  const order = SortOrderSchema.safeParse(params.get('order'));
  if (!sort.success) return DEFAULT_SORT;
  return { sort: sort.data, order: order.success ? order.data : FIRST_ORDER[sort.data] };
}

/** A click on a column's heading: the same column turns around, another starts in its first order. */
export function nextSort(current: ListSort, sort: NotebookSort): ListSort {
  if (current.sort === sort) return { sort, order: current.order === 'asc' ? 'desc' : 'asc' };
  return { sort, order: FIRST_ORDER[sort] };
}

/** `params` with `sort` written in; the default leaves the address clean. */
export function withSort(params: URLSearchParams, sort: ListSort): URLSearchParams {
  const next = new URLSearchParams(params);
  if (sort.sort === DEFAULT_SORT.sort && sort.order === DEFAULT_SORT.order) {
    next.delete('sort');
    next.delete('order');
  } else {
    next.set('sort', sort.sort);
    next.set('order', sort.order);
  }
  return next;
}
