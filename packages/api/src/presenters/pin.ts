import type { Pin, PinComment } from '../contract/pins.js';
import { iso, isoOrNull, presentAuthor } from './common.js';
import type { PinCommentRow, PinRow } from '../services/pins.js';

export function presentPinComment(row: PinCommentRow): PinComment {
  return { id: row.id, author: presentAuthor(row.authorId, row.authorLogin, row.authorName), body: row.body, createdAt: iso(row.createdAt) };
}

export function presentPin(row: PinRow, comments: PinCommentRow[]): Pin {
  return {
    id: row.id,
    notebookId: row.notebookId,
    cellId: row.cellId,
    revisionNumber: row.revisionNumber,
    currentRevisionNumber: row.currentRevisionNumber,
    trace: row.trace,
    frequency: Number(row.frequency),
    createdBy: presentAuthor(row.createdById, row.createdByLogin, row.createdByName),
    createdAt: iso(row.createdAt),
    resolved: row.resolvedAt !== null,
    resolvedBy: row.resolvedAt === null ? null : presentAuthor(row.resolvedById, row.resolvedByLogin, row.resolvedByName),
    resolvedAt: isoOrNull(row.resolvedAt),
    comments: comments.map(presentPinComment),
  };
}
