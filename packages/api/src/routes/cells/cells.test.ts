import { describe, expect, it } from 'vitest';
import { CellRevisionListSchema, CellRevisionSchema, CellSavedSchema, ConflictSchema } from '../../contract/cells.js';
import type { CellSaved } from '../../contract/cells.js';
import { LIMITS } from '../../contract/common.js';
import { NotebookSchema } from '../../contract/notebooks.js';
import { connect } from '../../db/connection.js';
import { Client, signedIn } from '../../../test/client.js';
import type { Reply } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/notebooks/:id/cells', () => {
  const server = useTestServer();

  async function ownNotebook(cells?: { kind: 'circuit' | 'note'; text: string }[]) {
    const notebook = await buildNotebook(cells ? { cells } : {});
    const client = await signedIn(server.url, notebook.ownerUser.login);
    return { notebook, client, base: `/api/notebooks/${notebook.id}/cells` };
  }

  async function positions(client: Client, id: string): Promise<number[]> {
    const body = NotebookSchema.parse((await client.get(`/api/notebooks/${id}`)).body);
    return body.cells.map((cell) => cell.id);
  }

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const anonymous = new Client(server.url);
    const cellId = notebook.cells[0]!.id;
    for (const reply of [
      await anonymous.post(`/api/notebooks/${notebook.id}/cells`, { kind: 'note', text: '' }),
      await anonymous.put(`/api/notebooks/${notebook.id}/cells/${cellId}`, { text: 'x', baseRevision: 1 }),
      await anonymous.get(`/api/notebooks/${notebook.id}/cells/${cellId}/revisions`),
    ]) {
      expect(reply.status).toBe(401);
    }
  });

  it('adds cells at a position, and saves revisions with the solver diagnostics counted', async () => {
    const { notebook, client, base } = await ownNotebook();
    const added = await client.post<CellSaved>(base, { kind: 'circuit', position: 0, text: 'R1 [in out] 1k\nC1 [out gnd] 10kΩ\n' });
    expect(added.status).toBe(201);
    const saved = CellSavedSchema.parse(added.body);
    expect(saved.cell).toMatchObject({ position: 0, revision: 1, kind: 'circuit' });
    expect(saved.diagnostics!.errors).toBeGreaterThan(0);
    expect(await positions(client, notebook.id)).toEqual([saved.cell.id, ...notebook.cells.map((c) => c.id)]);

    // Saved even with errors; a fixed text has none.
    const fixed = await client.put<CellSaved>(`${base}/${saved.cell.id}`, { text: rcLowPass, baseRevision: 1 });
    expect(fixed.status).toBe(201);
    expect(fixed.body.cell.revision).toBe(2);
    expect(fixed.body.diagnostics).toEqual({ errors: 0, warnings: 0 });
    expect(fixed.body.revision).toMatchObject({ number: 2, diagnostics: { errors: 0, warnings: 0 } });

    const note = await client.post<CellSaved>(base, { kind: 'note', text: 'Bench check next week.' });
    expect(note.body.cell.position).toBe(3);
    expect(note.body.diagnostics).toBeNull();

    // The same text again stores nothing new.
    const same = await client.put<CellSaved>(`${base}/${saved.cell.id}`, { text: rcLowPass, baseRevision: 2 });
    expect(same.status).toBe(200);
    expect(same.body.cell.revision).toBe(2);
  });

  it('keeps every revision immutable and lists them newest first, paged', async () => {
    const { notebook, client, base } = await ownNotebook();
    const cell = notebook.cells[1]!;
    const texts = [cell.text];
    for (let i = 2; i <= 5; i++) {
      const text = `${rcLowPass}# try ${i}\n`;
      texts.push(text);
      expect((await client.put(`${base}/${cell.id}`, { text, baseRevision: i - 1 })).status).toBe(201);
    }
    const first = CellRevisionListSchema.parse((await client.get(`${base}/${cell.id}/revisions?limit=3`)).body);
    expect(first.items.map((r) => r.number)).toEqual([5, 4, 3]);
    expect(first.items[0]!.size).toBe(Buffer.byteLength(texts[4]!));
    const second = CellRevisionListSchema.parse((await client.get(`${base}/${cell.id}/revisions?limit=3&cursor=${first.nextCursor}`)).body);
    expect(second.items.map((r) => r.number)).toEqual([2, 1]);
    expect(second.nextCursor).toBeNull();
    for (let n = 1; n <= 5; n++) {
      const revision = CellRevisionSchema.parse((await client.get(`${base}/${cell.id}/revisions/${n}`)).body);
      expect(revision.text).toBe(texts[n - 1]);
    }
    expect((await client.get(`${base}/${cell.id}/revisions/6`)).status).toBe(404);
    expect((await client.get(`${base}/${cell.id}/revisions/zero`)).status).toBe(404);
  });

  it('two saves on the same base revision: one 201, one 409 that returns the current revision and the refused text', async () => {
    const { notebook, client, base } = await ownNotebook();
    const editor = await buildUser();
    const owner = await connect();
    await owner.query('INSERT INTO notebook_members (notebookId, userId, role, createdAt) VALUES (?, ?, ?, NOW(3))', [notebook.id, editor.id, 'editor']);
    const other = await signedIn(server.url, editor.login);
    const cell = notebook.cells[1]!;
    const mine = `${rcLowPass}# owner's change\n`;
    const theirs = `${rcLowPass}# editor's change\n`;
    const replies = await Promise.all([
      client.put(`${base}/${cell.id}`, { text: mine, baseRevision: 1 }),
      other.put(`${base}/${cell.id}`, { text: theirs, baseRevision: 1 }),
    ]);
    expect(replies.map((r) => r.status).sort()).toEqual([201, 409]);
    const winner = replies.find((r) => r.status === 201) as Reply<CellSaved>;
    const loser = replies.find((r) => r.status === 409)!;
    const conflict = ConflictSchema.parse(loser.body);
    expect(conflict.details.current.number).toBe(2);
    expect(conflict.details.current.text).toBe(winner.body.cell.text);
    expect([mine, theirs]).toContain(winner.body.cell.text);
    expect(conflict.details.submitted.text).toBe(winner.body.cell.text === mine ? theirs : mine);
    expect(conflict.details.submitted.baseRevision).toBe(1);

    // The loser merges and saves on the current revision.
    const merged = await (loser === replies[0] ? client : other).put(`${base}/${cell.id}`, { text: `${mine}${theirs}`, baseRevision: 2 });
    expect(merged.status).toBe(201);
    const list = CellRevisionListSchema.parse((await client.get(`${base}/${cell.id}/revisions`)).body);
    expect(list.items.map((r) => r.number)).toEqual([3, 2, 1]);
  });

  it('50 parallel saves to 50 different cells lose none', async () => {
    const cells = Array.from({ length: 50 }, (_, i) => ({ kind: 'note' as const, text: `cell ${i}` }));
    const { notebook, client, base } = await ownNotebook(cells);
    const replies = await Promise.all(notebook.cells.map((cell, i) => client.put(`${base}/${cell.id}`, { text: `cell ${i}, edited`, baseRevision: 1 })));
    expect(replies.map((r) => r.status)).toEqual(Array(50).fill(201));
    const after = NotebookSchema.parse((await client.get(`/api/notebooks/${notebook.id}`)).body);
    expect(after.cells.map((c) => c.text)).toEqual(cells.map((_, i) => `cell ${i}, edited`));
    expect(after.cells.every((c) => c.revision === 2)).toBe(true);
    const db = await connect();
    const [row] = await db.query('SELECT COUNT(*) AS n FROM cell_revisions r JOIN cells c ON c.id = r.cellId WHERE c.notebookId = ?', [notebook.id]);
    expect(Number(row.n)).toBe(100);
  });

  it('moves a cell, deletes it (restorable) and restores it where it was', async () => {
    const cells = ['a', 'b', 'c', 'd'].map((text) => ({ kind: 'note' as const, text }));
    const { notebook, client, base } = await ownNotebook(cells);
    const [a, b, c, d] = notebook.cells.map((cell) => cell.id);

    const moved = await client.post<CellSaved>(`${base}/${a}/move`, { position: 2 });
    expect(moved.status).toBe(200);
    expect(CellSavedSchema.parse(moved.body).cell.position).toBe(2);
    expect(await positions(client, notebook.id)).toEqual([b, c, a, d]);
    await client.post(`${base}/${d}/move`, { position: 99 });
    expect(await positions(client, notebook.id)).toEqual([b, c, a, d]);
    await client.post(`${base}/${d}/move`, { position: 0 });
    expect(await positions(client, notebook.id)).toEqual([d, b, c, a]);

    const removed = await client.delete<CellSaved>(`${base}/${b}`);
    expect(removed.status).toBe(200);
    expect(CellSavedSchema.parse(removed.body).cell.deletedAt).not.toBeNull();
    const detail = NotebookSchema.parse((await client.get(`/api/notebooks/${notebook.id}`)).body);
    expect(detail.cells.map((cell) => [cell.id, cell.position])).toEqual([
      [d, 0],
      [c, 1],
      [a, 2],
    ]);
    expect(detail.deletedCells.map((cell) => cell.id)).toEqual([b]);
    expect(detail.cellCount).toBe(3);

    // A deleted cell keeps its text; saving it is a conflict that hands the text back.
    const stale = await client.put(`${base}/${b}`, { text: 'b2', baseRevision: 1 });
    expect(stale.status).toBe(409);
    expect(ConflictSchema.parse(stale.body).details.submitted.text).toBe('b2');
    expect((await client.post(`${base}/${b}/move`, { position: 0 })).status).toBe(400);

    const restored = await client.post<CellSaved>(`${base}/${b}/restore`);
    expect(restored.status).toBe(200);
    expect(CellSavedSchema.parse(restored.body).cell).toMatchObject({ deletedAt: null, position: 1, text: 'b' });
    expect(restored.body.revision).toMatchObject({ number: 1 });
    expect(await positions(client, notebook.id)).toEqual([d, b, c, a]);
  });

  it('refuses text over 64 KiB with 413, and a 501st cell', async () => {
    const { notebook, client, base } = await ownNotebook();
    const cell = notebook.cells[0]!;
    const big = await client.put(`${base}/${cell.id}`, { text: 'x'.repeat(LIMITS.cellTextBytes + 1), baseRevision: 1 });
    expect(big.status).toBe(413);
    expect(big.body).toMatchObject({ error: 'too_large', details: { issues: [{ path: 'text' }] } });
    expect((big.body as { message: string }).message).toMatch(/^text: .*64 KiB/);
    // Bytes count, not characters: 16 385 four-byte characters are just over.
    const wide = await client.put(`${base}/${cell.id}`, { text: '𝄞'.repeat(LIMITS.cellTextBytes / 4 + 1), baseRevision: 1 });
    expect(wide.status).toBe(413);
    const exact = await client.put(`${base}/${cell.id}`, { text: 'x'.repeat(LIMITS.cellTextBytes), baseRevision: 1 });
    expect(exact.status).toBe(201);

    const db = await connect();
    const now = new Date();
    for (let i = notebook.cells.length; i < LIMITS.cellsPerNotebook; i++) {
      const [inserted] = [
        await db.query('INSERT INTO cells (notebookId, kind, position, revision, createdAt, updatedAt) VALUES (?, ?, ?, 1, ?, ?)', [
          notebook.id,
          'note',
          i,
          now,
          now,
        ]),
      ];
      await db.query('INSERT INTO cell_revisions (cellId, number, text, createdAt) VALUES (?, 1, ?, ?)', [inserted.insertId, '', now]);
    }
    const full = await client.post(base, { kind: 'note', text: 'one too many' });
    expect(full.status).toBe(413);
    expect(full.body).toMatchObject({ error: 'too_large' });
    expect((full.body as { message: string }).message).toMatch(/500 cells/);
  });

  it("shows a deleted cell's history only to those who may edit, as the notebook shows the cell", async () => {
    const viewer = await buildUser();
    const reviewer = await buildUser();
    const notebook = await buildNotebook({
      cells: [
        { kind: 'note', text: 'kept' },
        { kind: 'note', text: 'gone' },
      ],
      members: [
        [viewer, 'viewer'],
        [reviewer, 'reviewer'],
      ],
    });
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const gone = notebook.cells[1]!.id;
    const history = `/api/notebooks/${notebook.id}/cells/${gone}/revisions`;
    expect((await owner.delete(`/api/notebooks/${notebook.id}/cells/${gone}`)).status).toBe(200);

    expect((await owner.get(history)).status).toBe(200);
    expect((await owner.get(`${history}/1`)).status).toBe(200);
    for (const login of [viewer.login, reviewer.login]) {
      const reader = await signedIn(server.url, login);
      for (const path of [history, `${history}/1`]) {
        const reply = await reader.get(path);
        expect(reply.status, `${login} ${path}`).toBe(404);
        expect(reply.text).not.toContain('gone');
      }
      // The live cell's history stays readable.
      expect((await reader.get(`/api/notebooks/${notebook.id}/cells/${notebook.cells[0]!.id}/revisions/1`)).status).toBe(200);
    }
  });

  it('answers 404 for a cell of another notebook', async () => {
    const { client, base } = await ownNotebook();
    const elsewhere = await buildNotebook();
    const reply = await client.put(`${base}/${elsewhere.cells[0]!.id}`, { text: 'x', baseRevision: 1 });
    expect(reply.status).toBe(404);
    expect(reply.body).toMatchObject({ error: 'not_found' });
  });
});
