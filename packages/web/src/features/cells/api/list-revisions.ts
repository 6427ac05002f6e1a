import { queryOptions, useQuery } from '@tanstack/react-query';
import { CellRevisionListSchema } from '@rolloff/api/contract';
import type { CellRevisionList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** A cell's revisions, newest first (up to 100). */
export function listRevisions(notebookId: string, cellId: number, signal?: AbortSignal): Promise<CellRevisionList> {
  return apiRequest(apiPaths.revisions(notebookId, cellId), CellRevisionListSchema, { signal });
}

export const revisionListQueryOptions = (notebookId: string, cellId: number) =>
  queryOptions({
    queryKey: ['notebooks', notebookId, 'cells', cellId, 'revisions'] as const,
    queryFn: ({ signal }) => listRevisions(notebookId, cellId, signal),
  });

export const useRevisionList = (notebookId: string, cellId: number) => useQuery(revisionListQueryOptions(notebookId, cellId));
