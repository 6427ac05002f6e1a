import { describe, expect, it } from 'vitest';
import { standinClient } from '../../config.js';
import { CSRF_COOKIE, SESSION_COOKIE } from '../../contract/common.js';
import { MeSchema } from '../../contract/users.js';
import { connect } from '../../db/connection.js';
import { Session } from '../../db/entities/session.js';
import { User } from '../../db/entities/user.js';
import { createOAuthStandin } from '../../standins/oauth/standin.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildUser, uniqueLogin } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('sign-in through the OAuth stand-in', () => {
  const server = useTestServer();

  it('requires sign-in: GET /api/me answers 401 when signed out', async () => {
    const reply = await new Client(server.url).get('/api/me');
    expect(reply.status).toBe(401);
    expect(reply.body).toMatchObject({ error: 'unauthenticated' });
  });

  it('goes app → stand-in → callback → /notebooks, and the session then knows the person', async () => {
    const login = uniqueLogin('octo');
    const client = new Client(server.url);

    const start = await client.fetch(`/auth/github?login=${login}`);
    expect(start.status).toBe(302);
    const authorize = new URL(start.headers.get('location')!);
    expect(authorize.origin).toBe(server.standin.url);
    expect(authorize.pathname).toBe('/login/oauth/authorize');
    expect(authorize.searchParams.get('client_id')).toBe('rolloff-local');
    expect(authorize.searchParams.get('redirect_uri')).toBe(`${server.url}/auth/github/callback`);
    expect(authorize.searchParams.get('scope')).toBe('user:email');
    expect(authorize.searchParams.get('login')).toBe(login);
    const state = authorize.searchParams.get('state');
    expect(state).toMatch(/.{8,}/);

    const granted = await client.fetch(authorize.toString());
    expect(granted.status).toBe(302);
    const callback = new URL(granted.headers.get('location')!);
    expect(`${callback.origin}${callback.pathname}`).toBe(`${server.url}/auth/github/callback`);
    expect(callback.searchParams.get('state')).toBe(state);
    expect(callback.searchParams.get('code')).toMatch(/^[0-9a-f]{40}$/);

    const landed = await client.fetch(callback.toString());
    expect(landed.status).toBe(302);
    expect(landed.headers.get('location')).toBe('/notebooks');
    const cookie = landed.headers.getSetCookie().find((line) => line.startsWith(`${SESSION_COOKIE}=`));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);

    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(MeSchema.parse(me.body)).toMatchObject({ login, email: `${login}@example.com`, siteRole: 'member' });

    // The code is single-use: replaying the callback does not sign anyone in.
    const replay = await new Client(server.url).fetch(callback.toString());
    expect(replay.status).toBeGreaterThanOrEqual(400);
  });

  it('takes a new identity typed on the authorize page, with its e-mail', async () => {
    const client = new Client(server.url);
    const start = await client.fetch('/auth/github');
    const authorize = new URL(start.headers.get('location')!);
    const page = await client.fetch(authorize.toString());
    const html = await page.text();
    expect(page.status).toBe(200);
    expect(html).toContain('mara.lindqvist');
    expect(html).toContain('name="email"');

    const login = uniqueLogin('typed');
    const form = new URLSearchParams({
      client_id: authorize.searchParams.get('client_id')!,
      redirect_uri: authorize.searchParams.get('redirect_uri')!,
      state: authorize.searchParams.get('state')!,
      scope: authorize.searchParams.get('scope')!,
      login,
      name: 'Typed Person',
      email: `${login}@lab.example.com`,
    });
    const granted = await client.fetch(`${server.standin.url}/login/oauth/authorize`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: form.toString(),
    });
    expect(granted.status).toBe(302);
    const landed = await client.fetch(granted.headers.get('location')!);
    expect(landed.headers.get('location')).toBe('/notebooks');
    const me = await client.get('/api/me');
    expect(me.body).toMatchObject({ login, name: 'Typed Person', email: `${login}@lab.example.com` });
  });

  it('makes the logins in ADMIN_LOGINS site admins', async () => {
    const admin = await signedIn(server.url, 'mara.lindqvist');
    expect((await admin.get('/api/me')).body).toMatchObject({ login: 'mara.lindqvist', siteRole: 'admin' });
  });

  it('returns to the path asked for, and never to another site', async () => {
    const login = uniqueLogin();
    const client = new Client(server.url);
    let url = `${server.url}/auth/github?login=${login}&returnTo=${encodeURIComponent('/notebooks/abcdefghijkl')}`;
    let response = await client.fetch(url);
    while (response.status === 302 && !response.headers.get('location')!.startsWith('/notebooks')) {
      url = new URL(response.headers.get('location')!, url).toString();
      response = await client.fetch(url);
    }
    expect(response.headers.get('location')).toBe('/notebooks/abcdefghijkl');

    const offsite = await client.fetch(`/auth/github?login=${login}&returnTo=${encodeURIComponent('//evil.example.com/')}`);
    expect(offsite.status).toBe(400);
  });

  it('has the stand-in send codes only to the callback registered for the client, as GitHub does', async () => {
    const authorize = (standinUrl: string, redirectUri: string) =>
      fetch(
        `${standinUrl}/login/oauth/authorize?${new URLSearchParams({ client_id: standinClient.id, redirect_uri: redirectUri, state: 's', login: 'someone' })}`,
        { redirect: 'manual' },
      );
    // Unregistered (the local default): the API's callback path on loopback only.
    for (const elsewhere of ['http://attacker.example/auth/github/callback', `${server.url}/somewhere/else`]) {
      const refused = await authorize(server.standin.url, elsewhere);
      expect(refused.status, elsewhere).toBe(400);
      expect(await refused.text()).toContain('redirect_uri is not the callback URL registered');
    }
    expect((await authorize(server.standin.url, `${server.url}/auth/github/callback`)).status).toBe(302);

    const registered = await createOAuthStandin({ clients: [{ ...standinClient, callbackUrl: 'https://rolloff.example/auth/github/callback' }] });
    try {
      expect((await authorize(registered.url, 'https://rolloff.example/auth/github/callback')).status).toBe(302);
      expect((await authorize(registered.url, 'https://rolloff.example/auth/github/callback/more')).status).toBe(302);
      for (const elsewhere of [
        'https://rolloff.example:8443/auth/github/callback',
        'http://rolloff.example/auth/github/callback',
        'https://rolloff.example/auth/other',
      ]) {
        expect((await authorize(registered.url, elsewhere)).status, elsewhere).toBe(400);
      }
    } finally {
      await registered.close();
    }
  });

  it('refuses a callback whose state it did not issue', async () => {
    const client = new Client(server.url);
    await client.fetch('/auth/github?login=someone');
    const forged = await client.fetch('/auth/github/callback?code=0123&state=not-the-state');
    expect(forged.status).toBe(401);
    expect((await client.get('/api/me')).status).toBe(401);
  });

  it("keeps the sign-in start's state in a cookie of its own, Secure only as PUBLIC_URL says (test/secure-cookies.test.ts)", async () => {
    const client = new Client(server.url);
    const start = await client.fetch('/auth/github?login=someone', { headers: { 'x-forwarded-proto': 'https' } });
    const cookies = start.headers.getSetCookie().filter((line) => !line.startsWith(`${CSRF_COOKIE}=`));
    // The OAuth state travels in a cookie of its own; the start makes no session.
    expect(cookies.map((line) => line.split('=')[0])).toEqual(['rolloff_oauth_state']);
    // No PUBLIC_URL here: a request that came over HTTPS does not make it Secure.
    expect(cookies[0]).not.toMatch(/Secure/i);
  });

  it('signs out with POST /auth/logout, which ends the stored session', async () => {
    const user = await buildUser();
    const client = await signedIn(server.url, user.login);
    const db = await connect();
    expect(await db.getRepository(Session).countBy({ userId: user.id })).toBe(1);

    const refused = await client.post('/auth/logout', undefined, { noCsrf: true });
    expect(refused.status).toBe(403);
    expect((await client.get('/api/me')).status).toBe(200);

    const out = await client.post('/auth/logout');
    expect(out.status).toBe(204);
    expect((await client.get('/api/me')).status).toBe(401);
    expect(await db.getRepository(Session).countBy({ userId: user.id })).toBe(0);
  });

  it('a disabled user is signed out at once and cannot sign in again until enabled', async () => {
    const user = await buildUser();
    const client = await signedIn(server.url, user.login);
    const second = await signedIn(server.url, user.login);
    const admin = await signedIn(server.url, 'mara.lindqvist');
    const db = await connect();
    expect(await db.getRepository(Session).countBy({ userId: user.id })).toBe(2);

    const disabled = await admin.patch(`/api/admin/users/${user.id}`, { disabled: true });
    expect(disabled.status).toBe(200);
    expect(disabled.body).toMatchObject({ id: user.id, disabled: true });
    expect(await db.getRepository(Session).countBy({ userId: user.id })).toBe(0);
    expect((await client.get('/api/me')).status).toBe(401);
    expect((await second.get('/api/notebooks')).status).toBe(401);

    const again = await new Client(server.url).signIn(user.login);
    const last = again.landing;
    expect(last.status).toBe(403);
    expect(await last.text()).toContain('disabled');

    // A session that outlived the delete (say, written back by a request in flight) is refused too.
    await db.getRepository(User).update({ id: user.id }, { disabled: false });
    const late = await signedIn(server.url, user.login);
    await db.getRepository(User).update({ id: user.id }, { disabled: true });
    expect((await late.get('/api/me')).status).toBe(401);

    expect((await admin.patch(`/api/admin/users/${user.id}`, { disabled: false })).status).toBe(200);
    const back = await signedIn(server.url, user.login);
    expect((await back.get('/api/me')).body).toMatchObject({ login: user.login });
  });
});
