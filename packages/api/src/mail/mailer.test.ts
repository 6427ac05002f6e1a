import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSmtpStandin } from '../standins/smtp/mailbox.js';
import type { SmtpStandin } from '../standins/smtp/mailbox.js';
import { isolatedPort } from '../../test/ports.js';
import { createMailer } from './mailer.js';

describe('the mailer with the SMTP stand-in', () => {
  let standin: SmtpStandin;
  beforeAll(async () => {
    standin = await createSmtpStandin();
  });
  afterAll(async () => {
    await standin.close();
  });

  it('delivers over real SMTP, and the stand-in keeps the message readable over HTTP', async () => {
    const mailer = createMailer({ host: '127.0.0.1', port: standin.smtpPort, from: 'Rolloff <rolloff@example.com>' });
    const delivered = await mailer.deliver({
      to: ['ines.carvalho@example.com'],
      subject: 'Review requested: anti-alias filter',
      text: 'Please review version 2: http://127.0.0.1:4410/notebooks/1',
    });
    mailer.close();
    expect(delivered).toBe(true);
    const response = await fetch(`http://127.0.0.1:${standin.httpPort}/messages`);
    const { messages } = (await response.json()) as { messages: { to: string[]; subject: string; text: string; from: string }[] };
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ to: ['ines.carvalho@example.com'], subject: 'Review requested: anti-alias filter', from: 'rolloff@example.com' });
    expect(messages[0].text).toContain('/notebooks/1');
  });

  it('retries, then gives up without throwing when nothing listens', async () => {
    const deadPort = await isolatedPort();
    const outcomes: { ok: boolean; attempts: number }[] = [];
    const mailer = createMailer({
      host: '127.0.0.1',
      port: deadPort,
      from: 'rolloff@example.com',
      retryDelays: [10, 10],
      onOutcome: (_mail, outcome) => outcomes.push(outcome),
    });
    expect(await mailer.deliver({ to: ['kenji.arai@example.com'], subject: 'x', text: 'y' })).toBe(false);
    mailer.close();
    expect(outcomes).toEqual([expect.objectContaining({ ok: false, attempts: 3 })]);
  });
});
