import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CellSaved } from '@rolloff/api/contract';
import { getRevision } from './get-revision';
import { revisionListQueryOptions } from './list-revisions';
import { saveCell } from './save-cell';

/**
 * Restores an old revision by saving its text as a new revision on top of the current one,
 * so history only ever grows.
 */
export async function restoreRevision(notebookId: string, cellId: number, number: number, currentRevision: number): Promise<CellSaved> {
  const old = await getRevision(notebookId, cellId, number);
  return saveCell(notebookId, cellId, { text: old.text, baseRevision: currentRevision });
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
