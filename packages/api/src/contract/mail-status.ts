import { z } from 'zod';
import { TimestampSchema } from './common.js';

/**
 * `GET /api/admin/mail` (site admins): whether the mail relay answers, and the outbox — mail
 * waiting to go out (it is kept while the relay is away and sent once it is back), and what
 * was sent or given up on in the last 24 hours, with the reason of the latest failure.
 */
export const MailStatusSchema = z.object({
  relay: z.object({ address: z.string(), up: z.boolean(), error: z.string().nullable() }),
  queued: z.number().int().nonnegative(),
  oldestQueuedAt: TimestampSchema.nullable(),
  sentLastDay: z.number().int().nonnegative(),
  failedLastDay: z.number().int().nonnegative(),
  lastFailure: z.object({ subject: z.string(), error: z.string(), at: TimestampSchema }).nullable(),
});
export type MailStatus = z.infer<typeof MailStatusSchema>;
