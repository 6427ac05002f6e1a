/**
 * What every web benchmark needs from the server: where it is, a signed-in page (through the
 * local sign-in stand-in, as a demo user), a notebook of its own, and a line describing the
 * machine, so figures are read with their conditions.
 *
 * The server: BENCH_BASE_URL, else `npm start`'s on 127.0.0.1:4410. The root `npm run bench`
 * starts a private one (scripts/bench.mjs) and sets BENCH_BASE_URL. A server signing in with
 * real GitHub cannot be used.
 */
import os from 'node:os';
import type { Page } from 'playwright-core';
import { fetchFromPage } from '../e2e/helpers';

export const baseUrl = process.env.BENCH_BASE_URL ?? 'http://127.0.0.1:4410';
// A demo user (packages/api/src/seed/demo-users.ts).
const login = 'tobias.okafor';

export async function requireServer(): Promise<void> {
  const hint = 'Run `npm start` in another terminal, set BENCH_BASE_URL, or run `npm run bench` at the project root (it starts its own server).';
  try {
    const response = await fetch(`${baseUrl}/api/health`);
    if (!response.ok) throw new Error(`status ${response.status}`);
  } catch (error) {
    throw new Error(`No Rolloff server answers at ${baseUrl} (${(error as Error).message}). ${hint}`);
  }
}

export async function signIn(page: Page): Promise<void> {
  await page.goto(`${baseUrl}/auth/github?login=${encodeURIComponent(login)}`);
  await page.waitForURL(/\/notebooks/, { timeout: 30_000 });
}

/** A notebook with one circuit cell; returns its id. */
export async function createNotebook(page: Page, title: string, text: string): Promise<string> {
  const { status, body } = await fetchFromPage(page, '/api/notebooks', { method: 'POST', body: { title, cells: [{ kind: 'circuit', text }] } });
  if (status !== 201 && status !== 200) throw new Error(`Creating the benchmark notebook answered ${status}: ${JSON.stringify(body)}`);
  return (body as { id: string }).id;
}

export async function deleteNotebook(page: Page, id: string): Promise<void> {
  await fetchFromPage(page, `/api/notebooks/${id}`, { method: 'DELETE' });
}

/** The machine and its load now, for the line under a table of figures. */
export function machineLine(): string {
  const load = os
    .loadavg()
    .map((l) => l.toFixed(1))
    .join(' ');
  return `${os.cpus().length} × ${os.cpus()[0]?.model ?? 'unknown CPU'}, Node.js ${process.versions.node}, load average ${load}, ${new Date().toISOString()}`;
}

export const ms = (value: number | null) => (value === null ? '–' : `${Math.round(value)} ms`);

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}
