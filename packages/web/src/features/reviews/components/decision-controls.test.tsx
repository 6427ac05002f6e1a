import type { Review } from '@rolloff/api/contract';
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery } from '../../../test/render-with-query';
import { buildReview, ines, kenji, mara, reviewNotebookId, tobias } from '../../../test/reviews';
import { DecisionControls } from './decision-controls';

interface Call {
  method: string;
  url: string;
  body: unknown;
  csrf: string | null;
}

/** A stand-in for the decision route: it applies the decision to `review` and answers with it. */
function stubApi(review: Review) {
  const calls: Call[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const headers = (init.headers ?? {}) as Record<string, string>;
      const body = init.body ? JSON.parse(String(init.body)) : undefined;
      calls.push({ method: init.method ?? 'GET', url, body, csrf: headers['x-csrf-token'] ?? null });
      const decided: Review = {
        ...review,
        state: body.state,
        reviewers: review.reviewers.map((r) =>
          r.user.id === mara.id ? { ...r, state: body.state, summary: body.summary, decidedAt: '2026-12-02T11:00:00.000Z' } : r,
        ),
        history: [...review.history, { reviewer: mara, state: body.state, summary: body.summary, createdAt: '2026-12-02T11:00:00.000Z' }],
      };
      return new Response(JSON.stringify(decided), { status: 200, headers: { 'content-type': 'application/json' } });
    }),
  );
  return calls;
}

function renderControls(review: Review, meId: number, onDecided = vi.fn()) {
  const view = renderWithQuery(<DecisionControls notebookId={reviewNotebookId} review={review} meId={meId} onDecided={onDecided} />);
  return { ...view, onDecided };
}

describe('the decision controls', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('give an assigned reviewer both decisions, and ask for a summary before asking for changes', async () => {
    const review = buildReview();
    const calls = stubApi(review);
    const { onDecided } = renderControls(review, mara.id);
    expect(screen.getByRole('button', { name: 'Sign off' })).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Ask for changes' }));
    expect(screen.getByText('Say what should change: a request for changes needs a summary.')).toBeTruthy();
    expect(calls).toEqual([]);

    await userEvent.type(screen.getByLabelText(/Summary/), 'Raise Cz: the margin is thin at light load.');
    await userEvent.click(screen.getByRole('button', { name: 'Ask for changes' }));
    await waitFor(() => expect(onDecided).toHaveBeenCalledTimes(1));
    expect(calls).toEqual([
      {
        method: 'POST',
        url: `/api/notebooks/${reviewNotebookId}/reviews/${review.id}/decision`,
        body: { state: 'needs_changes', summary: 'Raise Cz: the margin is thin at light load.' },
        csrf: 'token-from-the-server',
      },
    ]);
    expect((onDecided.mock.calls[0][0] as Review).state).toBe('needs_changes');
  });

  it('let a reviewer who asked for changes sign off later, but not ask twice', async () => {
    const review = buildReview({
      state: 'needs_changes',
      reviewers: [{ user: mara, state: 'needs_changes', summary: 'Raise Cz.', decidedAt: '2026-12-02T11:00:00.000Z' }],
    });
    const calls = stubApi(review);
    renderControls(review, mara.id);
    expect(screen.queryByRole('button', { name: 'Ask for changes' })).toBeNull();
    await userEvent.click(screen.getByRole('button', { name: 'Sign off' }));
    await waitFor(() => expect(calls).toHaveLength(1));
    expect(calls[0].body).toEqual({ state: 'signed_off', summary: '' });
  });

  it('show a reviewer who signed off that the decision is made, with no controls', () => {
    stubApi(buildReview());
    renderControls(buildReview({ reviewers: [{ user: mara, state: 'signed_off', summary: '', decidedAt: '2026-12-02T11:00:00.000Z' }] }), mara.id);
    expect(screen.getByTestId('my-decision').textContent).toBe('You signed off this round.');
    expect(screen.queryAllByRole('button')).toEqual([]);
  });

  it('offer nothing to people who were not asked: the editor who asked, a viewer, an unasked reviewer', () => {
    for (const person of [ines, tobias, { id: 99, login: 'priya.venkat', name: 'Priya Venkat' }]) {
      stubApi(buildReview());
      const { container } = renderControls(buildReview(), person.id);
      expect(container.innerHTML).toBe('');
      cleanup();
    }
  });

  it('take no decision on a round a later one replaced', () => {
    stubApi(buildReview());
    renderControls(buildReview({ superseded: true }), kenji.id);
    expect(screen.queryAllByRole('button')).toEqual([]);
    expect(screen.getByText(/A later round replaced this one/)).toBeTruthy();
  });
});
