import { useMutation, useQueryClient } from '@tanstack/react-query';
import { NotebookSchema } from '@rolloff/api/contract';
import type { Notebook, NotebookUpdate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';
import { notebookListsKey } from './list-notebooks';

/** Renames a notebook and/or turns link sharing on or off. */
export function updateNotebook(id: string, body: NotebookUpdate): Promise<Notebook> {
  return apiRequest(apiPaths.notebook(id), NotebookSchema, { method: 'PATCH', body });
}

export const useUpdateNotebook = (id: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: NotebookUpdate) => updateNotebook(id, body),
    onSuccess: (notebook) => {
      client.setQueryData(notebookQueryOptions(id).queryKey, notebook);
      void client.invalidateQueries({ queryKey: notebookListsKey() });
    },
  });
};
