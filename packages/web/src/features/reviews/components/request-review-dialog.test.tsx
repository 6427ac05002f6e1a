import { cleanup, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery } from '../../../test/render-with-query';
import { RequestReviewDialog } from './request-review-dialog';

describe('asking for a review with nobody to ask', () => {
  afterEach(cleanup);

  it('offers an owner the way to share the notebook with a reviewer', async () => {
    const shareFirst = vi.fn();
    renderWithQuery(<RequestReviewDialog notebookId="Nb1234567890" open onClose={() => {}} candidates={[]} onRequested={() => {}} onShareFirst={shareFirst} />);
    await userEvent.click(screen.getByRole('button', { name: 'Share it with a reviewer…' }));
    expect(shareFirst).toHaveBeenCalledTimes(1);
  });

  it('tells an editor who can share it', () => {
    renderWithQuery(<RequestReviewDialog notebookId="Nb1234567890" open onClose={() => {}} candidates={[]} onRequested={() => {}} />);
    expect(screen.queryByRole('button', { name: /Share it/ })).toBeNull();
    expect(screen.getByText(/Only the notebook’s owner can share it/)).toBeTruthy();
  });
});
