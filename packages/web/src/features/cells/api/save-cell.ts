import { CellSavedSchema, IDEMPOTENCY_HEADER } from '@rolloff/api/contract';
import type { CellSave, CellSaved } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/**
 * Saves a cell's text as a new revision on top of `baseRevision`. A stale base answers 409
 * (an ApiError whose details carry the current revision, see ConflictSchema). `key` is the
 * save attempt's Idempotency-Key: a retry with it gets the first answer, even when that answer
 * was lost after the save went through. The autosave hook drives this call itself, as it needs
 * to order saves and retries.
 */
export function saveCell(notebookId: string, cellId: number, body: CellSave, key?: string): Promise<CellSaved> {
  return apiRequest(apiPaths.cell(notebookId, cellId), CellSavedSchema, { method: 'PUT', body, headers: key ? { [IDEMPOTENCY_HEADER]: key } : undefined });
}
