/**
 * What the notebook routes read from their address and share: the notebook id (a 404 when
 * the address cannot name one) and how a cell is named in lists of pins and activity.
 */
import { NotebookIdSchema } from '@rolloff/api/contract';
import { data } from 'react-router-dom';

/** The notebook id of the address, or a 404 when it cannot be one. */
export function notebookIdOf(params: { id?: string }): string {
  const parsed = NotebookIdSchema.safeParse(params.id);
  if (!parsed.success) throw data({ what: 'This notebook' }, { status: 404 });
  return parsed.data;
}

/** "cell 2": where a cell stands among the notebook's live cells. */
export function cellNamer(cells: readonly { id: number; position: number }[]): (cellId: number) => string {
  const positions = new Map(cells.map((cell) => [cell.id, cell.position]));
  return (cellId) => {
    const position = positions.get(cellId);
    return position === undefined ? 'a deleted cell' : `cell ${position + 1}`;
  };
}
