/**
 * The pins of a notebook as threads, open ones first; resolved ones follow, folded away
 * until asked for. Anyone who can read sees them; only people who may comment get controls.
 */
import type { Pin } from '@rolloff/api/contract';
import { useState } from 'react';
import { EmptyState } from '../../../components/ui/status-message';
import { PinThread } from './pin-thread';

export interface PinListProps {
  notebookId: string;
  pins: readonly Pin[];
  labels: ReadonlyMap<number, string>;
  /** Where a cell is in the notebook, e.g. "circuit cell 2". */
  cellName: (cellId: number) => string;
  /** The revision of each cell on screen (a review's version), when not the current one. */
  shownRevision?: (cellId: number) => number | undefined;
  canComment: boolean;
  focusedPinId?: number | null;
  /** What to say when there are none yet. */
  emptyText?: string;
}

/** Every pin's thread. */
export function PinList({ notebookId, pins, labels, cellName, shownRevision, canComment, focusedPinId = null, emptyText }: PinListProps) {
  const open = pins.filter((p) => !p.resolved);
  const resolved = pins.filter((p) => p.resolved);
  const focusedIsResolved = resolved.some((p) => p.id === focusedPinId);
  const [showResolved, setShowResolved] = useState(false);
  const thread = (pin: Pin) => (
    <PinThread
      key={pin.id}
      notebookId={notebookId}
      pin={pin}
      label={labels.get(pin.id) ?? ''}
      cellName={cellName(pin.cellId)}
      shownRevision={shownRevision?.(pin.cellId)}
      canComment={canComment}
      focused={pin.id === focusedPinId}
    />
  );
  if (pins.length === 0) {
    return <EmptyState title="No pins yet">{emptyText ?? 'Pins are comments at a frequency on a plot.'}</EmptyState>;
  }
  return (
    <div className="space-y-3" data-testid="pins">
      {open.length > 0 ? <ul className="space-y-3">{open.map(thread)}</ul> : <p className="text-sm text-ink-soft">Every pin is resolved.</p>}
      {resolved.length > 0 ? (
        <div className="space-y-3">
          <button
            type="button"
            onClick={() => setShowResolved((shown) => !shown)}
            aria-expanded={showResolved || focusedIsResolved}
            className="text-sm font-medium text-accent underline-offset-2 hover:underline"
          >
            {showResolved || focusedIsResolved ? 'Hide' : 'Show'} {resolved.length} resolved {resolved.length === 1 ? 'pin' : 'pins'}
          </button>
          {showResolved || focusedIsResolved ? <ul className="space-y-3">{resolved.map(thread)}</ul> : null}
        </div>
      ) : null}
    </div>
  );
}
