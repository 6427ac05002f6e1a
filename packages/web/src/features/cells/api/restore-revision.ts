import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CellSavedSchema } from '@rolloff/api/contract';
import type { CellSaved, RevisionRestore } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { revisionListQueryOptions } from './list-revisions';

/**
 * Restores an old revision: the API saves its text (a circuit's in today's language forms) as
 * a new revision on top of the current one, so history only ever grows.
 */
export async function restoreRevision(notebookId: string, cellId: number, number: number, currentRevision: number): Promise<CellSaved> {
  const body: RevisionRestore = { baseRevision: currentRevision };
  return apiRequest(apiPaths.restoreRevision(notebookId, cellId, number), CellSavedSchema, { method: 'POST', body });
}

export const useRestoreRevision = (notebookId: string, cellId: number, onDone?: (saved: CellSaved) => void) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ number, currentRevision }: { number: number; currentRevision: number }) => restoreRevision(notebookId, cellId, number, currentRevision),
    onSuccess: (saved) => {
      void client.invalidateQueries({ queryKey: revisionListQueryOptions(notebookId, cellId).queryKey, exact: true });
      onDone?.(saved);
    },
  });
};
