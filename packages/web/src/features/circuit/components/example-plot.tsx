/**
 * A cell's plot and readouts without its editor, for the landing page: a real result from
 * the solver, drawn the way a notebook draws it.
 */
import { useMemo } from 'react';
import { useAnalysis } from '../worker/use-analysis';
import { LazyCircuitPlots, PlotPlaceholder } from './lazy-parts';
import { ReadoutsPanel } from './readouts-panel';
import { RequirementBadges } from './requirement-badges';

export function ExamplePlot({ text, filename }: { text: string; filename: string }) {
  const { outcome } = useAnalysis(text, { key: `example:${filename}` });
  const result = outcome?.ok ? outcome.result : null;
  const series = useMemo(() => (result ? [{ result }] : []), [result]);
  if (!result) return <PlotPlaceholder text={outcome && !outcome.ok ? `The solver could not run: ${outcome.message}` : 'Solving the example…'} />;
  return (
    <div className="space-y-3">
      <LazyCircuitPlots series={series} filename={filename} compact />
      <ReadoutsPanel readouts={result.readouts} />
      <RequirementBadges requirements={result.requirements} />
    </div>
  );
}
