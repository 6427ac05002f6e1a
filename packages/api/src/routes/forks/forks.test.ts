import { afterEach, describe, expect, it, vi } from 'vitest';
import { ForkListSchema } from '../../contract/forks.js';
import { NotebookSchema } from '../../contract/notebooks.js';
import type { Notebook } from '../../contract/notebooks.js';
import { connect } from '../../db/connection.js';
import { forkHooks } from '../../services/forks.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/notebooks/:id/forks', () => {
  const server = useTestServer();
  afterEach(() => {
    forkHooks.afterCell = null;
  });

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const anonymous = new Client(server.url);
    expect((await anonymous.post(`/api/notebooks/${notebook.id}/forks`, {})).status).toBe(401);
    expect((await anonymous.get(`/api/notebooks/${notebook.id}/forks`)).status).toBe(401);
  });

  it('copies the current cells into a notebook of the caller, recording where it came from', async () => {
    const viewer = await buildUser();
    const source = await buildNotebook({ title: 'Decoupling network', description: 'Analog rail, below 1 Ω from 10 kHz up.', members: [[viewer, 'viewer']] });
    const client = await signedIn(server.url, viewer.login);
    const made = await client.post<Notebook>(`/api/notebooks/${source.id}/forks`, {});
    expect(made.status).toBe(201);
    const fork = NotebookSchema.parse(made.body);
    expect(fork).toMatchObject({
      title: 'Decoupling network (fork)',
      description: source.description,
      role: 'owner',
      owner: { id: viewer.id },
      versionCount: 0,
    });
    expect(source.description).toBe('Analog rail, below 1 Ω from 10 kHz up.');
    expect(fork.id).not.toBe(source.id);
    expect(fork.cells.map((c) => [c.kind, c.text, c.revision])).toEqual(source.cells.map((c) => [c.kind, c.text, 1]));
    expect(fork.cells.map((c) => c.id)).not.toEqual(source.cells.map((c) => c.id));
    expect(fork.forkedFrom).toEqual({ notebook: { id: source.id, title: 'Decoupling network' }, version: null });
    expect(fork.lineage).toEqual([{ id: source.id, title: 'Decoupling network', owner: source.owner, version: null }]);

    // Editing the fork leaves the original alone.
    await client.put(`/api/notebooks/${fork.id}/cells/${fork.cells[1]!.id}`, { text: `${rcLowPass}# other topology\n`, baseRevision: 1 });
    const original = NotebookSchema.parse((await client.get(`/api/notebooks/${source.id}`)).body);
    expect(original.cells[1]!.text).toBe(source.cells[1]!.text);
    expect(original.forkCount).toBe(1);
    const forks = ForkListSchema.parse((await client.get(`/api/notebooks/${source.id}/forks`)).body);
    expect(forks.total).toBe(1);
    expect(forks.items.map((f) => [f.id, f.fromVersion])).toEqual([[fork.id, null]]);
  });

  it('forks from a version, and shows the lineage of a fork of a fork', async () => {
    const source = await buildNotebook({ title: 'Regulator loop', description: 'Type II compensation.' });
    const owner = await signedIn(server.url, source.ownerUser.login);
    await owner.post(`/api/notebooks/${source.id}/versions`, { label: 'Baseline' });
    await owner.put(`/api/notebooks/${source.id}/cells/${source.cells[1]!.id}`, { text: `${rcLowPass}# after the version\n`, baseRevision: 1 });

    // A version holds cells only: a fork of it takes the source's description as it is now.
    expect((await owner.patch(`/api/notebooks/${source.id}`, { description: 'Type II compensation, after the bench.' })).status).toBe(200);

    const fork = NotebookSchema.parse((await owner.post(`/api/notebooks/${source.id}/forks`, { version: 1, title: 'Loop, type II try' })).body);
    expect(fork.title).toBe('Loop, type II try');
    expect(fork.description).toBe('Type II compensation, after the bench.');
    expect(fork.cells.map((c) => c.text)).toEqual(source.cells.map((c) => c.text));
    expect(fork.forkedFrom).toEqual({ notebook: { id: source.id, title: 'Regulator loop' }, version: { number: 1, label: 'Baseline' } });

    const other = await buildUser();
    await owner.put(`/api/notebooks/${fork.id}/members/${other.id}`, { role: 'viewer' });
    const stranger = await signedIn(server.url, other.login);
    const grandchild = NotebookSchema.parse((await stranger.post(`/api/notebooks/${fork.id}/forks`, {})).body);
    // The stranger may read the fork but not the original: the lineage stops where reading does.
    expect(grandchild.lineage.map((l) => l.id)).toEqual([fork.id]);
    const ownerView = await owner.put(`/api/notebooks/${source.id}/members/${other.id}`, { role: 'viewer' });
    expect(ownerView.status).toBe(201);
    const again = NotebookSchema.parse((await stranger.get(`/api/notebooks/${grandchild.id}`)).body);
    expect(again.lineage.map((l) => [l.id, l.version])).toEqual([
      [fork.id, null],
      [source.id, { number: 1, label: 'Baseline' }],
    ]);
    expect((await owner.post(`/api/notebooks/${source.id}/forks`, { version: 9 })).status).toBe(404);
  });

  it('is all or nothing: a failure half-way leaves no partial notebook', async () => {
    const cells = Array.from({ length: 6 }, (_, i) => ({ kind: 'note' as const, text: `step ${i}` }));
    const source = await buildNotebook({ cells });
    const client = await signedIn(server.url, source.ownerUser.login);
    const db = await connect();
    const count = async (sql: string) => Number((await db.query(sql))[0].n);
    const notebooksBefore = await count('SELECT COUNT(*) AS n FROM notebooks');
    const cellsBefore = await count('SELECT COUNT(*) AS n FROM cells');
    const revisionsBefore = await count('SELECT COUNT(*) AS n FROM cell_revisions');

    let copied = 0;
    forkHooks.afterCell = (index) => {
      copied = index + 1;
      if (index === 2) throw new Error('disk full (injected by the test)');
    };
    const logged = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const failed = await client.post(`/api/notebooks/${source.id}/forks`, {});
    expect(logged).toHaveBeenCalledWith(expect.objectContaining({ message: 'disk full (injected by the test)' }));
    logged.mockRestore();
    expect(failed.status).toBe(500);
    expect(failed.body).toEqual({ error: 'internal', message: 'Something went wrong on our side.' });
    expect(copied).toBe(3);

    expect(await count('SELECT COUNT(*) AS n FROM notebooks')).toBe(notebooksBefore);
    expect(await count('SELECT COUNT(*) AS n FROM cells')).toBe(cellsBefore);
    expect(await count('SELECT COUNT(*) AS n FROM cell_revisions')).toBe(revisionsBefore);
    expect(await db.query('SELECT id FROM notebooks WHERE forkedFromId = ?', [source.id])).toEqual([]);

    forkHooks.afterCell = null;
    const ok = await client.post<Notebook>(`/api/notebooks/${source.id}/forks`, {});
    expect(ok.status).toBe(201);
    expect(ok.body.cells).toHaveLength(6);
  });
});
