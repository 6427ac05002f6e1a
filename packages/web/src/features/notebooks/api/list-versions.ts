import { queryOptions, useQuery } from '@tanstack/react-query';
import { VersionListSchema } from '@rolloff/api/contract';
import type { VersionList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';

/** The labelled versions of a notebook, newest first. */
export function listVersions(id: string, signal?: AbortSignal): Promise<VersionList> {
  return apiRequest(apiPaths.versions(id), VersionListSchema, { signal });
}

export const versionListQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...notebookQueryOptions(id).queryKey, 'versions'] as const,
    queryFn: ({ signal }) => listVersions(id, signal),
  });

export const useVersionList = (id: string) => useQuery(versionListQueryOptions(id));
