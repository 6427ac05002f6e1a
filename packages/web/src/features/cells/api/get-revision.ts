import { queryOptions, useQuery } from '@tanstack/react-query';
import { CellRevisionSchema } from '@rolloff/api/contract';
import type { CellRevision } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { revisionListQueryOptions } from './list-revisions';

/** One revision of a cell with its text. */
export function getRevision(notebookId: string, cellId: number, number: number, signal?: AbortSignal): Promise<CellRevision> {
  return apiRequest(apiPaths.revision(notebookId, cellId, number), CellRevisionSchema, { signal });
}

export const revisionQueryOptions = (notebookId: string, cellId: number, number: number) =>
  queryOptions({
    queryKey: [...revisionListQueryOptions(notebookId, cellId).queryKey, number] as const,
    queryFn: ({ signal }) => getRevision(notebookId, cellId, number, signal),
    // Revisions are immutable.
    staleTime: Infinity,
  });

export const useRevision = (notebookId: string, cellId: number, number: number | null) =>
  useQuery({ ...revisionQueryOptions(notebookId, cellId, number ?? 0), enabled: number !== null });
