import { useMutation } from '@tanstack/react-query';
import { CellSavedSchema } from '@rolloff/api/contract';
import type { CellSaved } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Deletes a cell; it stays restorable. */
export function deleteCell(notebookId: string, cellId: number): Promise<CellSaved> {
  return apiRequest(apiPaths.cell(notebookId, cellId), CellSavedSchema, { method: 'DELETE' });
}

export const useDeleteCell = (notebookId: string, onDone?: (saved: CellSaved) => void) =>
  useMutation({ mutationFn: (cellId: number) => deleteCell(notebookId, cellId), onSuccess: onDone });
