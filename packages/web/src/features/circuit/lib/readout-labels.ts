/**
 * How readout and requirement values are written on screen: in the unit the solver gives
 * them, with SI prefixes. Their names come from the solver (`READOUT_NAMES`).
 */
import { READOUT_NAMES, formatReading, formatSi } from '@rolloff/solver';
import type { Readout } from '@rolloff/solver';

/** A value with its unit as a readout shows it (`1 kHz`, `-3.01 dB`, `-40.04 dB/decade`): the solver's one spelling. */
export { formatReading as formatValue } from '@rolloff/solver';

/** A readout's value, with the frequency it was found at when it has one. */
export function formatReadout(readout: Readout): string {
  const value = formatReading(readout.value, readout.unit);
  return readout.at === null ? value : `${value} at ${formatSi(readout.at, 'Hz')}`;
}

/**
 * What the plots show, in words, for someone who cannot see them: each trace's readouts
 * ("out: corner 1 kHz, roll-off -20 dB/decade").
 */
export function plotSummary(traces: readonly { label: string }[], readouts: readonly Readout[]): string {
  if (traces.length === 0) return 'Nothing is plotted.';
  const lines = traces.map((trace) => {
    const own = readouts.filter((r) => r.trace === trace.label).map((r) => `${READOUT_NAMES[r.name]} ${formatReadout(r)}`);
    return `${trace.label}: ${own.length > 0 ? own.join(', ') : 'no readouts'}`;
  });
  return `The plots show ${lines.join('; ')}.`;
}
