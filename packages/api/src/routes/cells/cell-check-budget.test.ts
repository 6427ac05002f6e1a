/**
 * The server's check of a saved circuit runs in a worker-thread pool within a budget: a small
 * cell of nested blocks that expands to hundreds of thousands of parts is refused with 413 and
 * words saying what was too big and what to do, nothing saved changes, and everyone else's
 * requests go on meanwhile.
 */
import { DEFAULT_MAX_PARTS } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import type { CellSaved } from '../../contract/cells.js';
import type { ErrorBody } from '../../contract/common.js';
import type { Notebook } from '../../contract/notebooks.js';
import { signedIn } from '../../../test/client.js';
import type { Client } from '../../../test/client.js';
import { buildNotebook, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';
import type { RunningServer } from '../../../test/use-test-server.js';

/**
 * Blocks using blocks: `b0` holds 7 resistors and each of 8 levels uses the level below 4
 * times, so about 1 kB of text expands to 7 × 4⁸ = 458 752 parts.
 */
function nestedBlocks(levels = 8, uses = 4, baseParts = 7): string {
  const lines = ['block b0 [i o]'];
  for (let part = 1; part <= baseParts; part++) lines.push(`  R${part} [i o] 1k`);
  lines.push('end');
  for (let level = 1; level <= levels; level++) {
    lines.push(`block b${level} [i o]`);
    for (let use = 1; use <= uses; use++) lines.push(`  use b${level - 1} as B${use} [i o]`);
    lines.push('end');
  }
  lines.push('drive in', `use b${levels} as B1 [in out]`, 'R1 [out gnd] 1k', 'show out', '');
  return lines.join('\n');
}

async function ownNotebook(server: RunningServer) {
  const notebook = await buildNotebook({
    cells: [
      { kind: 'circuit', text: rcLowPass },
      { kind: 'note', text: 'Notes.' },
    ],
  });
  const client = await signedIn(server.url, notebook.ownerUser.login);
  return { notebook, client, cellUrl: `/api/notebooks/${notebook.id}/cells/${notebook.cells[0]!.id}` };
}

async function currentRevision(client: Client, notebookId: string, cellId: number) {
  const body = (await client.get<Notebook>(`/api/notebooks/${notebookId}`)).body;
  const cell = body.cells.find((c) => c.id === cellId)!;
  return { revision: cell.revision, text: cell.text };
}

describe('the server’s part budget', () => {
  const server = useTestServer();

  it('refuses a cell whose blocks expand past it with 413, and changes nothing saved', async () => {
    const { notebook, client, cellUrl } = await ownNotebook(server);
    const before = await currentRevision(client, notebook.id, notebook.cells[0]!.id);

    const refused = await client.put<ErrorBody>(cellUrl, { text: nestedBlocks(), baseRevision: 1 });
    expect(refused.status).toBe(413);
    expect(refused.body.error).toBe('too_large');
    expect(refused.body.message).toMatch(/more than 20,000 parts once its blocks are expanded/);
    expect(refused.body.message).toMatch(/Nothing was saved: split the network into smaller cells or use fewer block instances/);
    expect(refused.body.details).toEqual({ budget: 'parts', limit: 20_000 });
    expect(await currentRevision(client, notebook.id, notebook.cells[0]!.id)).toEqual(before);

    const added = await client.post<ErrorBody>(`/api/notebooks/${notebook.id}/cells`, { kind: 'circuit', text: nestedBlocks() });
    expect(added.status).toBe(413);
    const created = await client.post<ErrorBody>('/api/notebooks', { title: 'Too deep', cells: [{ kind: 'circuit', text: nestedBlocks() }] });
    expect(created.status).toBe(413);
    expect((await client.get<Notebook>(`/api/notebooks/${notebook.id}`)).body.cells).toHaveLength(2);
  });

  it('still checks and saves a normal cell, and a nested one within the budget', async () => {
    const { client, cellUrl } = await ownNotebook(server);
    const saved = await client.put<CellSaved>(cellUrl, { text: `${rcLowPass}# a second look\n`, baseRevision: 1 });
    expect(saved.status).toBe(201);
    expect(saved.body.diagnostics).toEqual({ errors: 0, warnings: 0 });
    // 7 × 4³ = 448 parts.
    const small = await client.put<CellSaved>(cellUrl, { text: nestedBlocks(3), baseRevision: 2 });
    expect(small.status).toBe(201);
    expect(small.body.diagnostics).toEqual({ errors: 0, warnings: 0 });
  });
});

describe('the server’s time budget', () => {
  // The part cap of a designer's browser, so that only the time budget stops the big cell;
  // one thread, so that the next check runs only if the timed-out thread was replaced.
  const server = useTestServer({ cellCheck: { maxParts: DEFAULT_MAX_PARTS, timeMs: 1_000, threads: 1 } });

  it('refuses a check that runs over it with 413 while other requests answer first', async () => {
    const { notebook, client, cellUrl } = await ownNotebook(server);
    const other = await ownNotebook(server);
    const finished: string[] = [];
    const track = <T>(name: string, request: Promise<T>) => request.then((reply) => (finished.push(name), reply));

    const slow = track('slow save', client.put<ErrorBody>(cellUrl, { text: nestedBlocks(), baseRevision: 1 }));
    const others = await Promise.all([
      track('notebook read', other.client.get(`/api/notebooks/${other.notebook.id}`)),
      track(
        'note save',
        other.client.put(`/api/notebooks/${other.notebook.id}/cells/${other.notebook.cells[1]!.id}`, { text: 'More notes.', baseRevision: 1 }),
      ),
      track('notebook list', client.get('/api/notebooks')),
    ]);
    const refused = await slow;

    expect(others.map((reply) => reply.status)).toEqual([200, 201, 200]);
    expect(finished.at(-1)).toBe('slow save');
    expect(refused.status).toBe(413);
    expect(refused.body.message).toMatch(
      /Checking this circuit took longer than the 1 s the server allows a save\. Nothing was saved: make the network smaller/,
    );
    expect(refused.body.details).toEqual({ budget: 'time', limit: 1_000 });
    expect((await currentRevision(client, notebook.id, notebook.cells[0]!.id)).revision).toBe(1);

    // The thread that ran over was terminated and replaced: the next check runs at once.
    const next = await client.put<CellSaved>(cellUrl, { text: `${rcLowPass}# after the refusal\n`, baseRevision: 1 });
    expect(next.status).toBe(201);
    expect(next.body.diagnostics).toEqual({ errors: 0, warnings: 0 });
  });
});
