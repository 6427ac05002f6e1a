/**
 * Frequency grids: log (N per decade), linear (N points), explicit lists, and the default
 * sweep, 1 Hz .. 1 MHz at 100 per decade, widened to cover where the network's poles and
 * zeros show in its traces.
 */
import type { SweepSpec } from './circuit.js';

/** The most frequency points a sweep may have when the caller gives no limit (the API's cell check uses it too). */
export const DEFAULT_MAX_POINTS = 20_000;

export const DEFAULT_SWEEP = { from: 1, to: 1e6, perDecade: 100 } as const;

/** The coarse scan that finds where a network is active: 1 mHz .. 1 THz, 4 per decade. */
const SCAN_FIRST_DECADE = -3;
const SCAN_LAST_DECADE = 12;
const SCAN_PER_DECADE = 4;

/**
 * Activity is how far d(ln H)/d(ln ω) is from a constant integer slope: its imaginary part
 * (phase change per neper) and the distance of its real part from the nearest integer. Far
 * from every pole and zero it tends to 0; within about a decade of one it exceeds this.
 */
export const ACTIVITY_THRESHOLD = 0.05;

export type GridResult = { frequencies: Float64Array; error: null } | { frequencies: null; error: string };

/** The grid of a written sweep, or why it cannot be made. */
export function gridFromSpec(spec: SweepSpec, maxPoints = DEFAULT_MAX_POINTS): GridResult {
  switch (spec.kind) {
    case 'log': {
      const { from, to, perDecade } = spec;
      if (!(from > 0 && to > 0 && Number.isFinite(from) && Number.isFinite(to))) {
        return { frequencies: null, error: 'a log sweep needs frequencies above 0 Hz' };
      }
      if (to < from) return { frequencies: null, error: 'the sweep runs backwards: its end is below its start' };
      if (!(perDecade > 0 && Number.isFinite(perDecade))) return { frequencies: null, error: 'a sweep needs at least one point per decade' };
      const count = logCount(from, to, perDecade);
      if (count > maxPoints) return { frequencies: null, error: `the sweep has ${count} points, over the limit of ${maxPoints}` };
      return { frequencies: logGrid(from, to, perDecade), error: null };
    }
    case 'linear': {
      const { from, to, points } = spec;
      if (!(from >= 0 && Number.isFinite(from) && Number.isFinite(to))) {
        return { frequencies: null, error: 'a sweep needs frequencies of 0 Hz or above' };
      }
      if (to < from) return { frequencies: null, error: 'the sweep runs backwards: its end is below its start' };
      const count = Math.floor(points);
      if (!(count >= 1)) return { frequencies: null, error: 'a linear sweep needs at least one point' };
      if (count > maxPoints) return { frequencies: null, error: `the sweep has ${count} points, over the limit of ${maxPoints}` };
      const f = new Float64Array(count);
      for (let k = 0; k < count; k++) f[k] = count === 1 ? from : from + ((to - from) * k) / (count - 1);
      if (count > 1) f[count - 1] = to;
      return { frequencies: f, error: null };
    }
    case 'list': {
      const list = spec.frequencies.filter((f) => Number.isFinite(f));
      if (list.length !== spec.frequencies.length || list.some((f) => f < 0)) {
        return { frequencies: null, error: 'every listed frequency must be a number of 0 Hz or above' };
      }
      const sorted = Array.from(new Set(list)).sort((a, b) => a - b);
      if (sorted.length === 0) return { frequencies: null, error: 'the sweep lists no frequency' };
      if (sorted.length > maxPoints) return { frequencies: null, error: `the sweep has ${sorted.length} points, over the limit of ${maxPoints}` };
      return { frequencies: Float64Array.from(sorted), error: null };
    }
  }
}

function logCount(from: number, to: number, perDecade: number): number {
  const steps = Math.floor(Math.log10(to / from) * perDecade + 1e-9);
  const last = from * Math.pow(10, steps / perDecade);
  return steps + 1 + (last < to * (1 - 1e-12) ? 1 : 0);
}

/** from·10^(k/N) up to `to`; `to` itself ends the grid even when it falls between steps. */
export function logGrid(from: number, to: number, perDecade: number): Float64Array {
  const steps = Math.floor(Math.log10(to / from) * perDecade + 1e-9);
  const list: number[] = [];
  for (let k = 0; k <= steps; k++) list.push(from * Math.pow(10, k / perDecade));
  if (list[list.length - 1] < to * (1 - 1e-12)) list.push(to);
  else list[list.length - 1] = to;
  if (steps === 0 && from === to) list.length = 1;
  return Float64Array.from(list);
}

/** The frequencies of the coarse scan behind the default sweep. */
export function scanFrequencies(): Float64Array {
  const list: number[] = [];
  for (let k = SCAN_FIRST_DECADE * SCAN_PER_DECADE; k <= SCAN_LAST_DECADE * SCAN_PER_DECADE; k++) {
    list.push(Math.pow(10, k / SCAN_PER_DECADE));
  }
  return Float64Array.from(list);
}

/**
 * The default grid: 1 Hz .. 1 MHz, widened to whole decades so that every scan frequency
 * whose activity passes the threshold lies at least half a decade inside, at 100 points per
 * decade (fewer when that would pass `maxPoints`).
 */
export function defaultGrid(scan: Float64Array, activity: Float64Array, maxPoints = DEFAULT_MAX_POINTS): Float64Array {
  let lo: number = DEFAULT_SWEEP.from;
  let hi: number = DEFAULT_SWEEP.to;
  for (let k = 0; k < scan.length; k++) {
    if (!(activity[k] > ACTIVITY_THRESHOLD)) continue;
    lo = Math.min(lo, Math.pow(10, Math.floor(Math.log10(scan[k]) - 0.5 + 1e-9)));
    hi = Math.max(hi, Math.pow(10, Math.ceil(Math.log10(scan[k]) + 0.5 - 1e-9)));
  }
  const decades = Math.round(Math.log10(hi / lo));
  let perDecade: number = DEFAULT_SWEEP.perDecade;
  if (decades * perDecade + 1 > maxPoints) perDecade = Math.max(1, Math.floor((maxPoints - 1) / decades));
  return logGrid(lo, hi, perDecade);
}
