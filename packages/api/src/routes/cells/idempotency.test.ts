/**
 * `Idempotency-Key` on saves and other creating writes: the same key from the same user again
 * answers the first outcome (status and body), a different request with the key is 422, keys
 * are per user and count for a day.
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { CellSaved } from '../../contract/cells.js';
import { IDEMPOTENCY_HEADER, IDEMPOTENT_REPLAY_HEADER } from '../../contract/common.js';
import type { ErrorBody } from '../../contract/common.js';
import type { Notebook } from '../../contract/notebooks.js';
import { connect } from '../../db/connection.js';
import { signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('Idempotency-Key', () => {
  const server = useTestServer();
  const keyed = (key: string) => ({ headers: { [IDEMPOTENCY_HEADER]: key } });

  async function ownNotebook() {
    const editor = await buildUser();
    const notebook = await buildNotebook({ cells: [{ kind: 'circuit', text: rcLowPass }], members: [[editor, 'editor']] });
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const cellUrl = `/api/notebooks/${notebook.id}/cells/${notebook.cells[0]!.id}`;
    return { notebook, owner, editor: await signedIn(server.url, editor.login), cellUrl, cellsUrl: `/api/notebooks/${notebook.id}/cells` };
  }

  it('answers a repeated save with its first outcome, not a conflict with the sender’s own text', async () => {
    const { notebook, owner, cellUrl } = await ownNotebook();
    const key = randomUUID();
    const save = { text: `${rcLowPass}# tuned\n`, baseRevision: 1 };
    const first = await owner.put<CellSaved>(cellUrl, save, keyed(key));
    expect(first.status).toBe(201);
    expect(first.headers.get(IDEMPOTENT_REPLAY_HEADER)).toBeNull();

    // The answer was lost; the same attempt is sent again, even after the cell moved on.
    const again = await owner.put<CellSaved>(cellUrl, save, keyed(key));
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(again.headers.get(IDEMPOTENT_REPLAY_HEADER)).toBe('true');
    expect((await owner.put(cellUrl, { text: `${rcLowPass}# later\n`, baseRevision: 2 })).status).toBe(201);
    const late = await owner.put<CellSaved>(cellUrl, save, keyed(key));
    expect(late.status).toBe(201);
    expect(late.body.cell.revision).toBe(2);

    // Without the key the same request is what it always was: a conflict.
    expect((await owner.put(cellUrl, save)).status).toBe(409);
    const revisions = await owner.get<{ items: unknown[] }>(`${cellUrl}/revisions`);
    expect(revisions.body.items).toHaveLength(3);
    expect((await owner.get<Notebook>(`/api/notebooks/${notebook.id}`)).body.cells[0]!.revision).toBe(3);
  });

  it('refuses the same key on a different request with 422, saving nothing', async () => {
    const { owner, cellUrl } = await ownNotebook();
    const key = randomUUID();
    expect((await owner.put(cellUrl, { text: `${rcLowPass}# one\n`, baseRevision: 1 }, keyed(key))).status).toBe(201);
    const other = await owner.put<ErrorBody>(cellUrl, { text: `${rcLowPass}# two\n`, baseRevision: 2 }, keyed(key));
    expect(other.status).toBe(422);
    expect(other.body.error).toBe('key_reused');
    expect(other.body.message).toMatch(/already used for a different request.*Send a new key with a new request/);
    const elsewhere = await owner.post<ErrorBody>('/api/notebooks', { title: 'Elsewhere' }, keyed(key));
    expect(elsewhere.status).toBe(422);
    expect((await owner.get<{ items: unknown[] }>(`${cellUrl}/revisions`)).body.items).toHaveLength(2);
  });

  it('keeps each user’s keys apart', async () => {
    const { owner, editor, cellsUrl } = await ownNotebook();
    const key = randomUUID();
    const note = { kind: 'note', text: 'Check the bench supply.' };
    const mine = await owner.post<CellSaved>(cellsUrl, note, keyed(key));
    const theirs = await editor.post<CellSaved>(cellsUrl, note, keyed(key));
    expect([mine.status, theirs.status]).toEqual([201, 201]);
    expect(theirs.headers.get(IDEMPOTENT_REPLAY_HEADER)).toBeNull();
    expect(theirs.body.cell.id).not.toBe(mine.body.cell.id);
  });

  it('does a creating write once when the same attempt arrives twice at the same time', async () => {
    const { notebook, owner, cellsUrl } = await ownNotebook();
    const key = randomUUID();
    const note = { kind: 'note', text: 'Sent twice.' };
    const [a, b] = await Promise.all([owner.post<CellSaved>(cellsUrl, note, keyed(key)), owner.post<CellSaved>(cellsUrl, note, keyed(key))]);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(a.body).toEqual(b.body);
    expect((await owner.get<Notebook>(`/api/notebooks/${notebook.id}`)).body.cells).toHaveLength(2);

    const created = await Promise.all([1, 2].map(() => owner.post<Notebook>('/api/notebooks', { title: 'Once only' }, keyed(`${key}-nb`))));
    expect(created.map((reply) => reply.body.id)).toEqual([created[0]!.body.id, created[0]!.body.id]);
  });

  it('answers a repeated refusal with the same refusal, and forgets a key after a day', async () => {
    const { owner, cellUrl } = await ownNotebook();
    const key = randomUUID();
    const stale = { text: `${rcLowPass}# stale\n`, baseRevision: 7 };
    const refused = await owner.put<ErrorBody>(cellUrl, stale, keyed(key));
    expect(refused.status).toBe(409);
    const again = await owner.put<ErrorBody>(cellUrl, stale, keyed(key));
    expect(again.status).toBe(409);
    expect(again.body).toEqual(refused.body);
    expect(again.headers.get(IDEMPOTENT_REPLAY_HEADER)).toBe('true');

    const db = await connect();
    await db.query('UPDATE idempotency_keys SET createdAt = ? WHERE idempotencyKey = ?', [new Date(Date.now() - 25 * 3_600_000), key]);
    const fresh = await owner.put(cellUrl, { text: `${rcLowPass}# fresh\n`, baseRevision: 1 }, keyed(key));
    expect(fresh.status).toBe(201);
    expect(fresh.headers.get(IDEMPOTENT_REPLAY_HEADER)).toBeNull();
  });

  it('refuses a key that is not 1 to 255 visible ASCII characters with 400', async () => {
    const { owner, cellUrl } = await ownNotebook();
    for (const key of ['', 'a key with spaces', 'k'.repeat(256)]) {
      const reply = await owner.put<ErrorBody>(cellUrl, { text: rcLowPass, baseRevision: 1 }, keyed(key));
      expect(reply.status, JSON.stringify(key)).toBe(400);
      expect(reply.body.message).toMatch(/idempotency-key header must be 1 to 255 visible ASCII characters/);
    }
  });
});
