import { z } from 'zod';
import { LIMITS, MarkdownSchema, TimestampSchema, UserRefSchema, isOneLine, oneLineMessage } from './common.js';

/** A comment's Markdown: trimmed, 1 to 10 000 characters. */
export const CommentBodySchema = MarkdownSchema.min(1, 'A comment cannot be empty.');

/**
 * `POST /api/notebooks/:id/pins` (reviewer, editor or owner): a comment pinned to a circuit
 * cell's revision (default: its current one), a trace of its plot, and a frequency in Hz.
 */
export const PinCreateSchema = z.strictObject({
  cellId: z.number().int().positive(),
  revisionNumber: z.number().int().positive().optional(),
  /** The label of the trace, as the plot's legend shows it. */
  trace: z
    .string()
    .trim()
    .min(1, 'Name the trace the pin is on.')
    .max(LIMITS.traceLabelLength, `A trace label has at most ${LIMITS.traceLabelLength} characters.`)
    .refine(isOneLine, oneLineMessage('A trace label')),
  /** Hz; finite and above zero (a Bode plot's axis is logarithmic). */
  frequency: z.number({ error: 'A frequency is a finite number of Hz.' }).positive('A frequency must be above 0 Hz.'),
  body: CommentBodySchema,
});
export type PinCreate = z.infer<typeof PinCreateSchema>;

/** `POST …/pins/:pinId/comments`: a reply in the pin's thread. */
export const PinCommentCreateSchema = z.strictObject({ body: CommentBodySchema });
export type PinCommentCreate = z.infer<typeof PinCommentCreateSchema>;

/** `GET /api/notebooks/:id/pins?cellId=`: every pin, or a cell's pins only. */
export const PinListQuerySchema = z.object({
  cellId: z.coerce.number().int().positive().max(4_294_967_295).optional(),
});
export type PinListQuery = z.input<typeof PinListQuerySchema>;

export const PinCommentSchema = z.object({
  id: z.number().int(),
  author: UserRefSchema.nullable(),
  /** Markdown as written; render it without raw HTML. */
  body: z.string(),
  createdAt: TimestampSchema,
});
export type PinComment = z.infer<typeof PinCommentSchema>;

/**
 * A pin and its thread (the first comment is the pin's own text). A pin stays on the
 * revision it was made on: when `revisionNumber` is below `currentRevisionNumber` the cell
 * has moved on, and the web says "on revision N".
 */
export const PinSchema = z.object({
  id: z.number().int(),
  notebookId: z.string(),
  cellId: z.number().int(),
  revisionNumber: z.number().int().positive(),
  currentRevisionNumber: z.number().int().positive(),
  trace: z.string(),
  frequency: z.number().positive(),
  createdBy: UserRefSchema.nullable(),
  createdAt: TimestampSchema,
  resolved: z.boolean(),
  resolvedBy: UserRefSchema.nullable(),
  resolvedAt: TimestampSchema.nullable(),
  /** Oldest first. */
  comments: z.array(PinCommentSchema),
});
export type Pin = z.infer<typeof PinSchema>;

/**
 * `GET /api/notebooks/:id/pins`: oldest first. `POST …/pins` answers 201 with the pin;
 * `POST …/pins/:pinId/comments` 201 with the pin and its whole thread; `…/resolve` and
 * `…/reopen` 200 with the pin (asking twice changes nothing).
 */
export const PinListSchema = z.object({ items: z.array(PinSchema) });
export type PinList = z.infer<typeof PinListSchema>;
