/**
 * The path parameters of every route, in one place. A parameter that is not a well-formed id
 * is not refused: it matches nothing, so the request gets the same 404 as an id that does not
 * exist.
 */
import { z } from 'zod';
import { NumericIdSchema } from '../contract/common.js';

/** A numeric path segment; anything else becomes 0, which matches nothing (404). */
const pathNumber = z.string().transform((text) => (/^[1-9]\d{0,9}$/.test(text) ? Number(text) : 0));

/** `:id` is taken as any string: one that is not a notebook id simply finds nothing (404). */
export const NotebookParamsSchema = z.object({ id: z.string() });
export const CellParamsSchema = NotebookParamsSchema.extend({ cellId: pathNumber });
export const RevisionParamsSchema = CellParamsSchema.extend({ number: pathNumber });
export const MemberParamsSchema = NotebookParamsSchema.extend({ userId: pathNumber });
export const PinParamsSchema = NotebookParamsSchema.extend({ pinId: pathNumber });
export const ReviewParamsSchema = NotebookParamsSchema.extend({ reviewId: pathNumber });
export const VersionParamsSchema = NotebookParamsSchema.extend({ number: pathNumber });
/** `/api/admin/users/:userId`. */
export const UserParamsSchema = z.object({ userId: NumericIdSchema });
