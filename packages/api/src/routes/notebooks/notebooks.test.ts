import { beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '../../contract/common.js';
import { NotebookListSchema, NotebookSchema } from '../../contract/notebooks.js';
import type { Notebook } from '../../contract/notebooks.js';
import { connect } from '../../db/connection.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass, uniqueLogin } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/notebooks', () => {
  const server = useTestServer();

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
    expect(notebook).toMatchObject({
      title: 'Anti-alias filter',
      role: 'owner',
      visibility: 'private',
      cellCount: 3,
      forkCount: 0,
      forkedFrom: null,
      lineage: [],
    });
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

    const many = await client.post('/api/notebooks', {
      title: 'Many',
      cells: Array.from({ length: LIMITS.cellsPerNotebook + 1 }, () => ({ kind: 'note', text: '' })),
    });
    expect(many.status).toBe(400);
    expect((many.body as { message: string }).message).toMatch(/^cells: .*500/);
  });

  it('keeps a plain-text description: given at creation, changed alone by an editor, refused to reviewers and viewers', async () => {
    const editor = await buildUser();
    const reviewer = await buildUser();
    const viewer = await buildUser();
    const owner = await buildUser();
    const ownerClient = await signedIn(server.url, owner.login);
    const created = await ownerClient.post<Notebook>('/api/notebooks', {
      title: 'Rail filter',
      description: '  Ferrite bead and two capacitors.\r\nSee the second cell.  ',
    });
    expect(created.status).toBe(201);
    // Trimmed, and CR LF kept as a plain line break.
    expect(NotebookSchema.parse(created.body).description).toBe('Ferrite bead and two capacitors.\nSee the second cell.');
    const id = created.body.id;
    for (const [user, role] of [
      [editor, 'editor'],
      [reviewer, 'reviewer'],
      [viewer, 'viewer'],
    ] as const) {
      expect((await ownerClient.put(`/api/notebooks/${id}/members/${user.id}`, { role })).status).toBe(201);
    }
    const untitled = NotebookSchema.parse((await ownerClient.post('/api/notebooks', { title: 'No words yet' })).body);
    expect(untitled.description).toBe('');

    const editorClient = await signedIn(server.url, editor.login);
    const changed = await editorClient.patch<Notebook>(`/api/notebooks/${id}`, { description: 'Bead, 10 µF and 100 nF; the damping arm comes next.' });
    expect(changed.status).toBe(200);
    const after = NotebookSchema.parse(changed.body);
    expect(after.description).toBe('Bead, 10 µF and 100 nF; the damping arm comes next.');
    expect(after.title).toBe('Rail filter');
    expect(Date.parse(after.updatedAt)).toBeGreaterThanOrEqual(Date.parse(created.body.updatedAt));
    const read = NotebookSchema.parse((await ownerClient.get(`/api/notebooks/${id}`)).body);
    expect(read.description).toBe(after.description);

    for (const login of [reviewer.login, viewer.login]) {
      const refused = await (await signedIn(server.url, login)).patch(`/api/notebooks/${id}`, { description: 'Mine now.' });
      expect(refused.status).toBe(403);
      expect(refused.body).toMatchObject({ error: 'forbidden' });
    }
    const stranger = await signedIn(server.url, (await buildUser()).login);
    expect((await stranger.patch(`/api/notebooks/${id}`, { description: 'Mine now.' })).status).toBe(404);
    expect(NotebookSchema.parse((await ownerClient.get(`/api/notebooks/${id}`)).body).description).toBe(after.description);

    expect(NotebookSchema.parse((await editorClient.patch(`/api/notebooks/${id}`, { description: '' })).body).description).toBe('');
  });

  it('refuses a description over 2000 characters or with control characters, naming the field', async () => {
    const notebook = await buildNotebook();
    const client = await signedIn(server.url, notebook.ownerUser.login);
    const long = await client.patch(`/api/notebooks/${notebook.id}`, { description: 'x'.repeat(LIMITS.descriptionLength + 1) });
    expect(long.status).toBe(400);
    expect(long.body).toMatchObject({ error: 'validation', details: { issues: [{ path: 'description' }] } });
    expect((long.body as { message: string }).message).toMatch(/^description: .*2000/);
    const fits = await client.patch<Notebook>(`/api/notebooks/${notebook.id}`, { description: 'x'.repeat(LIMITS.descriptionLength) });
    expect(fits.status).toBe(200);
    expect(fits.body.description).toHaveLength(LIMITS.descriptionLength);

    const longAtCreation = await client.post('/api/notebooks', { title: 'Long', description: 'y'.repeat(LIMITS.descriptionLength + 1) });
    expect(longAtCreation.status).toBe(400);
    expect((longAtCreation.body as { message: string }).message).toMatch(/^description: /);
    const control = await client.patch(`/api/notebooks/${notebook.id}`, { description: 'bell\u0007' });
    expect(control.status).toBe(400);
    expect((control.body as { message: string }).message).toMatch(/^description: .*control characters/);
    const notText = await client.patch(`/api/notebooks/${notebook.id}`, { description: 42 });
    expect(notText.status).toBe(400);
    expect((notText.body as { message: string }).message).toMatch(/^description: /);
    expect(NotebookSchema.parse((await client.get(`/api/notebooks/${notebook.id}`)).body).description).toHaveLength(LIMITS.descriptionLength);
  });

  it('counts versions in the list and in one notebook', async () => {
    const me = await buildUser();
    const client = await signedIn(server.url, me.login);
    const none = await buildNotebook({ owner: me });
    const two = await buildNotebook({ owner: me });
    for (const label of ['First bench build', 'After the bench']) {
      expect((await client.post(`/api/notebooks/${two.id}/versions`, { label })).status).toBe(201);
    }
    const list = NotebookListSchema.parse((await client.get('/api/notebooks?scope=mine')).body);
    const counts = new Map(list.items.map((n) => [n.id, n.versionCount]));
    expect(counts.get(none.id)).toBe(0);
    expect(counts.get(two.id)).toBe(2);
    expect(NotebookSchema.parse((await client.get(`/api/notebooks/${two.id}`)).body).versionCount).toBe(2);
    expect(NotebookSchema.parse((await client.get(`/api/notebooks/${none.id}`)).body).versionCount).toBe(0);
  });

  describe('sorting on the server', () => {
    type Sort = 'changed' | 'title' | 'created';
    interface Made {
      id: string;
      title: string;
      createdAt: Date;
      updatedAt: Date;
    }
    let client: Client;
    let made: Made[];

    // Five notebooks with ties in every sort key, so the id has to break them.
    beforeAll(async () => {
      const me = await buildUser();
      client = await signedIn(server.url, me.login);
      const tag = uniqueLogin('sort');
      const hour = 3_600_000;
      const start = Date.parse('2026-03-02T08:00:00.000Z');
      const plan = [
        { suffix: 'c', created: 3, changed: 0 },
        { suffix: 'a', created: 1, changed: 4 },
        { suffix: 'b', created: 1, changed: 2 },
        { suffix: 'a', created: 2, changed: 4 },
        { suffix: 'c', created: 3, changed: 1 },
      ];
      const db = await connect();
      made = [];
      for (const step of plan) {
        const notebook = await buildNotebook({ owner: me, title: `${tag} ${step.suffix}` });
        const createdAt = new Date(start + step.created * hour);
        const updatedAt = new Date(start + 10 * hour + step.changed * hour);
        await db.query('UPDATE notebooks SET createdAt = ?, updatedAt = ? WHERE id = ?', [createdAt, updatedAt, notebook.id]);
        made.push({ id: notebook.id, title: notebook.title, createdAt, updatedAt });
      }
    });

    /** The expected order, from the planned keys: by key, then by id (the ids compare as bytes). */
    function expected(sort: Sort, order: 'asc' | 'desc'): string[] {
      const key = (n: Made) => (sort === 'title' ? n.title : sort === 'created' ? n.createdAt.getTime() : n.updatedAt.getTime());
      const ascending = [...made].sort((a, b) => (key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
      const ids = ascending.map((n) => n.id);
      return order === 'asc' ? ids : ids.reverse();
    }

    async function pages(query: string): Promise<string[][]> {
      const all: string[][] = [];
      let cursor: string | null = null;
      do {
        const reply = await client.get(`/api/notebooks?scope=mine&limit=2&${query}${cursor ? `&cursor=${cursor}` : ''}`);
        expect(reply.status).toBe(200);
        const page = NotebookListSchema.parse(reply.body);
        all.push(page.items.map((n) => n.id));
        cursor = page.nextCursor;
      } while (cursor && all.length < 10);
      return all;
    }

    for (const sort of ['changed', 'title', 'created'] as const) {
      for (const order of ['desc', 'asc'] as const) {
        it(`sorts by ${sort} (${order}), and pages through it two at a time`, async () => {
          const whole = NotebookListSchema.parse((await client.get(`/api/notebooks?scope=mine&limit=100&sort=${sort}&order=${order}`)).body);
          expect(whole.items.map((n) => n.id)).toEqual(expected(sort, order));
          expect(whole.nextCursor).toBeNull();
          const paged = await pages(`sort=${sort}&order=${order}`);
          expect(paged.map((page) => page.length)).toEqual([2, 2, 1]);
          expect(paged.flat()).toEqual(expected(sort, order));
        });
      }
    }

    it('defaults to the last change, newest first', async () => {
      const plain = NotebookListSchema.parse((await client.get('/api/notebooks?scope=mine')).body);
      expect(plain.items.map((n) => n.id)).toEqual(expected('changed', 'desc'));
    });

    it('keeps its place when a notebook is added between two pages', async () => {
      const first = NotebookListSchema.parse((await client.get('/api/notebooks?scope=mine&limit=2&sort=created&order=desc')).body);
      expect(first.items.map((n) => n.id)).toEqual(expected('created', 'desc').slice(0, 2));
      // Made now, so it belongs before the first page; the second page must not repeat a row.
      const added = NotebookSchema.parse((await client.post('/api/notebooks', { title: `${made[0]!.title} later` })).body);
      const second = NotebookListSchema.parse((await client.get(`/api/notebooks?scope=mine&limit=2&sort=created&order=desc&cursor=${first.nextCursor}`)).body);
      expect(second.items.map((n) => n.id)).toEqual(expected('created', 'desc').slice(2, 4));
      await client.delete(`/api/notebooks/${added.id}`);
    });

    it('refuses an unknown sort or order, and a cursor made for another sort', async () => {
      const bad = await client.get('/api/notebooks?sort=owner&order=up');
      expect(bad.status).toBe(400);
      expect((bad.body as { message: string }).message).toMatch(/query\.sort/);
      expect((bad.body as { message: string }).message).toMatch(/query\.order/);
      const byTitle = NotebookListSchema.parse((await client.get('/api/notebooks?scope=mine&limit=2&sort=title&order=asc')).body);
      expect(byTitle.nextCursor).not.toBeNull();
      const mixed = await client.get(`/api/notebooks?scope=mine&limit=2&sort=created&order=asc&cursor=${byTitle.nextCursor}`);
      expect(mixed.status).toBe(400);
      expect(mixed.body).toMatchObject({ error: 'validation', details: { issues: [{ path: 'query.cursor' }] } });
      expect((mixed.body as { message: string }).message).toMatch(/sorted by title/);
      const flipped = await client.get(`/api/notebooks?scope=mine&limit=2&sort=title&order=desc&cursor=${byTitle.nextCursor}`);
      expect(flipped.status).toBe(400);
      const forged = Buffer.from(JSON.stringify(['title', 'asc', 12, made[0]!.id])).toString('base64url');
      expect((await client.get(`/api/notebooks?scope=mine&sort=title&order=asc&cursor=${forged}`)).status).toBe(400);
    });
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
