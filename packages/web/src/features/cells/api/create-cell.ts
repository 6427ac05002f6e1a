import { useMutation } from '@tanstack/react-query';
import { CellSavedSchema } from '@rolloff/api/contract';
import type { CellCreate, CellSaved } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Adds a cell at `position` (at the end when omitted). */
export function createCell(notebookId: string, body: CellCreate): Promise<CellSaved> {
  return apiRequest(apiPaths.cells(notebookId), CellSavedSchema, { method: 'POST', body });
}

/** `onDone` lets the page refresh the notebook the cell belongs to. */
export const useCreateCell = (notebookId: string, onDone?: (saved: CellSaved) => void) =>
  useMutation({ mutationFn: (body: CellCreate) => createCell(notebookId, body), onSuccess: onDone });
