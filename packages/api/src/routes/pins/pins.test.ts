import { describe, expect, it } from 'vitest';
import { LIMITS } from '../../contract/common.js';
import { PinListSchema, PinSchema } from '../../contract/pins.js';
import type { Pin } from '../../contract/pins.js';
import type { User } from '../../db/entities/user.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

interface ErrorReply {
  error: string;
  message: string;
  details?: { issues: { path: string; message: string }[] };
}

/** The RC low-pass corner 1/(2π·1 kΩ·100 nF) in Hz, as a reviewer would type it from a plot. */
const corner = 1 / (2 * Math.PI * 1e3 * 100e-9);

describe('/api/notebooks/:id/pins', () => {
  const server = useTestServer();

  async function team() {
    const [editor, reviewer, other, viewer] = [await buildUser(), await buildUser(), await buildUser(), await buildUser()];
    const notebook = await buildNotebook({
      members: [
        [editor, 'editor'],
        [reviewer, 'reviewer'],
        [other, 'reviewer'],
        [viewer, 'viewer'],
      ],
    });
    const as = (user: User) => signedIn(server.url, user.login);
    return {
      notebook,
      circuit: notebook.cells[1]!,
      people: { owner: notebook.ownerUser, editor, reviewer, other, viewer },
      clients: {
        owner: await as(notebook.ownerUser),
        editor: await as(editor),
        reviewer: await as(reviewer),
        other: await as(other),
        viewer: await as(viewer),
      },
      base: `/api/notebooks/${notebook.id}/pins`,
    };
  }

  const mailTo = async (address: string) => (await server.mailbox()).filter((m) => m.to.includes(address));

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const anonymous = new Client(server.url);
    const base = `/api/notebooks/${notebook.id}/pins`;
    for (const reply of [
      await anonymous.get(base),
      await anonymous.post(base, { cellId: notebook.cells[1]!.id, trace: 'out', frequency: 1000, body: 'x' }),
      await anonymous.post(`${base}/1/comments`, { body: 'x' }),
      await anonymous.post(`${base}/1/resolve`),
      await anonymous.post(`${base}/1/reopen`),
    ]) {
      expect(reply.status).toBe(401);
      expect(reply.body).toMatchObject({ error: 'unauthenticated' });
    }
  });

  it('keeps a pin on the revision it was made on as the cell moves on', async () => {
    const { notebook, circuit, people, clients, base } = await team();
    const made = await clients.reviewer.post<Pin>(base, { cellId: circuit.id, trace: ' out ', frequency: corner, body: 'Is this the **corner** we want?' });
    expect(made.status).toBe(201);
    const pin = PinSchema.parse(made.body);
    expect(pin).toMatchObject({
      notebookId: notebook.id,
      cellId: circuit.id,
      revisionNumber: 1,
      currentRevisionNumber: 1,
      trace: 'out',
      resolved: false,
      resolvedBy: null,
      createdBy: { id: people.reviewer.id },
    });
    // DOUBLE keeps every bit of the frequency.
    expect(pin.frequency).toBe(corner);
    expect(pin.comments.map((c) => [c.author?.id, c.body])).toEqual([[people.reviewer.id, 'Is this the **corner** we want?']]);

    expect(
      (await clients.editor.put(`/api/notebooks/${notebook.id}/cells/${circuit.id}`, { text: rcLowPass.replace('100n', '120n'), baseRevision: 1 })).status,
    ).toBe(201);
    const later = PinListSchema.parse((await clients.viewer.get(base)).body);
    expect(later.items.map((p) => [p.id, p.revisionNumber, p.currentRevisionNumber])).toEqual([[pin.id, 1, 2]]);

    // A pin can be put on an older revision on purpose, or on the current one by default.
    const onOld = PinSchema.parse(
      (await clients.other.post(base, { cellId: circuit.id, revisionNumber: 1, trace: 'out', frequency: 50, body: 'Flat here.' })).body,
    );
    const onNew = PinSchema.parse((await clients.editor.post(base, { cellId: circuit.id, trace: 'out', frequency: 2e3, body: 'Moved.' })).body);
    expect([onOld.revisionNumber, onNew.revisionNumber]).toEqual([1, 2]);

    // Filtered by cell, oldest first.
    const other = await clients.owner.post<{ cell: { id: number } }>(`/api/notebooks/${notebook.id}/cells`, { kind: 'circuit', text: rcLowPass });
    const elsewhere = PinSchema.parse(
      (await clients.owner.post(base, { cellId: other.body.cell.id, trace: 'out', frequency: 10, body: 'Another cell.' })).body,
    );
    expect(PinListSchema.parse((await clients.viewer.get(`${base}?cellId=${circuit.id}`)).body).items.map((p) => p.id)).toEqual([pin.id, onOld.id, onNew.id]);
    expect(PinListSchema.parse((await clients.viewer.get(`${base}?cellId=${other.body.cell.id}`)).body).items.map((p) => p.id)).toEqual([elsewhere.id]);
    expect(PinListSchema.parse((await clients.viewer.get(base)).body).items).toHaveLength(4);
    expect((await clients.viewer.get(`${base}?cellId=abc`)).status).toBe(400);
  });

  it('refuses a pin without a place, trace, frequency or text, saying which field is wrong', async () => {
    const { notebook, circuit, clients, base } = await team();
    const good = { cellId: circuit.id, trace: 'out', frequency: 1000, body: 'x' };
    const cases: [unknown, string, RegExp][] = [
      [{ ...good, frequency: 0 }, 'frequency', /above 0 Hz/],
      [{ ...good, frequency: -5 }, 'frequency', /above 0 Hz/],
      [{ ...good, frequency: '1k' }, 'frequency', /finite number of Hz/],
      [{ ...good, trace: '   ' }, 'trace', /Name the trace/],
      [{ ...good, trace: 'x'.repeat(LIMITS.traceLabelLength + 1) }, 'trace', /at most 100/],
      [{ ...good, body: '  ' }, 'body', /cannot be empty/],
      [{ ...good, body: 'x'.repeat(LIMITS.markdownLength + 1) }, 'body', /at most 10000/],
      [{ ...good, cellId: 999999 }, 'cellId', /no cell with id 999999/],
      [{ ...good, cellId: notebook.cells[0]!.id }, 'cellId', /cellId: Note 1 is a note cell/],
      [{ ...good, revisionNumber: 4 }, 'revisionNumber', /no revision 4; its latest is revision 1/],
      [{ ...good, trace: 'nowhere' }, 'trace', /Revision 1 of Circuit 2 does not show a trace “nowhere”; it shows “out”/],
      [{ ...good, colour: 'red' }, '', /colour/],
    ];
    for (const [body, path, message] of cases) {
      const reply = await clients.reviewer.post<ErrorReply>(base, body);
      expect(reply.status, JSON.stringify(body).slice(0, 80)).toBe(400);
      expect(reply.body.error).toBe('validation');
      expect(reply.body.message).toMatch(message);
      if (path) expect(reply.body.details!.issues.map((i) => i.path)).toContain(path);
    }
    // JSON can spell a number too large for a double: it arrives as Infinity and is refused.
    const huge = await clients.reviewer.post<ErrorReply>(base, undefined, {
      raw: `{"cellId": ${circuit.id}, "trace": "out", "frequency": 1e400, "body": "x"}`,
    });
    expect(huge.status).toBe(400);
    expect(huge.body.details!.issues).toEqual([{ path: 'frequency', message: 'A frequency is a finite number of Hz.' }]);
    // A long comment within the limit is kept whole.
    const long = 'Ω'.repeat(LIMITS.markdownLength);
    expect(PinSchema.parse((await clients.reviewer.post(base, { ...good, body: long })).body).comments[0]!.body).toBe(long);
    expect(PinListSchema.parse((await clients.owner.get(base)).body).items).toHaveLength(1);
  });

  it('threads replies, resolves and reopens; asking twice for the same state changes nothing', async () => {
    const { circuit, people, clients, base } = await team();
    const pin = PinSchema.parse((await clients.reviewer.post(base, { cellId: circuit.id, trace: 'out', frequency: 1000, body: 'Too much peaking?' })).body);
    const reply = await clients.editor.post<Pin>(`${base}/${pin.id}/comments`, { body: 'Q is 0.5 here; no peaking.' });
    expect(reply.status).toBe(201);
    expect(PinSchema.parse(reply.body).comments.map((c) => [c.author?.id, c.body])).toEqual([
      [people.reviewer.id, 'Too much peaking?'],
      [people.editor.id, 'Q is 0.5 here; no peaking.'],
    ]);

    const resolved = PinSchema.parse((await clients.reviewer.post(`${base}/${pin.id}/resolve`)).body);
    expect(resolved).toMatchObject({ resolved: true, resolvedBy: { id: people.reviewer.id } });
    const again = PinSchema.parse((await clients.owner.post(`${base}/${pin.id}/resolve`)).body);
    expect(again).toMatchObject({ resolved: true, resolvedBy: { id: people.reviewer.id }, resolvedAt: resolved.resolvedAt });
    // A resolved pin still takes replies, and stays resolved.
    expect(PinSchema.parse((await clients.other.post(`${base}/${pin.id}/comments`, { body: 'Agreed.' })).body)).toMatchObject({ resolved: true });

    const reopened = PinSchema.parse((await clients.owner.post(`${base}/${pin.id}/reopen`)).body);
    expect(reopened).toMatchObject({ resolved: false, resolvedBy: null, resolvedAt: null });
    expect(PinSchema.parse((await clients.owner.post(`${base}/${pin.id}/reopen`)).body).resolved).toBe(false);

    expect((await clients.editor.post(`${base}/${pin.id}/comments`, { body: '' })).status).toBe(400);
    for (const path of [`${base}/999999/comments`, `${base}/999999/resolve`, `${base}/x/reopen`]) {
      const missing = await clients.owner.post<ErrorReply>(path, { body: 'x' });
      expect(missing.status, path).toBe(404);
    }
    expect((await clients.owner.post<ErrorReply>(`${base}/999999/resolve`)).body.message).toBe('That pin was not found.');
  });

  it('lets a viewer read pins but not pin, reply or resolve; a stranger gets 404', async () => {
    const { circuit, clients, base } = await team();
    const pin = PinSchema.parse((await clients.reviewer.post(base, { cellId: circuit.id, trace: 'out', frequency: 1000, body: 'Check.' })).body);
    expect((await clients.viewer.get(base)).status).toBe(200);
    for (const reply of [
      await clients.viewer.post(base, { cellId: circuit.id, trace: 'out', frequency: 1000, body: 'Mine.' }),
      await clients.viewer.post(`${base}/${pin.id}/comments`, { body: 'Mine.' }),
      await clients.viewer.post(`${base}/${pin.id}/resolve`),
      await clients.viewer.post(`${base}/${pin.id}/reopen`),
    ]) {
      expect(reply.status).toBe(403);
      expect(reply.body).toMatchObject({ error: 'forbidden' });
    }
    const stranger = await signedIn(server.url, (await buildUser()).login);
    expect((await stranger.get(base)).status).toBe(404);
    expect((await stranger.post(`${base}/${pin.id}/comments`, { body: 'Hi.' })).status).toBe(404);
    // Nothing they tried was stored.
    expect(PinListSchema.parse((await clients.owner.get(base)).body).items.map((p) => p.comments.length)).toEqual([1]);
  });

  it('mails a reply to the people earlier in the thread, never to its author', async () => {
    const { notebook, circuit, people, clients, base } = await team();
    const pin = PinSchema.parse((await clients.reviewer.post(base, { cellId: circuit.id, trace: 'out', frequency: corner, body: 'Corner too high?' })).body);
    // Making a pin mails nobody: there is nobody in its thread yet.
    expect(await mailTo(people.owner.email!)).toEqual([]);

    await clients.editor.post(`${base}/${pin.id}/comments`, { body: 'It meets the 1.2 kHz requirement.' });
    const toReviewer = await mailTo(people.reviewer.email!);
    expect(toReviewer).toHaveLength(1);
    expect(toReviewer[0]!.subject).toBe(`New reply on a pin in “${notebook.title}”`);
    // 1591.549… Hz, the corner above, shown to four digits.
    expect(toReviewer[0]!.text).toContain('the pin at 1.592 kHz on trace out of Circuit 2 (revision 1)');
    expect(toReviewer[0]!.text).toContain('> It meets the 1.2 kHz requirement.');
    expect(toReviewer[0]!.text).toContain(`${server.url}/notebooks/${notebook.id}#pin-${pin.id}`);
    expect(await mailTo(people.editor.email!)).toEqual([]);

    await clients.other.post(`${base}/${pin.id}/comments`, { body: 'Agreed.' });
    expect(await mailTo(people.reviewer.email!)).toHaveLength(2);
    expect(await mailTo(people.editor.email!)).toHaveLength(1);
    expect(await mailTo(people.other.email!)).toEqual([]);
    // The owner and the viewer were never in the thread.
    expect(await mailTo(people.owner.email!)).toEqual([]);
    expect(await mailTo(people.viewer.email!)).toEqual([]);
  });
});
