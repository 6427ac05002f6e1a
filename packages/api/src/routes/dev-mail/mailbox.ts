/**
 * What the page reads from the mail stand-in's `GET /messages`: checked like any reply from
 * another process, so the route depends on the stand-in's wire format, not on its code.
 */
import { z } from 'zod';

export const MailboxReplySchema = z.object({
  messages: z.array(
    z.object({
      id: z.number(),
      receivedAt: z.string(),
      from: z.string(),
      to: z.array(z.string()),
      subject: z.string(),
      text: z.string(),
    }),
  ),
});
export type MailboxMessage = z.infer<typeof MailboxReplySchema>['messages'][number];
