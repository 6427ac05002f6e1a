import { describe, expect, it } from 'vitest';
import { CellSavedSchema, cellName } from '../../contract/cells.js';
import type { CellSaved } from '../../contract/cells.js';
import { NotebookSchema } from '../../contract/notebooks.js';
import { VersionSchema } from '../../contract/versions.js';
import { Client, signedIn } from '../../../test/client.js';
import type { Reply } from '../../../test/client.js';
import { buildNotebook, buildUser } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe("PATCH /api/notebooks/:id/cells/:cellId (a cell's title)", () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    expect((await new Client(server.url).patch(`/api/notebooks/${notebook.id}/cells/${notebook.cells[1]!.id}`, { title: 'Input filter' })).status).toBe(401);
  });

  it('names the cell by the title chosen, everywhere the cell is named, until it is cleared', async () => {
    const viewer = await buildUser();
    const notebook = await buildNotebook({ members: [[viewer, 'viewer']] });
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const path = `/api/notebooks/${notebook.id}/cells/${notebook.cells[1]!.id}`;
    expect(cellName(notebook.cells[1]!)).toBe('Circuit 2');

    const titled = await client.patch<CellSaved>(path, { title: '  Input filter ' });
    expect(titled.status).toBe(200);
    const saved = CellSavedSchema.parse(titled.body);
    expect(saved.cell).toMatchObject({ title: 'Input filter', revision: 1 });
    expect(cellName(saved.cell)).toBe('Input filter');

    // Versions and forks carry the title with the cell.
    await client.post(`/api/notebooks/${notebook.id}/versions`, { label: 'Titled' });
    const version = VersionSchema.parse((await client.get(`/api/notebooks/${notebook.id}/versions/1`)).body);
    expect(version.cells.map((cell) => cellName(cell))).toEqual(['Note 1', 'Input filter']);
    const fork = NotebookSchema.parse((await client.post(`/api/notebooks/${notebook.id}/forks`, {})).body);
    expect(fork.cells.map((cell) => cell.title)).toEqual([null, 'Input filter']);

    // A pin's message names it by its title too.
    const note = await client.post<{ message: string }>(`/api/notebooks/${notebook.id}/pins`, {
      cellId: notebook.cells[0]!.id,
      trace: 'out',
      frequency: 1000,
      body: 'x',
    });
    expect(note.body.message).toMatch(/Note 1 is a note cell/);

    const cleared = CellSavedSchema.parse((await client.patch(path, { title: null })).body);
    expect(cleared.cell.title).toBeNull();
    expect(cellName(cleared.cell)).toBe('Circuit 2');

    for (const body of [{ title: '   ' }, { title: 'x'.repeat(81) }, { title: 'two\nlines' }, {}]) {
      const reply = (await client.patch(path, body)) as Reply<{ error: string }>;
      expect(reply.status, JSON.stringify(body)).toBe(400);
    }
    const reader = await signedIn(server.url, viewer.login);
    expect((await reader.patch(path, { title: 'Mine' })).status).toBe(403);
  });
});
