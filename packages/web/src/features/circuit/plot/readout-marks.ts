/** Readouts on a plot: a dotted line at each readout frequency with its value, and the minimum of an impedance. */
import { READOUT_NAMES, formatSi } from '@rolloff/solver';
import type { NumberArray, Readout, ReadoutId } from '@rolloff/solver';
import type { Annotations, ScatterData, Shape } from 'plotly.js-basic-dist-min';
import type { PlotTheme } from './figure-style';

/** Readouts that are frequencies and get a vertical marker on the plot (a peak gets one at its `at`). */
const MARKED_FREQUENCIES: readonly ReadoutId[] = ['corner', 'corner-low', 'corner-high', 'center', 'crossover', 'phase-crossover'];

/** Peaks smaller than this (dB above the passband) get no marker. */
const MARKED_PEAK_DB = 0.1;

/** Labels in the right quarter of the frequency axis are written leftwards, so they stay inside. */
function labelSide(frequency: number, frequencies: NumberArray): { xanchor: 'left' | 'right'; xshift: number } {
  const first = Math.log10(frequencies[0]);
  const span = Math.log10(frequencies[frequencies.length - 1]) - first;
  const where = span > 0 ? (Math.log10(frequency) - first) / span : 0;
  return where > 0.75 ? { xanchor: 'right', xshift: -4 } : { xanchor: 'left', xshift: 4 };
}

/**
 * A vertical dotted marker with its value written at the top of the magnitude panel; without
 * `labelled` (the variants of a cell, whose values the readouts table lists) the line alone.
 */
export function frequencyMarkers(
  readouts: Readout[],
  traceColour: (trace: string) => string | null,
  theme: PlotTheme,
  frequencies: NumberArray,
  labelled = true,
) {
  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotations>[] = [];
  const byTrace = new Map<string, Readout[]>();
  for (const readout of readouts) byTrace.set(readout.trace, [...(byTrace.get(readout.trace) ?? []), readout]);
  let slot = 0;
  for (const [trace, list] of byTrace) {
    const colour = traceColour(trace);
    if (colour === null) continue;
    for (const readout of list) {
      let at: number;
      let text: string;
      if (readout.name === 'peak') {
        // A flat response has a "peak" of a few µdB somewhere; only a real one is worth a marker.
        if (readout.at === null || !(readout.value >= MARKED_PEAK_DB)) continue;
        at = readout.at;
        text = `${READOUT_NAMES.peak} ${formatSi(readout.value, readout.unit)} at ${formatSi(at, 'Hz')}`;
      } else if (MARKED_FREQUENCIES.includes(readout.name)) {
        at = readout.value;
        text = `${READOUT_NAMES[readout.name]} ${formatSi(at, readout.unit)}`;
      } else {
        continue;
      }
      if (!(at > 0) || !Number.isFinite(at)) continue;
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: at, x1: at, y0: 0, y1: 1, line: { color: colour, width: 1, dash: 'dot' } });
      if (!labelled) continue;
      annotations.push({
        xref: 'x',
        yref: 'y domain',
        x: Math.log10(at),
        y: 1 - 0.09 * (slot % 4),
        yanchor: 'top',
        ...labelSide(at, frequencies),
        showarrow: false,
        text,
        font: { color: colour, size: 11 },
        bgcolor: theme.panel,
      });
      slot += 1;
    }
  }
  return { shapes, annotations };
}

export function mergeMarks(marks: { shapes: Partial<Shape>[]; annotations: Partial<Annotations>[] }[]) {
  return { shapes: marks.flatMap((m) => m.shapes), annotations: marks.flatMap((m) => m.annotations) };
}

export function minimumImpedanceMarkers(readouts: Readout[], traceColour: (trace: string) => string | null, theme: PlotTheme) {
  const points: Partial<ScatterData>[] = [];
  const annotations: Partial<Annotations>[] = [];
  for (const readout of readouts) {
    const colour = traceColour(readout.trace);
    if (readout.name !== 'min-impedance' || colour === null || readout.at === null || !(readout.value > 0) || !(readout.at > 0)) continue;
    points.push({
      type: 'scatter',
      mode: 'markers',
      x: [readout.at],
      y: [readout.value],
      xaxis: 'x',
      yaxis: 'y',
      showlegend: false,
      hoverinfo: 'skip',
      marker: { color: colour, size: 8 },
    });
    annotations.push({
      xref: 'x',
      yref: 'y',
      x: Math.log10(readout.at),
      y: Math.log10(readout.value),
      yanchor: 'top',
      yshift: -6,
      showarrow: false,
      text: `${READOUT_NAMES['min-impedance']} ${formatSi(readout.value, readout.unit)} at ${formatSi(readout.at, 'Hz')}`,
      font: { color: colour, size: 11 },
      bgcolor: theme.panel,
    });
  }
  return { points, annotations };
}
