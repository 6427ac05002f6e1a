import type { NotebookList, NotebookSummary } from '@rolloff/api/contract';
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ines } from '../../../test/cells';
import { renderWithQuery } from '../../../test/render-with-query';
import { NotebooksTable } from './notebooks-table';

function summary(id: string, title: string, versionCount: number): NotebookSummary {
  return {
    id,
    title,
    owner: ines,
    visibility: 'private',
    role: 'owner',
    cellCount: 3,
    forkCount: 1,
    versionCount,
    createdAt: '2026-11-20T09:00:00.000Z',
    updatedAt: '2026-12-01T09:00:00.000Z',
    deletedAt: null,
  };
}

/** A stand-in for `GET /api/notebooks` that records the query of every request. */
function stubList() {
  const queries: URLSearchParams[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string) => {
      const parsed = new URL(url, 'http://localhost');
      queries.push(parsed.searchParams);
      // The first page of any list has a second page; the second page is the last.
      const second = parsed.searchParams.has('cursor');
      const body: NotebookList = second
        ? { items: [summary('Nb0000000003', 'Tone network', 0)], nextCursor: null }
        : { items: [summary('Nb0000000001', 'Anti-alias filter', 2), summary('Nb0000000002', 'Decoupling network', 1)], nextCursor: 'page-2' };
      return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
    }),
  );
  return queries;
}

function renderTable(address = '/notebooks') {
  renderWithQuery(
    <MemoryRouter initialEntries={[address]}>
      <NotebooksTable />
    </MemoryRouter>,
  );
}

const last = (queries: URLSearchParams[]) => Object.fromEntries(queries[queries.length - 1]!);

describe('the notebooks table', () => {
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('asks the server for the order a column heading names, and starts again from the first page', async () => {
    const queries = stubList();
    const user = userEvent.setup();
    renderTable();
    await screen.findByText('Anti-alias filter');
    expect(last(queries)).toEqual({ scope: 'all', sort: 'changed', order: 'desc' });

    await user.click(screen.getByRole('button', { name: 'Next →' }));
    await screen.findByText('Tone network');
    expect(last(queries)).toEqual({ scope: 'all', sort: 'changed', order: 'desc', cursor: 'page-2' });

    await user.click(screen.getByRole('button', { name: /^Title/ }));
    await waitFor(() => expect(last(queries)).toEqual({ scope: 'all', sort: 'title', order: 'asc' }));
    await screen.findByText('Anti-alias filter');
    expect(screen.getByRole('columnheader', { name: /^Title/ }).getAttribute('aria-sort')).toBe('ascending');

    await user.click(screen.getByRole('button', { name: /^Title/ }));
    await waitFor(() => expect(last(queries)).toEqual({ scope: 'all', sort: 'title', order: 'desc' }));

    await user.click(screen.getByRole('button', { name: /^Created/ }));
    await waitFor(() => expect(last(queries)).toEqual({ scope: 'all', sort: 'created', order: 'desc' }));
    expect(screen.getByRole('columnheader', { name: /^Created/ }).getAttribute('aria-sort')).toBe('descending');
    expect(screen.getByRole('columnheader', { name: /^Title/ }).getAttribute('aria-sort')).toBe('none');

    // A second page of this order carries it along with the cursor.
    await screen.findByText('Anti-alias filter');
    await user.click(screen.getByRole('button', { name: 'Next →' }));
    await waitFor(() => expect(last(queries)).toEqual({ scope: 'all', sort: 'created', order: 'desc', cursor: 'page-2' }));
  });

  it('reads the order from the address, shows each notebook’s versions, and no longer says sorting stays on one page', async () => {
    const queries = stubList();
    renderTable('/notebooks?scope=mine&sort=title&order=desc');
    const row = (await screen.findByText('Anti-alias filter')).closest('tr')!;
    expect(last(queries)).toEqual({ scope: 'mine', sort: 'title', order: 'desc' });
    const headings = screen.getAllByRole('columnheader').map((th) => th.textContent?.replace(/[↑↓]/g, ''));
    const cells = within(row)
      .getAllByRole('cell')
      .map((td) => td.textContent);
    expect(cells[headings.indexOf('Versions')]).toBe('2');
    expect(screen.queryByText(/page shown/)).toBeNull();
  });
});
