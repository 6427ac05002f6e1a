import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '../../contract/common.js';
import { NotebookListSchema, NotebookSchema } from '../../contract/notebooks.js';
import type { Notebook } from '../../contract/notebooks.js';
import { disconnect } from '../../db/connection.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass, uniqueLogin } from '../../../test/factories.js';
import { startTestServer } from '../../../test/http.js';
import type { TestServer } from '../../../test/http.js';

describe('/api/notebooks', () => {
  let server: TestServer;
  beforeAll(async () => {
    server = await startTestServer();
  });
  afterAll(async () => {
    await server.close();
    await disconnect();
  });

  it('requires sign-in', async () => {
    const anonymous = new Client(server.url);
    expect((await anonymous.get('/api/notebooks')).status).toBe(401);
    expect((await anonymous.post('/api/notebooks', { title: 'x' })).status).toBe(401);
    const notebook = await buildNotebook();
    const reply = await anonymous.get(`/api/notebooks/${notebook.id}`);
    expect(reply.status).toBe(401);
    expect(reply.body).toMatchObject({ error: 'unauthenticated', message: 'Sign in first.' });
  });

  it('creates a notebook with its first cells, checked by the solver, and reads it back', async () => {
    const user = await buildUser();
    const client = await signedIn(server.url, user.login);
    const created = await client.post<Notebook>('/api/notebooks', {
      title: '  Anti-alias filter  ',
      cells: [
        { kind: 'note', text: '# Anti-alias\nSecond order in front of the converter.' },
        { kind: 'circuit', text: rcLowPass },
        { kind: 'circuit', text: 'R1 [in out] 10kΩ\nC1 [out gnd] 10kΩ\n' },
      ],
    });
    expect(created.status).toBe(201);
    const notebook = NotebookSchema.parse(created.body);
    expect(notebook).toMatchObject({ title: 'Anti-alias filter', role: 'owner', visibility: 'private', cellCount: 3, forkCount: 0, forkedFrom: null, lineage: [] });
    expect(notebook.owner).toMatchObject({ id: user.id, login: user.login });
    expect(notebook.permissions).toEqual({ read: true, fork: true, review: true, edit: true, share: true, delete: true });
    expect(notebook.cells.map((cell) => [cell.position, cell.kind, cell.revision])).toEqual([
      [0, 'note', 1],
      [1, 'circuit', 1],
      [2, 'circuit', 1],
    ]);
    expect(notebook.cells[0]!.diagnostics).toBeNull();
    expect(notebook.cells[1]!.diagnostics).toEqual({ errors: 0, warnings: 0 });
    expect(notebook.cells[2]!.diagnostics!.errors).toBeGreaterThan(0);

    const read = await client.get(`/api/notebooks/${notebook.id}`);
    expect(read.status).toBe(200);
    expect(NotebookSchema.parse(read.body)).toEqual(notebook);
  });

  it('lists mine, shared and all, newest change first, with search and cursor paging', async () => {
    const me = await buildUser();
    const other = await buildUser();
    const tag = uniqueLogin('tag');
    const mine: string[] = [];
    for (let i = 0; i < 5; i++) mine.push((await buildNotebook({ owner: me, title: `Mine ${tag} ${i}` })).id);
    const shared = await buildNotebook({ owner: other, title: `Shared ${tag}`, members: [[me, 'viewer']] });
    const hidden = await buildNotebook({ owner: other, title: `Hidden ${tag}` });
    const client = await signedIn(server.url, me.login);

    const all = NotebookListSchema.parse((await client.get('/api/notebooks?scope=all&limit=100')).body);
    expect(all.items.map((n) => n.id)).toEqual([shared.id, ...[...mine].reverse()]);
    expect(all.items.map((n) => n.id)).not.toContain(hidden.id);
    expect(all.items[0]!.role).toBe('viewer');

    const onlyMine = NotebookListSchema.parse((await client.get('/api/notebooks?scope=mine')).body);
    expect(onlyMine.items.map((n) => n.id)).toEqual([...mine].reverse());
    const onlyShared = NotebookListSchema.parse((await client.get('/api/notebooks?scope=shared')).body);
    expect(onlyShared.items.map((n) => n.id)).toEqual([shared.id]);

    const search = NotebookListSchema.parse((await client.get(`/api/notebooks?q=${encodeURIComponent(`Mine ${tag} 3`)}`)).body);
    expect(search.items.map((n) => n.id)).toEqual([mine[3]]);

    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const page = NotebookListSchema.parse((await client.get(`/api/notebooks?scope=mine&limit=2${cursor ? `&cursor=${cursor}` : ''}`)).body);
      expect(page.items.length).toBeLessThanOrEqual(2);
      seen.push(...page.items.map((n) => n.id));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual([...mine].reverse());

    // A change to an older notebook brings it to the top.
    const oldest = mine[0]!;
    const detail = NotebookSchema.parse((await client.get(`/api/notebooks/${oldest}`)).body);
    const cell = detail.cells[1]!;
    expect((await client.put(`/api/notebooks/${oldest}/cells/${cell.id}`, { text: `${cell.text}# touched\n`, baseRevision: 1 })).status).toBe(201);
    const after = NotebookListSchema.parse((await client.get('/api/notebooks?scope=mine')).body);
    expect(after.items[0]!.id).toBe(oldest);

    const bad = await client.get('/api/notebooks?scope=everything&limit=0&cursor=zzz');
    expect(bad.status).toBe(400);
    expect(bad.body).toMatchObject({ error: 'validation' });
    expect((bad.body as { message: string }).message).toMatch(/query\.scope/);
    expect((bad.body as { message: string }).message).toMatch(/query\.limit/);
    const badCursor = await client.get('/api/notebooks?cursor=not-a-cursor');
    expect(badCursor.status).toBe(400);
    expect((badCursor.body as { message: string }).message).toMatch(/cursor/);
  });

  it('renames (editor) and shares by link (owner only)', async () => {
    const editor = await buildUser();
    const notebook = await buildNotebook({ members: [[editor, 'editor']] });
    const client = await signedIn(server.url, editor.login);
    const renamed = await client.patch<Notebook>(`/api/notebooks/${notebook.id}`, { title: 'Tone network, second try' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.title).toBe('Tone network, second try');
    const shared = await client.patch(`/api/notebooks/${notebook.id}`, { visibility: 'link' });
    expect(shared.status).toBe(403);
    expect(shared.body).toMatchObject({ error: 'forbidden' });

    const owner = await signedIn(server.url, notebook.ownerUser.login);
    expect((await owner.patch(`/api/notebooks/${notebook.id}`, { visibility: 'link' })).body).toMatchObject({ visibility: 'link' });
    const stranger = await signedIn(server.url, (await buildUser()).login);
    const seen = await stranger.get<Notebook>(`/api/notebooks/${notebook.id}`);
    expect(seen.status).toBe(200);
    expect(seen.body.role).toBe('viewer');
    expect(seen.body.permissions).toMatchObject({ read: true, fork: true, edit: false });
    // A link does not put the notebook in the stranger's lists.
    const list = NotebookListSchema.parse((await stranger.get('/api/notebooks')).body);
    expect(list.items.map((n) => n.id)).not.toContain(notebook.id);

    expect((await owner.patch(`/api/notebooks/${notebook.id}`, { visibility: 'private' })).status).toBe(200);
    expect((await stranger.get(`/api/notebooks/${notebook.id}`)).status).toBe(404);
    expect((await owner.patch(`/api/notebooks/${notebook.id}`, {})).status).toBe(400);
  });

  it('deletes softly and restores; a deleted notebook is gone for everyone but its owner', async () => {
    const viewer = await buildUser();
    const notebook = await buildNotebook({ members: [[viewer, 'viewer']] });
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const member = await signedIn(server.url, viewer.login);

    expect((await owner.delete(`/api/notebooks/${notebook.id}`)).status).toBe(204);
    expect((await member.get(`/api/notebooks/${notebook.id}`)).status).toBe(404);
    const ownView = await owner.get<Notebook>(`/api/notebooks/${notebook.id}`);
    expect(ownView.status).toBe(200);
    expect(ownView.body.deletedAt).not.toBeNull();
    expect(ownView.body.permissions).toMatchObject({ read: true, edit: false, delete: true });
    const mine = NotebookListSchema.parse((await owner.get('/api/notebooks?scope=mine')).body);
    expect(mine.items.map((n) => n.id)).not.toContain(notebook.id);
    const trash = NotebookListSchema.parse((await owner.get('/api/notebooks?scope=deleted')).body);
    expect(trash.items.map((n) => n.id)).toEqual([notebook.id]);
    expect((await owner.post(`/api/notebooks/${notebook.id}/cells`, { kind: 'note', text: 'x' })).status).toBe(403);

    const restored = await owner.post<Notebook>(`/api/notebooks/${notebook.id}/restore`);
    expect(restored.status).toBe(200);
    expect(restored.body.deletedAt).toBeNull();
    expect(restored.body.cells).toHaveLength(2);
    expect((await member.get(`/api/notebooks/${notebook.id}`)).status).toBe(200);
  });

  it('refuses a title over 200 characters and more than 500 cells, naming the field', async () => {
    const client = await signedIn(server.url, (await buildUser()).login);
    const long = await client.post('/api/notebooks', { title: 'x'.repeat(LIMITS.titleLength + 1) });
    expect(long.status).toBe(400);
    expect(long.body).toMatchObject({ error: 'validation', details: { issues: [{ path: 'title' }] } });
    expect((long.body as { message: string }).message).toMatch(/^title: .*200/);
    expect((await client.post('/api/notebooks', { title: 'x'.repeat(LIMITS.titleLength) })).status).toBe(201);

    const many = await client.post('/api/notebooks', { title: 'Many', cells: Array.from({ length: LIMITS.cellsPerNotebook + 1 }, () => ({ kind: 'note', text: '' })) });
    expect(many.status).toBe(400);
    expect((many.body as { message: string }).message).toMatch(/^cells: .*500/);
  });

  it('answers 404 for ids that are not notebooks', async () => {
    const client = await signedIn(server.url, (await buildUser()).login);
    for (const id of ['nope', 'AAAAAAAAAAAA', 'abc%2F..%2Fdef', '%00']) {
      const reply = await client.get(`/api/notebooks/${id}`);
      expect(reply.status).toBe(404);
      expect(reply.body).toMatchObject({ error: 'not_found' });
    }
  });
});
