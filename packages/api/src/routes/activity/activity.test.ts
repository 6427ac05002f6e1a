import { describe, expect, it } from 'vitest';
import { ActivityPageSchema } from '../../contract/activity.js';
import type { ActivityItem } from '../../contract/activity.js';
import { NotebookSchema } from '../../contract/notebooks.js';
import { PinSchema } from '../../contract/pins.js';
import { ReviewSchema } from '../../contract/reviews.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/notebooks/:id/activity', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const reply = await new Client(server.url).get(`/api/notebooks/${notebook.id}/activity`);
    expect(reply.status).toBe(401);
    expect(reply.body).toMatchObject({ error: 'unauthenticated' });
  });

  /** Every page of the timeline, `limit` at a time. */
  async function everything(client: Client, notebookId: string, limit: number): Promise<ActivityItem[]> {
    const items: ActivityItem[] = [];
    let cursor: string | null = null;
    for (let page = 0; page < 50; page++) {
      const query: string = cursor ? `?limit=${limit}&cursor=${encodeURIComponent(cursor)}` : `?limit=${limit}`;
      const body = ActivityPageSchema.parse((await client.get(`/api/notebooks/${notebookId}/activity${query}`)).body);
      expect(body.items.length).toBeLessThanOrEqual(limit);
      items.push(...body.items);
      cursor = body.nextCursor;
      if (!cursor) return items;
    }
    throw new Error('the timeline did not end');
  }

  it('tells saves, versions, forks, pins, replies and review states, newest first, each with who and what', async () => {
    const [reviewer, viewer] = [await buildUser(), await buildUser()];
    const notebook = await buildNotebook({
      members: [
        [reviewer, 'reviewer'],
        [viewer, 'viewer'],
      ],
    });
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const reviewing = await signedIn(server.url, reviewer.login);
    const viewing = await signedIn(server.url, viewer.login);
    const id = notebook.id;
    const circuit = notebook.cells[1]!;

    await owner.put(`/api/notebooks/${id}/cells/${circuit.id}`, { text: rcLowPass.replace('1k', '1.2k'), baseRevision: 1 });
    await owner.post(`/api/notebooks/${id}/versions`, { label: 'First look' });
    const fork = NotebookSchema.parse((await viewing.post(`/api/notebooks/${id}/forks`, {})).body);
    const review = ReviewSchema.parse((await owner.post(`/api/notebooks/${id}/reviews`, { reviewerIds: [reviewer.id], message: 'Corner, please.' })).body);
    const pin = PinSchema.parse(
      (await reviewing.post(`/api/notebooks/${id}/pins`, { cellId: circuit.id, trace: 'out', frequency: 1326, body: 'Corner moved down.' })).body,
    );
    await owner.post(`/api/notebooks/${id}/pins/${pin.id}/comments`, { body: 'On purpose: more margin.' });
    await reviewing.post(`/api/notebooks/${id}/pins/${pin.id}/resolve`);
    await reviewing.post(`/api/notebooks/${id}/reviews/${review.id}/decision`, { state: 'signed_off', summary: 'Fine.' });

    const items = await everything(viewing, id, 100);
    const brief = items.map((item) => [item.kind, item.actor?.id ?? null]);
    // Same-millisecond entries may come in either order, so compare as sets, then check the order of what is surely later.
    expect(brief).toEqual(
      expect.arrayContaining([
        ['review_decision', reviewer.id],
        ['pin_resolved', reviewer.id],
        ['comment', notebook.ownerUser.id],
        ['pin', reviewer.id],
        ['review_requested', notebook.ownerUser.id],
        ['fork', viewer.id],
        ['version', notebook.ownerUser.id],
        ['revision', notebook.ownerUser.id],
        ['revision', notebook.ownerUser.id],
        ['revision', notebook.ownerUser.id],
      ]),
    );
    expect(items, JSON.stringify(brief)).toHaveLength(10);
    for (let i = 1; i < items.length; i++) expect(items[i - 1]!.at >= items[i]!.at, `${items[i - 1]!.id} before ${items[i]!.id}`).toBe(true);
    const position = (kind: ActivityItem['kind']) => items.findIndex((item) => item.kind === kind);
    expect(position('review_decision')).toBeLessThan(position('pin'));
    expect(position('pin')).toBeLessThan(position('fork'));
    expect(position('fork')).toBeLessThan(position('revision'));

    const find = <K extends ActivityItem['kind']>(kind: K) => items.filter((item): item is Extract<ActivityItem, { kind: K }> => item.kind === kind);
    expect(
      find('revision')
        .map((r) => [r.cell.id, r.cell.kind, r.revisionNumber, r.message])
        .sort(),
    ).toEqual(
      [
        [notebook.cells[0]!.id, 'note', 1, null],
        [circuit.id, 'circuit', 1, null],
        [circuit.id, 'circuit', 2, null],
      ].sort(),
    );
    // Nothing changed after "First look", so the review is of that version.
    expect(find('version').map((v) => v.version)).toEqual([{ number: 1, label: 'First look' }]);
    expect(find('fork')[0]!.fork).toEqual({ id: fork.id, title: fork.title });
    expect(find('pin')[0]).toMatchObject({
      pin: { id: pin.id, cellId: circuit.id, revisionNumber: 2, trace: 'out', frequency: 1326 },
      excerpt: 'Corner moved down.',
    });
    expect(find('comment')[0]).toMatchObject({ pin: { id: pin.id }, excerpt: 'On purpose: more margin.' });
    expect(find('review_requested')[0]).toMatchObject({
      review: { id: review.id, round: 1, versionNumber: 1 },
      reviewers: [{ id: reviewer.id }],
      excerpt: 'Corner, please.',
    });
    expect(review.version.number).toBe(1);
    expect(find('review_decision')[0]).toMatchObject({ review: { id: review.id, round: 1 }, state: 'signed_off', excerpt: 'Fine.' });
    expect(new Set(items.map((item) => item.id)).size).toBe(items.length);

    // Paged a few at a time, the timeline is the same.
    for (const limit of [1, 3, 4]) expect(await everything(viewing, id, limit)).toEqual(items);
  });

  it('does not show a fork the caller may not read, and refuses a cursor it did not make', async () => {
    const [forker, reader] = [await buildUser(), await buildUser()];
    const notebook = await buildNotebook({
      members: [
        [forker, 'viewer'],
        [reader, 'viewer'],
      ],
    });
    const fork = NotebookSchema.parse(
      (await (await signedIn(server.url, forker.login)).post(`/api/notebooks/${notebook.id}/forks`, { title: 'Private try' })).body,
    );
    const readerClient = await signedIn(server.url, reader.login);
    const seen = ActivityPageSchema.parse((await readerClient.get(`/api/notebooks/${notebook.id}/activity`)).body);
    const forkItem = seen.items.find((item) => item.kind === 'fork');
    expect(forkItem).toMatchObject({ fork: null, actor: null });
    expect(JSON.stringify(seen)).not.toContain('Private try');
    expect(JSON.stringify(seen)).not.toContain(fork.id);
    const forkerView = ActivityPageSchema.parse((await (await signedIn(server.url, forker.login)).get(`/api/notebooks/${notebook.id}/activity`)).body);
    expect(forkerView.items.find((item) => item.kind === 'fork')).toMatchObject({ fork: { id: fork.id, title: 'Private try' }, actor: { id: forker.id } });

    for (const cursor of [
      'nonsense',
      Buffer.from('12.revision.DROP TABLE').toString('base64url'),
      Buffer.from('12.unknown.000000000001').toString('base64url'),
    ]) {
      const reply = await readerClient.get(`/api/notebooks/${notebook.id}/activity?cursor=${cursor}`);
      expect(reply.status, cursor).toBe(400);
      expect(reply.body).toMatchObject({ error: 'validation', details: { issues: [{ path: 'query.cursor' }] } });
    }
    expect((await readerClient.get(`/api/notebooks/${notebook.id}/activity?limit=0`)).status).toBe(400);
    const stranger = await signedIn(server.url, (await buildUser()).login);
    expect((await stranger.get(`/api/notebooks/${notebook.id}/activity`)).status).toBe(404);
  });
});
