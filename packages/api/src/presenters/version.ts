import type { Version, VersionCell, VersionRef, VersionSummary } from '../contract/versions.js';
import { presentAuthor, presentDiagnostics, iso } from './common.js';
import type { VersionCellRow, VersionRow } from '../services/versions.js';

export function presentVersionRef(row: { number: number; label: string }): VersionRef {
  return { number: row.number, label: row.label };
}

export function presentVersionSummary(row: VersionRow): VersionSummary {
  return {
    number: row.number,
    label: row.label,
    author: presentAuthor(row.authorId, row.authorLogin, row.authorName),
    createdAt: iso(row.createdAt),
    cellCount: Number(row.cellCount),
  };
}

function presentVersionCell(row: VersionCellRow): VersionCell {
  return {
    cellId: row.cellId,
    kind: row.kind,
    title: row.title,
    position: row.position,
    revision: row.revision,
    text: row.text,
    diagnostics: presentDiagnostics(row.diagnosticErrors, row.diagnosticWarnings),
  };
}

export function presentVersion(row: VersionRow, cells: VersionCellRow[]): Version {
  return { ...presentVersionSummary(row), notebookId: row.notebookId, cells: cells.map(presentVersionCell) };
}
