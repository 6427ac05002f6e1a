/**
 * Pins on a plot: a marker on the trace at the pin's frequency, labelled like its thread in
 * the panel; and the way back, a click on the plot read as a frequency on a trace (to pin
 * there) or as a click on a pin (to open its thread). The pins themselves belong to another
 * feature; this module knows only what a plot needs of them.
 */
import { formatSi } from '@rolloff/solver';
import type { NumberArray } from '@rolloff/solver';
import type { Annotations, ScatterData } from 'plotly.js-basic-dist-min';
import { plotText } from './plot-text';
import { valueAtFrequency } from './trace-at';

/** A pin as a plot draws it. */
export interface PlotPin {
  id: number;
  /** Short name shared with the pin's thread, e.g. "P3". */
  label: string;
  /** The trace's label, as the legend shows it. */
  trace: string;
  /** Hz. */
  frequency: number;
  resolved: boolean;
  /** The first words of its comment, for the hover text. */
  note: string;
}

/** What a curve of a figure stands for, so a click on it can be read back. */
export type PlotTarget = { kind: 'trace'; trace: string } | { kind: 'pin'; pinId: number };

/** What a click on a plot picked: a frequency on a trace, or an existing pin. */
export type PlotPick = { kind: 'frequency'; trace: string; frequency: number } | { kind: 'pin'; pinId: number };

/** The part of a Plotly click point this module reads. */
export interface ClickedPoint {
  curveNumber: number;
  x: unknown;
}

/** A trace's values on the panel its pins sit on (magnitude in dB on a Bode plot). */
export interface PinnableTrace {
  label: string;
  values: NumberArray;
}

/**
 * One marker per pin whose trace is drawn, on the trace's line at the pin's frequency, with
 * its label above it; a resolved pin is drawn hollow. Pins outside the sweep are left off.
 */
export function pinMarkers(pins: readonly PlotPin[], traces: readonly PinnableTrace[], frequencies: NumberArray, pinColour: string) {
  const data: Partial<ScatterData>[] = [];
  const targets: PlotTarget[] = [];
  const annotations: Partial<Annotations>[] = [];
  for (const pin of pins) {
    const trace = traces.find((t) => t.label === pin.trace);
    if (!trace) continue;
    const y = valueAtFrequency(frequencies, trace.values, pin.frequency);
    if (y === null) continue;
    data.push({
      type: 'scatter',
      mode: 'markers',
      x: [pin.frequency],
      y: [y],
      xaxis: 'x',
      yaxis: 'y',
      showlegend: false,
      marker: { color: pin.resolved ? 'rgba(0,0,0,0)' : pinColour, size: 13, symbol: 'diamond', line: { width: 2, color: pinColour } },
      hovertext: [`${pin.label} · ${formatSi(pin.frequency, 'Hz')}${pin.resolved ? ' · resolved' : ''}<br>${plotText(pin.note)}`],
      hoverinfo: 'text',
    });
    targets.push({ kind: 'pin', pinId: pin.id });
    annotations.push({
      xref: 'x',
      yref: 'y',
      x: Math.log10(pin.frequency),
      y,
      yanchor: 'bottom',
      yshift: 8,
      showarrow: false,
      text: pin.label,
      font: { color: pinColour, size: 11 },
    });
  }
  return { data, targets, annotations };
}

/**
 * Reads a click: a pin under the pointer wins (its thread opens); otherwise the frequency of
 * the nearest point of a drawn trace. Points of curves that stand for nothing (requirement
 * marks, other revisions) are passed over.
 */
export function readPlotPick(targets: readonly (PlotTarget | null)[], points: readonly ClickedPoint[]): PlotPick | null {
  for (const point of points) {
    const target = targets[point.curveNumber];
    if (target?.kind === 'pin') return { kind: 'pin', pinId: target.pinId };
  }
  for (const point of points) {
    const target = targets[point.curveNumber];
    const frequency = typeof point.x === 'number' ? point.x : Number(point.x);
    if (target?.kind === 'trace' && Number.isFinite(frequency) && frequency > 0) return { kind: 'frequency', trace: target.trace, frequency };
  }
  return null;
}
