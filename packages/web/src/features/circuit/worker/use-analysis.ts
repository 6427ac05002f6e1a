/**
 * `useAnalysis(key, text)`: the solver's result for a cell's text, computed in the shared
 * Web Worker at the next animation frame after the text changes. The result keeps the text
 * it belongs to, so an editor can tell whether its diagnostics still fit the document. A run
 * past the time budget is stopped; `solveAnyway` lifts the budget for this cell.
 */
import { useCallback, useEffect, useId, useMemo, useState } from 'react';
import { TIMING, recordElapsed } from '../../../lib/timing';
import { AnalysisScheduler } from './analysis-scheduler';
import type { AnalysisOutcome, WorkerLike } from './analysis-scheduler';

let shared: AnalysisScheduler | null = null;

function scheduler(): AnalysisScheduler {
  shared ??= new AnalysisScheduler(
    () => new Worker(new URL('./solver.worker.ts', import.meta.url), { type: 'module', name: 'rolloff-solver' }) as unknown as WorkerLike,
  );
  return shared;
}

export interface AnalysisState {
  /** The newest outcome delivered (its `text` says which text it belongs to). */
  outcome: AnalysisOutcome | null;
  /** True while the newest text has not been answered yet. */
  busy: boolean;
  /** Solves this cell however long it takes, from now on (after a run was stopped for its time). */
  solveAnyway: () => void;
}

/** Analyses `text` whenever it changes; `key` separates cells that share the worker. */
export function useAnalysis(text: string, options: { key?: string; maxPoints?: number } = {}): AnalysisState {
  const ownId = useId();
  const key = options.key ?? ownId;
  const [outcome, setOutcome] = useState<AnalysisOutcome | null>(null);
  const [askedFor, setAskedFor] = useState<string | null>(null);
  const [unbudgeted, setUnbudgeted] = useState(false);

  useEffect(() => {
    const frame = requestAnimationFrame(() => {
      setAskedFor(text);
      scheduler().submit(
        key,
        text,
        (next) => {
          if (next.ok) recordElapsed(TIMING.solve, next.elapsedMs);
          setOutcome(next);
        },
        options.maxPoints,
        unbudgeted,
      );
    });
    return () => cancelAnimationFrame(frame);
  }, [key, text, options.maxPoints, unbudgeted]);

  useEffect(() => () => scheduler().release(key), [key]);

  const solveAnyway = useCallback(() => {
    setUnbudgeted(true);
    setOutcome(null);
  }, []);
  return { outcome, busy: askedFor !== null && outcome?.text !== askedFor, solveAnyway };
}

/** Analyses several texts at once (revisions to overlay); outcomes come back in order. */
export function useAnalyses(texts: readonly string[], baseKey: string): (AnalysisOutcome | null)[] {
  const [outcomes, setOutcomes] = useState<Record<string, AnalysisOutcome>>({});
  const joined = JSON.stringify(texts);
  useEffect(() => {
    const list: string[] = JSON.parse(joined);
    const keys = list.map((_, i) => `${baseKey}:${i}`);
    list.forEach((text, i) => scheduler().submit(keys[i], text, (outcome) => setOutcomes((old) => ({ ...old, [keys[i]]: outcome }))));
    return () => keys.forEach((key) => scheduler().release(key));
  }, [joined, baseKey]);
  return useMemo(
    () =>
      texts.map((text, i) => {
        const outcome = outcomes[`${baseKey}:${i}`];
        return outcome && outcome.text === text ? outcome : null;
      }),
    // `joined` stands for `texts`, which callers may rebuild on every render.
    [outcomes, joined, baseKey],
  );
}
