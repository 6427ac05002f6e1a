import { modernizeCellText } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { CellRevisionListSchema, CellSavedSchema, ConflictSchema } from '../../contract/cells.js';
import type { CellSaved } from '../../contract/cells.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

// An RC low-pass in the language's earlier forms: free-form designators, digit node, 0 as ground.
const oldLowPass = `drive in
Rin [in 1] 1k
Cout [1 0] 100n
show 1
`;

describe('POST /api/notebooks/:id/cells/:cellId/revisions/:number/restore', () => {
  const server = useTestServer();
  const restorePath = (notebookId: string, cellId: number, number: number) => `/api/notebooks/${notebookId}/cells/${cellId}/revisions/${number}/restore`;

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const reply = await new Client(server.url).post(restorePath(notebook.id, notebook.cells[1]!.id, 1), { baseRevision: 1 });
    expect(reply.status).toBe(401);
  });

  it("saves an old circuit revision in today's forms as a new revision, and says so", async () => {
    const notebook = await buildNotebook({ cells: [{ kind: 'circuit', text: oldLowPass }] });
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const cellId = notebook.cells[0]!.id;
    await client.put(`/api/notebooks/${notebook.id}/cells/${cellId}`, { text: rcLowPass, baseRevision: 1 });

    const restored = await client.post<CellSaved>(restorePath(notebook.id, cellId, 1), { baseRevision: 2 });
    expect(restored.status).toBe(201);
    const saved = CellSavedSchema.parse(restored.body);
    expect(saved.cell).toMatchObject({ revision: 3, text: modernizeCellText(oldLowPass).text });
    expect(saved.cell.text).toMatch(/^R1 \[in n1\] 1k$/m);
    expect(saved.cell.text).toMatch(/\[n1 gnd\]/);
    expect(saved.revision).toMatchObject({ number: 3, message: 'restored from revision 1, with the language update', author: { id: notebook.ownerUser.id } });
    expect(saved.diagnostics).toMatchObject({ errors: 0 });

    // History only grows: revision 1 keeps its old text.
    const history = CellRevisionListSchema.parse((await client.get(`/api/notebooks/${notebook.id}/cells/${cellId}/revisions`)).body);
    expect(history.items.map((r) => [r.number, r.message])).toEqual([
      [3, 'restored from revision 1, with the language update'],
      [2, null],
      [1, null],
    ]);
    expect((await client.get<{ text: string }>(`/api/notebooks/${notebook.id}/cells/${cellId}/revisions/1`)).body.text).toBe(oldLowPass);

    // A revision already in today's forms comes back as it was.
    const again = await client.post<CellSaved>(restorePath(notebook.id, cellId, 2), { baseRevision: 3 });
    expect(again.body.cell.text).toBe(rcLowPass);
    expect(again.body.revision.message).toBe('restored from revision 2');
  });

  it('restores a note as it was, and refuses a stale base, a missing revision and a reader', async () => {
    const note = 'Ground is node 0 in the old sketches.';
    const reader = await buildUser();
    const notebook = await buildNotebook({ cells: [{ kind: 'note', text: note }], members: [[reader, 'viewer']] });
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const cellId = notebook.cells[0]!.id;
    await client.put(`/api/notebooks/${notebook.id}/cells/${cellId}`, { text: 'Ground is gnd.', baseRevision: 1 });

    const stale = await client.post(restorePath(notebook.id, cellId, 1), { baseRevision: 1 });
    expect(stale.status).toBe(409);
    expect(ConflictSchema.parse(stale.body).details.current.number).toBe(2);
    expect((await client.post(restorePath(notebook.id, cellId, 9), { baseRevision: 2 })).status).toBe(404);
    expect((await client.post(restorePath(notebook.id, cellId, 1), {})).status).toBe(400);
    const viewer = await signedIn(server.url, reader.login);
    expect((await viewer.post(restorePath(notebook.id, cellId, 1), { baseRevision: 2 })).status).toBe(403);

    const restored = await client.post<CellSaved>(restorePath(notebook.id, cellId, 1), { baseRevision: 2 });
    expect(restored.status).toBe(201);
    expect(restored.body.cell.text).toBe(note);
    expect(restored.body.revision.message).toBe('restored from revision 1');
  });
});
