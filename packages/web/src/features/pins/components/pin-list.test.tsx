import type { Pin } from '@rolloff/api/contract';
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery, testQueryClient } from '../../../test/render-with-query';
import { buildPin, ines, mara, reviewNotebookId } from '../../../test/reviews';
import { pinListQueryOptions, usePinList } from '../api/list-pins';
import { pinLabels } from './pin-labels';
import { PinList } from './pin-list';

interface Call {
  method: string;
  url: string;
  body: unknown;
  csrf: string | null;
}

/** A stand-in for the pins API that keeps its pins and records every request. */
function stubApi(pins: Pin[]) {
  const calls: Call[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const method = init.method ?? 'GET';
      const headers = (init.headers ?? {}) as Record<string, string>;
      const body = init.body ? JSON.parse(String(init.body)) : undefined;
      calls.push({ method, url, body, csrf: headers['x-csrf-token'] ?? null });
      const json = (value: unknown, status = 200) => new Response(JSON.stringify(value), { status, headers: { 'content-type': 'application/json' } });
      if (url === `/api/notebooks/${reviewNotebookId}/pins` && method === 'GET') return json({ items: pins });
      const match = /\/pins\/(\d+)\/(comments|resolve|reopen)$/.exec(url);
      const pin = pins.find((p) => p.id === Number(match?.[1]));
      if (!match || !pin) return json({ error: 'not_found', message: 'That pin does not exist.' }, 404);
      if (match[2] === 'comments')
        pin.comments = [...pin.comments, { id: 90 + pin.comments.length, author: ines, body: body.body, createdAt: '2026-12-02T12:00:00.000Z' }];
      else
        Object.assign(
          pin,
          match[2] === 'resolve'
            ? { resolved: true, resolvedBy: ines, resolvedAt: '2026-12-02T12:00:00.000Z' }
            : { resolved: false, resolvedBy: null, resolvedAt: null },
        );
      return json(pin, match[2] === 'comments' ? 201 : 200);
    }),
  );
  return calls;
}

/** The list as a page shows it: read from the pins query, so changes come back through it. */
function Threads({ canComment, shownRevision }: { canComment: boolean; shownRevision?: number }) {
  const pins = usePinList(reviewNotebookId);
  if (!pins.data) return null;
  return (
    <PinList
      notebookId={reviewNotebookId}
      pins={pins.data.items}
      labels={pinLabels(pins.data.items)}
      cellName={(cellId) => `cell ${cellId === 7 ? 2 : 4}`}
      shownRevision={shownRevision === undefined ? undefined : () => shownRevision}
      canComment={canComment}
    />
  );
}

async function renderThreads(pins: Pin[], props: { canComment: boolean; shownRevision?: number }) {
  const calls = stubApi(pins);
  const client = testQueryClient();
  await client.prefetchQuery(pinListQueryOptions(reviewNotebookId));
  renderWithQuery(<Threads {...props} />, client);
  await screen.findByTestId('pins');
  return calls;
}

const threadOf = (label: string) => screen.getByRole('listitem', { name: new RegExp(`^Pin ${label} at`) });

describe('the pin threads', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('name each pin, where it sits and its thread, with comments rendered as safe Markdown', async () => {
    const pins = [
      buildPin(),
      buildPin({
        id: 6,
        frequency: 1_500,
        comments: [{ id: 60, author: null, body: '<img src=x onerror="alert(1)"> *why* this dip?', createdAt: '2026-12-02T10:40:00.000Z' }],
      }),
    ];
    await renderThreads(pins, { canComment: false });
    const first = threadOf('P1');
    expect(first.textContent).toContain('27 kHz');
    expect(first.textContent).toContain('on loop out / inj · cell 2');
    expect(within(first).getByText('crossover').tagName).toBe('STRONG');
    expect(within(first).getByText('Mara Lindqvist')).toBeTruthy();
    const second = threadOf('P2');
    expect(second.textContent).toContain('1.5 kHz');
    expect(second.querySelector('img')).toBeNull();
    expect(within(second).getByText('why').tagName).toBe('EM');
    expect(within(second).getByText('someone no longer here')).toBeTruthy();
  });

  it('say "on revision N" for a pin made on a revision the cell has moved on from', async () => {
    await renderThreads([buildPin({ revisionNumber: 2, currentRevisionNumber: 3 }), buildPin({ id: 6, revisionNumber: 3, currentRevisionNumber: 3 })], {
      canComment: false,
    });
    expect(within(threadOf('P1')).getByTestId('pin-revision').textContent).toBe('on revision 2');
    expect(within(threadOf('P2')).queryByTestId('pin-revision')).toBeNull();
  });

  it('say "on revision N" when the revision on screen is another one, as in a review of an older version', async () => {
    await renderThreads([buildPin({ revisionNumber: 3, currentRevisionNumber: 3 })], { canComment: false, shownRevision: 2 });
    expect(within(threadOf('P1')).getByTestId('pin-revision').textContent).toBe('on revision 3');
  });

  it('give a viewer no reply, resolve or reopen controls', async () => {
    const calls = await renderThreads([buildPin(), buildPin({ id: 6, resolved: true, resolvedBy: mara })], { canComment: false });
    await userEvent.click(screen.getByRole('button', { name: 'Show 1 resolved pin' }));
    await screen.findByRole('listitem', { name: /^Pin P2 at/ });
    expect(screen.getAllByRole('button').map((b) => b.textContent)).toEqual(['Hide 1 resolved pin']);
    expect(screen.queryByRole('textbox')).toBeNull();
    expect(calls.every((c) => c.method === 'GET')).toBe(true);
  });

  it('let a reviewer reply in a thread, sending the CSRF token', async () => {
    const calls = await renderThreads([buildPin()], { canComment: true });
    await userEvent.click(within(threadOf('P1')).getByRole('button', { name: 'Reply' }));
    await userEvent.click(screen.getByRole('button', { name: 'Send reply' }));
    expect(screen.getByText('A comment cannot be empty.')).toBeTruthy();
    await userEvent.type(screen.getByLabelText('Your reply'), 'Moved it to **31 kHz** in revision 3.');
    await userEvent.click(screen.getByRole('button', { name: 'Send reply' }));
    await waitFor(() => expect(within(threadOf('P1')).getAllByTestId('pin-comment')).toHaveLength(2));
    expect(within(threadOf('P1')).getByText('31 kHz').tagName).toBe('STRONG');
    expect(calls.find((c) => c.method === 'POST')).toEqual({
      method: 'POST',
      url: `/api/notebooks/${reviewNotebookId}/pins/5/comments`,
      body: { body: 'Moved it to **31 kHz** in revision 3.' },
      csrf: 'token-from-the-server',
    });
    expect(screen.queryByLabelText('Your reply')).toBeNull();
  });

  it('resolve a pin, which folds it away, and reopen it', async () => {
    const calls = await renderThreads([buildPin()], { canComment: true });
    await userEvent.click(within(threadOf('P1')).getByRole('button', { name: 'Resolve' }));
    await screen.findByText('Every pin is resolved.');
    expect(screen.queryByRole('listitem', { name: /^Pin P1 at/ })).toBeNull();
    await userEvent.click(screen.getByRole('button', { name: 'Show 1 resolved pin' }));
    expect(within(threadOf('P1')).getByTestId('pin-resolved').textContent).toBe('resolved by Inês Carvalho');
    await userEvent.click(within(threadOf('P1')).getByRole('button', { name: 'Reopen' }));
    await waitFor(() => expect(screen.queryByText('Every pin is resolved.')).toBeNull());
    expect(calls.filter((c) => c.method === 'POST').map((c) => c.url)).toEqual([
      `/api/notebooks/${reviewNotebookId}/pins/5/resolve`,
      `/api/notebooks/${reviewNotebookId}/pins/5/reopen`,
    ]);
  });
});
