import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSmtpStandin } from '../standins/smtp/mailbox.js';
import type { SmtpStandin } from '../standins/smtp/mailbox.js';
import { isolatedPort } from '../../test/ports.js';
import { createRelay } from './mailer.js';

describe('the relay with the SMTP stand-in', () => {
  let standin: SmtpStandin;
  beforeAll(async () => {
    standin = await createSmtpStandin({
      refuse: (address) =>
        address.startsWith('nobody@')
          ? { code: 550, message: '5.1.1 No such mailbox' }
          : address.startsWith('later@')
            ? { code: 451, message: '4.3.0 Try again later' }
            : null,
    });
  });
  afterAll(async () => {
    await standin.close();
  });

  it('delivers over real SMTP, and the stand-in keeps the message readable over HTTP', async () => {
    const relay = createRelay({ host: '127.0.0.1', port: standin.smtpPort, from: 'Rolloff <rolloff@example.com>' });
    const outcome = await relay.send({
      to: 'ines.carvalho@example.com',
      subject: 'Review requested: anti-alias filter',
      text: 'Please review version 2: http://127.0.0.1:4410/notebooks/1',
    });
    expect(await relay.check()).toEqual({ state: 'up' });
    relay.close();
    expect(outcome).toEqual({ ok: true });
    const response = await fetch(`http://127.0.0.1:${standin.httpPort}/messages`);
    const { messages } = (await response.json()) as { messages: { to: string[]; subject: string; text: string; from: string }[] };
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ to: ['ines.carvalho@example.com'], subject: 'Review requested: anti-alias filter', from: 'rolloff@example.com' });
    expect(messages[0].text).toContain('/notebooks/1');
  });

  it('calls a 5xx refusal permanent, and a 4xx one temporary', async () => {
    const relay = createRelay({ host: '127.0.0.1', port: standin.smtpPort, from: 'rolloff@example.com' });
    const refused = await relay.send({ to: 'nobody@example.com', subject: 'x', text: 'y' });
    const deferred = await relay.send({ to: 'later@example.com', subject: 'x', text: 'y' });
    relay.close();
    expect(refused).toEqual({ ok: false, permanent: true, unreachable: false, error: expect.stringMatching(/550.*No such mailbox/) });
    expect(deferred).toEqual({ ok: false, permanent: false, unreachable: false, error: expect.stringMatching(/451.*Try again later/) });
  });

  it('calls a relay that nothing answers for unreachable, a temporary failure', async () => {
    const relay = createRelay({ host: '127.0.0.1', port: await isolatedPort(), from: 'rolloff@example.com' });
    const outcome = await relay.send({ to: 'kenji.arai@example.com', subject: 'x', text: 'y' });
    const state = await relay.check();
    relay.close();
    expect(outcome).toEqual({ ok: false, permanent: false, unreachable: true, error: expect.stringMatching(/ECONNREFUSED/) });
    expect(state).toEqual({ state: 'down', error: expect.stringMatching(/ECONNREFUSED/) });
  });
});
