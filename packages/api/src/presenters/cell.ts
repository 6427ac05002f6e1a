import type { Cell, CellRevision, CellRevisionSummary } from '../contract/cells.js';
import { presentAuthor, presentDiagnostics, iso, isoOrNull } from './common.js';
import type { CellRow, RevisionRow } from '../services/cells.js';

export function presentCell(row: CellRow): Cell {
  return {
    id: row.id,
    kind: row.kind,
    title: row.title,
    position: row.position,
    text: row.text,
    revision: row.revision,
    diagnostics: presentDiagnostics(row.diagnosticErrors, row.diagnosticWarnings),
    updatedAt: iso(row.updatedAt),
    updatedBy: presentAuthor(row.authorId, row.authorLogin, row.authorName),
    deletedAt: isoOrNull(row.deletedAt),
  };
}

export function presentRevision(row: RevisionRow & { text: string }): CellRevision {
  return {
    cellId: row.cellId,
    number: row.number,
    text: row.text,
    author: presentAuthor(row.authorId, row.authorLogin, row.authorName),
    message: row.message,
    createdAt: iso(row.createdAt),
    diagnostics: presentDiagnostics(row.diagnosticErrors, row.diagnosticWarnings),
  };
}

export function presentRevisionSummary(row: RevisionRow): CellRevisionSummary {
  return {
    cellId: row.cellId,
    number: row.number,
    author: presentAuthor(row.authorId, row.authorLogin, row.authorName),
    message: row.message,
    createdAt: iso(row.createdAt),
    diagnostics: presentDiagnostics(row.diagnosticErrors, row.diagnosticWarnings),
    size: Number(row.size ?? (row.text === undefined ? 0 : Buffer.byteLength(row.text, 'utf8'))),
  };
}

/** The revision summary of a cell row's current revision. */
export function presentCurrentRevision(row: CellRow): CellRevisionSummary {
  return {
    cellId: row.id,
    number: row.revision,
    author: presentAuthor(row.authorId, row.authorLogin, row.authorName),
    message: row.revisionMessage,
    createdAt: iso(row.revisionCreatedAt),
    diagnostics: presentDiagnostics(row.diagnosticErrors, row.diagnosticWarnings),
    size: Buffer.byteLength(row.text, 'utf8'),
  };
}
