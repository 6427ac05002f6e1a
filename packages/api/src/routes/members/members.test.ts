import { describe, expect, it } from 'vitest';
import { MemberListSchema, MemberSchema } from '../../contract/members.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/notebooks/:id/members', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const anonymous = new Client(server.url);
    expect((await anonymous.get(`/api/notebooks/${notebook.id}/members`)).status).toBe(401);
    expect((await anonymous.put(`/api/notebooks/${notebook.id}/members/1`, { role: 'viewer' })).status).toBe(401);
    expect((await anonymous.delete(`/api/notebooks/${notebook.id}/members/1`)).status).toBe(401);
  });

  it('gives, changes and removes roles (owner only); the owner is listed first', async () => {
    const notebook = await buildNotebook();
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const person = await buildUser();
    const base = `/api/notebooks/${notebook.id}/members`;

    const added = await owner.put(`${base}/${person.id}`, { role: 'reviewer' });
    expect(added.status).toBe(201);
    expect(MemberSchema.parse(added.body)).toMatchObject({ user: { id: person.id, login: person.login }, role: 'reviewer' });
    const changed = await owner.put(`${base}/${person.id}`, { role: 'editor' });
    expect(changed.status).toBe(200);

    const member = await signedIn(server.url, person.login);
    const list = MemberListSchema.parse((await member.get(base)).body);
    expect(list.items.map((m) => [m.user.id, m.role])).toEqual([
      [notebook.ownerUser.id, 'owner'],
      [person.id, 'editor'],
    ]);
    expect((await member.put(`${base}/${person.id}`, { role: 'viewer' })).status).toBe(403);

    expect((await owner.put(`${base}/${notebook.ownerUser.id}`, { role: 'viewer' })).status).toBe(400);
    expect((await owner.put(`${base}/${person.id}`, { role: 'owner' })).status).toBe(400);
    expect((await owner.put(`${base}/999999`, { role: 'viewer' })).status).toBe(404);

    expect((await owner.delete(`${base}/${person.id}`)).status).toBe(204);
    expect((await owner.delete(`${base}/${person.id}`)).status).toBe(404);
    expect((await member.get(`/api/notebooks/${notebook.id}`)).status).toBe(404);
  });

  it('mails a person when they are added, not when their role changes, and not if they turned it off', async () => {
    const notebook = await buildNotebook();
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const [newcomer, quiet] = [await buildUser(), await buildUser()];
    await (await signedIn(server.url, quiet.login)).patch('/api/me/settings', { mail: { addedToNotebook: false } });
    const base = `/api/notebooks/${notebook.id}/members`;

    expect((await owner.put(`${base}/${newcomer.id}`, { role: 'reviewer' })).status).toBe(201);
    expect((await owner.put(`${base}/${newcomer.id}`, { role: 'editor' })).status).toBe(200);
    expect((await owner.put(`${base}/${quiet.id}`, { role: 'viewer' })).status).toBe(201);

    const mailbox = await server.mailbox();
    const toNewcomer = mailbox.filter((m) => m.to.includes(newcomer.email!));
    expect(toNewcomer.map((m) => m.subject)).toEqual([`You were added to “${notebook.title}”`]);
    expect(toNewcomer[0]!.envelopeTo).toEqual([newcomer.email]);
    expect(toNewcomer[0]!.text).toMatch(/gave you the reviewer role in “.*”: you may read it, pin comments and sign off reviews\./);
    expect(toNewcomer[0]!.text).toContain(`Open the notebook: ${server.url}/notebooks/${notebook.id}`);
    expect(mailbox.filter((m) => m.to.includes(quiet.email!))).toEqual([]);
    expect(mailbox.filter((m) => m.to.includes(notebook.ownerUser.email!))).toEqual([]);
  });
});
