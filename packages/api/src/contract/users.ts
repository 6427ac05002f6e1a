import { z } from 'zod';
import { TimestampSchema, UserRefSchema } from './common.js';

export const SiteRoleSchema = z.enum(['admin', 'member']);
export type SiteRole = z.infer<typeof SiteRoleSchema>;

/** `GET /api/me`: the signed-in person (401 `unauthenticated` when signed out). */
export const MeSchema = z.object({
  id: z.number().int(),
  login: z.string(),
  name: z.string(),
  email: z.string().nullable(),
  siteRole: SiteRoleSchema,
});
export type Me = z.infer<typeof MeSchema>;

/** A user as an admin sees them (`GET /api/admin/users`). */
export const AdminUserSchema = MeSchema.extend({
  disabled: z.boolean(),
  createdAt: TimestampSchema,
  lastSignInAt: TimestampSchema.nullable(),
});
export type AdminUser = z.infer<typeof AdminUserSchema>;

export const AdminUserListSchema = z.object({ items: z.array(AdminUserSchema) });
export type AdminUserList = z.infer<typeof AdminUserListSchema>;

/** `PATCH /api/admin/users/:userId`: change the site role, or disable / enable. */
export const AdminUserUpdateSchema = z
  .strictObject({
    siteRole: SiteRoleSchema.optional(),
    disabled: z.boolean().optional(),
  })
  .refine((body) => body.siteRole !== undefined || body.disabled !== undefined, {
    message: 'Send siteRole, disabled, or both.',
  });
export type AdminUserUpdate = z.infer<typeof AdminUserUpdateSchema>;

/** `GET /api/users?q=`: people to share a notebook with (login or name starts with q). */
export const UserSearchQuerySchema = z.object({
  q: z.string().trim().max(100).default(''),
});
export type UserSearchQuery = z.infer<typeof UserSearchQuerySchema>;

export const UserDirectorySchema = z.object({ items: z.array(UserRefSchema) });
export type UserDirectory = z.infer<typeof UserDirectorySchema>;
