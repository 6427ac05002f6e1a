import { z } from 'zod';
import { pathNumber } from '../notebooks/schema.js';

export { ReviewCreateSchema, ReviewDecisionCreateSchema } from '../../contract/reviews.js';

export const ReviewParamsSchema = z.object({ id: z.string(), reviewId: pathNumber });
