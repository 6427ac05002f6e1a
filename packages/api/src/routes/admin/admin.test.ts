import { describe, expect, it } from 'vitest';
import { AdminUserListSchema, AdminUserSchema } from '../../contract/users.js';
import { connect } from '../../db/connection.js';
import { SYSTEM_USER, User } from '../../db/entities/user.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildUser } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/admin/users', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const anonymous = new Client(server.url);
    expect((await anonymous.get('/api/admin/users')).status).toBe(401);
    expect((await anonymous.patch('/api/admin/users/1', { siteRole: 'admin' })).status).toBe(401);
  });

  it('lets a site admin list users and change site roles; members get 403', async () => {
    const admin = await signedIn(server.url, 'mara.lindqvist');
    const person = await buildUser();
    const list = AdminUserListSchema.parse((await admin.get('/api/admin/users')).body);
    expect(list.items.map((u) => u.login)).toContain(person.login);
    expect(list.items.find((u) => u.login === person.login)).toMatchObject({ siteRole: 'member', disabled: false, email: person.email });

    const member = await signedIn(server.url, person.login);
    expect((await member.get('/api/admin/users')).status).toBe(403);
    expect((await member.patch(`/api/admin/users/${person.id}`, { siteRole: 'admin' })).status).toBe(403);

    const promoted = await admin.patch(`/api/admin/users/${person.id}`, { siteRole: 'admin' });
    expect(AdminUserSchema.parse(promoted.body).siteRole).toBe('admin');
    expect((await member.get('/api/me')).body).toMatchObject({ siteRole: 'admin' });
    expect((await member.get('/api/admin/users')).status).toBe(200);
    expect((await admin.patch(`/api/admin/users/${person.id}`, { siteRole: 'member' })).status).toBe(200);
    expect((await member.get('/api/admin/users')).status).toBe(403);
  });

  it('keeps an admin from locking themselves out, and validates the change', async () => {
    const admin = await signedIn(server.url, 'mara.lindqvist');
    const me = (await admin.get<{ id: number }>('/api/me')).body;
    expect((await admin.patch(`/api/admin/users/${me.id}`, { disabled: true })).status).toBe(403);
    expect((await admin.patch(`/api/admin/users/${me.id}`, { siteRole: 'member' })).status).toBe(403);
    const empty = await admin.patch(`/api/admin/users/${me.id}`, {});
    expect(empty.status).toBe(400);
    const wrong = await admin.patch(`/api/admin/users/${me.id}`, { siteRole: 'owner' });
    expect(wrong.status).toBe(400);
    expect((wrong.body as { message: string }).message).toMatch(/^siteRole: /);
    expect((await admin.patch('/api/admin/users/999999', { disabled: true })).status).toBe(404);
  });

  it('leaves out the system user, which authors the language update and is no one to manage', async () => {
    const admin = await signedIn(server.url, 'mara.lindqvist');
    const system = await (await connect()).getRepository(User).findOneByOrFail({ login: SYSTEM_USER.login });
    const list = AdminUserListSchema.parse((await admin.get('/api/admin/users')).body);
    expect(list.items.map((u) => u.login)).not.toContain(SYSTEM_USER.login);
    expect((await admin.patch(`/api/admin/users/${system.id}`, { disabled: false })).status).toBe(404);
  });
});
