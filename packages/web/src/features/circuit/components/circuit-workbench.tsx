/**
 * A circuit cell at work: the editor beside its plots on wide screens (above them on narrow
 * ones), the readouts and requirement badges under the plots, cautions, and the problems the
 * solver found. Every edit is analysed in the Web Worker; while the text has errors the last
 * result that solved stays on screen, dimmed.
 */
import type { Result } from '@rolloff/solver';
import { useMemo, useRef, useState } from 'react';
import type { PlotPin } from '../plot/plot-pins';
import { cautionsOf, problemsOf } from '../lib/cautions';
import { plotSummary } from '../lib/readout-labels';
import { useAnalysis } from '../worker/use-analysis';
import { DiagnosticsAnnouncement } from './diagnostics-announcement';
import { DiagnosticsList } from './diagnostics-list';
import { HazardCaution, SmallSignalNote } from './hazard-caution';
import { LazyCircuitEditor, LazyCircuitPlots, PlotPlaceholder } from './lazy-parts';
import { ReadoutsPanel } from './readouts-panel';
import { RequirementBadges } from './requirement-badges';
import { SolverFailure } from './solver-failure';
import { TraceData } from './trace-data';

export interface CircuitWorkbenchProps {
  /** Separates this cell's analyses from other cells'. */
  cellKey: string;
  text: string;
  onChange?: (text: string) => void;
  readOnly?: boolean;
  /** Accessible name of the editor. */
  label: string;
  /** File name stem of plot downloads. */
  filename: string;
  onLeave?: () => void;
  autoFocus?: boolean;
  /** Where the language reference lives. */
  helpHref: string;
  /** Pins on this text's plot (made on the revision being edited). */
  pins?: readonly PlotPin[];
}

const hasErrors = (result: Result) => result.diagnostics.some((d) => d.severity === 'error');

/** The editor, plots and readouts of one circuit cell. */
export function CircuitWorkbench({ cellKey, text, onChange, readOnly, label, filename, onLeave, autoFocus, helpHref, pins }: CircuitWorkbenchProps) {
  const { outcome, busy, solveAnyway } = useAnalysis(text, { key: cellKey });
  const lastGood = useRef<Result | null>(null);
  const result = outcome?.ok ? outcome.result : null;
  if (result && !hasErrors(result) && result.traces.length > 0) lastGood.current = result;
  const shown = result && !hasErrors(result) ? result : lastGood.current;
  const stale = shown !== null && shown !== result;
  const series = useMemo(() => (shown ? [{ result: shown }] : []), [shown]);
  // While the text has errors, the cautions of the last result that solved stay, like its plots.
  const cautions = useMemo(() => cautionsOf((result && !hasErrors(result) ? result : (shown ?? result))?.diagnostics ?? []), [result, shown]);
  const diagnostics = useMemo(() => (outcome?.ok ? { text: outcome.text, items: outcome.result.diagnostics } : null), [outcome]);
  const [editing, setEditing] = useState(false);
  // A keystroke re-renders this cell; the plots and the tables under them change only with a
  // new result, so they are kept as they were until one arrives.
  const plotsView = useMemo(
    () =>
      shown ? (
        <>
          <p className="sr-only">{plotSummary(shown.traces, shown.readouts, shown.variants)}</p>
          <LazyCircuitPlots series={series} filename={filename} pins={pins} />
        </>
      ) : null,
    [shown, series, filename, pins],
  );
  const resultView = useMemo(
    () =>
      shown ? (
        <>
          <ReadoutsPanel readouts={shown.readouts} variants={shown.variants} stale={stale} />
          <RequirementBadges requirements={shown.requirements} variants={shown.variants} stale={stale} />
          <TraceData result={shown} />
        </>
      ) : null,
    [shown, stale],
  );

  return (
    // Wide screens: the editor beside its plots. Narrow ones (a phone, 200 % zoom): the plots
    // first and sticky, so they stay in view while the text under them is edited.
    <div className="grid gap-4 lg:grid-cols-2" data-testid="circuit-workbench" data-busy={busy}>
      <div className="min-w-0 space-y-2 max-lg:order-3" onFocus={() => setEditing(!readOnly)} onBlur={() => setEditing(false)}>
        <LazyCircuitEditor
          value={text}
          onChange={onChange}
          diagnostics={diagnostics}
          readOnly={readOnly}
          label={label}
          onLeave={onLeave}
          autoFocus={autoFocus}
        />
        {result ? <DiagnosticsList diagnostics={problemsOf(result.diagnostics)} /> : null}
        <DiagnosticsAnnouncement diagnostics={diagnostics?.items ?? null} editing={editing} />
        <p className="text-xs text-ink-faint">
          <a href={helpHref} target="_blank" rel="noreferrer" className="text-accent underline-offset-2 hover:underline">
            Cell language reference
          </a>{' '}
          · Ctrl-Space offers words, ↓ and Enter pick one · Shift-Enter goes to the next cell
          {outcome?.ok ? <span data-testid="solve-time"> · solved in {Math.max(1, Math.round(outcome.elapsedMs))} ms</span> : null}
        </p>
      </div>
      <div className="min-w-0 space-y-3 max-lg:contents">
        <div className="space-y-3 empty:hidden max-lg:order-1">
          <HazardCaution cautions={cautions} />
          {outcome && !outcome.ok ? <SolverFailure outcome={outcome} onSolveAnyway={solveAnyway} /> : null}
          {stale ? <p className="text-xs text-warn">The cell has errors: showing the last result that solved.</p> : null}
        </div>
        <div
          className={`max-lg:sticky max-lg:top-0 max-lg:z-10 max-lg:order-2 max-lg:max-h-[45vh] max-lg:overflow-y-auto max-lg:bg-paper ${stale ? 'opacity-60' : ''}`}
          data-testid="workbench-plots"
        >
          {plotsView ?? <PlotPlaceholder text={outcome ? 'Nothing to plot: fix the errors or add a show line.' : 'Solving…'} />}
        </div>
        <div className="space-y-3 max-lg:order-4">
          {resultView}
          <SmallSignalNote />
        </div>
      </div>
    </div>
  );
}
