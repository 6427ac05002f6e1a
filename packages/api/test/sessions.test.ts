import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { TOUCH_EVERY_MS } from '../src/auth/session-store.js';
import { SESSION_COOKIE } from '../src/contract/common.js';
import { connect } from '../src/db/connection.js';
import { errorMiddleware } from '../src/errors.js';
import { Client, signedIn } from './client.js';
import { buildUser } from './factories.js';
import { useTestServer } from './use-test-server.js';

/** The session id inside the signed session cookie (`s:<id>.<signature>`). */
function sessionIdOf(client: Client): string {
  const cookie = client.jar.get(SESSION_COOKIE);
  if (!cookie) throw new Error('no session cookie');
  return cookie.slice(2, cookie.lastIndexOf('.'));
}

async function expiryOf(sid: string): Promise<number> {
  const [row]: { expiresAt: Date }[] = await (await connect()).query('SELECT expiresAt FROM sessions WHERE id = ?', [sid]);
  return row!.expiresAt.getTime();
}

async function setExpiry(sid: string, at: number): Promise<void> {
  await (await connect()).query('UPDATE sessions SET expiresAt = ? WHERE id = ?', [new Date(at), sid]);
}

describe('sessions', () => {
  const server = useTestServer();

  it('are written again by a read only once their expiry would move by minutes', async () => {
    const client = await signedIn(server.url, (await buildUser()).login);
    const sid = sessionIdOf(client);
    const twoWeeks = (await expiryOf(sid)) - Date.now();

    // Written a minute ago: a read leaves the row alone.
    const recent = Date.now() + twoWeeks - 60_000;
    await setExpiry(sid, recent);
    expect((await client.get('/api/me')).status).toBe(200);
    expect(await expiryOf(sid)).toBe(recent);

    // Written longer ago than TOUCH_EVERY_MS: the read moves the expiry on.
    const older = Date.now() + twoWeeks - 2 * TOUCH_EVERY_MS;
    await setExpiry(sid, older);
    expect((await client.get('/api/me')).status).toBe(200);
    expect(await expiryOf(sid)).toBeGreaterThan(older + TOUCH_EVERY_MS);
  });

  it('are not made for a visit to the sign-in start that does not finish', async () => {
    const visitor = new Client(server.url);
    const start = await visitor.fetch('/auth/github?returnTo=/notebooks');
    expect(start.status).toBe(302);
    expect(visitor.jar.get(SESSION_COOKIE)).toBeUndefined();
  });
});

describe('the error handler, for an error after the answer went out', () => {
  afterEach(() => vi.restoreAllMocks());

  it('logs it and leaves the finished answer and its connection alone', async () => {
    const logged = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const app = express();
    app.get('/late', (_req, res, next) => {
      res.json({ ok: true });
      next(new Error('a session write failed after the answer'));
    });
    app.get('/next', (_req, res) => {
      res.json({ ok: true });
    });
    app.use(errorMiddleware);
    const server = app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const get = (path: string) =>
      new Promise<{ status: number; body: string; reused: boolean }>((resolve, reject) => {
        const request = http.get({ host: '127.0.0.1', port: (server.address() as AddressInfo).port, path, agent }, (response) => {
          let body = '';
          response.on('data', (chunk: Buffer) => (body += chunk.toString()));
          response.on('end', () => resolve({ status: response.statusCode ?? 0, body, reused: request.reusedSocket }));
        });
        request.on('error', reject);
      });
    try {
      expect(await get('/late')).toMatchObject({ status: 200, body: '{"ok":true}' });
      await new Promise((resolve) => setTimeout(resolve, 50));
      // The same connection answers the next request: it was not dropped.
      expect(await get('/next')).toMatchObject({ status: 200, reused: true });
      expect(logged).toHaveBeenCalledWith(expect.objectContaining({ message: 'a session write failed after the answer' }));
      expect(logged.mock.calls.flat().some((e) => (e as { code?: string })?.code === 'ERR_HTTP_HEADERS_SENT')).toBe(false);
    } finally {
      agent.destroy();
      await new Promise((resolve) => server.close(resolve));
    }
  });
});
