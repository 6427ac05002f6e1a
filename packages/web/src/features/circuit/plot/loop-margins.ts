/**
 * The stability figures of a loop-gain trace drawn on the Bode plot itself, so a reviewer
 * reads them at a glance: at the crossover a bar on the phase panel from −180° up to the
 * phase, labelled with the phase margin; at the phase crossover a bar on the magnitude
 * panel from |T| up to 0 dB, labelled with the gain margin; and the 0 dB and −180° lines
 * they are measured from. The values are the solver's readouts; nothing is recomputed here.
 */
import { formatSi } from '@rolloff/solver';
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

/** "phase margin 84.37° at 27.32 kHz". */
export function phaseMarginText(margin: number, crossover: number): string {
  return `phase margin ${formatSi(margin, 'deg')} at ${formatSi(crossover, 'Hz')}`;
}

/** "gain margin 6.02 dB at 2.757 kHz", or why there is none to draw. */
export function gainMarginText(margin: number, phaseCrossover: number | null): string {
  if (phaseCrossover === null || !Number.isFinite(margin)) return 'gain margin ∞: the phase never reaches −180° in the sweep';
  return `gain margin ${formatSi(margin, 'dB')} at ${formatSi(phaseCrossover, 'Hz')}`;
}

const finite = (readout: Readout | undefined) => (readout && Number.isFinite(readout.value) ? readout : undefined);

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

  const crossover = finite(find('crossover'));
  const phaseMargin = finite(find('phase-margin'));
  if (crossover && phaseMargin && crossover.value > 0) {
    const phase = valueAtFrequency(frequencies, trace.phaseDeg, crossover.value);
    if (phase !== null) {
      const base = marginReference(phase, phaseMargin.value);
      shapes.push(reference('y2', base));
      shapes.push({ type: 'line', xref: 'x', yref: 'y2', x0: crossover.value, x1: crossover.value, y0: base, y1: base + phaseMargin.value, line: { color: colour, width: 3 } });
      annotations.push({
        xref: 'x',
        yref: 'y2',
        x: Math.log10(crossover.value),
        y: base + phaseMargin.value,
        text: phaseMarginText(phaseMargin.value, crossover.value),
        showarrow: true,
        arrowhead: 0,
        arrowcolor: colour,
        ax: arrowX(crossover.value),
        ay: -24,
        font,
        bgcolor: panel,
      });
    }
  }

  if (crossover || find('gain-margin')) shapes.push(reference('y', 0));
  const phaseCrossover = finite(find('phase-crossover'));
  const gainMargin = find('gain-margin');
  if (gainMargin && phaseCrossover && Number.isFinite(gainMargin.value) && phaseCrossover.value > 0) {
    shapes.push({ type: 'line', xref: 'x', yref: 'y', x0: phaseCrossover.value, x1: phaseCrossover.value, y0: -gainMargin.value, y1: 0, line: { color: colour, width: 3 } });
    annotations.push({
      xref: 'x',
      yref: 'y',
      x: Math.log10(phaseCrossover.value),
      y: -gainMargin.value,
      text: gainMarginText(gainMargin.value, phaseCrossover.value),
      showarrow: true,
      arrowhead: 0,
      arrowcolor: colour,
      ax: arrowX(phaseCrossover.value),
      ay: 24,
      font,
      bgcolor: panel,
    });
  } else if (gainMargin && !Number.isFinite(gainMargin.value)) {
    annotations.push({ xref: 'paper', yref: 'y domain', x: 1, y: 0.04, xanchor: 'right', yanchor: 'bottom', showarrow: false, text: gainMarginText(gainMargin.value, null), font, bgcolor: panel });
  }
  return { shapes, annotations };
}
