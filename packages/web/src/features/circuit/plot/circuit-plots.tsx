/**
 * The plots of one cell (or of several revisions overlaid): each figure with its toolbar
 * (downloads and reset zoom), and pins on it when given. Loaded lazily (default export), as it
 * brings Plotly.
 */
import { useMemo, useRef } from 'react';
import { TIMING, timed } from '../../../lib/timing';
import { figureCsv } from './figure-csv';
import { readPlotPick } from './plot-pins';
import type { PlotPick, PlotPin } from './plot-pins';
import { PlotlyChart } from './plotly-chart';
import type { ChartHandle } from './plotly-chart';
import { usePlotTheme } from './plot-theme';
import { PlotToolbar, saveText } from './plot-toolbar';
import { figuresFor } from './result-figures';
import type { Figure, PlotSeries } from './figure-style';

export interface CircuitPlotsProps {
  series: PlotSeries[];
  /** File name stem of downloads, e.g. the notebook and cell. */
  filename: string;
  /** Smaller plots, for the landing page and overlays. */
  compact?: boolean;
  /** Pins drawn on the first series' traces. */
  pins?: readonly PlotPin[];
  /** A click on a plot: a frequency on a trace, or a pin. */
  onPick?: (pick: PlotPick) => void;
}

const NO_PINS: readonly PlotPin[] = [];

function FigurePanel({ figure, filename, compact, onPick }: { figure: Figure; filename: string; compact: boolean; onPick?: (pick: PlotPick) => void }) {
  const chart = useRef<ChartHandle>(null);
  const stem = `${filename}-${figure.kind}`;
  // Narrow screens keep the plot short enough to stay in view above the text being edited.
  const height = figure.kind === 'bode' || figure.kind === 'impedance' ? (compact ? 'h-80' : 'h-72 lg:h-[26rem]') : compact ? 'h-56' : 'h-60 lg:h-72';
  return (
    <figure className="rounded-lg border border-rule bg-panel">
      <figcaption className="flex items-center justify-between gap-2 border-b border-rule px-3 py-1.5 text-sm">
        <span className="font-medium text-ink-soft">{figure.title}</span>
        <PlotToolbar
          title={figure.title}
          onImage={(format) => void chart.current?.download(format, stem)}
          onCsv={() => saveText(`${stem}.csv`, figureCsv(figure), 'text/csv')}
          onResetZoom={() => void chart.current?.resetZoom()}
        />
      </figcaption>
      <PlotlyChart
        ref={chart}
        figure={figure}
        label={figure.title}
        className={`w-full ${height} ${onPick ? 'cursor-crosshair' : ''}`}
        onPointClick={
          onPick
            ? (points) => {
                const pick = readPlotPick(figure.targets, points);
                if (pick) onPick(pick);
              }
            : undefined
        }
      />
    </figure>
  );
}

/** Every figure the series have something for. */
export default function CircuitPlots({ series, filename, compact = false, pins = NO_PINS, onPick }: CircuitPlotsProps) {
  const theme = usePlotTheme();
  // Every empty list of pins is the same one: the notebook's "no pins on this revision" and its
  // "no pins while the text is unsaved" must not redraw the plots at the first keystroke.
  const shownPins = pins.length === 0 ? NO_PINS : pins;
  const figures = useMemo(() => timed(TIMING.figures, () => figuresFor(series, theme, shownPins)), [series, theme, shownPins]);
  if (figures.length === 0) {
    return <p className="rounded-lg border border-dashed border-rule px-4 py-8 text-center text-sm text-ink-faint">Nothing to plot yet: add a show line.</p>;
  }
  return (
    <div className="space-y-3">
      {figures.map((figure) => (
        <FigurePanel key={figure.kind} figure={figure} filename={filename} compact={compact} onPick={onPick} />
      ))}
    </div>
  );
}
