import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import http from 'node:http';
import net from 'node:net';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import type { CellSaved } from '../src/contract/cells.js';
import type { Notebook } from '../src/contract/notebooks.js';
import type { Me } from '../src/contract/users.js';
import { createOAuthStandin } from '../src/standins/oauth/standin.js';
import type { OAuthStandin } from '../src/standins/oauth/standin.js';
import { WORKER_HEADER } from '../src/worker-header.js';
import { Client } from './client.js';
import { buildNotebook, buildUser, rcLowPass } from './factories.js';
import { isolatedPort } from './ports.js';

/**
 * A client that opens a new connection for every request, as many browsers behind a proxy
 * do, so the cluster's primary hands successive requests to different workers; it notes
 * which worker answered each one.
 */
class FreshConnectionClient extends Client {
  readonly workers: string[] = [];

  override async fetch(url: string, init: RequestInit = {}): Promise<Response> {
    const target = new URL(url, this.baseUrl);
    const headers = Object.fromEntries(new Headers(init.headers));
    if (target.hostname === '127.0.0.1' && this.jar.header()) headers.cookie = this.jar.header();
    const reply = await new Promise<{ status: number; headers: Headers; body: Buffer }>((resolve, reject) => {
      const request = http.request(target, { method: init.method ?? 'GET', headers, agent: false }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => {
          const replyHeaders = new Headers();
          for (const [name, value] of Object.entries(res.headers)) {
            for (const one of Array.isArray(value) ? value : [value ?? '']) replyHeaders.append(name, one);
          }
          resolve({ status: res.statusCode ?? 0, headers: replyHeaders, body: Buffer.concat(chunks) });
        });
      });
      request.setTimeout(10_000, () => request.destroy(new Error(`${init.method ?? 'GET'} ${target.pathname} got no answer within 10 s`)));
      request.on('error', reject);
      request.end(typeof init.body === 'string' ? init.body : undefined);
    });
    this.jar.store(reply.headers);
    const worker = reply.headers.get(WORKER_HEADER);
    if (worker) this.workers.push(worker);
    return new Response(reply.status === 204 || reply.status === 304 ? null : reply.body, { status: reply.status, headers: reply.headers });
  }
}

async function waitForHealth(base: string): Promise<void> {
  // Each worker compiles the sources as it starts (tsx), which takes a while on a busy machine.
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    const status = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(2000) })
      .then((r) => r.status)
      .catch(() => 0);
    if (status === 200) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${base} never became healthy`);
}

/** The workers that answer `rounds` health checks, each on its own connection. */
async function workersAnswering(client: FreshConnectionClient, rounds: number): Promise<Set<string>> {
  const before = client.workers.length;
  for (let i = 0; i < rounds; i++) await client.get('/api/health');
  return new Set(client.workers.slice(before));
}

/** The primary, as `npm start` runs it, on the test database. */
function startPrimary(settings: Record<string, string>): ChildProcess {
  // Vitest's own IPC channel (this file runs in a forked process) is not the primary's.
  const { NODE_CHANNEL_FD: _fd, NODE_CHANNEL_SERIALIZATION_MODE: _mode, ...env } = process.env;
  return spawn(process.execPath, ['--import', 'tsx', fileURLToPath(new URL('../src/cluster.ts', import.meta.url))], {
    // No secret of its own: the primary gives its workers one to share.
    env: { ...env, SESSION_SECRET: '', NODE_ENV: 'test', ...settings },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
}

const exited = (child: ChildProcess) =>
  new Promise<number | null>((resolve) => (child.exitCode !== null ? resolve(child.exitCode) : child.once('exit', (code) => resolve(code))));

describe('the server as several processes (cluster.ts)', () => {
  let primary: ChildProcess | undefined;
  let standin: OAuthStandin | undefined;
  afterEach(async () => {
    if (primary && primary.exitCode === null) {
      primary.kill('SIGTERM');
      await exited(primary);
    }
  });
  afterAll(async () => {
    await standin?.close();
  });

  it('signs in, saves and reads with requests spread over both workers, replaces a worker that dies, and stops them all', { timeout: 150_000 }, async () => {
    const apiPort = await isolatedPort();
    standin = await createOAuthStandin();
    primary = startPrimary({ API_PORT: String(apiPort), API_WORKERS: '2', API_WORKER_HEADER: '1', OAUTH_BASE_URL: standin.url });
    let stderr = '';
    primary.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    const base = `http://127.0.0.1:${apiPort}`;
    await waitForHealth(base);

    const owner = await buildUser();
    const notebook = await buildNotebook({ owner, cells: [{ kind: 'circuit', text: rcLowPass }] });
    const cell = notebook.cells[0]!;
    const client = new FreshConnectionClient(base);
    // Both workers must be listening before the spread can be seen.
    for (let i = 0; i < 50 && (await workersAnswering(client, 4)).size < 2; i++) await new Promise((r) => setTimeout(r, 100));

    // The sign-in's state is kept in the session by one request and checked by the next.
    const signInStart = client.workers.length;
    const { hops } = await client.signIn(owner.login);
    expect(new URL(hops.at(-1)!.url).pathname).toBe('/notebooks');
    const me = await client.get<Me>('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.login).toBe(owner.login);
    const signInWorkers = new Set(client.workers.slice(signInStart));

    const savesStart = client.workers.length;
    const cellPath = `/api/notebooks/${notebook.id}/cells/${cell.id}`;
    for (let revision = 1; revision <= 6; revision++) {
      const saved = await client.put<CellSaved>(cellPath, { text: `${rcLowPass}# save ${revision}\n`, baseRevision: revision });
      expect(saved.status).toBe(201);
      expect(saved.body.cell.revision).toBe(revision + 1);
      const read = await client.get<Notebook>(`/api/notebooks/${notebook.id}`);
      expect(read.status).toBe(200);
      expect(read.body.cells[0]!.revision).toBe(revision + 1);
      expect(read.body.cells[0]!.text).toBe(`${rcLowPass}# save ${revision}\n`);
    }
    const saveWorkers = new Set(client.workers.slice(savesStart));
    expect(signInWorkers.size).toBe(2);
    expect(saveWorkers.size).toBe(2);

    // A worker that dies is replaced, and the new one serves too.
    const [victim, survivor] = [...saveWorkers];
    process.kill(Number(victim), 'SIGKILL');
    // Until the primary has seen the death it may hand a new connection to the dead worker,
    // where it would hang: Node's cluster cannot help that, a load balancer's retry can.
    const noticed = `Server worker ${victim} stopped (signal SIGKILL)`;
    for (let i = 0; i < 100 && !stderr.includes(noticed); i++) await new Promise((r) => setTimeout(r, 100));
    expect(stderr).toContain(noticed);
    let now = new Set<string>();
    for (let i = 0; i < 100; i++) {
      now = await workersAnswering(client, 4);
      if (now.size === 2 && !now.has(victim!)) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(now.has(survivor!)).toBe(true);
    expect(now.has(victim!)).toBe(false);
    expect(now.size).toBe(2);
    expect((await client.get<Notebook>(`/api/notebooks/${notebook.id}`)).body.cells[0]!.revision).toBe(7);

    // SIGTERM stops every worker, then the primary, cleanly.
    primary.kill('SIGTERM');
    expect(await exited(primary)).toBe(0);
    for (const pid of now) expect(() => process.kill(Number(pid), 0)).toThrow();
  });

  it('gives up with a clear message when workers die as they start', { timeout: 150_000 }, async () => {
    const taken = net.createServer();
    await new Promise<void>((resolve) => taken.listen(0, '127.0.0.1', resolve));
    const { port } = taken.address() as AddressInfo;
    try {
      primary = startPrimary({ API_PORT: String(port), API_WORKERS: '1' });
      let stderr = '';
      primary.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
      expect(await exited(primary)).toBe(1);
      expect(stderr).toContain(`Port ${port} is already in use`);
      expect(stderr).toMatch(/Server workers keep stopping as they start \(5 times in a row, the last with exit code 1\); giving up/);
    } finally {
      taken.close();
    }
  });
});
