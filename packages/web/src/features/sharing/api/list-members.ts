import { queryOptions, useQuery } from '@tanstack/react-query';
import { MemberListSchema } from '@rolloff/api/contract';
import type { MemberList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** The people with a role in a notebook, the owner first. */
export function listMembers(notebookId: string, signal?: AbortSignal): Promise<MemberList> {
  return apiRequest(apiPaths.members(notebookId), MemberListSchema, { signal });
}

export const memberListQueryOptions = (notebookId: string) =>
  queryOptions({
    queryKey: ['notebooks', notebookId, 'members'] as const,
    queryFn: ({ signal }) => listMembers(notebookId, signal),
  });

export const useMemberList = (notebookId: string, enabled = true) => useQuery({ ...memberListQueryOptions(notebookId), enabled });
