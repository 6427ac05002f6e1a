/**
 * The stability figures of a loop-gain trace drawn on the Bode plot itself, so a reviewer
 * reads them at a glance: at the crossover a bar on the phase panel from −180° up to the
 * phase, labelled with the phase margin; at the phase crossover a bar on the magnitude
 * panel from |T| up to 0 dB, labelled with the gain margin; and the 0 dB and −180° lines
 * they are measured from. The values, and the crossovers they are found at, are the solver's
 * readouts; nothing is recomputed here.
 */
import { READOUT_NAMES, formatSi } from '@rolloff/solver';
import type { NumberArray, Readout, TraceResult } from '@rolloff/solver';
import type { Annotations, Shape } from 'plotly.js-basic-dist-min';
import { valueAtFrequency } from './trace-at';

export interface LoopMarginMarks {
  shapes: Partial<Shape>[];
  annotations: Partial<Annotations>[];
}

/** The phase the margin is measured from: the odd multiple of 180° nearest `phase − margin`. */
export function marginReference(phase: number, margin: number): number {
  return Math.round((phase - margin + 180) / 360) * 360 - 180;
}

/** "phase margin 84.37° at 27.32 kHz", "gain margin 6.02 dB at 2.757 kHz": a margin at the frequency it was found. */
export function marginText(margin: Readout): string {
  if (margin.at === null || !Number.isFinite(margin.value)) return `${READOUT_NAMES[margin.name]} ∞: the phase never reaches −180° in the sweep`;
  return `${READOUT_NAMES[margin.name]} ${formatSi(margin.value, margin.unit)} at ${formatSi(margin.at, 'Hz')}`;
}

/** A margin found at a frequency inside the plot. */
const placed = (readout: Readout | undefined) =>
  readout && Number.isFinite(readout.value) && readout.at !== null && readout.at > 0 ? { readout, at: readout.at } : undefined;

/**
 * The margin marks of one loop trace (none for other kinds). Annotations on a log axis are
 * placed by the logarithm of the frequency, as Plotly wants; shapes by the frequency itself.
 */
export function loopMarginMarks(trace: TraceResult, readouts: readonly Readout[], frequencies: NumberArray, colour: string, panel: string): LoopMarginMarks {
  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotations>[] = [];
  if (trace.kind !== 'loop' || frequencies.length < 2) return { shapes, annotations };
  const mine = readouts.filter((r) => r.trace === trace.label);
  const find = (name: string) => mine.find((r) => r.name === name);
  const first = frequencies[0];
  const last = frequencies[frequencies.length - 1];
  const reference = (yref: 'y' | 'y2', y: number): Partial<Shape> => ({
    type: 'line',
    layer: 'below',
    xref: 'x',
    yref,
    x0: first,
    x1: last,
    y0: y,
    y1: y,
    line: { color: colour, width: 1, dash: 'dash' },
    opacity: 0.5,
  });
  const font = { color: colour, size: 11 };
  // A label near the right end of the axis points leftwards, so it stays inside the plot.
  const arrowX = (frequency: number) => (Math.log(frequency / first) / Math.log(last / first) > 0.7 ? -40 : 40);

  const phaseMargin = placed(find('phase-margin'));
  if (phaseMargin) {
    const { readout: margin, at } = phaseMargin;
    const phase = valueAtFrequency(frequencies, trace.phaseDeg, at);
    if (phase !== null) {
      const base = marginReference(phase, margin.value);
      shapes.push(reference('y2', base));
      shapes.push({ type: 'line', xref: 'x', yref: 'y2', x0: at, x1: at, y0: base, y1: base + margin.value, line: { color: colour, width: 3 } });
      annotations.push({
        xref: 'x',
        yref: 'y2',
        x: Math.log10(at),
        y: base + margin.value,
        text: marginText(margin),
        showarrow: true,
        arrowhead: 0,
        arrowcolor: colour,
        ax: arrowX(at),
        ay: -24,
        font,
        bgcolor: panel,
      });
    }
  }

  const gainMargin = find('gain-margin');
  if (phaseMargin || gainMargin) shapes.push(reference('y', 0));
  const gainBar = placed(gainMargin);
  if (gainBar) {
    const { readout: margin, at } = gainBar;
    shapes.push({ type: 'line', xref: 'x', yref: 'y', x0: at, x1: at, y0: -margin.value, y1: 0, line: { color: colour, width: 3 } });
    annotations.push({
      xref: 'x',
      yref: 'y',
      x: Math.log10(at),
      y: -margin.value,
      text: marginText(margin),
      showarrow: true,
      arrowhead: 0,
      arrowcolor: colour,
      ax: arrowX(at),
      ay: 24,
      font,
      bgcolor: panel,
    });
  } else if (gainMargin && !Number.isFinite(gainMargin.value)) {
    annotations.push({
      xref: 'paper',
      yref: 'y domain',
      x: 1,
      y: 0.04,
      xanchor: 'right',
      yanchor: 'bottom',
      showarrow: false,
      text: marginText(gainMargin),
      font,
      bgcolor: panel,
    });
  }
  return { shapes, annotations };
}
