/**
 * The cells of a notebook in order: each with its save state and tools (history, move,
 * delete with undo), a bar between any two cells to add one there, and keyboard moves from
 * cell to cell (Shift-Enter). The body of a circuit cell is drawn by the page, which knows
 * the editor and the plots; this list keeps texts, saves and order.
 */
import { cellName } from '@rolloff/api/contract';
import type { Cell, CellKind, CellSaved } from '@rolloff/api/contract';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { ErrorMessage } from '../../../components/ui/status-message';
import { timeAgo } from '../../../lib/format-time';
import { useCreateCell } from '../api/create-cell';
import { useDeleteCell } from '../api/delete-cell';
import { useMoveCell } from '../api/move-cell';
import { useRestoreCell } from '../api/restore-cell';
import { ConflictDialog } from './conflict-dialog';
import { NoteCell } from './note-cell';
import { SaveStatus } from './save-status';
import { useCellAutosave } from '../hooks/use-cell-autosave';

/** What the page needs to draw a circuit cell's body. */
export interface CircuitBodyProps {
  cell: Cell;
  text: string;
  onChange: (text: string) => void;
  readOnly: boolean;
  onLeave: () => void;
  autoFocus: boolean;
  label: string;
}

export interface CellListProps {
  notebookId: string;
  cells: readonly Cell[];
  deletedCells: readonly Cell[];
  editable: boolean;
  renderCircuit: (props: CircuitBodyProps) => ReactNode;
  /** The notebook's cells changed (added, moved, deleted, restored): refresh it. */
  onChanged: () => void;
  /** A cell was saved: the page may update what it caches. */
  onSaved: (saved: CellSaved) => void;
  historyHref: (cellId: number) => string;
}

/** Focuses the editor or the first control of the cell at `index`, or the add bar after the last. */
function focusCell(list: HTMLElement | null, index: number) {
  const cells = list?.querySelectorAll<HTMLElement>('[data-cell-index]');
  const target = cells?.[index];
  if (!target) {
    list?.querySelector<HTMLElement>('[data-add-bar="end"] button')?.focus();
    return;
  }
  const editor = target.querySelector<HTMLElement>('.cm-content, textarea, [data-focus-target]');
  (editor ?? target).focus();
}

function AddCellBar({ onAdd, busy, position, end }: { onAdd: (kind: CellKind, position: number) => void; busy: boolean; position: number; end?: boolean }) {
  return (
    <div className="group flex items-center gap-2 py-1" data-add-bar={end ? 'end' : position}>
      <span className="h-px flex-1 bg-rule opacity-0 transition-opacity group-focus-within:opacity-100 group-hover:opacity-100" />
      <span className="flex gap-1 opacity-60 transition-opacity group-focus-within:opacity-100 group-hover:opacity-100">
        <Button
          size="sm"
          variant="quiet"
          disabled={busy}
          onClick={() => onAdd('circuit', position)}
          aria-label={`Add a circuit cell at position ${position + 1}`}
        >
          + Circuit cell
        </Button>
        <Button size="sm" variant="quiet" disabled={busy} onClick={() => onAdd('note', position)} aria-label={`Add a note cell at position ${position + 1}`}>
          + Note cell
        </Button>
      </span>
      <span className="h-px flex-1 bg-rule opacity-0 transition-opacity group-focus-within:opacity-100 group-hover:opacity-100" />
    </div>
  );
}

interface CellItemProps {
  notebookId: string;
  cell: Cell;
  index: number;
  count: number;
  editable: boolean;
  autoFocus: boolean;
  renderCircuit: CellListProps['renderCircuit'];
  onSaved: CellListProps['onSaved'];
  onMove: (cell: Cell, position: number) => void;
  onDelete: (cell: Cell) => void;
  onLeave: () => void;
  historyHref: string;
  busy: boolean;
}

function CellItem({
  notebookId,
  cell,
  index,
  count,
  editable,
  autoFocus,
  renderCircuit,
  onSaved,
  onMove,
  onDelete,
  onLeave,
  historyHref,
  busy,
}: CellItemProps) {
  const autosave = useCellAutosave({ notebookId, cell, editable, onSaved });
  const [conflictOpen, setConflictOpen] = useState(true);
  // The one name a cell has everywhere: its title, or "Circuit 2" / "Note 3".
  const label = cellName({ kind: cell.kind, position: index, title: cell.title });
  const conflict = autosave.state.kind === 'conflict' ? autosave.state.theirs : null;
  return (
    <article
      data-cell-index={index}
      data-cell-id={cell.id}
      data-kind={cell.kind}
      aria-label={label}
      tabIndex={-1}
      className="rounded-xl border border-rule bg-panel/60 p-3 focus:outline-none"
    >
      <header className="mb-2 flex flex-wrap items-center gap-x-3 gap-y-1">
        <h2 className="text-xs font-semibold uppercase tracking-wide text-ink-faint">{label}</h2>
        <SaveStatus state={autosave.state} revision={autosave.revision} onRetry={autosave.retryNow} />
        {cell.updatedBy ? (
          <span className="text-xs text-ink-faint" title={cell.updatedAt}>
            last saved by {cell.updatedBy.name || cell.updatedBy.login} {timeAgo(cell.updatedAt)}
          </span>
        ) : null}
        {autosave.restoredDraft ? <span className="text-xs text-warn">unsaved text from this browser restored</span> : null}
        {conflict && !conflictOpen ? (
          <Button size="sm" variant="secondary" onClick={() => setConflictOpen(true)}>
            Resolve the conflict
          </Button>
        ) : null}
        <span className="ml-auto flex flex-wrap gap-1">
          <Link to={historyHref} className="rounded px-2 py-1 text-xs text-ink-soft hover:bg-sunken hover:text-ink">
            History
          </Link>
          {editable ? (
            <>
              <Button size="sm" variant="quiet" disabled={busy || index === 0} onClick={() => onMove(cell, index - 1)} aria-label={`Move ${label} up`}>
                ↑
              </Button>
              <Button
                size="sm"
                variant="quiet"
                disabled={busy || index === count - 1}
                onClick={() => onMove(cell, index + 1)}
                aria-label={`Move ${label} down`}
              >
                ↓
              </Button>
              <Button size="sm" variant="quiet" disabled={busy} onClick={() => onDelete(cell)} aria-label={`Delete ${label}`}>
                Delete
              </Button>
            </>
          ) : null}
        </span>
      </header>
      {cell.kind === 'circuit' ? (
        renderCircuit({ cell, text: autosave.text, onChange: autosave.setText, readOnly: !editable, onLeave, autoFocus, label: `${label}, circuit text` })
      ) : (
        <NoteCell text={autosave.text} onChange={autosave.setText} editable={editable} onLeave={onLeave} label={label} startEditing={autoFocus} />
      )}
      {conflict ? (
        <ConflictDialog
          open={conflictOpen}
          mine={autosave.text}
          theirs={conflict}
          onKeepMine={() => autosave.resolveConflict('mine')}
          onTakeTheirs={() => autosave.resolveConflict('theirs')}
          onDismiss={() => setConflictOpen(false)}
        />
      ) : null}
    </article>
  );
}

/** The notebook's cells with everything needed to edit them. */
export function CellList({ notebookId, cells, deletedCells, editable, renderCircuit, onChanged, onSaved, historyHref }: CellListProps) {
  const list = useRef<HTMLDivElement>(null);
  const [focusId, setFocusId] = useState<number | null>(null);
  const [undo, setUndo] = useState<Cell | null>(null);
  const create = useCreateCell(notebookId, (saved) => {
    setFocusId(saved.cell.id);
    onChanged();
  });
  const move = useMoveCell(notebookId, onChanged);
  const remove = useDeleteCell(notebookId, (saved) => {
    setUndo(saved.cell);
    onChanged();
  });
  const restore = useRestoreCell(notebookId, () => {
    setUndo(null);
    onChanged();
  });
  // A new cell takes the focus once, when it first appears; a cell brought back later does not.
  useEffect(() => {
    if (focusId === null || !cells.some((c) => c.id === focusId)) return;
    const frame = requestAnimationFrame(() => setFocusId(null));
    return () => cancelAnimationFrame(frame);
  }, [focusId, cells]);
  const busy = create.isPending || move.isPending || remove.isPending || restore.isPending;
  const failure = create.error ?? move.error ?? remove.error ?? restore.error;
  const add = useCallback((kind: CellKind, position: number) => create.mutate({ kind, position, text: '' }), [create]);

  return (
    <div ref={list} className="space-y-1" data-testid="cells">
      {undo ? (
        <div role="status" className="flex items-center gap-3 rounded-lg border border-rule bg-sunken px-3 py-2 text-sm">
          <span>The {undo.kind} cell was deleted.</span>
          <Button size="sm" variant="primary" disabled={restore.isPending} onClick={() => restore.mutate(undo.id)}>
            Undo
          </Button>
          <Button size="sm" variant="quiet" onClick={() => setUndo(null)} aria-label="Dismiss">
            ×
          </Button>
        </div>
      ) : null}
      {failure ? <ErrorMessage error={failure} /> : null}
      {cells.length === 0 ? (
        <p className="rounded-xl border border-dashed border-rule px-4 py-8 text-center text-sm text-ink-soft">
          This notebook has no cells yet.{editable ? ' Add a circuit cell to describe a network, or a note cell for words.' : ''}
        </p>
      ) : null}
      {cells.map((cell, index) => (
        <div key={cell.id}>
          {editable ? <AddCellBar onAdd={add} busy={busy} position={index} /> : null}
          <CellItem
            notebookId={notebookId}
            cell={cell}
            index={index}
            count={cells.length}
            editable={editable}
            autoFocus={focusId === cell.id}
            renderCircuit={renderCircuit}
            onSaved={onSaved}
            onMove={(c, position) => move.mutate({ cellId: c.id, position })}
            onDelete={(c) => remove.mutate(c.id)}
            onLeave={() => focusCell(list.current, index + 1)}
            historyHref={historyHref(cell.id)}
            busy={busy}
          />
        </div>
      ))}
      {editable ? <AddCellBar onAdd={add} busy={busy} position={cells.length} end /> : null}
      {editable && deletedCells.length > 0 ? (
        <details className="mt-4 rounded-lg border border-rule bg-panel px-3 py-2 text-sm">
          <summary className="cursor-pointer text-ink-soft">Deleted cells ({deletedCells.length})</summary>
          <ul className="mt-2 space-y-2">
            {deletedCells.map((cell) => (
              <li key={cell.id} className="flex items-start gap-3">
                <pre className="max-h-16 flex-1 overflow-hidden rounded bg-sunken p-2 font-mono text-xs text-ink-soft">{cell.text || '(empty)'}</pre>
                <Button size="sm" disabled={restore.isPending} onClick={() => restore.mutate(cell.id)}>
                  Restore
                </Button>
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
