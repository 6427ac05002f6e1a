import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { UserDirectorySchema } from '@rolloff/api/contract';
import type { UserDirectory } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** People whose login or name starts with `q`, to share a notebook with. */
export function searchUsers(q: string, signal?: AbortSignal): Promise<UserDirectory> {
  return apiRequest(apiPaths.users(q), UserDirectorySchema, { signal });
}

export const userSearchQueryOptions = (q: string) =>
  queryOptions({
    queryKey: ['users', 'search', q] as const,
    queryFn: ({ signal }) => searchUsers(q, signal),
    placeholderData: keepPreviousData,
  });

export const useUserSearch = (q: string) => useQuery({ ...userSearchQueryOptions(q.trim()), enabled: q.trim().length > 0 });
