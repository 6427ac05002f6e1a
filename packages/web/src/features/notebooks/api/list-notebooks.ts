import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { NotebookListSchema } from '@rolloff/api/contract';
import type { NotebookList, NotebookListQuery } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

type ListParams = Omit<NotebookListQuery, 'limit'> & { limit?: number };

/** One page of the notebooks the caller can open, in the order asked for (newest change first by default). */
export function listNotebooks(params: ListParams, signal?: AbortSignal): Promise<NotebookList> {
  return apiRequest(apiPaths.notebooks(params), NotebookListSchema, { signal });
}

/** The key prefix of every notebook list, for invalidating them all at once. */
export const notebookListsKey = () => ['notebooks', 'list'] as const;

export const notebookListQueryOptions = (params: ListParams = {}) =>
  queryOptions({
    queryKey: [...notebookListsKey(), params] as const,
    queryFn: ({ signal }) => listNotebooks(params, signal),
    placeholderData: keepPreviousData,
  });

export const useNotebookList = (params: ListParams) => useQuery(notebookListQueryOptions(params));
