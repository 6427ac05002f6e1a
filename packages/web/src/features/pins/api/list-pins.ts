import { queryOptions, useQuery } from '@tanstack/react-query';
import { PinListSchema } from '@rolloff/api/contract';
import type { Pin, PinList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Every pin of a notebook with its thread, oldest first. */
export function listPins(notebookId: string, signal?: AbortSignal): Promise<PinList> {
  return apiRequest(apiPaths.pins(notebookId), PinListSchema, { signal });
}

export const pinListQueryOptions = (notebookId: string) =>
  queryOptions({
    queryKey: ['notebooks', notebookId, 'pins'] as const,
    queryFn: ({ signal }) => listPins(notebookId, signal),
  });

export const usePinList = (notebookId: string) => useQuery(pinListQueryOptions(notebookId));

/** Puts a changed pin (with its thread) into the cached list, in its place or at the end. */
export function withPin(list: PinList | undefined, pin: Pin): PinList | undefined {
  if (!list) return list;
  const known = list.items.some((p) => p.id === pin.id);
  return { items: known ? list.items.map((p) => (p.id === pin.id ? pin : p)) : [...list.items, pin] };
}
