/**
 * What the notebook routes read from their address and share: the notebook id (a 404 when
 * the address cannot name one) and how a cell is named in lists of pins and activity.
 */
import { NotebookIdSchema, cellName } from '@rolloff/api/contract';
import type { CellKind } from '@rolloff/api/contract';
import { data } from 'react-router-dom';

/** The notebook id of the address, or a 404 when it cannot be one. */
export function notebookIdOf(params: { id?: string }): string {
  const parsed = NotebookIdSchema.safeParse(params.id);
  if (!parsed.success) throw data({ what: 'This notebook' }, { status: 404 });
  return parsed.data;
}

/** A notebook cell's name by its id (its title or "Circuit 2": the contract's cellName), or "a deleted cell" for one no longer listed. */
export function cellNamer(
  cells: readonly { id: number; kind: CellKind; title: string | null; position: number; deletedAt: string | null }[],
): (cellId: number) => string {
  const byId = new Map(cells.map((cell) => [cell.id, cell]));
  return (cellId) => {
    const cell = byId.get(cellId);
    return cell ? cellName({ ...cell, deleted: cell.deletedAt !== null }) : 'a deleted cell';
  };
}
