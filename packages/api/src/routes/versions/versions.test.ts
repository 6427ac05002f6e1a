import { describe, expect, it } from 'vitest';
import { VersionListSchema, VersionSchema } from '../../contract/versions.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/notebooks/:id/versions', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const anonymous = new Client(server.url);
    expect((await anonymous.get(`/api/notebooks/${notebook.id}/versions`)).status).toBe(401);
    expect((await anonymous.post(`/api/notebooks/${notebook.id}/versions`, { label: 'x' })).status).toBe(401);
    expect((await anonymous.get(`/api/notebooks/${notebook.id}/versions/1`)).status).toBe(401);
  });

  it('snapshots every live cell at its current revision, and keeps the snapshot as cells change', async () => {
    const reviewer = await buildUser();
    const notebook = await buildNotebook({ members: [[reviewer, 'reviewer']] });
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const [note, circuit] = notebook.cells;
    const edited = `${rcLowPass}# C1 raised for margin\n`;
    await client.put(`/api/notebooks/${notebook.id}/cells/${circuit!.id}`, { text: edited, baseRevision: 1 });

    const made = await client.post(`/api/notebooks/${notebook.id}/versions`, { label: '  For review  ' });
    expect(made.status).toBe(201);
    const version = VersionSchema.parse(made.body);
    expect(version).toMatchObject({ number: 1, label: 'For review', cellCount: 2, notebookId: notebook.id });
    expect(version.cells.map((c) => [c.cellId, c.revision, c.text])).toEqual([
      [note!.id, 1, note!.text],
      [circuit!.id, 2, edited],
    ]);

    // Later edits, a deletion and a new cell leave version 1 as it was.
    await client.put(`/api/notebooks/${notebook.id}/cells/${circuit!.id}`, { text: rcLowPass, baseRevision: 2 });
    await client.delete(`/api/notebooks/${notebook.id}/cells/${note!.id}`);
    await client.post(`/api/notebooks/${notebook.id}/cells`, { kind: 'note', text: 'after the version' });
    const second = VersionSchema.parse((await client.post(`/api/notebooks/${notebook.id}/versions`, { label: 'Second' })).body);
    expect(second.number).toBe(2);
    expect(second.cells.map((c) => c.revision)).toEqual([3, 1]);

    const reader = await signedIn(server.url, reviewer.login);
    const again = VersionSchema.parse((await reader.get(`/api/notebooks/${notebook.id}/versions/1`)).body);
    expect(again.cells).toEqual(version.cells);
    const list = VersionListSchema.parse((await reader.get(`/api/notebooks/${notebook.id}/versions`)).body);
    expect(list.items.map((v) => [v.number, v.label])).toEqual([
      [2, 'Second'],
      [1, 'For review'],
    ]);
    expect((await reader.post(`/api/notebooks/${notebook.id}/versions`, { label: 'mine' })).status).toBe(403);
    expect((await reader.get(`/api/notebooks/${notebook.id}/versions/3`)).status).toBe(404);
  });

  it('needs a label', async () => {
    const notebook = await buildNotebook();
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const reply = await client.post(`/api/notebooks/${notebook.id}/versions`, { label: '   ' });
    expect(reply.status).toBe(400);
    expect((reply.body as { message: string }).message).toMatch(/^label: /);
  });
});
