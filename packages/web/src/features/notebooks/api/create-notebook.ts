import { useMutation, useQueryClient } from '@tanstack/react-query';
import { NotebookSchema } from '@rolloff/api/contract';
import type { Notebook, NotebookCreate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';
import { notebookListsKey } from './list-notebooks';

/** Makes a new notebook owned by the caller. */
export function createNotebook(body: NotebookCreate): Promise<Notebook> {
  return apiRequest(apiPaths.notebooks(), NotebookSchema, { method: 'POST', body });
}

export const useCreateNotebook = () => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createNotebook,
    onSuccess: (notebook) => {
      client.setQueryData(notebookQueryOptions(notebook.id).queryKey, notebook);
      void client.invalidateQueries({ queryKey: notebookListsKey() });
    },
  });
};
