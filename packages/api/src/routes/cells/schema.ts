import { z } from 'zod';
import { pathNumber } from '../notebooks/schema.js';

export { CellCreateSchema, CellMoveSchema, CellSaveSchema } from '../../contract/cells.js';
export { PageQuerySchema as RevisionListQuerySchema } from '../../contract/common.js';

export const CellParamsSchema = z.object({ id: z.string(), cellId: pathNumber });
export const RevisionParamsSchema = CellParamsSchema.extend({ number: pathNumber });
