/**
 * How readout and requirement values are written on screen: in the unit the solver gives
 * them, with SI prefixes. Their names come from the solver (`READOUT_NAMES`).
 */
import { READOUT_NAMES, formatReading, formatSi } from '@rolloff/solver';
import type { Readout, VariantResult } from '@rolloff/solver';

/** A value with its unit as a readout shows it (`1 kHz`, `-3.01 dB`, `-40.04 dB/decade`): the solver's one spelling. */
export { formatReading as formatValue } from '@rolloff/solver';

/** A readout's value, with the frequency it was found at when it has one. */
export function formatReadout(readout: Readout): string {
  const value = formatReading(readout.value, readout.unit);
  return readout.at === null ? value : `${value} at ${formatSi(readout.at, 'Hz')}`;
}

/**
 * What the plots show, in words, for someone who cannot see them: each trace's readouts
 * ("out: corner 1 kHz, roll-off -20 dB/decade"), for each variant of a cell that has them
 * ("with Rload = 10 Ω, out: corner …").
 */
export function plotSummary(
  traces: readonly { label: string }[],
  readouts: readonly Readout[],
  variants: readonly Pick<VariantResult, 'label' | 'traces' | 'readouts'>[] = [],
): string {
  if (traces.length === 0) return 'Nothing is plotted.';
  const traceLines = (own: readonly { label: string }[], all: readonly Readout[]) =>
    own.map((trace) => {
      const read = all.filter((r) => r.trace === trace.label).map((r) => `${READOUT_NAMES[r.name]} ${formatReadout(r)}`);
      return `${trace.label}: ${read.length > 0 ? read.join(', ') : 'no readouts'}`;
    });
  if (variants.length > 0) return `The plots show ${variants.map((v) => `with ${v.label}, ${traceLines(v.traces, v.readouts).join('; ')}`).join('; ')}.`;
  return `The plots show ${traceLines(traces, readouts).join('; ')}.`;
}

/**
 * Readouts worth a line: a "peak" too small to show at the panel's hundredth of a dB is the
 * ripple of a flat passband, not a peak, so it and its frequency are left out.
 */
export function shownReadouts(readouts: readonly Readout[]): Readout[] {
  const flat = new Set(readouts.filter((r) => r.name === 'peak' && Math.abs(r.value) < 0.005).map((r) => r.trace));
  return readouts.filter((r) => !(flat.has(r.trace) && (r.name === 'peak' || r.name === 'peak-frequency')));
}
