import { z } from 'zod';
import { CellTextSchema, DiagnosticCountsSchema, LIMITS, TimestampSchema, UserRefSchema, isOneLine, oneLineMessage } from './common.js';

export const CellKindSchema = z.enum(['circuit', 'note']);
export type CellKind = z.infer<typeof CellKindSchema>;

/**
 * A cell's name wherever one is named (review, history, activity, e-mail, messages): the title
 * its people chose, else its kind and 1-based place, "Circuit 2", "Note 3"; a deleted cell
 * keeps the place it had.
 */
export function cellName(cell: { kind: CellKind; position: number; title?: string | null; deleted?: boolean }): string {
  return `${cell.title || `${cell.kind === 'circuit' ? 'Circuit' : 'Note'} ${cell.position + 1}`}${cell.deleted ? ' (deleted)' : ''}`;
}

/** A title chosen for a cell: one line, trimmed, not empty. */
export const CellTitleSchema = z
  .string()
  .trim()
  .min(1, 'A title cannot be empty; send null to go back to "Circuit 2" or "Note 3".')
  .max(LIMITS.cellTitleLength, `A cell title has at most ${LIMITS.cellTitleLength} characters.`)
  .refine(isOneLine, oneLineMessage('A cell title'));

/** A cell at its current revision. `diagnostics` is null for note cells. */
export const CellSchema = z.object({
  id: z.number().int(),
  kind: CellKindSchema,
  /** The title its people chose; null: named by kind and place (see cellName). */
  title: z.string().nullable(),
  /** 0-based place among the notebook's live cells. */
  position: z.number().int().nonnegative(),
  text: z.string(),
  /** Number of the current revision (1 for a new cell); send it back as `baseRevision`. */
  revision: z.number().int().positive(),
  diagnostics: DiagnosticCountsSchema.nullable(),
  updatedAt: TimestampSchema,
  updatedBy: UserRefSchema.nullable(),
  /** Set on a deleted cell (restorable with `POST …/cells/:cellId/restore`). */
  deletedAt: TimestampSchema.nullable(),
});
export type Cell = z.infer<typeof CellSchema>;

/** `POST /api/notebooks/:id/cells`: a new cell at `position` (default: at the end). */
export const CellCreateSchema = z.strictObject({
  kind: CellKindSchema,
  position: z.number().int().nonnegative().max(LIMITS.cellsPerNotebook).optional(),
  text: CellTextSchema.default(''),
});
export type CellCreate = z.input<typeof CellCreateSchema>;

/**
 * `POST /api/notebooks/:id/cells/:cellId/revisions/:number/restore`: saves that old revision's
 * text as a new revision on `baseRevision` (409 like a save when it is stale). A circuit cell's
 * text is first brought to today's language forms, as the language update did; the new
 * revision's message says so.
 */
export const RevisionRestoreSchema = z.strictObject({
  baseRevision: z.number().int().positive(),
});
export type RevisionRestore = z.infer<typeof RevisionRestoreSchema>;

/** `PUT /api/notebooks/:id/cells/:cellId`: the new text and the revision it was based on. */
export const CellSaveSchema = z.strictObject({
  text: CellTextSchema,
  baseRevision: z.number().int().positive(),
});
export type CellSave = z.infer<typeof CellSaveSchema>;

/** `PATCH /api/notebooks/:id/cells/:cellId`: a title for the cell (editor or owner), or null for none. Not a revision: titles have no history. */
export const CellTitleUpdateSchema = z.strictObject({ title: CellTitleSchema.nullable() });
export type CellTitleUpdate = z.infer<typeof CellTitleUpdateSchema>;

/** `POST /api/notebooks/:id/cells/:cellId/move`: the cell's new 0-based position. */
export const CellMoveSchema = z.strictObject({
  position: z.number().int().nonnegative(),
});
export type CellMove = z.infer<typeof CellMoveSchema>;

/** One immutable revision of a cell, with its text. */
export const CellRevisionSchema = z.object({
  cellId: z.number().int(),
  number: z.number().int().positive(),
  text: z.string(),
  author: UserRefSchema.nullable(),
  /** Why the revision was made when its author did not type it: `language update` (by the system user, whose name is Rolloff), `restored from revision 3`; null for a save. */
  message: z.string().nullable(),
  createdAt: TimestampSchema,
  diagnostics: DiagnosticCountsSchema.nullable(),
});
export type CellRevision = z.infer<typeof CellRevisionSchema>;

/** A revision in a list: everything but the text (fetch one revision for its text). */
export const CellRevisionSummarySchema = CellRevisionSchema.omit({ text: true }).extend({
  /** Size of the text in UTF-8 bytes. */
  size: z.number().int().nonnegative(),
});
export type CellRevisionSummary = z.infer<typeof CellRevisionSummarySchema>;

/** `GET …/cells/:cellId/revisions?cursor=&limit=`: newest first. */
export const CellRevisionListSchema = z.object({
  items: z.array(CellRevisionSummarySchema),
  nextCursor: z.string().nullable(),
});
export type CellRevisionList = z.infer<typeof CellRevisionListSchema>;

/**
 * The answer to a create (201), a save (201 with a new revision; 200 when the text equals the
 * current one and nothing was stored), a move, a delete and a restore (200). A circuit cell's
 * text is checked by the solver on every save and stored even with errors; `diagnostics`
 * counts them (null for note cells).
 */
export const CellSavedSchema = z.object({
  cell: CellSchema,
  revision: CellRevisionSummarySchema,
  diagnostics: DiagnosticCountsSchema.nullable(),
});
export type CellSaved = z.infer<typeof CellSavedSchema>;

/**
 * 409 body of a stale save: the revision that is current now (with its text) and the text
 * that was refused, so nothing typed is lost; merge and save again on `current.number`.
 */
export const ConflictSchema = z.object({
  error: z.literal('conflict'),
  message: z.string(),
  details: z.object({
    current: CellRevisionSchema,
    submitted: z.object({ text: z.string(), baseRevision: z.number().int() }),
  }),
});
export type Conflict = z.infer<typeof ConflictSchema>;
