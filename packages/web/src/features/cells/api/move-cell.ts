import { useMutation } from '@tanstack/react-query';
import { CellSavedSchema } from '@rolloff/api/contract';
import type { CellSaved } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Moves a cell to a new 0-based position. */
export function moveCell(notebookId: string, cellId: number, position: number): Promise<CellSaved> {
  return apiRequest(apiPaths.moveCell(notebookId, cellId), CellSavedSchema, { method: 'POST', body: { position } });
}

export const useMoveCell = (notebookId: string, onDone?: (saved: CellSaved) => void) =>
  useMutation({ mutationFn: ({ cellId, position }: { cellId: number; position: number }) => moveCell(notebookId, cellId, position), onSuccess: onDone });
