import { z } from 'zod';

/** A GitHub-like login: letters, digits and `.`, `_`, `-` (the demo logins have dots). */
export const LoginSchema = z.string().regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$/, 'not a login');

/** A path on this site to return to after sign-in: never another site (`//host`, `/\host`). */
export const ReturnToSchema = z
  .string()
  .max(2000)
  .regex(/^\/(?![/\\])[^\s]*$/, 'must be a path on this site, such as /notebooks');

export const SignInStartSchema = z.object({
  login: LoginSchema.optional(),
  returnTo: ReturnToSchema.optional(),
});
