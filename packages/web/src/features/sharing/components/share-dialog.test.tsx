import type { Member, MemberList, MemberRole, UserDirectory } from '@rolloff/api/contract';
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ines, tobias } from '../../../test/cells';
import { renderWithQuery } from '../../../test/render-with-query';
import { ShareDialog } from './share-dialog';

const notebookId = 'Nb1234567890';
const owner = { id: 1, login: 'mara.lindqvist', name: 'Mara Lindqvist' };
const kenji = { id: 4, login: 'kenji.arai', name: 'Kenji Arai' };
const member = (user: typeof owner, role: Member['role']): Member => ({ user, role, addedAt: '2026-12-01T09:00:00.000Z' });

interface Call {
  method: string;
  url: string;
  body: unknown;
  csrf: string | null;
}

/** A stand-in for the members API that keeps its list and records every request. */
function stubApi() {
  const members: Member[] = [member(owner, 'owner'), member(ines, 'editor'), member(tobias, 'viewer')];
  const calls: Call[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const method = init.method ?? 'GET';
      const headers = (init.headers ?? {}) as Record<string, string>;
      const body = init.body ? JSON.parse(String(init.body)) : undefined;
      calls.push({ method, url, body, csrf: headers['x-csrf-token'] ?? null });
      const json = (value: unknown, status = 200) => new Response(JSON.stringify(value), { status, headers: { 'content-type': 'application/json' } });
      if (url === `/api/notebooks/${notebookId}/members` && method === 'GET') return json({ items: members } satisfies MemberList);
      if (url.startsWith('/api/users?')) return json({ items: [kenji] } satisfies UserDirectory);
      const match = /\/members\/(\d+)$/.exec(url);
      if (match && method === 'PUT') {
        const userId = Number(match[1]);
        const user = [owner, ines, tobias, kenji].find((u) => u.id === userId) ?? kenji;
        const existing = members.find((m) => m.user.id === userId);
        if (existing) existing.role = body.role;
        else members.push(member(user, body.role));
        return json(member(user, body.role), existing ? 200 : 201);
      }
      if (match && method === 'DELETE') {
        members.splice(
          members.findIndex((m) => m.user.id === Number(match[1])),
          1,
        );
        return new Response(null, { status: 204 });
      }
      return json({ error: 'not_found', message: 'no such route' }, 404);
    }),
  );
  return calls;
}

function renderDialog(props: { canShare: boolean; onVisibilityChange?: (v: 'private' | 'link') => void; initialRole?: MemberRole }) {
  renderWithQuery(
    <ShareDialog
      notebookId={notebookId}
      open
      onClose={() => {}}
      canShare={props.canShare}
      visibility="private"
      onVisibilityChange={props.onVisibilityChange ?? (() => {})}
      link={`http://localhost/notebooks/${notebookId}`}
      initialRole={props.initialRole}
    />,
  );
}

describe('the share dialog', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('lists the members with their roles, the owner first', async () => {
    stubApi();
    renderDialog({ canShare: true });
    const list = await screen.findByTestId('members');
    await waitFor(() => expect(list.querySelectorAll('li')).toHaveLength(3));
    expect([...list.querySelectorAll('li')].map((li) => li.dataset.login)).toEqual(['mara.lindqvist', 'ines.carvalho', 'tobias.okafor']);
    expect((screen.getByLabelText('Role of ines.carvalho') as HTMLSelectElement).value).toBe('editor');
    expect(screen.queryByLabelText('Role of mara.lindqvist')).toBeNull();
  });

  it('changes a role and removes a member, sending the CSRF token', async () => {
    const calls = stubApi();
    renderDialog({ canShare: true });
    await userEvent.selectOptions(await screen.findByLabelText('Role of tobias.okafor'), 'reviewer');
    await waitFor(() => expect(calls.some((c) => c.method === 'PUT')).toBe(true));
    const put = calls.find((c) => c.method === 'PUT');
    expect(put).toEqual({ method: 'PUT', url: `/api/notebooks/${notebookId}/members/${tobias.id}`, body: { role: 'reviewer' }, csrf: 'token-from-the-server' });
    await waitFor(() => expect((screen.getByLabelText('Role of tobias.okafor') as HTMLSelectElement).value).toBe('reviewer'));

    await userEvent.click(screen.getByRole('button', { name: 'Remove ines.carvalho' }));
    await waitFor(() => expect(screen.queryByText('Inês Carvalho')).toBeNull());
    expect(calls.find((c) => c.method === 'DELETE')?.url).toBe(`/api/notebooks/${notebookId}/members/${ines.id}`);
  });

  it('adds someone by login with the chosen role', async () => {
    const calls = stubApi();
    renderDialog({ canShare: true });
    await screen.findByLabelText('Role of ines.carvalho');
    await userEvent.type(screen.getByLabelText('Add someone by login'), 'ke');
    await userEvent.click(await screen.findByRole('button', { name: /kenji\.arai/ }));
    await userEvent.selectOptions(screen.getByLabelText('Role for the new member'), 'editor');
    await userEvent.click(screen.getByRole('button', { name: 'Add' }));
    await waitFor(() => expect(calls.find((c) => c.method === 'PUT')?.body).toEqual({ role: 'editor' }));
    expect(calls.find((c) => c.method === 'PUT')?.url).toBe(`/api/notebooks/${notebookId}/members/${kenji.id}`);
    const row = await screen.findByText('Kenji Arai');
    expect(within(row.closest('li') as HTMLElement).getByLabelText('Role of kenji.arai')).toBeTruthy();
  });

  it('turns link sharing on', async () => {
    stubApi();
    const change = vi.fn();
    renderDialog({ canShare: true, onVisibilityChange: change });
    await userEvent.click(screen.getByRole('checkbox', { name: /Link sharing/ }));
    expect(change).toHaveBeenCalledWith('link');
  });

  it('offers nothing a role cannot do: no role changes, removals, additions or link switch', async () => {
    const calls = stubApi();
    renderDialog({ canShare: false });
    const list = await screen.findByTestId('members');
    await waitFor(() => expect(list.querySelectorAll('li')).toHaveLength(3));
    expect(screen.queryAllByRole('combobox')).toEqual([]);
    expect(screen.queryByRole('button', { name: /Remove/ })).toBeNull();
    expect(screen.queryByLabelText('Add someone by login')).toBeNull();
    expect(screen.queryByRole('checkbox')).toBeNull();
    expect(calls.every((c) => c.method === 'GET')).toBe(true);
  });

  it('offers the reviewer role first when opened to add a reviewer', async () => {
    stubApi();
    renderDialog({ canShare: true, initialRole: 'reviewer' });
    expect((screen.getByLabelText('Role for the new member') as HTMLSelectElement).value).toBe('reviewer');
  });
});
