import { describe, expect, it } from 'vitest';
import { NotebookSchema } from '../../contract/notebooks.js';
import { ReviewListSchema, ReviewSchema } from '../../contract/reviews.js';
import type { Review } from '../../contract/reviews.js';
import { VersionListSchema } from '../../contract/versions.js';
import type { User } from '../../db/entities/user.js';
import { Client, signedIn } from '../../../test/client.js';
import type { Reply } from '../../../test/client.js';
import { buildNotebook, buildUser, rcLowPass } from '../../../test/factories.js';
import { useTestServer } from '../../../test/use-test-server.js';

interface ErrorReply {
  error: string;
  message: string;
  details?: { issues: { path: string; message: string }[] };
}

describe('/api/notebooks/:id/reviews', () => {
  const server = useTestServer();

  /** A notebook with an editor who asks, two reviewers, a viewer, and a reviewer nobody asks. */
  async function team() {
    const [editor, first, second, viewer, idle] = [await buildUser(), await buildUser(), await buildUser(), await buildUser(), await buildUser()];
    const notebook = await buildNotebook({
      members: [
        [editor, 'editor'],
        [first, 'reviewer'],
        [second, 'reviewer'],
        [viewer, 'viewer'],
        [idle, 'reviewer'],
      ],
    });
    const as = async (user: User) => signedIn(server.url, user.login);
    return {
      notebook,
      people: { editor, first, second, viewer, idle, owner: notebook.ownerUser },
      clients: {
        owner: await as(notebook.ownerUser),
        editor: await as(editor),
        first: await as(first),
        second: await as(second),
        viewer: await as(viewer),
        idle: await as(idle),
      },
      base: `/api/notebooks/${notebook.id}/reviews`,
    };
  }

  const mailTo = async (address: string) => (await server.mailbox()).filter((m) => m.to.includes(address));

  it('requires sign-in', async () => {
    const notebook = await buildNotebook();
    const anonymous = new Client(server.url);
    const base = `/api/notebooks/${notebook.id}/reviews`;
    for (const reply of [
      await anonymous.post(base, { reviewerIds: [1] }),
      await anonymous.get(base),
      await anonymous.get(`${base}/1`),
      await anonymous.post(`${base}/1/decision`, { state: 'signed_off' }),
    ]) {
      expect(reply.status).toBe(401);
      expect(reply.body).toMatchObject({ error: 'unauthenticated' });
    }
  });

  it('asks reviewers to review a new "For review" version, and mails each of them a link to it', async () => {
    const { notebook, people, clients, base } = await team();
    const asked = await clients.editor.post<Review>(base, {
      reviewerIds: [people.first.id, people.second.id, people.first.id],
      message: 'Check the **corner** against the converter.',
    });
    expect(asked.status).toBe(201);
    const review = ReviewSchema.parse(asked.body);
    expect(review).toMatchObject({
      notebookId: notebook.id,
      round: 1,
      version: { number: 1, label: 'For review' },
      requestedBy: { id: people.editor.id },
      message: 'Check the **corner** against the converter.',
      state: 'requested',
      superseded: false,
      history: [],
    });
    expect(review.reviewers.map((r) => [r.user.id, r.state, r.decidedAt])).toEqual([
      [people.first.id, 'requested', null],
      [people.second.id, 'requested', null],
    ]);
    // The version holds every cell as it was.
    const versions = VersionListSchema.parse((await clients.first.get(`/api/notebooks/${notebook.id}/versions`)).body);
    expect(versions.items.map((v) => [v.number, v.label, v.cellCount])).toEqual([[1, 'For review', 2]]);

    // Anyone who may read sees the rounds and the state in the notebook's header.
    const list = ReviewListSchema.parse((await clients.viewer.get(base)).body);
    expect(list.items).toEqual([review]);
    expect(ReviewSchema.parse((await clients.viewer.get(`${base}/${review.id}`)).body)).toEqual(review);
    const header = NotebookSchema.parse((await clients.viewer.get(`/api/notebooks/${notebook.id}`)).body);
    expect(header.review).toEqual({ reviewId: review.id, round: 1, state: 'requested', versionNumber: 1 });

    for (const person of [people.first, people.second]) {
      const mails = await mailTo(person.email!);
      expect(mails).toHaveLength(1);
      expect(mails[0]!.subject).toBe(`Review requested: “${notebook.title}”, version 1`);
      expect(mails[0]!.text).toContain(`${server.url}/notebooks/${notebook.id}?review=${review.id}`);
      // The name the person signed in with (the stand-in's, as GitHub's would be).
      expect(mails[0]!.text).toContain(`${review.requestedBy!.name} asks you to review version 1`);
      expect(mails[0]!.text).toContain('> Check the **corner** against the converter.');
    }
    // Nobody else is mailed: not the editor who asked, not the others.
    for (const person of [people.editor, people.owner, people.viewer, people.idle]) expect(await mailTo(person.email!)).toEqual([]);
  });

  it('reviews the latest version when nothing changed since, and makes a new one when something did', async () => {
    const { notebook, people, clients, base } = await team();
    expect((await clients.owner.post(`/api/notebooks/${notebook.id}/versions`, { label: 'Ready' })).status).toBe(201);
    const first = ReviewSchema.parse((await clients.owner.post(base, { reviewerIds: [people.first.id] })).body);
    expect(first.version).toEqual({ number: 1, label: 'Ready' });

    const cell = notebook.cells[1]!;
    expect((await clients.editor.put(`/api/notebooks/${notebook.id}/cells/${cell.id}`, { text: `${rcLowPass}# C1 to 120n\n`, baseRevision: 1 })).status).toBe(
      201,
    );
    const second = ReviewSchema.parse((await clients.editor.post(base, { reviewerIds: [people.first.id] })).body);
    expect(second).toMatchObject({ round: 2, version: { number: 2, label: 'For review' } });

    // A version named in the request is used as it is.
    const named = await clients.editor.post<ErrorReply>(base, { reviewerIds: [people.first.id], versionNumber: 9 });
    expect(named.status).toBe(400);
    expect(named.body.details!.issues).toEqual([{ path: 'versionNumber', message: 'This notebook has no version 9.' }]);
  });

  it('moves each reviewer from requested to needs changes or signed off, and refuses the illegal moves', async () => {
    const { notebook, people, clients, base } = await team();
    const review = ReviewSchema.parse((await clients.editor.post(base, { reviewerIds: [people.first.id, people.second.id] })).body);
    const decide = (client: Client, body: unknown) => client.post<Review | ErrorReply>(`${base}/${review.id}/decision`, body);

    // Asking for changes needs a summary.
    const bare = (await decide(clients.first, { state: 'needs_changes' })) as Reply<ErrorReply>;
    expect(bare.status).toBe(400);
    expect(bare.body.details!.issues[0]!.path).toBe('summary');
    expect((await decide(clients.first, { state: 'approved', summary: 'x' })).status).toBe(400);

    const changes = await decide(clients.first, { state: 'needs_changes', summary: 'The corner sits at 1.6 kHz; the spec says 1.2 kHz.' });
    expect(changes.status).toBe(200);
    expect(ReviewSchema.parse(changes.body)).toMatchObject({ state: 'needs_changes' });

    const twice = (await decide(clients.first, { state: 'needs_changes', summary: 'Again.' })) as Reply<ErrorReply>;
    expect(twice.status).toBe(409);
    expect(twice.body.message).toMatch(/already asked for changes in round 1/);

    const signed = ReviewSchema.parse((await decide(clients.second, { state: 'signed_off', summary: '' })).body);
    expect(signed.state).toBe('needs_changes');
    expect(signed.reviewers.find((r) => r.user.id === people.second.id)).toMatchObject({ state: 'signed_off', summary: '' });

    // From needs changes to signed off, within the round.
    const both = ReviewSchema.parse((await decide(clients.first, { state: 'signed_off', summary: 'Fine after all: the spec was old.' })).body);
    expect(both.state).toBe('signed_off');
    expect(both.history.map((h) => [h.reviewer?.id, h.state])).toEqual([
      [people.first.id, 'needs_changes'],
      [people.second.id, 'signed_off'],
      [people.first.id, 'signed_off'],
    ]);
    expect(both.reviewers.find((r) => r.user.id === people.first.id)).toMatchObject({ state: 'signed_off', summary: 'Fine after all: the spec was old.' });

    for (const body of [{ state: 'needs_changes', summary: 'One more thing.' }, { state: 'signed_off' }]) {
      const after = (await decide(clients.first, body)) as Reply<ErrorReply>;
      expect(after.status).toBe(409);
      expect(after.body.message).toMatch(/already signed off round 1/);
    }

    // Only the people asked may decide: not an unasked reviewer, the editor, or the owner.
    for (const client of [clients.idle, clients.editor, clients.owner]) {
      const refused = (await decide(client, { state: 'signed_off' })) as Reply<ErrorReply>;
      expect(refused.status).toBe(403);
      expect(refused.body.message).toMatch(/you were not asked/);
    }
    expect((await decide(clients.viewer, { state: 'signed_off' })).status).toBe(403);
    const stranger = await signedIn(server.url, (await buildUser()).login);
    expect((await decide(stranger, { state: 'signed_off' })).status).toBe(404);
    expect((await clients.first.post(`${base}/999999/decision`, { state: 'signed_off' })).status).toBe(404);

    const header = NotebookSchema.parse((await clients.viewer.get(`/api/notebooks/${notebook.id}`)).body);
    expect(header.review).toMatchObject({ round: 1, state: 'signed_off' });
    // A reviewer reads and decides, but does not edit cells.
    expect((await clients.first.put(`/api/notebooks/${notebook.id}/cells/${notebook.cells[1]!.id}`, { text: 'x', baseRevision: 1 })).status).toBe(403);
  });

  it('starts a new round for a later version, which supersedes the open one', async () => {
    const { notebook, people, clients, base } = await team();
    const round1 = ReviewSchema.parse((await clients.editor.post(base, { reviewerIds: [people.first.id] })).body);
    await clients.first.post(`${base}/${round1.id}/decision`, { state: 'needs_changes', summary: 'Raise C1.' });

    const cell = notebook.cells[1]!;
    await clients.editor.put(`/api/notebooks/${notebook.id}/cells/${cell.id}`, { text: rcLowPass.replace('100n', '120n'), baseRevision: 1 });
    const asked = await clients.editor.post<Review>(base, { reviewerIds: [people.first.id], message: 'C1 raised.' });
    expect(asked.status).toBe(201);
    const round2 = ReviewSchema.parse(asked.body);
    expect(round2).toMatchObject({ round: 2, version: { number: 2 }, state: 'requested', superseded: false });

    const list = ReviewListSchema.parse((await clients.viewer.get(base)).body);
    expect(list.items.map((r) => [r.round, r.superseded, r.state])).toEqual([
      [2, false, 'requested'],
      [1, true, 'needs_changes'],
    ]);

    // A superseded round takes no decisions; the new one does.
    const late = await clients.first.post<ErrorReply>(`${base}/${round1.id}/decision`, { state: 'signed_off' });
    expect(late.status).toBe(409);
    expect(late.body.message).toBe('Round 1 was superseded by round 2; decide on round 2 instead.');
    expect((await clients.first.post(`${base}/${round2.id}/decision`, { state: 'signed_off' })).status).toBe(200);

    // The same version again adds people to the open round; nobody is asked twice.
    const more = await clients.editor.post<Review>(base, { reviewerIds: [people.first.id, people.second.id] });
    expect(more.status).toBe(200);
    expect(ReviewSchema.parse(more.body)).toMatchObject({ id: round2.id, state: 'requested' });
    expect(more.body.reviewers.map((r) => [r.user.id, r.state])).toEqual([
      [people.first.id, 'signed_off'],
      [people.second.id, 'requested'],
    ]);
    const again = await clients.editor.post<ErrorReply>(base, { reviewerIds: [people.second.id] });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/already asked to review version 2 in round 2/);
    // An older version than the open round's is refused.
    const older = await clients.editor.post<ErrorReply>(base, { reviewerIds: [people.second.id], versionNumber: 1 });
    expect(older.status).toBe(409);
    expect(older.body.message).toMatch(/Round 2 reviews version 2, which is newer than version 1/);

    const header = NotebookSchema.parse((await clients.owner.get(`/api/notebooks/${notebook.id}`)).body);
    expect(header.review).toEqual({ reviewId: round2.id, round: 2, state: 'requested', versionNumber: 2 });
    // The first reviewer was asked once per round; the second once, when added.
    expect((await mailTo(people.first.email!)).filter((m) => m.subject.startsWith('Review requested'))).toHaveLength(2);
    expect((await mailTo(people.second.email!)).map((m) => m.subject)).toEqual([`Review requested: “${notebook.title}”, version 2`]);
  });

  it('asks only members with the reviewer role or higher, never oneself, and only an editor or the owner asks', async () => {
    const { notebook, people, clients, base } = await team();
    const outsider = await buildUser();
    const refused = await clients.editor.post<ErrorReply>(base, { reviewerIds: [people.editor.id, people.viewer.id, outsider.id, 999999, people.owner.id] });
    expect(refused.status).toBe(400);
    expect(refused.body.details!.issues).toEqual([
      { path: 'reviewerIds.0', message: 'You cannot review your own request; ask someone else.' },
      { path: 'reviewerIds.1', message: `${people.viewer.login} is not a member with the reviewer role or higher; give them that role first.` },
      { path: 'reviewerIds.2', message: `${outsider.login} is not a member with the reviewer role or higher; give them that role first.` },
      { path: 'reviewerIds.3', message: 'There is no active user 999999.' },
    ]);
    // Nothing was stored, not even a version.
    expect(ReviewListSchema.parse((await clients.owner.get(base)).body).items).toEqual([]);
    expect(VersionListSchema.parse((await clients.owner.get(`/api/notebooks/${notebook.id}/versions`)).body).items).toEqual([]);

    for (const body of [{ reviewerIds: [] }, {}, { reviewerIds: ['1'] }, { reviewerIds: [people.first.id], colour: 'red' }]) {
      expect((await clients.editor.post(base, body)).status, JSON.stringify(body)).toBe(400);
    }
    // The owner can be asked; a reviewer cannot ask; a stranger learns nothing.
    expect((await clients.editor.post(base, { reviewerIds: [people.owner.id] })).status).toBe(201);
    expect((await clients.first.post(base, { reviewerIds: [people.second.id] })).status).toBe(403);
    const stranger = await signedIn(server.url, outsider.login);
    expect((await stranger.post(base, { reviewerIds: [people.first.id] })).status).toBe(404);
    expect((await stranger.get(base)).status).toBe(404);
    expect((await clients.owner.get(`${base}/abc`)).status).toBe(404);
    // A round of another notebook is not found through this one.
    const other = await buildNotebook({ owner: people.owner, members: [[people.first, 'reviewer']] });
    const elsewhere = ReviewSchema.parse((await clients.owner.post(`/api/notebooks/${other.id}/reviews`, { reviewerIds: [people.first.id] })).body);
    expect((await clients.owner.get(`${base}/${elsewhere.id}`)).status).toBe(404);
  });

  it("mails each decision to the requester and the notebook's editors and owner, but not to the reviewer", async () => {
    const { notebook, people, clients, base } = await team();
    const review = ReviewSchema.parse((await clients.editor.post(base, { reviewerIds: [people.first.id, people.second.id] })).body);
    await clients.first.post(`${base}/${review.id}/decision`, { state: 'needs_changes', summary: 'Raise C1 to 120n.' });
    const decided = ReviewSchema.parse((await clients.second.post(`${base}/${review.id}/decision`, { state: 'signed_off', summary: 'Good to go.' })).body);
    const firstName = decided.history[0]!.reviewer!.name;

    for (const person of [people.editor, people.owner]) {
      const mails = (await mailTo(person.email!)).sort((a, b) => a.id - b.id);
      expect(mails.map((m) => m.subject)).toEqual([`Needs changes: “${notebook.title}”, version 1`, `Signed off: “${notebook.title}”, version 1`]);
      expect(mails[0]!.text).toContain(`${firstName} says version 1 of “${notebook.title}” needs changes`);
      expect(mails[0]!.text).toContain('> Raise C1 to 120n.');
      expect(mails[1]!.text).toContain(`${server.url}/notebooks/${notebook.id}?review=${review.id}`);
    }
    // Each reviewer got only the request, never their own or each other's decisions.
    for (const person of [people.first, people.second]) {
      expect((await mailTo(person.email!)).map((m) => m.subject)).toEqual([`Review requested: “${notebook.title}”, version 1`]);
    }
    expect(await mailTo(people.viewer.email!)).toEqual([]);
  });
});
