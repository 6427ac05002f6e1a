/**
 * A trace's value between the sweep's points, for placing a marker at a frequency the sweep
 * does not hold (a readout's crossover, a pin typed in by hand). Interpolated linearly in
 * log-frequency, the way the plot's log axis draws the line between two points.
 */
import type { NumberArray } from '@rolloff/solver';

/** `values` at `frequency`; null outside the sweep or where the trace has a gap. */
export function valueAtFrequency(frequencies: NumberArray, values: NumberArray, frequency: number): number | null {
  const n = Math.min(frequencies.length, values.length);
  if (n === 0 || !(frequency > 0) || !Number.isFinite(frequency)) return null;
  if (frequency < frequencies[0] || frequency > frequencies[n - 1]) return null;
  let lo = 0;
  let hi = n - 1;
  // The sweep rises, so the two points around `frequency` are found by halving.
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (frequencies[mid] <= frequency) lo = mid;
    else hi = mid;
  }
  const [f0, f1, v0, v1] = [frequencies[lo], frequencies[hi], values[lo], values[hi]];
  if (!Number.isFinite(v0) || !Number.isFinite(v1)) return frequency === f0 && Number.isFinite(v0) ? v0 : null;
  if (f1 === f0) return v0;
  const t = Math.log(frequency / f0) / Math.log(f1 / f0);
  return v0 + t * (v1 - v0);
}
