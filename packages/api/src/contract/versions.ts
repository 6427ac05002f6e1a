import { z } from 'zod';
import { DiagnosticCountsSchema, LIMITS, TimestampSchema, UserRefSchema, isOneLine, oneLineMessage } from './common.js';
import { CellKindSchema } from './cells.js';

/** `POST /api/notebooks/:id/versions`: label a snapshot of every cell's current revision. */
export const VersionCreateSchema = z.strictObject({
  label: z
    .string()
    .trim()
    .min(1, 'A version needs a label.')
    .max(LIMITS.versionLabelLength, `A label has at most ${LIMITS.versionLabelLength} characters.`)
    .refine(isOneLine, oneLineMessage('A version label')),
});
export type VersionCreate = z.infer<typeof VersionCreateSchema>;

/** How other resources point at a version. */
export const VersionRefSchema = z.object({
  number: z.number().int().positive(),
  label: z.string(),
});
export type VersionRef = z.infer<typeof VersionRefSchema>;

export const VersionSummarySchema = VersionRefSchema.extend({
  author: UserRefSchema.nullable(),
  createdAt: TimestampSchema,
  cellCount: z.number().int().nonnegative(),
});
export type VersionSummary = z.infer<typeof VersionSummarySchema>;

/** One cell as it was in a version: the revision it had then, with that revision's text. */
export const VersionCellSchema = z.object({
  cellId: z.number().int(),
  kind: CellKindSchema,
  /** The cell's title now (titles have no history), or null. */
  title: z.string().nullable(),
  position: z.number().int().nonnegative(),
  revision: z.number().int().positive(),
  text: z.string(),
  diagnostics: DiagnosticCountsSchema.nullable(),
});
export type VersionCell = z.infer<typeof VersionCellSchema>;

/** `GET /api/notebooks/:id/versions/:number` (and the 201 of a create). */
export const VersionSchema = VersionSummarySchema.extend({
  notebookId: z.string(),
  cells: z.array(VersionCellSchema),
});
export type Version = z.infer<typeof VersionSchema>;

/** `GET /api/notebooks/:id/versions`: newest first. */
export const VersionListSchema = z.object({ items: z.array(VersionSummarySchema) });
export type VersionList = z.infer<typeof VersionListSchema>;
