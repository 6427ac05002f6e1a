import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReviewSchema } from '../contract/reviews.js';
import { connect, disconnect } from '../db/connection.js';
import { signedIn } from '../../test/client.js';
import { buildNotebook, buildUser } from '../../test/factories.js';
import { startTestServer } from '../../test/http.js';
import type { TestServer } from '../../test/http.js';
import { isolatedPort } from '../../test/ports.js';

interface LogRow {
  toAddress: string;
  kind: string;
  notebookId: string;
  status: string;
  attempts: number;
  error: string | null;
  subject: string;
  finishedAt: Date | null;
}

describe('mail that cannot be delivered', () => {
  let dead: TestServer;
  beforeAll(async () => {
    // Nothing listens on this port: every attempt fails to connect. The waits between attempts
    // are long enough that the request has surely answered before the mail is given up on.
    dead = await startTestServer({ smtpPort: await isolatedPort(), retryDelays: [400, 400] });
  });
  afterAll(async () => {
    await dead.close();
    await disconnect();
  });

  it('never fails the request, is retried, and ends in the mail log as failed', async () => {
    const reviewer = await buildUser();
    const notebook = await buildNotebook({ members: [[reviewer, 'reviewer']] });
    const owner = await signedIn(dead.url, notebook.ownerUser.login);
    const asked = await owner.post(`/api/notebooks/${notebook.id}/reviews`, { reviewerIds: [reviewer.id] });
    expect(asked.status).toBe(201);
    const review = ReviewSchema.parse(asked.body);

    // The answer came before the mail was given up on: it is still queued or being retried.
    const db = await connect();
    const during: LogRow[] = await db.query('SELECT status FROM mail_log WHERE toAddress = ?', [reviewer.email]);
    expect(during.every((row) => row.status === 'queued')).toBe(true);

    await dead.notifier.idle();
    const rows: LogRow[] = await db.query(
      'SELECT toAddress, kind, notebookId, status, attempts, error, subject, finishedAt FROM mail_log WHERE toAddress = ?',
      [reviewer.email],
    );
    expect(rows).toEqual([
      {
        toAddress: reviewer.email,
        kind: 'reviewRequests',
        notebookId: notebook.id,
        status: 'failed',
        attempts: 3,
        error: expect.stringMatching(/ECONNREFUSED/),
        subject: `Review requested: “${notebook.title}”, version 1`,
        finishedAt: expect.any(Date),
      },
    ]);
    // The review itself is stored whatever became of the mail.
    expect((await owner.get(`/api/notebooks/${notebook.id}/reviews/${review.id}`)).status).toBe(200);
  });
});
