import { queryOptions, useQuery } from '@tanstack/react-query';
import { ForkListSchema } from '@rolloff/api/contract';
import type { ForkList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';

/** The forks of a notebook that the caller may open, newest first. */
export function listForks(id: string, signal?: AbortSignal): Promise<ForkList> {
  return apiRequest(apiPaths.forks(id), ForkListSchema, { signal });
}

export const forkListQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...notebookQueryOptions(id).queryKey, 'forks'] as const,
    queryFn: ({ signal }) => listForks(id, signal),
  });

export const useForkList = (id: string) => useQuery(forkListQueryOptions(id));
