import { describe, expect, it } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { buildCell, buildRevision } from '../../../test/cells';
import { RETRY_STEPS_MS, autosaveReducer, classifyFailure, initialAutosave, nextSaveIn } from './autosave-state';
import type { AutosaveEvent, AutosaveState } from './autosave-state';

const cell = buildCell(3, 'drive in\nshow in');
const run = (state: AutosaveState, ...events: AutosaveEvent[]) => events.reduce(autosaveReducer, state);
const typed = (text: string): AutosaveEvent => ({ type: 'edited', text, editable: true });
const offline = { type: 'failed', failure: { kind: 'retry', message: 'Offline', slow: false }, now: 1_000 } as const;
let keys = 0;
/** The timer firing, with the fresh key the hook would make. */
const send = (): AutosaveEvent => ({ type: 'send', key: `key-${++keys}` });

describe('the autosave machine', () => {
  it('opens saved, or on a draft from this browser: saved at once, or as a conflict when the cell moved on', () => {
    expect(initialAutosave(cell, null).status).toEqual({ kind: 'saved' });
    expect(initialAutosave(cell, { text: cell.text, baseRevision: 3 }).status).toEqual({ kind: 'saved' });
    const current = initialAutosave(cell, { text: 'drive in', baseRevision: 3 });
    expect([current.text, current.status.kind, nextSaveIn(current, 800, 0)]).toEqual(['drive in', 'pending', 0]);
    const older = initialAutosave(cell, { text: 'drive in', baseRevision: 2 });
    expect(older.status.kind).toBe('conflict');
    expect(initialAutosave(cell, { text: 'drive in', baseRevision: 9 }).text).toBe(cell.text);
  });

  it('waits for typing to stop, then sends the text on the revision it was based on', () => {
    const pending = run(initialAutosave(cell, null), typed('drive a'));
    expect(nextSaveIn(pending, 800, 0)).toBe(800);
    const saving = run(pending, { type: 'send', key: 'k1' });
    expect(saving.sending).toEqual({ text: 'drive a', baseRevision: 3, key: 'k1' });
    expect(nextSaveIn(saving, 800, 0)).toBeNull();
    expect(run(saving, { type: 'stored', revision: 4, text: 'drive a' })).toMatchObject({ base: 4, sending: null, status: { kind: 'saved' } });
  });

  it('saves again when typing went on during a save', () => {
    const state = run(initialAutosave(cell, null), typed('drive a'), send(), typed('drive ab'), { type: 'stored', revision: 4, text: 'drive a' });
    expect(state.status.kind).toBe('pending');
    expect(run(state, { type: 'send', key: 'k2' }).sending).toEqual({ text: 'drive ab', baseRevision: 4, key: 'k2' });
  });

  it('sends nothing when the text is back to what the server has', () => {
    const state = run(initialAutosave(cell, null), typed('x'), typed(cell.text), send());
    expect([state.sending, state.status.kind]).toEqual([null, 'saved']);
  });

  it('pauses longer after each failure in a row, and at least 10 s while signed out', () => {
    let state = run(initialAutosave(cell, null), typed('drive a'));
    const pauses: number[] = [];
    for (let i = 0; i < RETRY_STEPS_MS.length + 1; i += 1) {
      state = run(state, send(), offline);
      pauses.push(nextSaveIn(state, 800, 1_000) ?? -1);
    }
    expect(pauses).toEqual([...RETRY_STEPS_MS, RETRY_STEPS_MS.at(-1)]);
    const signedOut = run(initialAutosave(cell, null), typed('drive a'), send(), { ...offline, failure: { kind: 'retry', message: 'signed out', slow: true } });
    expect(nextSaveIn(signedOut, 800, 1_000)).toBe(10_000);
  });

  it('saves typing during a retry a moment after it stops, and "retry now" at once', () => {
    const retrying = run(initialAutosave(cell, null), typed('drive a'), send(), offline);
    const typing = run(retrying, typed('drive ab'));
    expect([typing.status.kind, nextSaveIn(typing, 800, 1_000)]).toEqual(['retrying', 800]);
    expect(nextSaveIn(run(retrying, { type: 'retry-now' }), 800, 1_000)).toBe(0);
  });

  it('retries an unanswered save with its own key, and gives changed text a new one', () => {
    const unanswered = run(initialAutosave(cell, null), typed('drive a'), { type: 'send', key: 'first' }, offline);
    expect(unanswered.unanswered).toEqual({ text: 'drive a', baseRevision: 3, key: 'first' });
    expect(run(unanswered, { type: 'retry-now' }, { type: 'send', key: 'second' }).sending?.key).toBe('first');
    expect(run(unanswered, typed('drive ab'), { type: 'send', key: 'second' }).sending).toEqual({ text: 'drive ab', baseRevision: 3, key: 'second' });
    // Typing back to the unanswered text is that same save again.
    expect(run(unanswered, typed('drive ab'), typed('drive a'), { type: 'send', key: 'third' }).sending?.key).toBe('first');
    // An answer (stored, a conflict, a refusal) ends the attempt: the next save is a new one.
    const stored = run(unanswered, { type: 'retry-now' }, send(), { type: 'stored', revision: 4, text: 'drive a' });
    expect(stored.unanswered).toBeNull();
    const refused = run(unanswered, { type: 'retry-now' }, send(), { type: 'failed', failure: { kind: 'refused', message: 'too large' }, now: 0 });
    expect(refused.unanswered).toBeNull();
  });

  it('holds a conflict until the person chooses, and saves "mine" on top of theirs', () => {
    const theirs = buildRevision(4, 'drive b');
    const conflict = run(initialAutosave(cell, null), typed('drive a'), send(), { type: 'failed', failure: { kind: 'conflict', theirs }, now: 0 });
    expect(conflict.status).toEqual({ kind: 'conflict', theirs });
    expect(nextSaveIn(run(conflict, typed('drive ab')), 800, 0)).toBeNull();
    const mine = run(conflict, { type: 'resolved', choice: 'mine' });
    expect([mine.base, nextSaveIn(mine, 800, 0)]).toEqual([4, 0]);
    expect(run(conflict, { type: 'resolved', choice: 'theirs' })).toMatchObject({ text: 'drive b', base: 4, status: { kind: 'saved' } });
  });

  it('treats a conflict with the very same text as saved', () => {
    const theirs = buildRevision(4, 'drive a');
    const state = run(initialAutosave(cell, null), typed('drive a'), send(), { type: 'failed', failure: { kind: 'conflict', theirs }, now: 0 });
    expect(state).toMatchObject({ base: 4, status: { kind: 'saved' } });
  });

  it('shows someone else’s newer text only when nothing is unsaved here', () => {
    const clean = run(initialAutosave(cell, null), { type: 'remote', revision: 5, text: 'drive z' });
    expect([clean.text, clean.base]).toEqual(['drive z', 5]);
    const dirty = run(initialAutosave(cell, null), typed('drive a'), { type: 'remote', revision: 5, text: 'drive z' });
    expect([dirty.text, dirty.base]).toEqual(['drive a', 3]);
  });

  it('lets a reader change the text on screen without saving', () => {
    const state = run(initialAutosave(cell, null), { type: 'edited', text: 'x', editable: false });
    expect([state.text, nextSaveIn(state, 800, 0)]).toEqual(['x', null]);
  });
});

describe('what a failed save means', () => {
  it('reads the server’s answer: conflict, retry, or refusal', () => {
    const theirs = buildRevision(4, 'drive b');
    const conflict = new ApiError(409, 'conflict', 'changed', { current: theirs, submitted: { text: 'x', baseRevision: 3 } });
    expect(classifyFailure(conflict)).toEqual({ kind: 'conflict', theirs });
    expect(classifyFailure(new ApiError(0, 'unreachable', 'no'))).toMatchObject({ kind: 'retry', slow: false });
    expect(classifyFailure(new ApiError(503, 'unavailable', 'busy'))).toMatchObject({ kind: 'retry', slow: false });
    expect(classifyFailure(new ApiError(401, 'unauthenticated', 'who'))).toMatchObject({ kind: 'retry', slow: true });
    expect(classifyFailure(new ApiError(413, 'too-large', 'The text is too long.'))).toEqual({ kind: 'refused', message: 'The text is too long.' });
    expect(classifyFailure(new Error('boom'))).toMatchObject({ kind: 'retry' });
  });
});
