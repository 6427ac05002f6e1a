/**
 * The history of one cell: its revisions with author and time, the text difference between
 * any two of them, the two drawn over each other (for circuit cells, by the page), and
 * "restore", which saves an old text as a new revision.
 */
import type { CellKind, CellSaved } from '@rolloff/api/contract';
import { useEffect, useMemo, useState } from 'react';
import type { ReactNode } from 'react';
import { Button } from '../../../components/ui/button';
import { EmptyState, ErrorMessage, Loading } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { useRevision } from '../api/get-revision';
import { useRevisionList } from '../api/list-revisions';
import { useRestoreRevision } from '../api/restore-revision';
import { TextDiff } from './text-diff';

export interface OverlayTexts {
  entries: { name: string; text: string }[];
}

export interface CellHistoryProps {
  notebookId: string;
  cellId: number;
  kind: CellKind;
  editable: boolean;
  /** Draws two revisions' traces on one plot (circuit cells). */
  renderOverlay?: (texts: OverlayTexts) => ReactNode;
  onRestored?: (saved: CellSaved) => void;
}

/** The revisions of a cell and their comparison. */
export function CellHistory({ notebookId, cellId, kind, editable, renderOverlay, onRestored }: CellHistoryProps) {
  const list = useRevisionList(notebookId, cellId);
  const items = list.data?.items;
  const [older, setOlder] = useState<number | null>(null);
  const [newer, setNewer] = useState<number | null>(null);
  const [restored, setRestored] = useState<number | null>(null);

  useEffect(() => {
    if (!items || items.length === 0) return;
    setNewer((n) => n ?? items[0].number);
    setOlder((o) => o ?? (items[1] ?? items[0]).number);
  }, [items]);

  const left = useRevision(notebookId, cellId, older);
  const right = useRevision(notebookId, cellId, newer);
  const restore = useRestoreRevision(notebookId, cellId, (saved) => {
    setRestored(saved.revision.number);
    setNewer(saved.revision.number);
    onRestored?.(saved);
  });
  const overlay = useMemo(
    () =>
      left.data && right.data
        ? {
            entries: [
              { name: `revision ${right.data.number}`, text: right.data.text },
              ...(left.data.number !== right.data.number ? [{ name: `revision ${left.data.number}`, text: left.data.text }] : []),
            ],
          }
        : null,
    [left.data, right.data],
  );

  if (list.isPending) return <Loading text="Loading the revisions…" />;
  if (list.isError) return <ErrorMessage error={list.error} retry={() => void list.refetch()} />;
  if (!items || items.length === 0) return <EmptyState title="No revisions yet" />;
  const current = items[0].number;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(16rem,22rem)_1fr]">
      <section aria-label="Revisions">
        <h2 className="mb-2 text-sm font-semibold text-ink-soft">Revisions ({items.length})</h2>
        <p className="mb-2 text-xs text-ink-faint">Pick two to compare: A (older) and B (newer).</p>
        {restore.error ? <ErrorMessage error={restore.error} /> : null}
        {restored !== null ? (
          <p role="status" className="mb-2 rounded bg-pass-soft px-2 py-1 text-xs text-pass">
            Restored as revision {restored}.
          </p>
        ) : null}
        <table className="w-full text-sm" data-testid="revisions">
          <thead>
            <tr className="text-left text-xs text-ink-faint">
              <th className="w-8 font-normal">A</th>
              <th className="w-8 font-normal">B</th>
              <th className="font-normal">Revision</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {items.map((revision) => (
              <tr key={revision.number} className="border-t border-rule align-top" data-revision={revision.number}>
                <td className="py-1.5">
                  <input
                    type="radio"
                    name="older"
                    aria-label={`Compare revision ${revision.number} as A`}
                    checked={older === revision.number}
                    onChange={() => setOlder(revision.number)}
                  />
                </td>
                <td className="py-1.5">
                  <input
                    type="radio"
                    name="newer"
                    aria-label={`Compare revision ${revision.number} as B`}
                    checked={newer === revision.number}
                    onChange={() => setNewer(revision.number)}
                  />
                </td>
                <td className="py-1.5">
                  <span className="font-medium">revision {revision.number}</span>
                  {revision.number === current ? <span className="ml-1 text-xs text-accent">current</span> : null}
                  <div className="text-xs text-ink-faint" title={exactTime(revision.createdAt)}>
                    {revision.author ? revision.author.name || revision.author.login : 'unknown'}
                    {revision.message ? ` · ${revision.message}` : ''} · {timeAgo(revision.createdAt)}
                    {revision.diagnostics && revision.diagnostics.errors > 0
                      ? ` · ${revision.diagnostics.errors} error${revision.diagnostics.errors === 1 ? '' : 's'}`
                      : ''}
                  </div>
                </td>
                <td className="py-1.5 text-right">
                  {editable && revision.number !== current ? (
                    <Button
                      size="sm"
                      disabled={restore.isPending}
                      onClick={() => restore.mutate({ number: revision.number, currentRevision: current })}
                      aria-label={`Restore revision ${revision.number}`}
                    >
                      Restore
                    </Button>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section aria-label="Comparison" className="min-w-0 space-y-4">
        <h2 className="text-sm font-semibold text-ink-soft">
          {older !== null && newer !== null ? `Revision ${older} (A) → revision ${newer} (B)` : 'Comparison'}
        </h2>
        {left.isError || right.isError ? <ErrorMessage error={left.error ?? right.error} /> : null}
        {left.data && right.data ? <TextDiff before={left.data.text} after={right.data.text} /> : <Loading text="Loading the texts…" />}
        {kind === 'circuit' && overlay && renderOverlay ? renderOverlay(overlay) : null}
      </section>
    </div>
  );
}
