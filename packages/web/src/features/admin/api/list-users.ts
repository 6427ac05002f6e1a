import { queryOptions, useQuery } from '@tanstack/react-query';
import { AdminUserListSchema } from '@rolloff/api/contract';
import type { AdminUserList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Every user with their site role and state (admins only). */
export function listUsers(signal?: AbortSignal): Promise<AdminUserList> {
  return apiRequest(apiPaths.adminUsers(), AdminUserListSchema, { signal });
}

export const adminUserListQueryOptions = () =>
  queryOptions({
    queryKey: ['admin', 'users'] as const,
    queryFn: ({ signal }) => listUsers(signal),
  });

export const useAdminUserList = () => useQuery(adminUserListQueryOptions());
