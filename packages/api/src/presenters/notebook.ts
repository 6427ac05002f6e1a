import type { Cell } from '../contract/cells.js';
import type { ForkOrigin, LineageEntry, Notebook, NotebookSummary } from '../contract/notebooks.js';
import type { ForkSummary } from '../contract/forks.js';
import type { ReviewStatus } from '../contract/reviews.js';
import type { VersionRef } from '../contract/versions.js';
import { effectiveRole, permissionsOf } from '../policy.js';
import type { Actor } from '../policy.js';
import { iso, isoOrNull } from './common.js';
import type { NotebookRow } from '../services/access.js';

/** The policy's view of a notebook row. */
export function accessOf(row: NotebookRow) {
  return { ownerId: row.ownerId, visibility: row.visibility, deletedAt: row.deletedAt, memberRole: row.memberRole };
}

export function presentNotebookSummary(row: NotebookRow, actor: Actor): NotebookSummary {
  return {
    id: row.id,
    title: row.title,
    owner: { id: row.ownerId, login: row.ownerLogin, name: row.ownerName },
    visibility: row.visibility,
    // Lists only hold readable notebooks, so a role always exists.
    role: effectiveRole(actor, accessOf(row)) ?? 'viewer',
    cellCount: Number(row.cellCount),
    forkCount: Number(row.forkCount),
    versionCount: Number(row.versionCount),
    createdAt: iso(row.createdAt),
    updatedAt: iso(row.updatedAt),
    deletedAt: isoOrNull(row.deletedAt),
  };
}

export interface NotebookDetailParts {
  cells: Cell[];
  deletedCells: Cell[];
  forkedFrom: ForkOrigin | null;
  lineage: LineageEntry[];
  review: ReviewStatus | null;
}

export function presentNotebook(row: NotebookRow, actor: Actor, parts: NotebookDetailParts): Notebook {
  return {
    ...presentNotebookSummary(row, actor),
    description: row.description,
    permissions: permissionsOf(actor, accessOf(row)),
    cells: parts.cells,
    deletedCells: parts.deletedCells,
    forkedFrom: parts.forkedFrom,
    lineage: parts.lineage,
    review: parts.review,
  };
}

export function presentForkSummary(row: NotebookRow, actor: Actor, fromVersion: VersionRef | null): ForkSummary {
  return { ...presentNotebookSummary(row, actor), fromVersion };
}
