/**
 * Starts the real Express app on an ephemeral loopback port for a test file, with its own
 * OAuth stand-in for sign-in and its own SMTP stand-in for mail (both on ephemeral ports).
 */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createApp } from '../src/app.js';
import { cellCheckConfig, oauthConfig, rateLimitConfig } from '../src/config.js';
import type { AuthConfig, CellCheckConfig, OutboxTiming, RateLimitConfig } from '../src/config.js';
import { connect } from '../src/db/connection.js';
import { createRelay } from '../src/mail/mailer.js';
import { createOutbox } from '../src/mail/outbox.js';
import type { Outbox } from '../src/mail/outbox.js';
import { createOAuthStandin } from '../src/standins/oauth/standin.js';
import type { OAuthStandin } from '../src/standins/oauth/standin.js';
import { createSmtpStandin } from '../src/standins/smtp/mailbox.js';
import type { Refusal, SmtpStandin, StoredMessage } from '../src/standins/smtp/mailbox.js';

export interface TestServer {
  url: string;
  standin: OAuthStandin;
  smtp: SmtpStandin;
  /**
   * The app's mail outbox. Its sender runs when an action wakes it and when a test drains it
   * or calls `sendDue()`, not on a timer: two test servers in one file never send each other's mail.
   */
  outbox: Outbox;
  /**
   * Waits until the outbox is empty (every message sent or given up on, and logged), then
   * reads the SMTP stand-in's mailbox over HTTP, newest first.
   */
  mailbox(): Promise<StoredMessage[]>;
  close(): Promise<void>;
}

export interface TestServerOptions {
  webDist?: string | null;
  /** Changes to the sign-in settings the test server gets by default. */
  auth?: Partial<AuthConfig>;
  /** Mail goes to this SMTP port instead of the test's stand-in (a dead port, to see failures). */
  smtpPort?: number;
  /** Changes to the outbox's pace (short waits by default, so retries finish quickly). */
  outbox?: Partial<OutboxTiming>;
  /** Recipients the test's stand-in refuses. */
  refuse?: (address: string) => Refusal | null;
  /** Show the stand-in's mailbox at /dev/mail, as the server does with MAIL_STANDIN_URL. */
  devMail?: boolean;
  /** Changes to the budget of the server's cell checks. */
  cellCheck?: Partial<CellCheckConfig>;
  /** Changes to the rate limits (the rate-limit tests set low ones). */
  rateLimits?: Partial<RateLimitConfig>;
}

// Every test file signs in and writes from 127.0.0.1 against one database, so the product's
// per-address limits would count the whole suite's requests together: test servers run
// without limits (0 turns one off) unless a test sets its own, as the rate-limit tests do.
const noRateLimits = rateLimitConfig({
  RATE_LIMIT_SIGN_IN: '0',
  RATE_LIMIT_WRITES: '0',
  RATE_LIMIT_WRITES_PER_ADDRESS: '0',
  RATE_LIMIT_READS: '0',
  RATE_LIMIT_READS_PER_ADDRESS: '0',
});

/** The outbox's pace in tests: retries within milliseconds, the claim of a message long enough for any test. */
export const testOutboxTiming: OutboxTiming = { pollMs: 200, firstRetryMs: 20, maxRetryMs: 200, giveUpAfterMs: 60_000, probeMs: 20, leaseMs: 60_000 };

/** The demo admin is an admin in tests too, as `npm start` makes them by default. */
export const testAdminLogins = ['mara.lindqvist'];

export async function startTestServer(options: TestServerOptions = {}): Promise<TestServer> {
  const standin = await createOAuthStandin();
  const smtp = await createSmtpStandin({ refuse: options.refuse });
  const auth: AuthConfig = {
    oauth: oauthConfig({ OAUTH_BASE_URL: standin.url }),
    publicUrl: null,
    sessionSecret: 'test-session-secret',
    adminLogins: testAdminLogins,
    trustProxy: 'loopback',
    ...options.auth,
  };
  const relay = createRelay({ host: '127.0.0.1', port: options.smtpPort ?? smtp.smtpPort, from: 'Rolloff <rolloff@example.com>' });
  const outbox = createOutbox({ database: connect, relay, timing: { ...testOutboxTiming, ...options.outbox } });
  const mailboxUrl = `http://127.0.0.1:${smtp.httpPort}`;
  const app = createApp({
    webDist: options.webDist ?? null,
    auth,
    outbox,
    mailStandinUrl: options.devMail ? mailboxUrl : null,
    cellCheck: { ...cellCheckConfig(), ...options.cellCheck },
    rateLimits: { ...noRateLimits, ...options.rateLimits },
  });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    standin,
    smtp,
    outbox,
    mailbox: async () => {
      await outbox.drain();
      const reply = await fetch(`${mailboxUrl}/messages`);
      return ((await reply.json()) as { messages: StoredMessage[] }).messages;
    },
    close: async () => {
      await new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      });
      await outbox.stop();
      relay.close();
      await standin.close();
      await smtp.close();
    },
  };
}
