import { describe, expect, it } from 'vitest';
import { UserDirectorySchema } from '../../contract/users.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildUser } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('GET /api/users', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    expect((await new Client(server.url).get('/api/users?q=a')).status).toBe(401);
  });

  it('finds active people to share with by login or name, without their e-mail', async () => {
    const person = await buildUser({ name: 'Oskar Brandt' });
    const gone = await buildUser({ name: 'Oskar Brandtner', disabled: true });
    const client = await signedIn(server.url, (await buildUser()).login);
    const byLogin = UserDirectorySchema.parse((await client.get(`/api/users?q=${person.login}`)).body);
    expect(byLogin.items).toEqual([{ id: person.id, login: person.login, name: 'Oskar Brandt' }]);
    const byName = UserDirectorySchema.parse((await client.get('/api/users?q=Oskar%20Brandt')).body);
    expect(byName.items.map((u) => u.id)).toContain(person.id);
    expect(byName.items.map((u) => u.id)).not.toContain(gone.id);
    expect(JSON.stringify(byName)).not.toContain('@');
  });
});
