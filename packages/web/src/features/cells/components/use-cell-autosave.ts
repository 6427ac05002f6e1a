/**
 * Autosave of one cell: a save a moment after typing stops, on top of the revision the text
 * was based on. A stale base (409) becomes a conflict the user resolves; a failed or offline
 * save keeps the text, retries with growing pauses and says so. Until the server has the
 * text it is also kept in this browser's storage, so a closed tab or an expired session
 * loses nothing: the draft comes back the next time the cell is opened.
 */
import { ConflictSchema } from '@rolloff/api/contract';
import type { Cell, CellRevision, CellSaved } from '@rolloff/api/contract';
import { useCallback, useEffect, useRef, useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { saveCell } from '../api/save-cell';

export type SaveState =
  | { kind: 'saved' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'retrying'; message: string; retryAt: number }
  | { kind: 'conflict'; theirs: CellRevision }
  | { kind: 'refused'; message: string };

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

interface Draft {
  text: string;
  baseRevision: number;
}

const draftKey = (notebookId: string, cellId: number) => `rolloff.draft.${notebookId}.${cellId}`;

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

/** The cell's current revision in the shape of a conflict's "theirs". */
function revisionOf(cell: Cell): CellRevision {
  return { cellId: cell.id, number: cell.revision, text: cell.text, author: cell.updatedBy, createdAt: cell.updatedAt, diagnostics: cell.diagnostics };
}

const RETRY_STEPS_MS = [2_000, 4_000, 8_000, 15_000, 30_000];

/** Keeps a cell's text and saves it; see the module comment. */
export function useCellAutosave({ notebookId, cell, editable, onSaved, delayMs = 800, save = saveCell }: AutosaveOptions): Autosave {
  const key = draftKey(notebookId, cell.id);
  const initialDraft = useRef<Draft | null | undefined>(undefined);
  if (initialDraft.current === undefined) {
    const draft = editable ? readDraft(key) : null;
    initialDraft.current = draft && draft.text !== cell.text && draft.baseRevision <= cell.revision ? draft : null;
  }
  const draft = initialDraft.current;

  const [text, setTextState] = useState(draft ? draft.text : cell.text);
  const [state, setState] = useState<SaveState>(() =>
    !draft ? { kind: 'saved' } : draft.baseRevision === cell.revision ? { kind: 'pending' } : { kind: 'conflict', theirs: revisionOf(cell) },
  );
  const [revision, setRevision] = useState(cell.revision);

  const textRef = useRef(text);
  const baseRef = useRef(cell.revision);
  const savedTextRef = useRef(cell.text);
  const inFlight = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const attempts = useRef(0);
  const conflicted = useRef(state.kind === 'conflict');
  const conflictTheirs = useRef<CellRevision | null>(state.kind === 'conflict' ? state.theirs : null);
  const onSavedRef = useRef(onSaved);
  onSavedRef.current = onSaved;

  const run = useRef<() => void>(() => undefined);

  const schedule = useCallback((ms: number) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => {
      timer.current = null;
      run.current();
    }, ms);
  }, []);

  run.current = () => {
    if (!editable || conflicted.current) return;
    if (inFlight.current) return;
    const sent = textRef.current;
    if (sent === savedTextRef.current) {
      writeDraft(key, null);
      setState({ kind: 'saved' });
      return;
    }
    inFlight.current = true;
    setState({ kind: 'saving' });
    save(notebookId, cell.id, { text: sent, baseRevision: baseRef.current })
      .then((saved) => {
        inFlight.current = false;
        attempts.current = 0;
        baseRef.current = saved.cell.revision;
        savedTextRef.current = saved.cell.text;
        setRevision(saved.cell.revision);
        onSavedRef.current?.(saved);
        if (textRef.current !== savedTextRef.current) {
          setState({ kind: 'pending' });
          schedule(delayMs);
        } else {
          writeDraft(key, null);
          setState({ kind: 'saved' });
        }
      })
      .catch((error: unknown) => {
        inFlight.current = false;
        handleFailure(error);
      });
  };

  const retryLater = (message: string, slow = false) => {
    const step = RETRY_STEPS_MS[Math.min(attempts.current, RETRY_STEPS_MS.length - 1)];
    attempts.current += 1;
    const wait = slow ? Math.max(step, 10_000) : step;
    setState({ kind: 'retrying', message, retryAt: Date.now() + wait });
    schedule(wait);
  };

  const handleFailure = (error: unknown) => {
    if (!(error instanceof ApiError)) {
      retryLater('The save failed unexpectedly.');
      return;
    }
    if (error.status === 409) {
      const conflict = ConflictSchema.safeParse({ error: error.id, message: error.message, details: error.details });
      if (conflict.success) {
        const theirs = conflict.data.details.current;
        if (theirs.text === textRef.current) {
          // Someone saved exactly this text: nothing to resolve.
          baseRef.current = theirs.number;
          savedTextRef.current = theirs.text;
          setRevision(theirs.number);
          writeDraft(key, null);
          setState({ kind: 'saved' });
          return;
        }
        conflicted.current = true;
        conflictTheirs.current = theirs;
        setState({ kind: 'conflict', theirs });
        return;
      }
    }
    if (error.unreachable || error.status >= 500) {
      retryLater(error.status === 0 ? 'Offline: the server cannot be reached.' : `The server could not save (${error.message})`);
      return;
    }
    if (error.status === 401) {
      retryLater('You are signed out. Sign in again (in this or another tab) and the save goes through.', true);
      return;
    }
    setState({ kind: 'refused', message: error.message });
  };

  const setText = useCallback(
    (next: string) => {
      textRef.current = next;
      setTextState(next);
      if (!editable) return;
      writeDraft(key, next === savedTextRef.current ? null : { text: next, baseRevision: baseRef.current });
      if (conflicted.current) return;
      setState((old) => (old.kind === 'retrying' ? old : { kind: 'pending' }));
      schedule(delayMs);
    },
    [editable, key, delayMs, schedule],
  );

  const resolveConflict = useCallback(
    (choice: 'mine' | 'theirs') => {
      const theirs = conflictTheirs.current;
      if (!theirs) return;
      conflictTheirs.current = null;
      conflicted.current = false;
      baseRef.current = theirs.number;
      savedTextRef.current = theirs.text;
      setRevision(theirs.number);
      if (choice === 'theirs') {
        textRef.current = theirs.text;
        setTextState(theirs.text);
        writeDraft(key, null);
        setState({ kind: 'saved' });
        return;
      }
      writeDraft(key, { text: textRef.current, baseRevision: theirs.number });
      setState({ kind: 'pending' });
      schedule(0);
    },
    [key, schedule],
  );

  const retryNow = useCallback(() => {
    attempts.current = 0;
    schedule(0);
  }, [schedule]);

  // A draft from this browser on the current revision is saved straight away.
  useEffect(() => {
    if (draft && draft.baseRevision === cell.revision) schedule(0);
    // Only on mount: the draft is read once.
  }, []);

  // Someone else saved the cell and nothing is unsaved here: show their text.
  useEffect(() => {
    if (cell.revision > baseRef.current && textRef.current === savedTextRef.current && !inFlight.current && !conflicted.current) {
      baseRef.current = cell.revision;
      savedTextRef.current = cell.text;
      textRef.current = cell.text;
      setTextState(cell.text);
      setRevision(cell.revision);
    }
  }, [cell.revision, cell.text]);

  useEffect(() => {
    const online = () => {
      if (textRef.current !== savedTextRef.current) retryNow();
    };
    const beforeUnload = (event: BeforeUnloadEvent) => {
      if (editable && textRef.current !== savedTextRef.current) event.preventDefault();
    };
    window.addEventListener('online', online);
    window.addEventListener('beforeunload', beforeUnload);
    return () => {
      window.removeEventListener('online', online);
      window.removeEventListener('beforeunload', beforeUnload);
    };
  }, [editable, retryNow]);

  // Leaving the page with a save still waiting: send it now rather than after the pause.
  useEffect(
    () => () => {
      if (timer.current) {
        clearTimeout(timer.current);
        timer.current = null;
        run.current();
      }
    },
    [],
  );

  return { text, setText, state, revision, restoredDraft: draft !== null, resolveConflict, retryNow };
}
