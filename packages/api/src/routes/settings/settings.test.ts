import { describe, expect, it } from 'vitest';
import { ReviewSchema } from '../../contract/reviews.js';
import { SettingsSchema } from '../../contract/settings.js';
import { connect } from '../../db/connection.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('/api/me/settings', () => {
  const server = useTestServer();

  it('requires sign-in', async () => {
    const anonymous = new Client(server.url);
    for (const reply of [await anonymous.get('/api/me/settings'), await anonymous.patch('/api/me/settings', { mail: { pinReplies: false } })]) {
      expect(reply.status).toBe(401);
      expect(reply.body).toMatchObject({ error: 'unauthenticated' });
    }
  });

  it('has every kind of mail on at first, and changes only the kinds named', async () => {
    const user = await buildUser();
    const client = await signedIn(server.url, user.login);
    const everyOn = { mail: { reviewRequests: true, reviewDecisions: true, pinReplies: true, addedToNotebook: true } };
    expect(SettingsSchema.parse((await client.get('/api/me/settings')).body)).toEqual(everyOn);

    const changed = await client.patch('/api/me/settings', { mail: { pinReplies: false } });
    expect(changed.status).toBe(200);
    expect(changed.body).toEqual({ mail: { ...everyOn.mail, pinReplies: false } });
    await client.patch('/api/me/settings', { mail: { reviewRequests: false, addedToNotebook: false } });
    expect((await client.get('/api/me/settings')).body).toEqual({
      mail: { reviewRequests: false, reviewDecisions: true, pinReplies: false, addedToNotebook: false },
    });
    await client.patch('/api/me/settings', { mail: { pinReplies: true } });
    expect((await client.get('/api/me/settings')).body).toEqual({
      mail: { reviewRequests: false, reviewDecisions: true, pinReplies: true, addedToNotebook: false },
    });

    // Someone else's settings are their own.
    const other = await signedIn(server.url, (await buildUser()).login);
    expect((await other.get('/api/me/settings')).body).toEqual(everyOn);
  });

  it('refuses a body it cannot use, naming the field', async () => {
    const client = await signedIn(server.url, (await buildUser()).login);
    const cases: [unknown, RegExp][] = [
      [{}, /^mail: /],
      [{ mail: {} }, /Send at least one of/],
      [{ mail: { pinReplies: 'no' } }, /^mail\.pinReplies: /],
      [{ mail: { digest: true } }, /digest/],
      [{ mail: { pinReplies: false }, theme: 'dark' }, /theme/],
    ];
    for (const [body, message] of cases) {
      const reply = await client.patch<{ error: string; message: string }>('/api/me/settings', body);
      expect(reply.status, JSON.stringify(body)).toBe(400);
      expect(reply.body.message).toMatch(message);
    }
  });

  it('sends nothing of a kind a person turned off, and keeps sending the rest', async () => {
    const [quiet, loud] = [await buildUser(), await buildUser()];
    const notebook = await buildNotebook({
      members: [
        [quiet, 'reviewer'],
        [loud, 'reviewer'],
      ],
    });
    const quietClient = await signedIn(server.url, quiet.login);
    await quietClient.patch('/api/me/settings', { mail: { reviewRequests: false } });
    const owner = await signedIn(server.url, notebook.ownerUser.login);
    const review = ReviewSchema.parse((await owner.post(`/api/notebooks/${notebook.id}/reviews`, { reviewerIds: [quiet.id, loud.id] })).body);

    const mailbox = await server.mailbox();
    expect(mailbox.filter((m) => m.to.includes(quiet.email!))).toEqual([]);
    expect(mailbox.filter((m) => m.to.includes(loud.email!)).map((m) => m.subject)).toEqual([`Review requested: “${notebook.title}”, version 1`]);
    // Not even queued: the mail log has nothing for them.
    const db = await connect();
    expect(await db.query('SELECT id FROM mail_log WHERE userId = ?', [quiet.id])).toEqual([]);
    expect(await db.query('SELECT kind, status, attempts FROM mail_log WHERE userId = ?', [loud.id])).toEqual([
      { kind: 'reviewRequests', status: 'sent', attempts: 1 },
    ]);

    // Turning requests off leaves decisions on: the owner hears of the quiet reviewer's sign-off.
    await owner.patch('/api/me/settings', { mail: { reviewRequests: false } });
    await quietClient.post(`/api/notebooks/${notebook.id}/reviews/${review.id}/decision`, { state: 'signed_off' });
    expect((await server.mailbox()).filter((m) => m.to.includes(notebook.ownerUser.email!)).map((m) => m.subject)).toEqual([
      `Signed off: “${notebook.title}”, version 1`,
    ]);
    await owner.patch('/api/me/settings', { mail: { reviewDecisions: false } });
    await (await signedIn(server.url, loud.login)).post(`/api/notebooks/${notebook.id}/reviews/${review.id}/decision`, { state: 'signed_off' });
    expect((await server.mailbox()).filter((m) => m.to.includes(notebook.ownerUser.email!))).toHaveLength(1);
  });
});
