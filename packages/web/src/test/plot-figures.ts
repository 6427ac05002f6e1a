/** What the plot tests share: a theme of distinct colours and a way to the Bode figure. */
import type { Shape } from 'plotly.js-basic-dist-min';
import type { PlotPin } from '../features/circuit/plot/plot-pins';
import { figuresFor } from '../features/circuit/plot/result-figures';
import type { Figure, PlotSeries, PlotTheme } from '../features/circuit/plot/figure-style';

/** A theme whose every colour differs, so a test can tell which one a mark got. */
export const testTheme: PlotTheme = {
  font: 'sans',
  monoFont: 'mono',
  ink: '#111111',
  inkSoft: '#222222',
  rule: '#333333',
  panel: '#ffffff',
  pass: '#00aa00',
  fail: '#aa0000',
  pin: '#cc9900',
  traces: ['#000001', '#000002', '#000003'],
};

/** The Bode figure drawn for `series` (with `pins`) in the test theme; throws when there is none. */
export function bodeFigure(series: PlotSeries[], pins: readonly PlotPin[] = []): Figure {
  const figure = figuresFor(series, testTheme, pins).find((f) => f.kind === 'bode');
  if (!figure) throw new Error('no Bode figure');
  return figure;
}

/** The shapes of a figure's layout (lines, bands, markers). */
export function shapesOf(figure: Figure): Partial<Shape>[] {
  return (figure.layout.shapes ?? []) as Partial<Shape>[];
}
