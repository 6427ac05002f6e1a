import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { memberListQueryOptions } from './list-members';

/** Takes a person's role in a notebook away. */
export async function removeMember(notebookId: string, userId: number): Promise<void> {
  await apiRequest(apiPaths.member(notebookId, userId), z.unknown(), { method: 'DELETE' });
}

export const useRemoveMember = (notebookId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => removeMember(notebookId, userId),
    onSuccess: () => client.invalidateQueries({ queryKey: memberListQueryOptions(notebookId).queryKey }),
  });
};
