import { useMutation, useQueryClient } from '@tanstack/react-query';
import { NotebookSchema } from '@rolloff/api/contract';
import type { ForkCreate, Notebook } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { notebookQueryOptions } from './get-notebook';
import { forkListQueryOptions } from './list-forks';
import { notebookListsKey } from './list-notebooks';

/** Copies a notebook (its current cells, or a version's) into a new one owned by the caller. */
export function forkNotebook(id: string, body: ForkCreate = {}): Promise<Notebook> {
  return apiRequest(apiPaths.forks(id), NotebookSchema, { method: 'POST', body });
}

export const useForkNotebook = (id: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: ForkCreate = {}) => forkNotebook(id, body),
    onSuccess: (fork) => {
      client.setQueryData(notebookQueryOptions(fork.id).queryKey, fork);
      void client.invalidateQueries({ queryKey: forkListQueryOptions(id).queryKey });
      void client.invalidateQueries({ queryKey: notebookQueryOptions(id).queryKey, exact: true });
      void client.invalidateQueries({ queryKey: notebookListsKey() });
    },
  });
};
