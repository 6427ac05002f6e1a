import type { AdminUser, Me } from '../contract/users.js';
import type { User } from '../db/entities/user.js';
import { iso, isoOrNull } from './common.js';

export function presentMe(user: User): Me {
  return { id: user.id, login: user.login, name: user.name, email: user.email, siteRole: user.siteRole };
}

export function presentAdminUser(user: User): AdminUser {
  return {
    id: user.id,
    login: user.login,
    name: user.name,
    email: user.email,
    siteRole: user.siteRole,
    disabled: user.disabled,
    createdAt: iso(user.createdAt),
    lastSignInAt: isoOrNull(user.lastSignInAt),
  };
}
