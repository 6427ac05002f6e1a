/**
 * The Secure flag of every cookie follows PUBLIC_URL (https: Secure), never the request; a
 * proxy's X-Forwarded-Proto counts only from a proxy TRUST_PROXY names.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { authConfig } from '../src/config.js';
import { SESSION_COOKIE } from '../src/contract/common.js';
import { disconnect } from '../src/db/connection.js';
import { Client } from './client.js';
import { buildUser } from './factories.js';
import { startTestServer } from './http.js';
import type { TestServer } from './http.js';

/** The address people open behind the proxy: on loopback, so the OAuth stand-in sends codes there. */
const publicUrl = 'https://localhost';

/**
 * Signs in as if through a proxy in front of `server`: every hop to the app (at its own address
 * or at PUBLIC_URL's) goes to the server over plain HTTP with the proxy's `forwarded` headers.
 * Returns the Set-Cookie lines the app sent and whether it ended signed in.
 */
async function signInThroughProxy(server: TestServer, login: string, forwarded: Record<string, string>) {
  const client = new Client(server.url);
  const app = new URL(server.url);
  const setCookies: string[] = [];
  let url = new URL(`/auth/github?login=${encodeURIComponent(login)}`, server.url);
  for (let hop = 0; hop < 6 && url.pathname !== '/notebooks'; hop++) {
    const toApp = url.hostname === 'localhost' || url.host === app.host;
    const target = toApp ? new URL(`${url.pathname}${url.search}`, server.url) : url;
    const response = await client.fetch(target.toString(), { headers: toApp ? forwarded : {} });
    if (toApp) setCookies.push(...response.headers.getSetCookie());
    const location = response.headers.get('location');
    await response.arrayBuffer();
    if (!location) break;
    url = new URL(location, url);
  }
  const me = await client.get('/api/me');
  return { setCookies, signedIn: me.status === 200 };
}

const named = (lines: string[], name: string) => lines.filter((line) => line.startsWith(`${name}=`));

describe('the Secure cookie flag', () => {
  let plain: TestServer;
  let https: TestServer;
  let untrusted: TestServer;
  beforeAll(async () => {
    plain = await startTestServer();
    https = await startTestServer({ auth: { publicUrl } });
    untrusted = await startTestServer({ auth: { publicUrl, trustProxy: false } });
  });
  afterAll(async () => {
    await plain.close();
    await https.close();
    await untrusted.close();
    await disconnect();
  });

  it('is off without an https PUBLIC_URL, even when a trusted proxy says the request came over https', async () => {
    const { setCookies, signedIn } = await signInThroughProxy(plain, (await buildUser()).login, { 'x-forwarded-proto': 'https' });
    expect(signedIn).toBe(true);
    expect(named(setCookies, SESSION_COOKIE)).not.toEqual([]);
    expect(setCookies.length).toBeGreaterThanOrEqual(3);
    expect(setCookies.filter((line) => /;\s*Secure/i.test(line))).toEqual([]);
  });

  it('is on for every cookie with an https PUBLIC_URL behind the trusted proxy', async () => {
    const { setCookies, signedIn } = await signInThroughProxy(https, (await buildUser()).login, { 'x-forwarded-proto': 'https' });
    expect(signedIn).toBe(true);
    expect(named(setCookies, SESSION_COOKIE)).not.toEqual([]);
    expect(setCookies.filter((line) => !/;\s*Secure/i.test(line) && !/max-age=0|expires=Thu, 01 Jan 1970/i.test(line))).toEqual([]);
  });

  it('is on even for a plain request, and a proxy TRUST_PROXY does not name cannot make a request look https', async () => {
    const { setCookies, signedIn } = await signInThroughProxy(untrusted, (await buildUser()).login, { 'x-forwarded-proto': 'https' });
    // The session cookie is Secure, so it is not sent back over what the app sees as plain HTTP.
    expect(named(setCookies, SESSION_COOKIE)).toEqual([]);
    expect(signedIn).toBe(false);
    expect(named(setCookies, 'rolloff_csrf').every((line) => /;\s*Secure/i.test(line))).toBe(true);
    expect(named(setCookies, 'rolloff_csrf')).not.toEqual([]);
  });

  it('reads TRUST_PROXY as Express’s trust proxy setting', () => {
    expect(authConfig({}).trustProxy).toBe('loopback');
    expect(authConfig({ TRUST_PROXY: 'false' }).trustProxy).toBe(false);
    expect(authConfig({ TRUST_PROXY: '2' }).trustProxy).toBe(2);
    expect(authConfig({ TRUST_PROXY: '10.0.0.0/8, 192.168.1.4' }).trustProxy).toBe('10.0.0.0/8, 192.168.1.4');
  });
});
