import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MeSchema } from '../../contract/users.js';
import { disconnect } from '../../db/connection.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildUser } from '../../../test/factories.js';
import { startTestServer } from '../../../test/http.js';
import type { TestServer } from '../../../test/http.js';

describe('GET /api/me', () => {
  let server: TestServer;
  beforeAll(async () => {
    server = await startTestServer();
  });
  afterAll(async () => {
    await server.close();
    await disconnect();
  });

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
