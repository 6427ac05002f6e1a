import { queryOptions, useQuery } from '@tanstack/react-query';
import { NotebookSchema } from '@rolloff/api/contract';
import type { Notebook } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** A notebook with its cells at their current revisions and the caller's permissions. */
export function getNotebook(id: string, signal?: AbortSignal): Promise<Notebook> {
  return apiRequest(apiPaths.notebook(id), NotebookSchema, { signal });
}

export const notebookQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['notebooks', id] as const,
    queryFn: ({ signal }) => getNotebook(id, signal),
  });

export const useNotebook = (id: string) => useQuery(notebookQueryOptions(id));
