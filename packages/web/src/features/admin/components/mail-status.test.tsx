import type { MailStatus } from '@rolloff/api/contract';
import { cleanup, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery } from '../../../test/render-with-query';
import { MailStatusPanel } from './mail-status';

/** A stand-in for GET /api/admin/mail. */
function stubStatus(status: MailStatus) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => new Response(JSON.stringify(status), { status: 200 })),
  );
}

const quiet: MailStatus = {
  relay: { address: 'mail.example.com:25', up: true, error: null },
  queued: 0,
  oldestQueuedAt: null,
  sentLastDay: 12,
  failedLastDay: 0,
  lastFailure: null,
};

describe('the outgoing mail panel', () => {
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('says the relay answers and counts what went out', async () => {
    stubStatus(quiet);
    renderWithQuery(<MailStatusPanel />);
    const panel = await screen.findByTestId('mail-status');
    expect(panel.textContent).toContain('Mail relay mail.example.com:25: answers.');
    expect(screen.getByText('Sent, last 24 h').nextElementSibling?.textContent).toBe('12');
    expect(screen.getByText('Waiting').nextElementSibling?.textContent).toBe('0');
    expect(panel.textContent).not.toContain('Last failure');
  });

  it('says the relay is away, that mail waits, and why the last message failed', async () => {
    const tenMinutesAgo = new Date(Date.now() - 10 * 60_000).toISOString();
    stubStatus({
      ...quiet,
      relay: { address: 'mail.example.com:25', up: false, error: 'ESOCKET: connect ECONNREFUSED' },
      queued: 3,
      oldestQueuedAt: tenMinutesAgo,
      failedLastDay: 1,
      lastFailure: { subject: 'Review requested', error: 'refused: 550 No such mailbox', at: tenMinutesAgo },
    });
    renderWithQuery(<MailStatusPanel />);
    const panel = await screen.findByTestId('mail-status');
    expect(panel.textContent).toContain(
      'does not answer (ESOCKET: connect ECONNREFUSED). Rolloff keeps working; mail waits and goes out once the relay is back.',
    );
    expect(screen.getByText('Waiting').nextElementSibling?.textContent).toBe('3');
    expect(panel.textContent).toContain('oldest 10 minutes ago');
    expect(panel.textContent).toContain('“Review requested” — refused: 550 No such mailbox');
  });
});
