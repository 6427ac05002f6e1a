import { describe, expect, it } from 'vitest';
import { MeSchema } from '../../contract/users.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildUser } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('GET /api/me', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const reply = await new Client(server.url).get('/api/me');
    expect(reply.status).toBe(401);
    expect(reply.body).toEqual({ error: 'unauthenticated', message: 'Sign in first.' });
  });

  it('answers with the signed-in person and nothing more', async () => {
    const user = await buildUser();
    const reply = await (await signedIn(server.url, user.login)).get('/api/me');
    expect(reply.status).toBe(200);
    expect(Object.keys(reply.body as object).sort()).toEqual(['email', 'id', 'login', 'name', 'siteRole']);
    expect(MeSchema.parse(reply.body)).toMatchObject({ id: user.id, login: user.login, siteRole: 'member' });
  });
});
