import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '../contract/common.js';
import type { RateLimitConfig } from '../config.js';
import { connect, disconnect } from '../db/connection.js';
import { createDataSource } from '../db/data-source.js';
import { Client, signedIn } from '../../test/client.js';
import type { Reply } from '../../test/client.js';
import { buildUser } from '../../test/factories.js';
import { startTestServer } from '../../test/http.js';
import type { TestServer } from '../../test/http.js';
import { MariaDbStore } from './store.js';

const minute = 60_000;
/** Low limits for these tests only; every other test server keeps the generous defaults. */
const low: RateLimitConfig = {
  signIn: { windowMs: minute, perAddress: 6, perUser: 0 },
  writes: { windowMs: minute, perAddress: 20, perUser: 4 },
  reads: { windowMs: minute, perAddress: 20, perUser: 3 },
};

/** Asserts a 429 in the API's error shape with a Retry-After within the window. */
function expectLimited(reply: Reply, what: RegExp): void {
  expect(reply.status).toBe(429);
  const retryAfter = Number(reply.headers.get('retry-after'));
  expect(retryAfter).toBeGreaterThanOrEqual(1);
  expect(retryAfter).toBeLessThanOrEqual(60);
  const body = ErrorBodySchema.parse(reply.body);
  expect(body).toMatchObject({ error: 'rate_limited', details: { retryAfterSeconds: retryAfter } });
  expect(body.message).toMatch(what);
  expect(body.message).toContain(`Try again in ${retryAfter} s.`);
}

describe('rate limits', () => {
  let first: TestServer;
  let second: TestServer;
  beforeAll(async () => {
    // Two app instances on one database, as two server processes would be.
    first = await startTestServer({ rateLimits: low });
    second = await startTestServer({ rateLimits: { ...low, signIn: { ...low.signIn, perAddress: 50 } } });
  });
  beforeEach(async () => {
    // Every client here is 127.0.0.1: start each test from no hits, whatever ran before.
    await (await connect()).query('DELETE FROM rate_limits');
  });
  afterAll(async () => {
    await first.close();
    await second.close();
    await disconnect();
  });

  it('answer a burst of sign-in starts and callbacks from one address with 429 and Retry-After', async () => {
    const visitor = new Client(first.url);
    const starts: number[] = [];
    for (let i = 0; i < low.signIn.perAddress; i++) starts.push((await visitor.get('/auth/github')).status);
    expect(starts.every((status) => status === 302)).toBe(true);
    expectLimited(await visitor.get('/auth/github'), /^Too many sign-in attempts from your address: at most 6 a minute\./);
    // Callbacks count with starts.
    expectLimited(await new Client(first.url).get('/auth/github/callback?code=made-up&state=made-up'), /sign-in attempts/);
  });

  it('count one user’s writes across both instances, and leave another user alone', async () => {
    const [busy, other] = [await buildUser(), await buildUser()];
    const onFirst = await signedIn(first.url, busy.login);
    const onSecond = await signedIn(second.url, busy.login);
    const change = (client: Client) => client.patch('/api/me/settings', { mail: { pinReplies: false } });
    const statuses: number[] = [];
    for (let i = 0; i < low.writes.perUser; i++) statuses.push((await change(i % 2 === 0 ? onFirst : onSecond)).status);
    // Two each: either instance alone would allow four.
    expect(statuses).toEqual([200, 200, 200, 200]);
    expectLimited(await change(onFirst), /^Too many changes from your account: at most 4 a minute\./);
    expectLimited(await change(onSecond), /changes from your account/);
    // Reads are counted apart from writes.
    expect((await onFirst.get('/api/me/settings')).status).toBe(200);

    const otherClient = await signedIn(second.url, other.login);
    expect((await change(otherClient)).status).toBe(200);
  });

  it('limit reads of notebooks per user', async () => {
    const reader = await signedIn(first.url, (await buildUser()).login);
    for (let i = 0; i < low.reads.perUser; i++) expect((await reader.get('/api/notebooks')).status).toBe(200);
    expectLimited(await reader.get('/api/notebooks'), /^Too many reads of notebooks and people from your account/);
    // What is not an expensive read is not counted.
    expect((await reader.get('/api/me')).status).toBe(200);
  });

  it('count in windows: a window that is over starts again from one hit', async () => {
    const store = new MariaDbStore('test-window', connect);
    store.init({ windowMs: 300 } as Parameters<MariaDbStore['init']>[0]);
    await store.resetKey('ip:192.0.2.1');
    expect((await store.increment('ip:192.0.2.1')).totalHits).toBe(1);
    const second = await store.increment('ip:192.0.2.1');
    expect(second.totalHits).toBe(2);
    expect(second.resetTime!.getTime()).toBeGreaterThan(Date.now());
    await store.decrement('ip:192.0.2.1');
    expect((await store.get('ip:192.0.2.1'))?.totalHits).toBe(1);
    await new Promise((resolve) => setTimeout(resolve, 350));
    expect((await store.increment('ip:192.0.2.1')).totalHits).toBe(1);
    expect(await store.get('ip:192.0.2.2')).toBeUndefined();
  });

  it('count every hit once when two processes hit at the same moment', async () => {
    const other = createDataSource();
    await other.initialize();
    const options = { windowMs: minute } as Parameters<MariaDbStore['init']>[0];
    const stores = [new MariaDbStore('test-race', connect), new MariaDbStore('test-race', async () => other)];
    stores.forEach((store) => store.init(options));
    const hits = await Promise.all(Array.from({ length: 40 }, (_, i) => stores[i % 2]!.increment('user:1')));
    await other.destroy();
    // Each hit saw its own count: none lost, none counted twice.
    expect(hits.map((hit) => hit.totalHits).toSorted((a, b) => a - b)).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
  });
});
