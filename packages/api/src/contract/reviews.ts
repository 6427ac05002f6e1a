import { z } from 'zod';
import { LIMITS, MarkdownSchema, TimestampSchema, UserRefSchema } from './common.js';
import { VersionRefSchema } from './versions.js';

/**
 * A reviewer's state in a round (product.md: *requested*, *needs changes*, *signed off*).
 * `requested` → `needs_changes` or `signed_off`; `needs_changes` → `signed_off` within the
 * same round; a sign-off is final for its round.
 */
export const ReviewStateSchema = z.enum(['requested', 'needs_changes', 'signed_off']);
export type ReviewState = z.infer<typeof ReviewStateSchema>;

/** What a reviewer decides: the states a decision can move them to. */
export const DecisionStateSchema = ReviewStateSchema.exclude(['requested']);
export type DecisionState = z.infer<typeof DecisionStateSchema>;

/**
 * `POST /api/notebooks/:id/reviews` (editor or owner): ask members with the reviewer role
 * or higher (not oneself) to review a version. Without `versionNumber` the latest version is
 * reviewed, or, when the notebook changed since it, a new version labelled "For review" is
 * made first. A later version starts a new round (201) that supersedes the open one; the
 * version of the open round adds the people not yet asked to that round (200).
 */
export const ReviewCreateSchema = z.strictObject({
  reviewerIds: z
    .array(z.number().int().positive())
    .min(1, 'Ask at least one reviewer.')
    .max(LIMITS.reviewersPerRequest, `Ask at most ${LIMITS.reviewersPerRequest} reviewers at once.`),
  versionNumber: z.number().int().positive().optional(),
  /** What the reviewers should look at (Markdown). */
  message: MarkdownSchema.default(''),
});
export type ReviewCreate = z.input<typeof ReviewCreateSchema>;

/**
 * `POST …/reviews/:reviewId/decision` (an assigned reviewer of the open round): ask for
 * changes (a summary saying what should change is required) or sign off.
 */
export const ReviewDecisionCreateSchema = z
  .strictObject({
    state: DecisionStateSchema,
    summary: MarkdownSchema.default(''),
  })
  .refine((body) => body.state !== 'needs_changes' || body.summary.length > 0, {
    message: 'Say what should change: a request for changes needs a summary.',
    path: ['summary'],
  });
export type ReviewDecisionCreate = z.input<typeof ReviewDecisionCreateSchema>;

/** One person asked in a round, with their current decision. */
export const ReviewerSchema = z.object({
  user: UserRefSchema,
  state: ReviewStateSchema,
  /** Their latest summary; empty until they decide (and after a sign-off without one). */
  summary: z.string(),
  decidedAt: TimestampSchema.nullable(),
});
export type Reviewer = z.infer<typeof ReviewerSchema>;

/** A decision as it was made, for the round's history (a reviewer may decide twice). */
export const ReviewDecisionSchema = z.object({
  reviewer: UserRefSchema.nullable(),
  state: DecisionStateSchema,
  summary: z.string(),
  createdAt: TimestampSchema,
});
export type ReviewDecision = z.infer<typeof ReviewDecisionSchema>;

/** A review round: one version of the notebook, the people asked, and their decisions. */
export const ReviewSchema = z.object({
  id: z.number().int(),
  notebookId: z.string(),
  /** 1, 2, … within the notebook. */
  round: z.number().int().positive(),
  version: VersionRefSchema,
  requestedBy: UserRefSchema.nullable(),
  message: z.string(),
  createdAt: TimestampSchema,
  /**
   * The round's state: `needs_changes` when any reviewer asked for changes, `signed_off`
   * when every reviewer signed off, else `requested`.
   */
  state: ReviewStateSchema,
  /** True once a later round started; a superseded round takes no more decisions. */
  superseded: z.boolean(),
  reviewers: z.array(ReviewerSchema),
  /** Every decision of the round, oldest first. */
  history: z.array(ReviewDecisionSchema),
});
export type Review = z.infer<typeof ReviewSchema>;

/** `GET /api/notebooks/:id/reviews`: every round, newest first. */
export const ReviewListSchema = z.object({ items: z.array(ReviewSchema) });
export type ReviewList = z.infer<typeof ReviewListSchema>;

/** The latest round in brief, as the notebook's header shows it (`NotebookSchema.review`). */
export const ReviewStatusSchema = z.object({
  reviewId: z.number().int(),
  round: z.number().int().positive(),
  state: ReviewStateSchema,
  versionNumber: z.number().int().positive(),
});
export type ReviewStatus = z.infer<typeof ReviewStatusSchema>;
