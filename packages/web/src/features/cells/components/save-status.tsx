import { useEffect, useState } from 'react';
import type { SaveState } from '../hooks/autosave-state';

function secondsUntil(at: number): number {
  return Math.max(0, Math.ceil((at - Date.now()) / 1000));
}

/**
 * The save state of a cell in a few words, with "retry now" while a save waits to retry; read
 * out as it changes (a refusal at once, the rest politely).
 */
export function SaveStatus({ state, revision, onRetry }: { state: SaveState; revision: number; onRetry: () => void }) {
  return (
    <span role="status" aria-live={state.kind === 'refused' ? 'assertive' : 'polite'}>
      <SaveStateWords state={state} revision={revision} onRetry={onRetry} />
    </span>
  );
}

function SaveStateWords({ state, revision, onRetry }: { state: SaveState; revision: number; onRetry: () => void }) {
  const [, tick] = useState(0);
  useEffect(() => {
    if (state.kind !== 'retrying') return;
    const timer = setInterval(() => tick((n) => n + 1), 1000);
    return () => clearInterval(timer);
  }, [state]);
  const base = 'text-xs';
  switch (state.kind) {
    case 'saved':
      return (
        <span className={`${base} text-ink-faint`} data-testid="save-state" data-state="saved">
          revision {revision} · saved
        </span>
      );
    case 'pending':
      return (
        <span className={`${base} text-ink-soft`} data-testid="save-state" data-state="pending">
          revision {revision} · unsaved changes
        </span>
      );
    case 'saving':
      return (
        <span className={`${base} text-ink-soft`} data-testid="save-state" data-state="saving">
          revision {revision} · saving…
        </span>
      );
    case 'retrying':
      return (
        <span className={`${base} text-warn`} data-testid="save-state" data-state="retrying">
          Not saved yet — {state.message} Your text is kept; retrying in {secondsUntil(state.retryAt)} s.{' '}
          <button type="button" className="underline underline-offset-2" onClick={onRetry}>
            Retry now
          </button>
        </span>
      );
    case 'conflict':
      return (
        <span className={`${base} text-warn`} data-testid="save-state" data-state="conflict">
          Not saved — someone saved revision {state.theirs.number} first
        </span>
      );
    case 'refused':
      return (
        <span className={`${base} text-fail`} data-testid="save-state" data-state="refused">
          Not saved: {state.message} Your text is kept here.
        </span>
      );
  }
}
