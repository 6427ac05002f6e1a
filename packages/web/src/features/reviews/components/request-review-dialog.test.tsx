import type { Review } from '@rolloff/api/contract';
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery } from '../../../test/render-with-query';
import { buildReview, kenji, mara, reviewNotebookId, tobias } from '../../../test/reviews';
import { RequestReviewDialog } from './request-review-dialog';
import type { ReviewCandidate } from './request-review-dialog';

const candidates: ReviewCandidate[] = [
  { user: mara, role: 'reviewer' },
  { user: kenji, role: 'editor' },
  { user: tobias, role: 'owner' },
];

function renderDialog(props: { candidates: ReviewCandidate[] | null; onRequested?: (review: Review) => void; onShareFirst?: () => void }) {
  renderWithQuery(
    <RequestReviewDialog
      notebookId={reviewNotebookId}
      open
      onClose={() => {}}
      candidates={props.candidates}
      onRequested={props.onRequested ?? (() => {})}
      onShareFirst={props.onShareFirst}
    />,
  );
}

describe('asking for a review', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('sends the people picked and the note, and hands the new round to the page', async () => {
    const sent: { url: string; body: unknown }[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init: RequestInit = {}) => {
        sent.push({ url, body: JSON.parse(String(init.body)) });
        return new Response(JSON.stringify(buildReview()), { status: 201 });
      }),
    );
    const onRequested = vi.fn();
    renderDialog({ candidates, onRequested });
    const ask = screen.getByRole('button', { name: 'Ask for review' }) as HTMLButtonElement;
    expect(ask.disabled).toBe(true);
    await userEvent.click(screen.getByRole('checkbox', { name: /Mara Lindqvist/ }));
    await userEvent.click(screen.getByRole('checkbox', { name: /Kenji Arai/ }));
    await userEvent.type(screen.getByLabelText(/What should they look at/), 'The *margins* at light load.');
    await userEvent.click(ask);
    await waitFor(() => expect(onRequested).toHaveBeenCalledTimes(1));
    expect(sent).toEqual([
      { url: `/api/notebooks/${reviewNotebookId}/reviews`, body: { reviewerIds: [mara.id, kenji.id], message: 'The *margins* at light load.' } },
    ]);
    expect((onRequested.mock.calls[0][0] as Review).id).toBe(31);
  });

  it('says what the server refused, and keeps the choice', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(
        async () =>
          new Response(JSON.stringify({ error: 'validation', message: 'reviewerIds: Tobias Okafor cannot review: they are a viewer.' }), { status: 400 }),
      ),
    );
    renderDialog({ candidates });
    await userEvent.click(screen.getByRole('checkbox', { name: /Tobias Okafor/ }));
    await userEvent.click(screen.getByRole('button', { name: 'Ask for review' }));
    expect((await screen.findByRole('alert')).textContent).toContain('Tobias Okafor cannot review');
    expect((screen.getByRole('checkbox', { name: /Tobias Okafor/ }) as HTMLInputElement).checked).toBe(true);
  });

  it('says when nobody may review yet', () => {
    renderDialog({ candidates: [] });
    expect(screen.getByText(/Nobody else here may review yet/)).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Ask for review' }) as HTMLButtonElement).disabled).toBe(true);
  });

  it('offers an owner with nobody to ask the way to share the notebook with a reviewer', async () => {
    const shareFirst = vi.fn();
    renderDialog({ candidates: [], onShareFirst: shareFirst });
    await userEvent.click(screen.getByRole('button', { name: 'Share it with a reviewer…' }));
    expect(shareFirst).toHaveBeenCalledTimes(1);
  });

  it('tells an editor with nobody to ask who can share the notebook', () => {
    renderDialog({ candidates: [] });
    expect(screen.queryByRole('button', { name: /Share it/ })).toBeNull();
    expect(screen.getByText(/Only the notebook’s owner can share it/)).toBeTruthy();
  });
});
