/**
 * The notebooks the user can open: search, scope (mine, shared with me, all, deleted),
 * sorting by title, creation or last change, and paging. The server sorts and pages, so
 * every page follows the chosen order. Search, scope and sort live in the address, so a
 * reload or a shared link keeps them.
 */
import type { NotebookScope, NotebookSort } from '@rolloff/api/contract';
import { useEffect, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { RoleBadge } from '../../../components/ui/role-badge';
import { EmptyState, ErrorMessage, Loading } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { appPaths } from '../../../lib/paths';
import { useNotebookList } from '../api/list-notebooks';
import { useRestoreNotebook } from '../api/restore-notebook';
import { nextSort, sortFromParams, withSort } from '../lib/list-sort';
import { NewNotebookButton } from './new-notebook-dialog';

const SCOPES: { value: NotebookScope; label: string }[] = [
  { value: 'all', label: 'All I can see' },
  { value: 'mine', label: 'Mine' },
  { value: 'shared', label: 'Shared with me' },
  { value: 'deleted', label: 'Deleted' },
];

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return debounced;
}

/** The notebooks page's table. */
export function NotebooksTable() {
  const [params, setParams] = useSearchParams();
  const scope = (SCOPES.find((s) => s.value === params.get('scope'))?.value ?? 'all') as NotebookScope;
  const [search, setSearch] = useState(params.get('q') ?? '');
  const q = useDebounced(search.trim(), 300);
  const sort = sortFromParams(params);
  // Cursors belong to one list (scope, search and sort): another list starts on its first page.
  const listKey = [scope, q, sort.sort, sort.order].join('\n');
  const [paging, setPaging] = useState<{ listKey: string; cursors: (string | undefined)[] }>({ listKey, cursors: [undefined] });
  const cursors = paging.listKey === listKey ? paging.cursors : [undefined];
  const setCursors = (next: (current: (string | undefined)[]) => (string | undefined)[]) => setPaging({ listKey, cursors: next(cursors) });
  const list = useNotebookList({ scope, q: q || undefined, sort: sort.sort, order: sort.order, cursor: cursors[cursors.length - 1] });
  const restore = useRestoreNotebook();
  const rows = list.data?.items ?? [];

  useEffect(() => {
    setParams(
      (old) => {
        const next = new URLSearchParams(old);
        if (q) next.set('q', q);
        else next.delete('q');
        return next;
      },
      { replace: true },
    );
  }, [q, setParams]);

  const sortable = (key: NotebookSort, label: string) => {
    const active = sort.sort === key;
    const descending = sort.order === 'desc';
    return (
      <th scope="col" className="px-3 py-2 font-medium" aria-sort={active ? (descending ? 'descending' : 'ascending') : 'none'}>
        <button
          type="button"
          className="inline-flex items-center gap-1 uppercase tracking-wide hover:text-ink"
          onClick={() => setParams((old) => withSort(old, nextSort(sort, key)))}
        >
          {label}
          <span aria-hidden>{active ? (descending ? '↓' : '↑') : ''}</span>
        </button>
      </th>
    );
  };
  const plain = (label: string, className = '') => (
    <th scope="col" className={`px-3 py-2 font-medium uppercase tracking-wide ${className}`}>
      {label}
    </th>
  );

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <input
          type="search"
          value={search}
          onChange={(event) => setSearch(event.target.value)}
          placeholder="Search titles…"
          aria-label="Search notebooks"
          className="min-w-56 flex-1 rounded-md border border-rule bg-panel px-3 py-1.5 text-sm"
        />
        <div role="radiogroup" aria-label="Which notebooks" className="flex rounded-md border border-rule bg-panel p-0.5 text-sm">
          {SCOPES.map((s) => (
            <button
              key={s.value}
              type="button"
              role="radio"
              aria-checked={scope === s.value}
              onClick={() => setParams((old) => new URLSearchParams({ ...Object.fromEntries(old), scope: s.value }))}
              className={`rounded px-2.5 py-1 ${scope === s.value ? 'bg-accent text-accent-ink' : 'text-ink-soft hover:text-ink'}`}
            >
              {s.label}
            </button>
          ))}
        </div>
        <NewNotebookButton />
      </div>

      {list.isPending ? <Loading text="Loading notebooks…" /> : null}
      {list.isError ? <ErrorMessage error={list.error} retry={() => void list.refetch()} /> : null}
      {restore.error ? <ErrorMessage error={restore.error} /> : null}

      {list.isSuccess && rows.length === 0 ? (
        q ? (
          <EmptyState title={`No notebook matches “${q}”`}>Try fewer words, or look in another scope.</EmptyState>
        ) : scope === 'deleted' ? (
          <EmptyState title="Nothing deleted">Notebooks you delete wait here, ready to restore.</EmptyState>
        ) : scope === 'shared' ? (
          <EmptyState title="Nothing shared with you yet">When a colleague adds you to a notebook, it shows up here.</EmptyState>
        ) : (
          <EmptyState title="No notebooks yet">
            <p>A notebook holds circuit cells — short component lists that Rolloff solves and plots as you type — and note cells for your words.</p>
            <div className="mt-4 flex justify-center">
              <NewNotebookButton />
            </div>
          </EmptyState>
        )
      ) : null}

      {rows.length > 0 ? (
        <div className={`overflow-x-auto rounded-xl border border-rule bg-panel ${list.isPlaceholderData ? 'opacity-70' : ''}`}>
          <table className="w-full text-sm" data-testid="notebooks">
            <thead className="bg-sunken text-left text-xs text-ink-faint">
              <tr>
                {sortable('title', 'Title')}
                {plain('Owner')}
                {plain('Your role')}
                {sortable('created', 'Created')}
                {sortable('changed', 'Last change')}
                {plain('Versions', 'text-right')}
                {plain('Cells', 'text-right')}
                {plain('Forks', 'text-right')}
                {scope === 'deleted' ? <th className="px-3 py-2" /> : null}
              </tr>
            </thead>
            <tbody>
              {rows.map((notebook) => (
                <tr key={notebook.id} className="border-t border-rule hover:bg-sunken/60" data-notebook-id={notebook.id}>
                  <td className="px-3 py-2">
                    {scope === 'deleted' ? (
                      <span className="font-medium">{notebook.title}</span>
                    ) : (
                      <Link to={appPaths.notebook(notebook.id)} className="font-medium text-ink hover:text-accent">
                        {notebook.title}
                      </Link>
                    )}
                    {notebook.visibility === 'link' ? <span className="ml-2 text-xs text-ink-faint">link shared</span> : null}
                  </td>
                  <td className="px-3 py-2 text-ink-soft">{notebook.owner.name || notebook.owner.login}</td>
                  <td className="px-3 py-2">
                    <RoleBadge role={notebook.role} />
                  </td>
                  <td className="px-3 py-2 text-ink-soft" title={exactTime(notebook.createdAt)}>
                    {timeAgo(notebook.createdAt)}
                  </td>
                  <td className="px-3 py-2 text-ink-soft" title={exactTime(notebook.updatedAt)}>
                    {timeAgo(notebook.updatedAt)}
                  </td>
                  <td className="px-3 py-2 text-right tabular-nums">{notebook.versionCount}</td>
                  <td className="px-3 py-2 text-right tabular-nums">{notebook.cellCount}</td>
                  <td className="px-3 py-2 text-right tabular-nums">{notebook.forkCount}</td>
                  {scope === 'deleted' ? (
                    <td className="px-3 py-2 text-right">
                      <Button size="sm" disabled={restore.isPending} onClick={() => restore.mutate(notebook.id)}>
                        Restore
                      </Button>
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}

      {cursors.length > 1 || list.data?.nextCursor ? (
        <nav aria-label="Pages" className="flex items-center justify-between text-sm">
          <Button disabled={cursors.length <= 1} onClick={() => setCursors((c) => c.slice(0, -1))}>
            ← Previous
          </Button>
          <span className="text-ink-faint">Page {cursors.length}</span>
          <Button disabled={!list.data?.nextCursor} onClick={() => list.data?.nextCursor && setCursors((c) => [...c, list.data.nextCursor ?? undefined])}>
            Next →
          </Button>
        </nav>
      ) : null}
    </div>
  );
}
