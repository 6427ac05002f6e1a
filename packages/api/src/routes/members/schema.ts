import { z } from 'zod';
import { pathNumber } from '../notebooks/schema.js';

export { MemberPutSchema } from '../../contract/members.js';

export const MemberParamsSchema = z.object({ id: z.string(), userId: pathNumber });
