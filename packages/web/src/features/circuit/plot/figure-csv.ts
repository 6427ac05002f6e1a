/**
 * A figure's curves as CSV: one row per sweep point (or time step), the x value first, then
 * every curve drawn against it, headed by its legend name and its axis title (which carries
 * the unit). Read from the figure itself, so the file holds exactly what the plot shows;
 * markers (requirements, pins, readouts) are not curves and are left out. Curves drawn over
 * other x values (an earlier revision swept differently) are left out too.
 */
import type { Layout, ScatterData } from 'plotly.js-basic-dist-min';
import { fromPlotText } from './plot-text';
import type { Figure } from './figure-style';

type AxisKey = 'xaxis' | 'yaxis' | 'yaxis2';

function axisTitle(layout: Partial<Layout>, key: AxisKey): string {
  const title = layout[key]?.title;
  return (typeof title === 'string' ? title : title?.text) ?? '';
}

/** `y2` → `yaxis2`: the layout key of a trace's axis reference. */
function axisKey(ref: string | undefined, fallback: AxisKey): AxisKey {
  if (!ref) return fallback;
  return `${ref[0]}axis${ref.slice(1)}` as AxisKey;
}

/** RFC 4180 quoting: fields with a comma, quote or line break are quoted, quotes doubled. */
function field(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

const cell = (value: unknown) => (typeof value === 'number' && Number.isFinite(value) ? String(value) : '');

function sameValues(a: ArrayLike<unknown>, b: ArrayLike<unknown>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The figure's curves at their points, as CSV text (CRLF line ends, a header row first). */
export function figureCsv(figure: Figure): string {
  const curves = figure.data.filter(
    (trace): trace is Partial<ScatterData> & { x: ArrayLike<unknown>; y: ArrayLike<unknown> } => trace.mode === 'lines' && !!trace.x && !!trace.y,
  );
  if (curves.length === 0) return '';
  const x = curves[0].x;
  const shared = curves.filter((curve) => sameValues(curve.x, x));
  const header = [
    axisTitle(figure.layout, 'xaxis') || 'x',
    ...shared.map((curve) => [curve.name && fromPlotText(curve.name), axisTitle(figure.layout, axisKey(curve.yaxis, 'yaxis'))].filter(Boolean).join(' ')),
  ];
  const rows = [header.map(field).join(',')];
  for (let i = 0; i < x.length; i++) rows.push([cell(x[i]), ...shared.map((curve) => cell(curve.y[i]))].join(','));
  return `${rows.join('\r\n')}\r\n`;
}
