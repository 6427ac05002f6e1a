import type { Notebook, NotebookPermissions } from '@rolloff/api/contract';
import { LIMITS } from '@rolloff/api/contract';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ines } from '../../../test/cells';
import { renderWithQuery } from '../../../test/render-with-query';
import { NotebookDescription } from './notebook-description';

const reader: NotebookPermissions = { read: true, fork: true, review: false, edit: false, share: false, delete: false };
const editor: NotebookPermissions = { ...reader, review: true, edit: true };

function buildNotebook(description: string, permissions: NotebookPermissions): Notebook {
  return {
    id: 'Nb1234567890',
    title: 'Anti-alias filter',
    description,
    owner: ines,
    visibility: 'private',
    role: permissions.edit ? 'editor' : 'viewer',
    cellCount: 0,
    forkCount: 0,
    versionCount: 0,
    createdAt: '2026-11-20T09:00:00.000Z',
    updatedAt: '2026-12-01T09:00:00.000Z',
    deletedAt: null,
    permissions,
    cells: [],
    deletedCells: [],
    forkedFrom: null,
    lineage: [],
    review: null,
  };
}

interface Call {
  method: string;
  body: unknown;
}

/** A stand-in for `PATCH /api/notebooks/:id` that answers with the description it was sent. */
function stubUpdate(notebook: Notebook, status = 200) {
  const calls: Call[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (_url: string, init: RequestInit = {}) => {
      const body = init.body ? (JSON.parse(String(init.body)) as { description: string }) : undefined;
      calls.push({ method: init.method ?? 'GET', body });
      const answer =
        status === 200
          ? { ...notebook, description: body?.description ?? notebook.description }
          : { error: 'validation', message: 'description: refused by the server.' };
      return new Response(JSON.stringify(answer), { status, headers: { 'content-type': 'application/json' } });
    }),
  );
  return calls;
}

function renderDescription(notebook: Notebook) {
  renderWithQuery(<NotebookDescription notebook={notebook} />);
}

describe('the notebook description', () => {
  beforeEach(() => {
    document.cookie = 'rolloff_csrf=token-from-the-server';
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('shows plain text to a reader, with nothing to edit, and nothing at all when empty', () => {
    renderDescription(buildNotebook('Flat to 2 kHz.\n**Not** Markdown.', reader));
    const shown = screen.getByTestId('notebook-description');
    expect(shown.tagName).toBe('P');
    expect(shown.textContent).toBe('Flat to 2 kHz.\n**Not** Markdown.');
    expect(screen.queryByRole('button')).toBeNull();
    cleanup();
    renderDescription(buildNotebook('', reader));
    expect(screen.queryByTestId('notebook-description')).toBeNull();
  });

  it('lets an editor write one in place and saves it with Ctrl-Enter', async () => {
    const notebook = buildNotebook('', editor);
    const calls = stubUpdate(notebook);
    const user = userEvent.setup();
    renderDescription(notebook);
    await user.click(screen.getByRole('button', { name: 'Add a description…' }));
    const field = screen.getByLabelText('Notebook description');
    await user.type(field, '  Second order, 4 kHz corner.{Shift>}{Enter}{/Shift}Snapped to E24.  ');
    expect(screen.getByText(`${(field as HTMLTextAreaElement).value.length} / ${LIMITS.descriptionLength}`)).toBeTruthy();
    await user.keyboard('{Control>}{Enter}{/Control}');
    await waitFor(() => expect(calls).toHaveLength(1));
    // Trimmed before it is sent, line break kept.
    expect(calls[0]).toEqual({ method: 'PATCH', body: { description: 'Second order, 4 kHz corner.\nSnapped to E24.' } });
    await waitFor(() => expect(screen.queryByLabelText('Notebook description')).toBeNull());
  });

  it('keeps the text in the field when it is too long or the server refuses it', async () => {
    const notebook = buildNotebook('Old words.', editor);
    const calls = stubUpdate(notebook, 400);
    const user = userEvent.setup();
    renderDescription(notebook);
    await user.click(screen.getByRole('button', { name: 'Old words.' }));
    const field = screen.getByLabelText('Notebook description') as HTMLTextAreaElement;
    fireEvent.change(field, { target: { value: 'x'.repeat(LIMITS.descriptionLength + 1) } });
    await user.keyboard('{Control>}{Enter}{/Control}');
    expect(screen.getByText(`A description has at most ${LIMITS.descriptionLength} characters.`)).toBeTruthy();
    expect(calls).toHaveLength(0);

    fireEvent.change(field, { target: { value: 'New words.' } });
    await user.keyboard('{Control>}{Enter}{/Control}');
    expect(await screen.findByText('description: refused by the server.')).toBeTruthy();
    expect((screen.getByLabelText('Notebook description') as HTMLTextAreaElement).value).toBe('New words.');
  });
});
