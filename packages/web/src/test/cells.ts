/** Small builders of contract objects for component tests. */
import type { Cell, CellRevision, CellSaved, UserRef } from '@rolloff/api/contract';

export const ines: UserRef = { id: 3, login: 'ines.carvalho', name: 'Inês Carvalho' };
export const tobias: UserRef = { id: 2, login: 'tobias.okafor', name: 'Tobias Okafor' };

/** A circuit cell at `revision` with `text`. */
export function buildCell(revision: number, text: string, overrides: Partial<Cell> = {}): Cell {
  return {
    id: 7,
    kind: 'circuit',
    title: null,
    position: 0,
    text,
    revision,
    diagnostics: { errors: 0, warnings: 0 },
    updatedAt: '2026-12-02T10:15:00.000Z',
    updatedBy: ines,
    deletedAt: null,
    ...overrides,
  };
}

/** A revision of cell 7. */
export function buildRevision(number: number, text: string, author: UserRef = tobias): CellRevision {
  return { cellId: 7, number, text, author, message: null, createdAt: '2026-12-02T10:20:00.000Z', diagnostics: { errors: 0, warnings: 0 } };
}

/** The API's answer to a stored save. */
export function buildSaved(revision: number, text: string): CellSaved {
  const cell = buildCell(revision, text);
  return { cell, revision: { ...buildRevision(revision, text, ines), size: text.length }, diagnostics: cell.diagnostics };
}
