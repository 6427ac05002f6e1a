import type { Pin } from '@rolloff/api/contract';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { buildPin, reviewNotebookId } from '../../../test/reviews';
import { PinComposer } from './pin-composer';
import type { PinDraft } from './pin-composer';

function Composer({ onPinned }: { onPinned: (pin: Pin) => void }) {
  const [draft, setDraft] = useState<PinDraft>({ trace: 'loop out / inj', frequency: '' });
  return (
    <PinComposer
      notebookId={reviewNotebookId}
      cellId={7}
      cellName="cell 2"
      revisionNumber={2}
      traces={['loop out / inj', 'out']}
      draft={draft}
      onDraftChange={setDraft}
      onPinned={onPinned}
    />
  );
}

describe('the pin composer', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('pins a comment on the chosen trace at the typed frequency, on the revision on screen', async () => {
    const bodies: unknown[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (_url: string, init: RequestInit = {}) => {
        bodies.push(JSON.parse(String(init.body)));
        return new Response(JSON.stringify(buildPin({ trace: 'out', frequency: 31_000 })), { status: 201 });
      }),
    );
    const onPinned = vi.fn();
    const client = new QueryClient();
    render(
      <QueryClientProvider client={client}>
        <Composer onPinned={onPinned} />
      </QueryClientProvider>,
    );
    await userEvent.selectOptions(screen.getByLabelText('Trace'), 'out');
    await userEvent.type(screen.getByLabelText('Frequency'), '31 dB');
    await userEvent.type(screen.getByLabelText('Comment'), 'The peak sits here.');
    await userEvent.click(screen.getByRole('button', { name: 'Pin comment' }));
    expect(screen.getByText(/“31 dB” is not a frequency/)).toBeTruthy();
    expect(bodies).toEqual([]);

    await userEvent.clear(screen.getByLabelText('Frequency'));
    await userEvent.type(screen.getByLabelText('Frequency'), '31k');
    await userEvent.click(screen.getByRole('button', { name: 'Pin comment' }));
    await waitFor(() => expect(onPinned).toHaveBeenCalledTimes(1));
    expect(bodies).toEqual([{ cellId: 7, revisionNumber: 2, trace: 'out', frequency: 31_000, body: 'The peak sits here.' }]);
    expect(screen.getByRole('status').textContent).toBe('Pinned at 31k.');
    expect((screen.getByLabelText('Comment') as HTMLTextAreaElement).value).toBe('');
  });
});
