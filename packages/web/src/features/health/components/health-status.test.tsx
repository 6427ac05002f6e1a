import { cleanup, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery } from '../../../test/render-with-query';
import { HealthStatus } from './health-status';

function renderWithAnswer(status: number, body: unknown) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => new Response(JSON.stringify(body), { status })),
  );
  renderWithQuery(<HealthStatus />);
}

describe('HealthStatus', () => {
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('says ok when the server and its database answer', async () => {
    renderWithAnswer(200, { status: 'ok', db: 'up', version: '0.1.0' });
    await waitFor(() => expect(screen.getByTestId('health').dataset.state).toBe('ok'));
    expect(screen.getByTestId('health').textContent).toContain('v0.1.0');
  });

  it('says the database is down on a 503 health answer', async () => {
    renderWithAnswer(503, { status: 'degraded', db: 'down', version: '0.1.0' });
    await waitFor(() => expect(screen.getByTestId('health').dataset.state).toBe('database down'));
  });

  it('says unreachable when the answer is not a health body', async () => {
    renderWithAnswer(502, { oops: true });
    await waitFor(() => expect(screen.getByTestId('health').dataset.state).toBe('unreachable'));
  });
});
