import { z } from 'zod';
import { pathNumber } from '../notebooks/schema.js';

export { PinCommentCreateSchema, PinCreateSchema, PinListQuerySchema } from '../../contract/pins.js';

export const PinParamsSchema = z.object({ id: z.string(), pinId: pathNumber });
