/**
 * Autosave of one cell: a save a moment after typing stops, on top of the revision the text
 * was based on. A stale base (409) becomes a conflict the user resolves; a failed or offline
 * save keeps the text, retries with growing pauses and says so. Until the server has the
 * text it is also kept in this browser's storage, so a closed tab or an expired session
 * loses nothing: the draft comes back the next time the cell is opened. The decisions are
 * made by the pure machine in `autosave-state.ts`; this hook runs its timers and requests.
 */
import type { Cell, CellSaved } from '@rolloff/api/contract';
import { useCallback, useEffect, useReducer, useRef } from 'react';
import { saveCell } from '../api/save-cell';
import { autosaveReducer, classifyFailure, initialAutosave, isUnsaved, nextSaveIn, saveRequestOf } from './autosave-state';
import type { Draft, SaveRequest, SaveState } from './autosave-state';

export interface AutosaveOptions {
  notebookId: string;
  cell: Cell;
  editable: boolean;
  /** Called with the server's answer after every stored save. */
  onSaved?: (saved: CellSaved) => void;
  /** Pause after the last keystroke before saving. */
  delayMs?: number;
  /** Saves the text; replaceable in tests. */
  save?: typeof saveCell;
}

export interface Autosave {
  text: string;
  setText: (text: string) => void;
  state: SaveState;
  /** The revision the text on screen is based on. */
  revision: number;
  /** True when the text on screen came back from this browser's storage. */
  restoredDraft: boolean;
  resolveConflict: (choice: 'mine' | 'theirs') => void;
  retryNow: () => void;
}

const draftKey = (notebookId: string, cellId: number) => `rolloff.draft.${notebookId}.${cellId}`;

/** A new save attempt's Idempotency-Key (getRandomValues works outside https too, unlike randomUUID). */
const newSaveKey = () => Array.from(crypto.getRandomValues(new Uint8Array(16)), (byte) => byte.toString(16).padStart(2, '0')).join('');

function readDraft(key: string): Draft | null {
  try {
    const raw = localStorage.getItem(key);
    if (!raw) return null;
    const draft = JSON.parse(raw) as Partial<Draft>;
    return typeof draft.text === 'string' && typeof draft.baseRevision === 'number' ? { text: draft.text, baseRevision: draft.baseRevision } : null;
  } catch {
    return null;
  }
}

function writeDraft(key: string, draft: Draft | null): void {
  try {
    if (draft) localStorage.setItem(key, JSON.stringify(draft));
    else localStorage.removeItem(key);
  } catch {
    // Storage full or disabled: the text is still in the page and the saves go on.
  }
}

/** Keeps a cell's text and saves it; see the module comment. */
export function useCellAutosave({ notebookId, cell, editable, onSaved, delayMs = 800, save = saveCell }: AutosaveOptions): Autosave {
  const key = draftKey(notebookId, cell.id);
  const [state, dispatch] = useReducer(autosaveReducer, null, () => initialAutosave(cell, editable ? readDraft(key) : null));
  const restoredDraft = useRef(state.text !== cell.text).current;
  const latest = useRef(state);
  latest.current = state;
  const onSavedRef = useRef(onSaved);
  onSavedRef.current = onSaved;
  const editableRef = useRef(editable);
  editableRef.current = editable;

  const send = useCallback(
    (request: SaveRequest) =>
      save(notebookId, cell.id, { text: request.text, baseRevision: request.baseRevision }, request.key).then((saved) => {
        onSavedRef.current?.(saved);
        return saved;
      }),
    [save, notebookId, cell.id],
  );

  // The request of each save the machine starts, once.
  const started = useRef<SaveRequest | null>(null);
  useEffect(() => {
    const request = state.sending;
    if (!request || started.current === request) return;
    started.current = request;
    send(request).then(
      (saved) => dispatch({ type: 'stored', revision: saved.cell.revision, text: saved.cell.text }),
      (error: unknown) => dispatch({ type: 'failed', failure: classifyFailure(error), now: Date.now() }),
    );
  }, [state.sending, send]);

  // The timer of the next save; typing restarts it.
  const waitMs = editable ? nextSaveIn(state, delayMs, Date.now()) : null;
  useEffect(() => {
    if (waitMs === null) return;
    const timer = setTimeout(() => dispatch({ type: 'send', key: newSaveKey() }), waitMs);
    return () => clearTimeout(timer);
  }, [waitMs, state.text, state.status]);

  // The draft in this browser follows the text the server does not have yet.
  useEffect(() => {
    if (editable) writeDraft(key, isUnsaved(state) ? { text: state.text, baseRevision: state.base } : null);
  }, [editable, key, state.text, state.savedText, state.base]);

  // Someone else saved the cell: their text replaces mine if nothing is unsaved here.
  useEffect(() => dispatch({ type: 'remote', revision: cell.revision, text: cell.text }), [cell.revision, cell.text]);

  useEffect(() => {
    const online = () => dispatch({ type: 'retry-now' });
    const beforeUnload = (event: BeforeUnloadEvent) => {
      if (editable && isUnsaved(latest.current)) event.preventDefault();
    };
    window.addEventListener('online', online);
    window.addEventListener('beforeunload', beforeUnload);
    return () => {
      window.removeEventListener('online', online);
      window.removeEventListener('beforeunload', beforeUnload);
    };
  }, [editable]);

  // Leaving the page with a save still waiting: send it now rather than after the pause.
  useEffect(
    () => () => {
      const last = latest.current;
      if (editableRef.current && nextSaveIn(last, 0, 0) !== null && isUnsaved(last)) {
        send(saveRequestOf(last, newSaveKey())).catch(() => undefined);
      }
    },
    [],
  );

  const setText = useCallback((text: string) => dispatch({ type: 'edited', text, editable }), [editable]);
  const resolveConflict = useCallback((choice: 'mine' | 'theirs') => dispatch({ type: 'resolved', choice }), []);
  const retryNow = useCallback(() => dispatch({ type: 'retry-now' }), []);

  return { text: state.text, setText, state: state.status, revision: state.base, restoredDraft, resolveConflict, retryNow };
}
