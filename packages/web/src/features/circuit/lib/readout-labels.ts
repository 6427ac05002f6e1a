/**
 * How readout and requirement values are written on screen: in the unit the solver gives
 * them, with SI prefixes. Their names come from the solver (`READOUT_NAMES`).
 */
import { READOUT_NAMES, formatSi } from '@rolloff/solver';
import type { Readout } from '@rolloff/solver';

/** Levels and angles to a hundredth: finer digits are below anything a bench can see. */
function hundredths(value: number, unit: 'dB' | 'deg'): string {
  if (!Number.isFinite(value)) return formatSi(value, unit);
  const rounded = Math.round(value * 100) / 100;
  return formatSi(Object.is(rounded, -0) ? 0 : rounded, unit, 6);
}

/** A value with its unit as a readout shows it (`1 kHz`, `-3.01 dB`, `-40.04 dB/decade`). */
export function formatValue(value: number, unit: string): string {
  if (unit === 'dB' || unit === 'deg') return hundredths(value, unit);
  if (unit.startsWith('dB/')) return `${hundredths(value, 'dB')}${unit.slice(2)}`;
  return formatSi(value, unit);
}

/** A readout's value, with the frequency it was found at when it has one. */
export function formatReadout(readout: Readout): string {
  const value = formatValue(readout.value, readout.unit);
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
