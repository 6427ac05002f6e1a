import type { Settings } from '@rolloff/api/contract';
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithQuery } from '../../../test/render-with-query';
import { MailSettingsForm } from './mail-settings-form';

/** A stand-in for /api/me/settings; `refuse` makes every change fail. */
function stubApi({ refuse = false } = {}) {
  const settings: Settings = { mail: { reviewRequests: true, reviewDecisions: true, pinReplies: true, addedToNotebook: true } };
  const patches: unknown[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (_url: string, init: RequestInit = {}) => {
      if ((init.method ?? 'GET') === 'PATCH') {
        const body = JSON.parse(String(init.body));
        patches.push(body);
        if (refuse) return new Response(JSON.stringify({ error: 'unavailable', message: 'The database is not answering; try again.' }), { status: 503 });
        Object.assign(settings.mail, body.mail);
      }
      return new Response(JSON.stringify(settings), { status: 200 });
    }),
  );
  return patches;
}

function renderForm() {
  renderWithQuery(<MailSettingsForm />);
}

describe('the e-mail settings', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('turn one kind of e-mail off and leave the others as they are', async () => {
    const patches = stubApi();
    renderForm();
    const replies = (await screen.findByRole('checkbox', { name: /Replies on pins/ })) as HTMLInputElement;
    expect(replies.checked).toBe(true);
    await userEvent.click(replies);
    await waitFor(() => expect(screen.getByRole('status').textContent).toBe('Saved.'));
    expect(patches).toEqual([{ mail: { pinReplies: false } }]);
    expect(replies.checked).toBe(false);
    expect((screen.getByRole('checkbox', { name: /Review requests/ }) as HTMLInputElement).checked).toBe(true);
  });

  it('put a switch back and say why when the change is refused', async () => {
    stubApi({ refuse: true });
    renderForm();
    const requests = (await screen.findByRole('checkbox', { name: /Review requests/ })) as HTMLInputElement;
    await userEvent.click(requests);
    expect((await screen.findByRole('alert')).textContent).toContain('The database is not answering');
    expect(requests.checked).toBe(true);
  });
});
