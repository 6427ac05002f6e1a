import { z } from 'zod';
import { CellTextSchema, DescriptionSchema, LIMITS, NotebookIdSchema, PageQuerySchema, TimestampSchema, TitleSchema, UserRefSchema } from './common.js';
import { CellKindSchema, CellSchema } from './cells.js';
import { ReviewStatusSchema } from './reviews.js';
import { VersionRefSchema } from './versions.js';

/** A person's role in one notebook (architecture.md, "Roles"). */
export const NotebookRoleSchema = z.enum(['owner', 'editor', 'reviewer', 'viewer']);
export type NotebookRole = z.infer<typeof NotebookRoleSchema>;

/** `private`: owner and members only; `link`: any signed-in user with the link is a viewer. */
export const VisibilitySchema = z.enum(['private', 'link']);
export type Visibility = z.infer<typeof VisibilitySchema>;

/**
 * Which notebooks a list shows: `mine` (owned), `shared` (where the caller is a member),
 * `all` (both; for a site admin every notebook), `deleted` (the caller's deleted notebooks).
 */
export const NotebookScopeSchema = z.enum(['mine', 'shared', 'all', 'deleted']);
export type NotebookScope = z.infer<typeof NotebookScopeSchema>;

/** What the caller may do with a notebook, straight from the policy module. */
export const NotebookPermissionsSchema = z.object({
  read: z.boolean(),
  fork: z.boolean(),
  /** Pin, comment, sign off a review. */
  review: z.boolean(),
  /** Edit cells, upload bench data, make versions, rename. */
  edit: z.boolean(),
  /** Members, roles, link sharing. */
  share: z.boolean(),
  /** Delete and restore the notebook. */
  delete: z.boolean(),
});
export type NotebookPermissions = z.infer<typeof NotebookPermissionsSchema>;

/** `POST /api/notebooks`: a title and, optionally, a description and the first cells in order. */
export const NotebookCreateSchema = z.strictObject({
  title: TitleSchema,
  description: DescriptionSchema.default(''),
  cells: z
    .array(z.strictObject({ kind: CellKindSchema, text: CellTextSchema.default('') }))
    .max(LIMITS.cellsPerNotebook, `A notebook holds at most ${LIMITS.cellsPerNotebook} cells.`)
    .default([]),
});
export type NotebookCreate = z.input<typeof NotebookCreateSchema>;

/**
 * `PATCH /api/notebooks/:id`: a new title or description (editor or owner) and/or link
 * sharing (owner); any one of them alone is enough.
 */
export const NotebookUpdateSchema = z
  .strictObject({
    title: TitleSchema.optional(),
    description: DescriptionSchema.optional(),
    visibility: VisibilitySchema.optional(),
  })
  .refine((body) => body.title !== undefined || body.description !== undefined || body.visibility !== undefined, {
    message: 'Send at least one of title, description and visibility.',
  });
export type NotebookUpdate = z.infer<typeof NotebookUpdateSchema>;

/** What a notebook list is ordered by: the last change, the title, or when it was made. */
export const NotebookSortSchema = z.enum(['changed', 'title', 'created']);
export type NotebookSort = z.infer<typeof NotebookSortSchema>;

export const SortOrderSchema = z.enum(['desc', 'asc']);
export type SortOrder = z.infer<typeof SortOrderSchema>;

/**
 * `GET /api/notebooks?scope=&q=&sort=&order=&cursor=&limit=`: newest change first unless
 * `sort` and `order` say otherwise; ties are ordered by id in the same direction. A cursor
 * holds the sort it was made for (and, for `title`, a title), so it may be longer than the
 * cursors of other lists; a cursor of another sort or order is refused.
 */
export const NotebookListQuerySchema = PageQuerySchema.extend({
  scope: NotebookScopeSchema.default('all'),
  q: z.string().trim().max(LIMITS.searchLength).optional(),
  sort: NotebookSortSchema.default('changed'),
  order: SortOrderSchema.default('desc'),
  cursor: z.string().max(2000).optional(),
});
export type NotebookListQuery = z.input<typeof NotebookListQuerySchema>;

/** A notebook in a list. `role` is the caller's effective role. */
export const NotebookSummarySchema = z.object({
  id: NotebookIdSchema,
  title: z.string(),
  owner: UserRefSchema,
  visibility: VisibilitySchema,
  role: NotebookRoleSchema,
  cellCount: z.number().int().nonnegative(),
  forkCount: z.number().int().nonnegative(),
  /** Labelled versions made of the notebook. */
  versionCount: z.number().int().nonnegative(),
  createdAt: TimestampSchema,
  /** The last change to the notebook or any of its cells; lists sort by it by default. */
  updatedAt: TimestampSchema,
  deletedAt: TimestampSchema.nullable(),
});
export type NotebookSummary = z.infer<typeof NotebookSummarySchema>;

export const NotebookListSchema = z.object({
  items: z.array(NotebookSummarySchema),
  /** Pass as `cursor` for the next page; null on the last page. */
  nextCursor: z.string().nullable(),
});
export type NotebookList = z.infer<typeof NotebookListSchema>;

/** One ancestor of a fork: the notebook it was copied from and the version, if one was used. */
export const LineageEntrySchema = z.object({
  id: NotebookIdSchema,
  title: z.string(),
  owner: UserRefSchema,
  version: VersionRefSchema.nullable(),
});
export type LineageEntry = z.infer<typeof LineageEntrySchema>;

/**
 * Where a fork came from. `notebook` is null when the caller may not read the source (or it
 * is deleted); `version` is null when the fork copied the source's current cells.
 */
export const ForkOriginSchema = z.object({
  notebook: z.object({ id: NotebookIdSchema, title: z.string() }).nullable(),
  version: VersionRefSchema.nullable(),
});
export type ForkOrigin = z.infer<typeof ForkOriginSchema>;

/** `GET /api/notebooks/:id` (and the answer to create, update, restore and fork). */
export const NotebookSchema = NotebookSummarySchema.extend({
  /** Plain text under the title; empty when there is none. */
  description: z.string(),
  permissions: NotebookPermissionsSchema,
  /** Live cells in order, at their current revisions. */
  cells: z.array(CellSchema),
  /** Deleted cells (restorable), newest deletion first; empty unless the caller may edit. */
  deletedCells: z.array(CellSchema),
  /** null unless this notebook is a fork. */
  forkedFrom: ForkOriginSchema.nullable(),
  /** Readable ancestors, nearest first; stops at the first one the caller may not read. */
  lineage: z.array(LineageEntrySchema),
  /** The latest review round in brief; null when no review was ever asked for. */
  review: ReviewStatusSchema.nullable().optional(),
});
export type Notebook = z.infer<typeof NotebookSchema>;
