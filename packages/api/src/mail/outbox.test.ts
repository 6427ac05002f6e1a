import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { MailStatusSchema } from '../contract/mail-status.js';
import { createDataSource } from '../db/data-source.js';
import type { User } from '../db/entities/user.js';
import { connect, disconnect } from '../db/connection.js';
import { createSmtpStandin } from '../standins/smtp/mailbox.js';
import type { SmtpStandin } from '../standins/smtp/mailbox.js';
import { signedIn } from '../../test/client.js';
import { buildNotebook, buildUser, uniqueLogin } from '../../test/factories.js';
import { startTestServer, testOutboxTiming } from '../../test/http.js';
import type { TestServer } from '../../test/http.js';
import { isolatedPort } from '../../test/ports.js';
import { createRelay } from './mailer.js';
import { createOutbox, queueMail, retryDelay } from './outbox.js';

interface LogRow {
  status: string;
  attempts: number;
  error: string | null;
  finishedAt: Date | null;
}

const logOf = async (address: string): Promise<LogRow[]> =>
  (await connect()).query('SELECT status, attempts, error, finishedAt FROM mail_log WHERE toAddress = ? ORDER BY id', [address]);

const outboxRowsOf = async (address: string): Promise<unknown[]> =>
  (await connect()).query('SELECT o.mailLogId FROM mail_outbox o JOIN mail_log l ON l.id = o.mailLogId WHERE l.toAddress = ?', [address]);

/** Runs `step` (a pass of a sender) until `check` holds, failing after a few seconds. */
async function until(what: string, check: () => Promise<boolean>, step: () => Promise<void>): Promise<void> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    await step();
    if (await check()) return;
    if (Date.now() > deadline) throw new Error(`timed out waiting until ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** Asks for a review of a new notebook from `reviewer`; the request's answer and the review. */
async function askForReview(server: TestServer, reviewer: User) {
  const notebook = await buildNotebook({ members: [[reviewer, 'reviewer']] });
  const owner = await signedIn(server.url, notebook.ownerUser.login);
  return { notebook, asked: await owner.post(`/api/notebooks/${notebook.id}/reviews`, { reviewerIds: [reviewer.id] }) };
}

describe('the mail outbox', () => {
  afterAll(async () => {
    await disconnect();
  });

  it('backs off exponentially, up to its ceiling', () => {
    // Doubling waits with a ceiling: common practice for retrying a service that is away.
    const timing = { ...testOutboxTiming, firstRetryMs: 100, maxRetryMs: 1000 };
    expect([1, 2, 3, 4, 5, 9].map((attempts) => retryDelay(timing, attempts))).toEqual([100, 200, 400, 800, 1000, 1000]);
  });

  describe('while the relay is down, and once it is back', () => {
    let relayPort: number;
    let server: TestServer;
    let relayBack: SmtpStandin | undefined;
    beforeAll(async () => {
      relayPort = await isolatedPort();
      // Retries are an hour apart: only the sender's asking whether the relay is back sends the mail soon.
      server = await startTestServer({ smtpPort: relayPort, outbox: { firstRetryMs: 3_600_000, maxRetryMs: 3_600_000 } });
    });
    afterAll(async () => {
      await server.close();
      await relayBack?.close();
    });

    it('keeps the action and queues its mail, then sends it exactly once when the relay answers again', async () => {
      const reviewer = await buildUser();
      const { notebook, asked } = await askForReview(server, reviewer);
      expect(asked.status).toBe(201);

      // Tried, refused by a closed port, and kept for later.
      await until('the first attempt failed', async () => (await logOf(reviewer.email!))[0]?.attempts! >= 1, server.outbox.sendDue);
      const [waiting] = await logOf(reviewer.email!);
      expect(waiting).toMatchObject({ status: 'queued', finishedAt: null, error: expect.stringMatching(/ECONNREFUSED/) });
      expect(await outboxRowsOf(reviewer.email!)).toHaveLength(1);

      const admin = await signedIn(server.url, (await buildUser({ siteRole: 'admin' })).login);
      const down = MailStatusSchema.parse((await admin.get('/api/admin/mail')).body);
      expect(down.relay).toMatchObject({ address: `127.0.0.1:${relayPort}`, up: false, error: expect.stringMatching(/ECONNREFUSED/) });
      expect(down.queued).toBeGreaterThanOrEqual(1);
      expect(down.oldestQueuedAt).not.toBeNull();
      // Everyone else is told the page is for admins.
      expect((await (await signedIn(server.url, reviewer.login)).get('/api/admin/mail')).status).toBe(403);

      relayBack = await createSmtpStandin({ smtpPort: relayPort });
      await server.outbox.drain();
      const received = relayBack.messages().filter((m) => m.to.includes(reviewer.email!));
      expect(received.map((m) => m.subject)).toEqual([`Review requested: “${notebook.title}”, version 1`]);
      const [sent] = await logOf(reviewer.email!);
      expect(sent).toMatchObject({ status: 'sent', error: null, finishedAt: expect.any(Date) });
      expect(sent!.attempts).toBeGreaterThanOrEqual(2);

      // Later passes find nothing more to send.
      await new Promise((resolve) => setTimeout(resolve, testOutboxTiming.maxRetryMs));
      await server.outbox.sendDue();
      expect(relayBack.messages().filter((m) => m.to.includes(reviewer.email!))).toHaveLength(1);
      expect(await outboxRowsOf(reviewer.email!)).toEqual([]);

      const up = MailStatusSchema.parse((await admin.get('/api/admin/mail')).body);
      expect(up.relay).toMatchObject({ up: true, error: null });
      expect(up.sentLastDay).toBeGreaterThanOrEqual(1);
    });
  });

  describe('when the relay refuses a recipient', () => {
    let server: TestServer;
    let busy = true;
    beforeAll(async () => {
      server = await startTestServer({
        refuse: (address) => {
          if (address.startsWith('gone-')) return { code: 550, message: '5.1.1 No such mailbox here' };
          if (address.startsWith('full-') && busy) return { code: 452, message: '4.2.2 Mailbox full, try later' };
          return null;
        },
      });
    });
    afterAll(async () => {
      await server.close();
    });

    it('gives up at once on a permanent refusal (5xx) and records why', async () => {
      const reviewer = await buildUser({ login: uniqueLogin('gone') });
      expect((await askForReview(server, reviewer)).asked.status).toBe(201);
      await server.outbox.drain();
      expect(await logOf(reviewer.email!)).toEqual([
        { status: 'failed', attempts: 1, error: expect.stringMatching(/^refused: .*550.*No such mailbox/), finishedAt: expect.any(Date) },
      ]);
      expect(await outboxRowsOf(reviewer.email!)).toEqual([]);
      expect(server.smtp.messages().filter((m) => m.to.includes(reviewer.email!))).toEqual([]);

      const admin = await signedIn(server.url, (await buildUser({ siteRole: 'admin' })).login);
      const status = MailStatusSchema.parse((await admin.get('/api/admin/mail')).body);
      expect(status.relay.up).toBe(true);
      expect(status.failedLastDay).toBeGreaterThanOrEqual(1);
      expect(status.lastFailure?.error).toMatch(/550/);
    });

    it('retries a temporary refusal (4xx) until the relay takes the message', async () => {
      const reviewer = await buildUser({ login: uniqueLogin('full') });
      expect((await askForReview(server, reviewer)).asked.status).toBe(201);
      await until('the message was refused twice', async () => (await logOf(reviewer.email!))[0]?.attempts! >= 2, server.outbox.sendDue);
      expect(await logOf(reviewer.email!)).toEqual([{ status: 'queued', attempts: expect.any(Number), error: expect.stringMatching(/452/), finishedAt: null }]);

      busy = false;
      await server.outbox.drain();
      expect(server.smtp.messages().filter((m) => m.to.includes(reviewer.email!))).toHaveLength(1);
      expect((await logOf(reviewer.email!))[0]).toMatchObject({ status: 'sent', error: null });
    });
  });

  describe('with two sender loops on one database', () => {
    let smtp: SmtpStandin;
    let second: DataSource;
    beforeAll(async () => {
      smtp = await createSmtpStandin();
      second = createDataSource();
      await second.initialize();
    });
    afterAll(async () => {
      await second.destroy();
      await smtp.close();
    });

    it('send each message once', async () => {
      const run = uniqueLogin('pair');
      const subjects = Array.from({ length: 60 }, (_, i) => `${run} message ${i}`);
      await (
        await connect()
      ).transaction(async (manager) => {
        for (const subject of subjects) {
          await queueMail(manager, { to: `${run}@example.com`, userId: null, kind: 'pinReplies', notebookId: null, subject, text: 'Body' });
        }
      });
      const relays = [0, 1].map(() => createRelay({ host: '127.0.0.1', port: smtp.smtpPort, from: 'rolloff@example.com' }));
      const databases = [connect, async () => second];
      const loops = relays.map((relay, i) => createOutbox({ database: databases[i]!, relay, timing: testOutboxTiming }));
      loops.forEach((loop) => loop.start());
      const sent = async () => smtp.messages().length >= subjects.length;
      await until('every message was sent', sent, () => new Promise((resolve) => setTimeout(resolve, 50)));
      // A few more rounds of both loops, to see that nothing is sent twice.
      await new Promise((resolve) => setTimeout(resolve, testOutboxTiming.pollMs * 3));
      await Promise.all(loops.map((loop) => loop.stop()));
      relays.forEach((relay) => relay.close());

      const received = smtp.messages().map((m) => m.subject);
      expect(received.toSorted()).toEqual(subjects.toSorted());
      const log: { status: string; attempts: number }[] = await (
        await connect()
      ).query('SELECT status, attempts FROM mail_log WHERE toAddress = ?', [`${run}@example.com`]);
      expect(log).toHaveLength(subjects.length);
      expect(log.every((row) => row.status === 'sent' && row.attempts === 1)).toBe(true);
    });
  });
});
