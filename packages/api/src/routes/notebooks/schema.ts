import { z } from 'zod';

export { NotebookCreateSchema, NotebookListQuerySchema, NotebookUpdateSchema } from '../../contract/notebooks.js';

/**
 * `:id` is taken as any string: one that is not a notebook id simply finds nothing (404),
 * as a request for a notebook that does not exist should.
 */
export const NotebookParamsSchema = z.object({ id: z.string() });

/** A numeric path segment; anything else becomes 0, which matches nothing (404). */
export const pathNumber = z.string().transform((text) => (/^[1-9]\d{0,9}$/.test(text) ? Number(text) : 0));
