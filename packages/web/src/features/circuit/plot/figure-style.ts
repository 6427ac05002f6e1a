/**
 * What every figure shares: the types of a figure and of what it draws, the theme, the axes'
 * styles and ranges, and the legend's names. Pure functions of plain data.
 */
import type { NumberArray, Result } from '@rolloff/solver';
import type { Layout, ScatterData } from 'plotly.js-basic-dist-min';
import { plotText } from './plot-text';
import type { PlotTarget } from './plot-pins';

/** Colours and font of the plots, read from the palette so light and dark both work. */
export interface PlotTheme {
  font: string;
  monoFont: string;
  ink: string;
  inkSoft: string;
  rule: string;
  panel: string;
  pass: string;
  fail: string;
  /** Pins on the plot. */
  pin: string;
  traces: readonly string[];
}

export type FigureKind = 'bode' | 'impedance' | 'noise' | 'step';

/** One Result to draw; extra series (other revisions) are overlaid with their own dash. */
export interface PlotSeries {
  result: Result;
  /** Prefix of the legend entries, e.g. "revision 3"; omitted for a single series. */
  name?: string;
  dash?: 'solid' | 'dash' | 'dot' | 'dashdot';
}

export interface Figure {
  kind: FigureKind;
  title: string;
  data: Partial<ScatterData>[];
  layout: Partial<Layout>;
  /** What each entry of `data` stands for (by index, as Plotly's `curveNumber`), for clicks. */
  targets: (PlotTarget | null)[];
}

/** Plain numbers for Plotly, with NaN and ±∞ as gaps. */
export function finiteOrNull(values: NumberArray): (number | null)[] {
  return Array.from(values, (v) => (Number.isFinite(v) ? v : null));
}

function finiteRange(arrays: NumberArray[]): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const values of arrays) {
    for (const v of values) {
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : null;
}

/** Axis range for dB: whole tens around the data, never more than 200 dB deep. */
export function decibelRange(values: NumberArray[], limits: number[]): [number, number] {
  const range = finiteRange([...values, limits]) ?? [-40, 0];
  const hi = Math.ceil((range[1] + 3) / 10) * 10;
  const lo = Math.max(Math.floor((range[0] - 3) / 10) * 10, hi - 200);
  return [lo, hi];
}

/** Phase ticks at 45°, 90° or 180°, so a short panel does not crowd its labels. */
export function phaseTick([lo, hi]: [number, number]): number {
  const span = hi - lo;
  return span > 540 ? 180 : span > 180 ? 90 : 45;
}

export function phaseRange(values: NumberArray[], limits: number[]): [number, number] {
  const range = finiteRange([...values, limits]) ?? [-90, 90];
  return [Math.floor((range[0] - 10) / 45) * 45, Math.ceil((range[1] + 10) / 45) * 45];
}

export function colourOf(theme: PlotTheme, index: number): string {
  return theme.traces[index % theme.traces.length];
}

/** A trace's name in the legend and on hover, as text: Plotly reads names as a little HTML. */
export function legendName(series: PlotSeries, label: string): string {
  return plotText(series.name ? `${series.name} · ${label}` : label);
}

export function baseLayout(theme: PlotTheme): Partial<Layout> {
  return {
    paper_bgcolor: 'rgba(0,0,0,0)',
    plot_bgcolor: 'rgba(0,0,0,0)',
    font: { family: theme.font, color: theme.ink, size: 12 },
    margin: { l: 64, r: 20, t: 36, b: 48 },
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', font: { size: 12 } },
    hovermode: 'closest',
    hoverlabel: { font: { family: theme.monoFont, size: 12 }, bgcolor: theme.panel, bordercolor: theme.rule },
    autosize: true,
  };
}

export function axisStyle(theme: PlotTheme) {
  return { gridcolor: theme.rule, linecolor: theme.rule, zerolinecolor: theme.rule, tickfont: { color: theme.inkSoft }, automargin: true };
}

export function frequencyAxis(theme: PlotTheme, frequencies: NumberArray, anchor: 'y' | 'y2') {
  const first = Math.min(...frequencies);
  const last = Math.max(...frequencies);
  const range: [number, number] | undefined = first > 0 && last > first ? [Math.log10(first), Math.log10(last)] : undefined;
  return { ...axisStyle(theme), type: 'log' as const, anchor, title: { text: 'frequency (Hz)' }, exponentformat: 'SI' as const, range };
}

/** Log-axis range (in decades) around positive data and limits. */
export function logRange(values: NumberArray[], limits: number[]): [number, number] {
  const logs = values.map((v) => Array.from(v, (x) => (x > 0 ? Math.log10(x) : NaN)));
  const range = finiteRange([...logs, limits.filter((l) => l > 0).map((l) => Math.log10(l))]) ?? [0, 3];
  return [Math.floor(range[0] - 0.2), Math.ceil(range[1] + 0.2)];
}
