import { act, cleanup, renderHook } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { buildCell, buildRevision, buildSaved } from '../../../test/cells';
import type { saveCell } from '../api/save-cell';
import { useCellAutosave } from './use-cell-autosave';

const theirsText = 'drive in\nR1 [in out] 10k\nC1 [out gnd] 10n\nshow out';
const mineText = 'drive in\nR1 [in out] 12k\nC1 [out gnd] 10n\nshow out';

describe('autosave with conflicts and failures', () => {
  beforeEach(() => {
    vi.useFakeTimers();
    localStorage.clear();
  });
  afterEach(() => {
    vi.useRealTimers();
    cleanup();
  });

  const conflictError = (current: ReturnType<typeof buildRevision>, text: string, baseRevision: number) =>
    new ApiError(409, 'conflict', 'The cell changed since revision 3.', { current, submitted: { text, baseRevision } });

  it('saves a moment after typing stops, on the revision the text was based on', async () => {
    const save = vi.fn<typeof saveCell>(async (_n, _c, body) => buildSaved(4, body.text));
    const { result } = renderHook(() => useCellAutosave({ notebookId: 'abcdefghijkl', cell: buildCell(3, theirsText), editable: true, save, delayMs: 500 }));
    act(() => result.current.setText(mineText));
    expect(result.current.state.kind).toBe('pending');
    await act(() => vi.advanceTimersByTimeAsync(499));
    expect(save).not.toHaveBeenCalled();
    await act(() => vi.advanceTimersByTimeAsync(1));
    expect(save).toHaveBeenCalledWith('abcdefghijkl', 7, { text: mineText, baseRevision: 3 }, expect.stringMatching(/^[0-9a-f]{32}$/));
    expect(result.current.state.kind).toBe('saved');
    expect(result.current.revision).toBe(4);
  });

  it('turns a 409 into a conflict; keeping mine saves it on top of theirs', async () => {
    const theirs = buildRevision(4, theirsText.replace('10n', '12n'));
    const save = vi
      .fn<typeof saveCell>()
      .mockImplementationOnce(async (_n, _c, body) => {
        throw conflictError(theirs, body.text, body.baseRevision);
      })
      .mockImplementationOnce(async (_n, _c, body) => buildSaved(5, body.text));
    const { result } = renderHook(() => useCellAutosave({ notebookId: 'abcdefghijkl', cell: buildCell(3, theirsText), editable: true, save, delayMs: 100 }));
    act(() => result.current.setText(mineText));
    await act(() => vi.advanceTimersByTimeAsync(100));
    expect(result.current.state).toEqual({ kind: 'conflict', theirs });
    expect(result.current.text).toBe(mineText);
    act(() => result.current.resolveConflict('mine'));
    await act(() => vi.advanceTimersByTimeAsync(0));
    expect(save).toHaveBeenLastCalledWith('abcdefghijkl', 7, { text: mineText, baseRevision: 4 }, expect.any(String));
    expect(result.current.state.kind).toBe('saved');
    expect(result.current.revision).toBe(5);
  });

  it('taking theirs puts their text in the cell without another save', async () => {
    const theirs = buildRevision(4, 'drive in\nshow in');
    const save = vi.fn<typeof saveCell>(async (_n, _c, body) => {
      throw conflictError(theirs, body.text, body.baseRevision);
    });
    const { result } = renderHook(() => useCellAutosave({ notebookId: 'abcdefghijkl', cell: buildCell(3, theirsText), editable: true, save, delayMs: 100 }));
    act(() => result.current.setText(mineText));
    await act(() => vi.advanceTimersByTimeAsync(100));
    act(() => result.current.resolveConflict('theirs'));
    await act(() => vi.advanceTimersByTimeAsync(1000));
    expect(result.current.text).toBe(theirs.text);
    expect(result.current.state.kind).toBe('saved');
    expect(result.current.revision).toBe(4);
    expect(save).toHaveBeenCalledTimes(1);
  });

  it('keeps the text when offline, says so, and retries until the save goes through', async () => {
    const save = vi
      .fn<typeof saveCell>()
      .mockRejectedValueOnce(new ApiError(0, 'unreachable', 'The server cannot be reached.'))
      .mockImplementationOnce(async (_n, _c, body) => buildSaved(4, body.text));
    const { result } = renderHook(() => useCellAutosave({ notebookId: 'abcdefghijkl', cell: buildCell(3, theirsText), editable: true, save, delayMs: 100 }));
    act(() => result.current.setText(mineText));
    await act(() => vi.advanceTimersByTimeAsync(100));
    expect(result.current.state.kind).toBe('retrying');
    expect(result.current.text).toBe(mineText);
    expect(JSON.parse(localStorage.getItem('rolloff.draft.abcdefghijkl.7') ?? 'null')).toEqual({ text: mineText, baseRevision: 3 });
    await act(() => vi.advanceTimersByTimeAsync(2000));
    expect(save).toHaveBeenCalledTimes(2);
    // The retry is the same attempt, so it carries the same Idempotency-Key.
    expect(save.mock.calls[1]![3]).toBe(save.mock.calls[0]![3]);
    expect(result.current.state.kind).toBe('saved');
    expect(localStorage.getItem('rolloff.draft.abcdefghijkl.7')).toBeNull();
  });

  it('brings back a draft left in this browser and saves it', async () => {
    localStorage.setItem('rolloff.draft.abcdefghijkl.7', JSON.stringify({ text: mineText, baseRevision: 3 }));
    const save = vi.fn<typeof saveCell>(async (_n, _c, body) => buildSaved(4, body.text));
    const { result } = renderHook(() => useCellAutosave({ notebookId: 'abcdefghijkl', cell: buildCell(3, theirsText), editable: true, save }));
    expect(result.current.text).toBe(mineText);
    expect(result.current.restoredDraft).toBe(true);
    await act(() => vi.advanceTimersByTimeAsync(0));
    expect(save).toHaveBeenCalledWith('abcdefghijkl', 7, { text: mineText, baseRevision: 3 }, expect.stringMatching(/^[0-9a-f]{32}$/));
  });

  it('never saves for a reader', async () => {
    const save = vi.fn<typeof saveCell>();
    const { result } = renderHook(() => useCellAutosave({ notebookId: 'abcdefghijkl', cell: buildCell(3, theirsText), editable: false, save, delayMs: 10 }));
    act(() => result.current.setText(mineText));
    await act(() => vi.advanceTimersByTimeAsync(5000));
    expect(save).not.toHaveBeenCalled();
  });
});
