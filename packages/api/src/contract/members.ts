import { z } from 'zod';
import { TimestampSchema, UserRefSchema } from './common.js';
import { NotebookRoleSchema } from './notebooks.js';

/** Roles that can be given to a member (the owner is the notebook's creator). */
export const MemberRoleSchema = z.enum(['editor', 'reviewer', 'viewer']);
export type MemberRole = z.infer<typeof MemberRoleSchema>;

/** One person with a role in a notebook; the owner is listed first with role `owner`. */
export const MemberSchema = z.object({
  user: UserRefSchema,
  role: NotebookRoleSchema,
  addedAt: TimestampSchema,
});
export type Member = z.infer<typeof MemberSchema>;

/** `GET /api/notebooks/:id/members`. */
export const MemberListSchema = z.object({ items: z.array(MemberSchema) });
export type MemberList = z.infer<typeof MemberListSchema>;

/**
 * `PUT /api/notebooks/:id/members/:userId`: give or change a role (201 when added, 200 when
 * changed); `DELETE` removes the member (204).
 */
export const MemberPutSchema = z.strictObject({ role: MemberRoleSchema });
export type MemberPut = z.infer<typeof MemberPutSchema>;
