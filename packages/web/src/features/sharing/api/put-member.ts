import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MemberSchema } from '@rolloff/api/contract';
import type { Member, MemberRole } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { memberListQueryOptions } from './list-members';

/** Gives a person a role in a notebook, or changes the role they have. */
export function putMember(notebookId: string, userId: number, role: MemberRole): Promise<Member> {
  return apiRequest(apiPaths.member(notebookId, userId), MemberSchema, { method: 'PUT', body: { role } });
}

export const usePutMember = (notebookId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: number; role: MemberRole }) => putMember(notebookId, userId, role),
    onSuccess: () => client.invalidateQueries({ queryKey: memberListQueryOptions(notebookId).queryKey }),
  });
};
