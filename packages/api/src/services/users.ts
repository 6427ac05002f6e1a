/** People: sign-in records, the admin's list and changes, and the share dialog's directory. */
import { Not } from 'typeorm';
import type { UserRef } from '../contract/common.js';
import type { AdminUser, AdminUserList } from '../contract/users.js';
import { Session } from '../db/entities/session.js';
import { SYSTEM_USER, User } from '../db/entities/user.js';
import { forbidden, notFound } from '../errors.js';
import { authorizeSite } from '../policy.js';
import type { Actor } from '../policy.js';
import { presentUserRef } from '../presenters/common.js';
import { presentAdminUser } from '../presenters/user.js';
import { inTransaction } from './db.js';
import type { Database } from './db.js';

export interface UserRefRow {
  id: number;
  login: string;
  name: string;
}

/** What a GitHub profile (or the stand-in's) tells us about a person. */
export interface GithubIdentity {
  githubId: string;
  login: string;
  name: string;
  email: string | null;
}

export type SignInResult = { user: User } | { refused: 'disabled' | 'login-taken' };

/**
 * Records a sign-in: finds the person by GitHub id (or, the first time, by login, which
 * claims a user made beforehand such as a demo user), creates them if new, refreshes their
 * name and e-mail, and makes them admin when their login is in `adminLogins`.
 */
export async function recordSignIn(db: Database, identity: GithubIdentity, adminLogins: readonly string[]): Promise<SignInResult> {
  return inTransaction(db, async (manager) => {
    const repo = manager.getRepository(User);
    const byId = await repo.findOne({ where: { githubId: identity.githubId }, lock: { mode: 'pessimistic_write' } });
    const byLogin = byId ? null : await repo.findOne({ where: { login: identity.login }, lock: { mode: 'pessimistic_write' } });
    if (byLogin && byLogin.githubId && byLogin.githubId !== identity.githubId) return { refused: 'login-taken' };
    const admin = adminLogins.includes(identity.login);
    const now = new Date();
    const existing = byId ?? byLogin;
    if (existing) {
      if (existing.disabled) return { refused: 'disabled' };
      if (byId && byId.login !== identity.login) {
        // A renamed GitHub account keeps its Rolloff user, unless the new login is taken here.
        const clash = await repo.findOneBy({ login: identity.login });
        if (clash) return { refused: 'login-taken' };
      }
      await repo.update(
        { id: existing.id },
        {
          githubId: identity.githubId,
          login: identity.login,
          name: identity.name || existing.name || identity.login,
          email: identity.email ?? existing.email,
          lastSignInAt: now,
          ...(admin ? { siteRole: 'admin' as const } : {}),
        },
      );
      return { user: (await repo.findOneBy({ id: existing.id }))! };
    }
    const inserted = await repo.insert({
      githubId: identity.githubId,
      login: identity.login,
      name: identity.name || identity.login,
      email: identity.email,
      siteRole: admin ? 'admin' : 'member',
      disabled: false,
      lastSignInAt: now,
    });
    return { user: (await repo.findOneBy({ id: Number(inserted.identifiers[0]?.id) }))! };
  });
}

/** The user of a session, or null when they are gone or disabled. */
export async function activeUser(db: Database, id: number): Promise<User | null> {
  const user = await db.getRepository(User).findOneBy({ id });
  return user && !user.disabled ? user : null;
}

/** `GET /api/admin/users`. */
export async function listUsers(db: Database, actor: Actor): Promise<AdminUserList> {
  authorizeSite(actor, 'manage-users');
  // The system user is no one to manage: it signs nothing in and only authors the language update.
  const users = await db.getRepository(User).find({ where: { login: Not(SYSTEM_USER.login) }, order: { login: 'ASC' } });
  return { items: users.map(presentAdminUser) };
}

/**
 * `PATCH /api/admin/users/:userId`: change the site role, disable or enable. Disabling ends
 * every session of that person in the same transaction; an admin cannot lock themselves out.
 */
export async function updateUser(db: Database, actor: Actor, userId: number, input: { siteRole?: 'admin' | 'member'; disabled?: boolean }): Promise<AdminUser> {
  authorizeSite(actor, 'manage-users');
  if (userId === actor.id && (input.disabled === true || input.siteRole === 'member')) {
    throw forbidden('You cannot disable yourself or take away your own admin role; ask another admin.');
  }
  return inTransaction(db, async (manager) => {
    const repo = manager.getRepository(User);
    const user = await repo.findOne({ where: { id: userId }, lock: { mode: 'pessimistic_write' } });
    if (!user || user.login === SYSTEM_USER.login) throw notFound('That user');
    const changes: Partial<User> = {};
    if (input.siteRole !== undefined) changes.siteRole = input.siteRole;
    if (input.disabled !== undefined) changes.disabled = input.disabled;
    await repo.update({ id: userId }, changes);
    if (input.disabled) await manager.delete(Session, { userId });
    return presentAdminUser((await repo.findOneBy({ id: userId }))!);
  });
}

/** `GET /api/users?q=`: active people whose login or name starts with `q` (at most 20). */
export async function searchUsers(db: Database, q: string): Promise<{ items: UserRef[] }> {
  const prefix = `${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const rows: UserRefRow[] = await db.query('SELECT id, login, name FROM users WHERE disabled = 0 AND (login LIKE ? OR name LIKE ?) ORDER BY login LIMIT 20', [
    prefix,
    prefix,
  ]);
  return { items: rows.map(presentUserRef) };
}
