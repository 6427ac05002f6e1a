import { z } from 'zod';
import { NotebookIdSchema, TimestampSchema, UserRefSchema } from './common.js';
import { CellKindSchema } from './cells.js';
import { DecisionStateSchema } from './reviews.js';
import { VersionRefSchema } from './versions.js';

const base = {
  /** Unique within the timeline (`revision:12`, `pin:3`), for list keys. */
  id: z.string(),
  at: TimestampSchema,
  /** Who did it; null when that person is gone (or, for a fork, not visible to the caller). */
  actor: UserRefSchema.nullable(),
};

/** The pin an entry is about. */
const PinRefSchema = z.object({
  id: z.number().int(),
  cellId: z.number().int(),
  revisionNumber: z.number().int().positive(),
  trace: z.string(),
  frequency: z.number(),
});

/** The review round an entry is about. */
const ReviewRefSchema = z.object({
  id: z.number().int(),
  round: z.number().int().positive(),
  versionNumber: z.number().int().positive(),
});

/** The first characters of a comment, message or summary (the full text is on the pin or round). */
const excerpt = z.string();

/**
 * One entry of a notebook's timeline: a save (a cell revision; revision 1 is the cell's
 * creation), a version, a fork, a pin, a reply, a pin resolved, a review requested, a
 * reviewer's decision.
 */
export const ActivityItemSchema = z.discriminatedUnion('kind', [
  z.object({
    ...base,
    kind: z.literal('revision'),
    cell: z.object({ id: z.number().int(), kind: CellKindSchema }),
    revisionNumber: z.number().int().positive(),
    /** The revision's message when nobody typed it (`language update`, `restored from revision 3`). */
    message: z.string().nullable(),
  }),
  z.object({ ...base, kind: z.literal('version'), version: VersionRefSchema }),
  /** `fork` is null when the caller may not read the fork. */
  z.object({ ...base, kind: z.literal('fork'), fork: z.object({ id: NotebookIdSchema, title: z.string() }).nullable() }),
  z.object({ ...base, kind: z.literal('pin'), pin: PinRefSchema, excerpt }),
  z.object({ ...base, kind: z.literal('comment'), pin: PinRefSchema, excerpt }),
  z.object({ ...base, kind: z.literal('pin_resolved'), pin: PinRefSchema }),
  z.object({ ...base, kind: z.literal('review_requested'), review: ReviewRefSchema, reviewers: z.array(UserRefSchema), excerpt }),
  z.object({ ...base, kind: z.literal('review_decision'), review: ReviewRefSchema, state: DecisionStateSchema, excerpt }),
]);
export type ActivityItem = z.infer<typeof ActivityItemSchema>;
export type ActivityKind = ActivityItem['kind'];

/** `GET /api/notebooks/:id/activity?cursor=&limit=` (PageQuerySchema): newest first. */
export const ActivityPageSchema = z.object({
  items: z.array(ActivityItemSchema),
  /** Pass as `cursor` for the next page; null on the last page. */
  nextCursor: z.string().nullable(),
});
export type ActivityPage = z.infer<typeof ActivityPageSchema>;
