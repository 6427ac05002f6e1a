import { z } from 'zod';
import { NumericIdSchema } from '../../contract/common.js';

export { AdminUserUpdateSchema } from '../../contract/users.js';

export const UserParamsSchema = z.object({ userId: NumericIdSchema });
