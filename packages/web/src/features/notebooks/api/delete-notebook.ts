import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';
import { notebookListsKey } from './list-notebooks';

/** Deletes a notebook (softly: its owner can restore it). */
export async function deleteNotebook(id: string): Promise<void> {
  await apiRequest(apiPaths.notebook(id), z.unknown(), { method: 'DELETE' });
}

export const useDeleteNotebook = (id: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => deleteNotebook(id),
    onSuccess: () => {
      client.removeQueries({ queryKey: notebookQueryOptions(id).queryKey });
      void client.invalidateQueries({ queryKey: notebookListsKey() });
    },
  });
};
