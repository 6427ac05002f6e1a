import { useMutation } from '@tanstack/react-query';
import { CellSavedSchema } from '@rolloff/api/contract';
import type { CellSaved } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Brings back a deleted cell at its old place. */
export function restoreCell(notebookId: string, cellId: number): Promise<CellSaved> {
  return apiRequest(apiPaths.restoreCell(notebookId, cellId), CellSavedSchema, { method: 'POST' });
}

export const useRestoreCell = (notebookId: string, onDone?: (saved: CellSaved) => void) =>
  useMutation({ mutationFn: (cellId: number) => restoreCell(notebookId, cellId), onSuccess: onDone });
