/**
 * How readouts and requirement measures are named and written on screen: the trade's own
 * terms, values with SI prefixes.
 */
import { formatSi } from '@rolloff/solver';
import type { Readout } from '@rolloff/solver';

const READOUT_NAMES: Record<string, string> = {
  'low-frequency-gain': 'Low-frequency gain',
  corner: 'Corner frequency',
  'corner-low': 'Lower corner',
  'corner-high': 'Upper corner',
  bandwidth: 'Bandwidth',
  center: 'Centre frequency',
  q: 'Q',
  peak: 'Peak',
  'peak-frequency': 'Peak frequency',
  rolloff: 'Roll-off',
  crossover: 'Crossover',
  'phase-margin': 'Phase margin',
  'phase-crossover': 'Phase crossover',
  'gain-margin': 'Gain margin',
  'min-impedance': 'Minimum impedance',
  'noise-rms': 'Noise (RMS)',
  settling: 'Settling time',
  overshoot: 'Overshoot',
};

/** The screen name of a readout, e.g. `corner` → "Corner frequency". */
export function readoutName(name: string): string {
  return READOUT_NAMES[name] ?? name.replace(/-/g, ' ').replace(/^./, (c) => c.toUpperCase());
}

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

const MEASURE_UNITS: Record<string, string> = {
  gain: 'dB',
  phase: 'deg',
  delay: 's',
  corner: 'Hz',
  peak: 'dB',
  crossover: 'Hz',
  'phase-margin': 'deg',
  'gain-margin': 'dB',
  settling: 's',
  overshoot: '%',
};

/** The unit a requirement's measured value is in; `magnitude` is in its trace's unit. */
export function measureUnit(measure: string, traceUnit = ''): string {
  return measure === 'magnitude' ? traceUnit : (MEASURE_UNITS[measure] ?? '');
}
