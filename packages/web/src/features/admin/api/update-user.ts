import { useMutation, useQueryClient } from '@tanstack/react-query';
import { AdminUserSchema } from '@rolloff/api/contract';
import type { AdminUser, AdminUserUpdate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { adminUserListQueryOptions } from './list-users';

/** Changes a user's site role, or disables or enables them. */
export function updateUser(userId: number, body: AdminUserUpdate): Promise<AdminUser> {
  return apiRequest(apiPaths.adminUser(userId), AdminUserSchema, { method: 'PATCH', body });
}

export const useUpdateUser = () => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, body }: { userId: number; body: AdminUserUpdate }) => updateUser(userId, body),
    onSuccess: () => client.invalidateQueries({ queryKey: adminUserListQueryOptions().queryKey }),
  });
};
