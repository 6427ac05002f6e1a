import { z } from 'zod';
import { TitleSchema } from './common.js';
import { NotebookSummarySchema } from './notebooks.js';
import { VersionRefSchema } from './versions.js';

/**
 * `POST /api/notebooks/:id/forks`: copy the notebook (its current cells, or the cells of
 * `version`) into a new notebook owned by the caller; 201 with the new NotebookSchema.
 */
export const ForkCreateSchema = z.strictObject({
  version: z.number().int().positive().optional(),
  title: TitleSchema.optional(),
});
export type ForkCreate = z.infer<typeof ForkCreateSchema>;

/** A fork in `GET /api/notebooks/:id/forks`, with the version it was made from. */
export const ForkSummarySchema = NotebookSummarySchema.extend({
  fromVersion: VersionRefSchema.nullable(),
});
export type ForkSummary = z.infer<typeof ForkSummarySchema>;

/** Forks the caller may read, newest first; `total` counts every live fork. */
export const ForkListSchema = z.object({
  items: z.array(ForkSummarySchema),
  total: z.number().int().nonnegative(),
});
export type ForkList = z.infer<typeof ForkListSchema>;
