import { z } from 'zod';
import { pathNumber } from '../notebooks/schema.js';

export { VersionCreateSchema } from '../../contract/versions.js';

export const VersionParamsSchema = z.object({ id: z.string(), number: pathNumber });
