import { queryOptions, useQuery } from '@tanstack/react-query';
import { VersionSchema } from '@rolloff/api/contract';
import type { Version } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { versionListQueryOptions } from './list-versions';

/** One version of a notebook with the text of every cell as it was then. */
export function getVersion(id: string, number: number, signal?: AbortSignal): Promise<Version> {
  return apiRequest(apiPaths.version(id, number), VersionSchema, { signal });
}

export const versionQueryOptions = (id: string, number: number) =>
  queryOptions({
    queryKey: [...versionListQueryOptions(id).queryKey, number] as const,
    queryFn: ({ signal }) => getVersion(id, number, signal),
    // A version never changes.
    staleTime: Infinity,
  });

export const useVersion = (id: string, number: number) => useQuery(versionQueryOptions(id, number));
