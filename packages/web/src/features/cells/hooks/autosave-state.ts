/**
 * The autosave of one cell as a pure state machine: what is on screen, what the server has,
 * the save in flight and what the person is told. `autosaveReducer` takes the events (typing,
 * a timer firing, the server's answer, a choice in the conflict dialog, someone else's save);
 * `nextSaveIn` says when the next save is due. The hook around it only runs timers, requests
 * and storage.
 */
import { ConflictSchema } from '@rolloff/api/contract';
import type { Cell, CellRevision } from '@rolloff/api/contract';
import { ApiError } from '../../../lib/api-client';

export type SaveState =
  | { kind: 'saved' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'retrying'; message: string; retryAt: number }
  | { kind: 'conflict'; theirs: CellRevision }
  | { kind: 'refused'; message: string };

/**
 * A save on its way to the server: the text, the revision it was based on, and the attempt's
 * Idempotency-Key, which its retries reuse.
 */
export interface SaveRequest {
  text: string;
  baseRevision: number;
  key: string;
}

export interface AutosaveState {
  /** The text on screen. */
  text: string;
  /** The server's text at `base`. */
  savedText: string;
  /** The revision the text on screen is based on. */
  base: number;
  sending: SaveRequest | null;
  /** The save whose answer never came (offline, 5xx): it may have gone through, so its retry keeps its key. */
  unanswered: SaveRequest | null;
  /** Failed tries in a row, for the pause before the next. */
  attempts: number;
  /**
   * When the next save is due: a moment after typing stops, at once (a restored draft, a
   * resolved conflict, "retry now"), or after the pause that follows a failed save.
   */
  due: 'after-typing' | 'now' | 'after-pause';
  status: SaveState;
}

/** What a failed save means for the person. */
export type SaveFailure = { kind: 'conflict'; theirs: CellRevision } | { kind: 'retry'; message: string; slow: boolean } | { kind: 'refused'; message: string };

export type AutosaveEvent =
  | { type: 'edited'; text: string; editable: boolean }
  | { type: 'send'; key: string }
  | { type: 'stored'; revision: number; text: string }
  | { type: 'failed'; failure: SaveFailure; now: number }
  | { type: 'resolved'; choice: 'mine' | 'theirs' }
  | { type: 'retry-now' }
  | { type: 'remote'; revision: number; text: string };

/** A draft kept in this browser for a cell. */
export interface Draft {
  text: string;
  baseRevision: number;
}

/** Pauses after the first, second, … failed save in a row. */
export const RETRY_STEPS_MS = [2_000, 4_000, 8_000, 15_000, 30_000];
/** The least pause while signed out: signing in again takes a moment. */
const SIGNED_OUT_PAUSE_MS = 10_000;

/** The cell's current revision in the shape of a conflict's "theirs" (a cell carries no revision message). */
function revisionOf(cell: Cell): CellRevision {
  return {
    cellId: cell.id,
    number: cell.revision,
    text: cell.text,
    author: cell.updatedBy,
    message: null,
    createdAt: cell.updatedAt,
    diagnostics: cell.diagnostics,
  };
}

/**
 * The state a cell opens in. A draft on the current revision is saved at once; a draft on an
 * older revision meets the newer text as a conflict; a draft that says nothing new is dropped.
 */
export function initialAutosave(cell: Cell, draft: Draft | null): AutosaveState {
  const base = { savedText: cell.text, base: cell.revision, sending: null, unanswered: null, attempts: 0 };
  if (!draft || draft.text === cell.text || draft.baseRevision > cell.revision) {
    return { ...base, text: cell.text, due: 'after-typing', status: { kind: 'saved' } };
  }
  if (draft.baseRevision === cell.revision) return { ...base, text: draft.text, due: 'now', status: { kind: 'pending' } };
  return { ...base, text: draft.text, due: 'after-typing', status: { kind: 'conflict', theirs: revisionOf(cell) } };
}

/** Whether `state` holds text the server does not have yet. */
export const isUnsaved = (state: AutosaveState) => state.text !== state.savedText;

/** The save of the text on screen: a retry of the unanswered one (same key) if it is the same save, else a new attempt with `freshKey`. */
export function saveRequestOf(state: AutosaveState, freshKey: string): SaveRequest {
  const again = state.unanswered;
  // A new object even for a retry: the hook sends each request it is handed once.
  if (again && again.text === state.text && again.baseRevision === state.base) return { ...again };
  return { text: state.text, baseRevision: state.base, key: freshKey };
}

/** The next state after `event`. */
export function autosaveReducer(state: AutosaveState, event: AutosaveEvent): AutosaveState {
  switch (event.type) {
    case 'edited': {
      if (!event.editable || state.status.kind === 'conflict') return { ...state, text: event.text };
      // While retrying the message stays, but new typing is saved a moment after it stops.
      const status: SaveState = state.status.kind === 'retrying' ? state.status : { kind: 'pending' };
      return { ...state, text: event.text, due: 'after-typing', status };
    }
    case 'send':
      if (state.status.kind === 'conflict' || state.sending) return state;
      if (!isUnsaved(state)) return { ...state, status: { kind: 'saved' } };
      return { ...state, sending: saveRequestOf(state, event.key), status: { kind: 'saving' } };
    case 'stored': {
      const next = { ...state, sending: null, unanswered: null, attempts: 0, base: event.revision, savedText: event.text, due: 'after-typing' as const };
      return { ...next, status: isUnsaved(next) ? { kind: 'pending' } : { kind: 'saved' } };
    }
    case 'failed':
      return failed({ ...state, sending: null, unanswered: event.failure.kind === 'retry' ? state.sending : null }, event.failure, event.now);
    case 'resolved': {
      if (state.status.kind !== 'conflict') return state;
      const { theirs } = state.status;
      const next = { ...state, base: theirs.number, savedText: theirs.text, attempts: 0 };
      if (event.choice === 'theirs') return { ...next, text: theirs.text, status: { kind: 'saved' } };
      return { ...next, due: 'now', status: { kind: 'pending' } };
    }
    case 'retry-now':
      if (!isUnsaved(state) || state.sending || state.status.kind === 'conflict') return state;
      return { ...state, attempts: 0, due: 'now', status: { kind: 'pending' } };
    case 'remote':
      // Someone else saved the cell and nothing is unsaved here: show their text.
      if (event.revision <= state.base || isUnsaved(state) || state.sending || state.status.kind === 'conflict') return state;
      return { ...state, base: event.revision, savedText: event.text, text: event.text };
  }
}

function failed(state: AutosaveState, failure: SaveFailure, now: number): AutosaveState {
  switch (failure.kind) {
    case 'conflict':
      if (failure.theirs.text === state.text) {
        // Someone saved exactly this text: nothing to resolve.
        return { ...state, base: failure.theirs.number, savedText: failure.theirs.text, status: { kind: 'saved' } };
      }
      return { ...state, status: { kind: 'conflict', theirs: failure.theirs } };
    case 'retry': {
      const step = RETRY_STEPS_MS[Math.min(state.attempts, RETRY_STEPS_MS.length - 1)];
      const wait = failure.slow ? Math.max(step, SIGNED_OUT_PAUSE_MS) : step;
      return { ...state, attempts: state.attempts + 1, due: 'after-pause', status: { kind: 'retrying', message: failure.message, retryAt: now + wait } };
    }
    case 'refused':
      return { ...state, status: { kind: 'refused', message: failure.message } };
  }
}

/** Milliseconds until the next save is due (`delayMs` after typing stops), or null when none is. */
export function nextSaveIn(state: AutosaveState, delayMs: number, now: number): number | null {
  if (state.sending || (state.status.kind !== 'pending' && state.status.kind !== 'retrying')) return null;
  if (state.due === 'now') return 0;
  if (state.due === 'after-pause' && state.status.kind === 'retrying') return Math.max(0, state.status.retryAt - now);
  return delayMs;
}

/** What a failed save means: a conflict to resolve, a pause and another try, or a refusal. */
export function classifyFailure(error: unknown): SaveFailure {
  if (!(error instanceof ApiError)) return { kind: 'retry', message: 'The save failed unexpectedly.', slow: false };
  if (error.status === 409) {
    const conflict = ConflictSchema.safeParse({ error: error.id, message: error.message, details: error.details });
    if (conflict.success) return { kind: 'conflict', theirs: conflict.data.details.current };
  }
  if (error.unreachable || error.status >= 500) {
    const message = error.status === 0 ? 'Offline: the server cannot be reached.' : `The server could not save (${error.message})`;
    return { kind: 'retry', message, slow: false };
  }
  if (error.status === 401) {
    return { kind: 'retry', message: 'You are signed out. Sign in again (in this or another tab) and the save goes through.', slow: true };
  }
  return { kind: 'refused', message: error.message };
}
