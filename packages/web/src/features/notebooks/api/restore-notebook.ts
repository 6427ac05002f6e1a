import { useMutation, useQueryClient } from '@tanstack/react-query';
import { NotebookSchema } from '@rolloff/api/contract';
import type { Notebook } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';
import { notebookListsKey } from './list-notebooks';

/** Brings back a deleted notebook. */
export function restoreNotebook(id: string): Promise<Notebook> {
  return apiRequest(apiPaths.restoreNotebook(id), NotebookSchema, { method: 'POST' });
}

export const useRestoreNotebook = () => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: restoreNotebook,
    onSuccess: (notebook) => {
      client.setQueryData(notebookQueryOptions(notebook.id).queryKey, notebook);
      void client.invalidateQueries({ queryKey: notebookListsKey() });
    },
  });
};
