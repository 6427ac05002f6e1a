import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_COOKIE, CSRF_HEADER } from '../src/contract/common.js';
import type { Notebook } from '../src/contract/notebooks.js';
import { disconnect } from '../src/db/connection.js';
import { Client, signedIn } from './client.js';
import { buildNotebook, buildUser } from './factories.js';
import { startTestServer } from './http.js';
import type { TestServer } from './http.js';

describe('cross-site request forgery', () => {
  let server: TestServer;
  let behindProxy: TestServer;
  beforeAll(async () => {
    server = await startTestServer();
    behindProxy = await startTestServer({ auth: { publicUrl: 'https://rolloff.example.com' } });
  });
  afterAll(async () => {
    await server.close();
    await behindProxy.close();
    await disconnect();
  });

  it('sets a readable, SameSite=Lax token cookie on a response that arrives without one, once', async () => {
    const client = new Client(server.url);
    const first = await client.fetch('/api/health');
    const cookie = first.headers.getSetCookie().find((line) => line.startsWith(`${CSRF_COOKIE}=`));
    expect(cookie).toBeDefined();
    expect(cookie).not.toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(client.jar.get(CSRF_COOKIE)).toMatch(/^[A-Za-z0-9_-]{32}$/);
    const second = await client.fetch('/api/me');
    expect(second.headers.getSetCookie().some((line) => line.startsWith(`${CSRF_COOKIE}=`))).toBe(false);
  });

  it('refuses POST, PUT, PATCH and DELETE without the header, or with a wrong one', async () => {
    const notebook = await buildNotebook();
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const cellId = notebook.cells[0]!.id;
    const attempts: [string, string, unknown][] = [
      ['POST', '/api/notebooks', { title: 'forged' }],
      ['PUT', `/api/notebooks/${notebook.id}/cells/${cellId}`, { text: 'forged', baseRevision: 1 }],
      ['PATCH', `/api/notebooks/${notebook.id}`, { title: 'forged' }],
      ['DELETE', `/api/notebooks/${notebook.id}`, undefined],
      ['POST', '/auth/logout', undefined],
    ];
    for (const [method, path, body] of attempts) {
      const missing = await client.request(method, path, body, { noCsrf: true });
      expect(missing.status, `${method} ${path}`).toBe(403);
      expect(missing.body).toMatchObject({ error: 'forbidden' });
      expect((missing.body as { message: string }).message).toContain(CSRF_HEADER);
      const wrong = await client.request(method, path, body, { noCsrf: true, headers: { [CSRF_HEADER]: 'A'.repeat(32) } });
      expect(wrong.status, `${method} ${path}`).toBe(403);
    }
    // Nothing happened: the notebook and the session are as they were.
    const after = await client.get<Notebook>(`/api/notebooks/${notebook.id}`);
    expect(after.status).toBe(200);
    expect(after.body).toMatchObject({ title: notebook.title, deletedAt: null });
    expect(after.body.cells[0]!.revision).toBe(1);
  });

  it('refuses a header without the cookie (a forger cannot set our cookie)', async () => {
    const user = await buildUser();
    const client = await signedIn(server.url, user.login);
    const token = client.jar.get(CSRF_COOKIE)!;
    client.jar.delete(CSRF_COOKIE);
    const reply = await client.request('POST', '/api/notebooks', { title: 'x' }, { noCsrf: true, headers: { [CSRF_HEADER]: token } });
    expect(reply.status).toBe(403);
  });

  it("refuses another site's Origin even with the right token, and a cross-site fetch", async () => {
    const client = await signedIn(server.url, (await buildUser()).login);
    const foreign = await client.post('/api/notebooks', { title: 'x' }, { headers: { origin: 'https://evil.example.net' } });
    expect(foreign.status).toBe(403);
    expect((foreign.body as { message: string }).message).toMatch(/Cross-site request refused.*evil\.example\.net/);
    const opaque = await client.post('/api/notebooks', { title: 'x' }, { headers: { origin: 'null' } });
    expect(opaque.status).toBe(403);
    const marked = await client.post('/api/notebooks', { title: 'x' }, { headers: { 'sec-fetch-site': 'cross-site' } });
    expect(marked.status).toBe(403);
    const own = await client.post('/api/notebooks', { title: 'x' }, { headers: { origin: server.url, 'sec-fetch-site': 'same-origin' } });
    expect(own.status).toBe(201);
  });

  it('accepts the PUBLIC_URL origin behind a proxy', async () => {
    // Signed out on purpose: a request that passes the CSRF check reaches sign-in's 401.
    const client = new Client(behindProxy.url);
    const reply = await client.post('/api/notebooks', { title: 'x' }, { headers: { origin: 'https://rolloff.example.com' } });
    expect(reply.status).toBe(401);
    const other = await client.post('/api/notebooks', { title: 'x' }, { headers: { origin: 'https://rolloff.example.com.evil.example.net' } });
    expect(other.status).toBe(403);
  });

  it('binds the token to the session once signed in: another session’s token is refused', async () => {
    const anonymous = new Client(server.url);
    await anonymous.fetch('/api/health');
    const beforeSignIn = anonymous.jar.get(CSRF_COOKIE)!;
    const alice = await signedIn(server.url, (await buildUser()).login);
    const bob = await signedIn(server.url, (await buildUser()).login);
    const aliceToken = alice.jar.get(CSRF_COOKIE)!;
    const bobToken = bob.jar.get(CSRF_COOKIE)!;
    expect(aliceToken).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(aliceToken).not.toBe(bobToken);

    // Bob's token, sent as cookie and header alike (a double submit that would pass unbound).
    for (const token of [bobToken, beforeSignIn]) {
      alice.jar.set(CSRF_COOKIE, token);
      const reply = await alice.post('/api/notebooks', { title: 'forged' });
      expect(reply.status).toBe(403);
      expect((reply.body as { message: string }).message).toMatch(/belongs to another session/);
    }
    // Any answer puts the session's own token back, and it works.
    await alice.get('/api/me');
    expect(alice.jar.get(CSRF_COOKIE)).toBe(aliceToken);
    expect((await alice.post('/api/notebooks', { title: 'mine' })).status).toBe(201);
  });

  it('gives a new session a new token: the one from before signing in again is refused', async () => {
    const login = (await buildUser()).login;
    const client = await signedIn(server.url, login);
    const first = client.jar.get(CSRF_COOKIE)!;
    await client.signIn(login);
    const second = client.jar.get(CSRF_COOKIE)!;
    expect(second).not.toBe(first);
    client.jar.set(CSRF_COOKIE, first);
    expect((await client.post('/api/notebooks', { title: 'stale' })).status).toBe(403);
  });

  it('does not check reads', async () => {
    const client = await signedIn(server.url, (await buildUser()).login);
    expect((await client.get('/api/notebooks', { headers: { origin: 'https://evil.example.net' } })).status).toBe(200);
  });
});
