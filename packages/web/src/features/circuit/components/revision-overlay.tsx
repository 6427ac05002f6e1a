/**
 * Several texts of one cell (revisions) solved and drawn on one plot, the newest solid and
 * the others dashed, so a change in the response shows at a glance.
 */
import { useMemo } from 'react';
import type { PlotSeries } from '../plot/figure-style';
import { useAnalyses } from '../worker/use-analysis';
import { LazyCircuitPlots, PlotPlaceholder } from './lazy-parts';

export interface OverlayEntry {
  name: string;
  text: string;
}

const DASHES: PlotSeries['dash'][] = ['solid', 'dash', 'dot', 'dashdot'];

/** The overlaid plot of `entries` (the first is drawn solid and carries the markers). */
export function RevisionOverlay({ entries, cellKey, filename }: { entries: readonly OverlayEntry[]; cellKey: string; filename: string }) {
  const texts = useMemo(() => entries.map((e) => e.text), [entries]);
  const outcomes = useAnalyses(texts, `overlay:${cellKey}`);
  const series = useMemo(() => {
    const list: PlotSeries[] = [];
    outcomes.forEach((outcome, i) => {
      if (outcome?.ok && outcome.result.traces.length > 0) list.push({ result: outcome.result, name: entries[i].name, dash: DASHES[i % DASHES.length] });
    });
    return list;
  }, [outcomes, entries]);
  if (outcomes.some((o) => o === null)) return <PlotPlaceholder text="Solving the revisions…" />;
  if (series.length === 0) return <PlotPlaceholder text="Neither revision has anything to plot." />;
  return <LazyCircuitPlots series={series} filename={filename} compact />;
}
