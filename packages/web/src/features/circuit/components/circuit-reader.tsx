/**
 * A circuit cell for reading, as a review shows it: the plots across the page with the
 * loop margins and pins on them, the readouts and requirement results under them, and the
 * cell's text read-only beside those. A click on a plot picks a frequency on a trace.
 */
import type { ReactNode } from 'react';
import { useMemo } from 'react';
import type { PlotPick, PlotPin } from '../plot/plot-pins';
import { cautionsOf, problemsOf } from '../lib/cautions';
import { plotSummary } from '../lib/readout-labels';
import { useAnalysis } from '../worker/use-analysis';
import { DiagnosticsList } from './diagnostics-list';
import { HazardCaution, SmallSignalNote } from './hazard-caution';
import { LazyCircuitEditor, LazyCircuitPlots, PlotPlaceholder } from './lazy-parts';
import { ReadoutsPanel } from './readouts-panel';
import { RequirementBadges } from './requirement-badges';
import { SolverFailure } from './solver-failure';
import { TraceData } from './trace-data';

export interface CircuitReaderProps {
  /** Separates this cell's analyses from other cells'. */
  cellKey: string;
  text: string;
  /** Accessible name of the cell's text. */
  label: string;
  /** File name stem of plot downloads. */
  filename: string;
  pins?: readonly PlotPin[];
  onPick?: (pick: PlotPick) => void;
  /** Shown under the readouts, given the labels of the traces the cell draws (to pin on). */
  footer?: (traces: readonly string[]) => ReactNode;
}

const NO_TRACES: readonly string[] = [];

/** One circuit cell, read-only, with everything a reviewer reads off it. */
export function CircuitReader({ cellKey, text, label, filename, pins, onPick, footer }: CircuitReaderProps) {
  const { outcome, solveAnyway } = useAnalysis(text, { key: cellKey });
  const result = outcome?.ok ? outcome.result : null;
  const series = useMemo(() => (result ? [{ result }] : []), [result]);
  const traces = useMemo(() => (result ? result.traces.filter((t) => t.kind !== 'noise').map((t) => t.label) : NO_TRACES), [result]);
  const cautions = useMemo(() => cautionsOf(result?.diagnostics ?? []), [result]);
  const diagnostics = useMemo(() => (outcome?.ok ? { text: outcome.text, items: outcome.result.diagnostics } : null), [outcome]);

  return (
    <div className="space-y-3" data-testid="circuit-reader">
      <HazardCaution cautions={cautions} />
      {outcome && !outcome.ok ? <SolverFailure outcome={outcome} onSolveAnyway={solveAnyway} /> : null}
      {result && result.traces.length > 0 ? <p className="sr-only">{plotSummary(result.traces, result.readouts, result.variants)}</p> : null}
      {result && result.traces.length > 0 ? (
        <LazyCircuitPlots series={series} filename={filename} pins={pins} onPick={onPick} />
      ) : (
        <PlotPlaceholder text={outcome ? 'This revision has nothing to plot.' : 'Solving…'} />
      )}
      <div className="grid gap-3 lg:grid-cols-2">
        <div className="min-w-0 space-y-3">
          {result ? (
            <>
              <ReadoutsPanel readouts={result.readouts} variants={result.variants} />
              <RequirementBadges requirements={result.requirements} variants={result.variants} />
              <TraceData result={result} />
            </>
          ) : null}
          <SmallSignalNote />
        </div>
        <div className="min-w-0 space-y-2">
          <LazyCircuitEditor value={text} diagnostics={diagnostics} readOnly label={label} />
          {result ? <DiagnosticsList diagnostics={problemsOf(result.diagnostics)} /> : null}
        </div>
      </div>
      {footer ? footer(traces) : null}
    </div>
  );
}
