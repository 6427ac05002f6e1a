/**
 * What a step response measures: its final value, t63, the 10 %→90 % rise time, the 1 %
 * settling time and the overshoot. Crossings and the peak are found between time points: the
 * bracketing interval is solved again at finer steps (`StepData.sample`), four times over, and
 * the crossing or peak is then found on the cubic through the four nearest points (Brent's
 * method on it), so a fast edge between two points of a long window is measured, not guessed.
 * A measure that does not exist is a reason, never a number.
 */
import type { StepData } from './steps.js';
import { brent, brentMinimum } from './roots.js';

/** t63 is where the response reaches 1 − 1/e of its final value: one time constant of a first-order step. */
export const T63_LEVEL = 1 - 1 / Math.E;
/** The settling band, a fraction of the final value. */
export const SETTLING_BAND = 0.01;
/** A peak this little above the final value (a fraction of it) is the integration's own error, not an overshoot. */
const NO_OVERSHOOT = 1e-8;

export type StepMeasure = { value: number; at: number | null } | { reason: string };

export interface StepMeasures {
  final: StepMeasure;
  t63: StepMeasure;
  riseTime: StepMeasure;
  settling: StepMeasure;
  overshoot: StepMeasure;
}

export function stepMeasures(step: StepData): StepMeasures {
  const { times, values } = step.result;
  const t = Array.from(times);
  const y = Array.from(values);
  if (!('value' in step.final)) {
    const reason = step.final.reason;
    return { final: { reason }, t63: { reason }, riseTime: { reason }, settling: { reason }, overshoot: { reason } };
  }
  const final = step.final.value;
  if (y.some((v) => !Number.isFinite(v))) {
    const reason = 'the response has no value at some time points';
    return { final: { value: final, at: null }, t63: { reason }, riseTime: { reason }, settling: { reason }, overshoot: { reason } };
  }
  if (final === 0) {
    const reason = 'its final value is 0, and this measure is a fraction of it';
    return { final: { value: final, at: null }, t63: { reason }, riseTime: { reason }, settling: { reason }, overshoot: { reason } };
  }
  // Measured on the response as a fraction of its final value, so an inverting step reads like any other.
  const grid: Samples = { t, u: y.map((v) => v / final) };
  const t10 = firstCrossing(step, final, grid, 0.1);
  const t90 = firstCrossing(step, final, grid, 0.9);
  const t63 = firstCrossing(step, final, grid, T63_LEVEL);
  const notReached = (level: string): string => `the response does not reach ${level} of its final value within the time window; widen it with a time line`;
  return {
    final: { value: final, at: null },
    t63: t63 === null ? { reason: notReached('63.2 %') } : { value: t63, at: null },
    riseTime:
      grid.u[0] > 0.1
        ? { reason: 'the response starts above 10 % of its final value, so it has no 10 % point in the window' }
        : t10 === null || t90 === null
          ? { reason: notReached(t10 === null ? '10 %' : '90 %') }
          : { value: t90 - t10, at: null },
    settling: settling(step, final, grid),
    overshoot: overshoot(step, final, grid),
  };
}

/** Each refinement solves the bracket again at this many intervals, at most this many times over. */
const SUBDIVISIONS = 16;
const MAX_LEVELS = 10;
/** Refining stops once the chord and the cubic place a crossing within this fraction of the interval of each other. */
const CHORD_AGREES = 1e-6;
/** …or once the samples beside a peak are within this fraction of it. */
const FLAT_PEAK = 1e-10;

/** The response as a fraction of its final value, at evenly spaced times: the grid, or a sample. */
interface Samples {
  t: number[];
  u: number[];
}

/**
 * Finds the bracket a rule picks in the samples, solves it again finer, and so on until `done`;
 * the last samples and bracket.
 */
function refine(
  step: StepData,
  final: number,
  grid: Samples,
  pick: (s: Samples) => number | null,
  done: (s: Samples, k: number) => boolean,
  width = 1,
): { s: Samples; k: number } | null {
  let s = grid;
  let k = pick(s);
  if (k === null) return null;
  for (let level = 0; level < MAX_LEVELS && !done(s, k); level++) {
    const lo = Math.max(0, k - (width - 1));
    const hi = Math.min(s.t.length - 1, k + width);
    const finer = step.sample(s.t[lo], s.t[hi], SUBDIVISIONS);
    if (finer === null) break;
    const next: Samples = { t: finer.times, u: finer.values.map((v) => v / final) };
    const j = pick(next);
    if (j === null) break;
    s = next;
    k = j;
  }
  return { s, k };
}

/** The first time u reaches `level` from below, or null. */
function firstCrossing(step: StepData, final: number, grid: Samples, level: number): number | null {
  if (grid.u[0] >= level) return grid.u[0] === level ? grid.t[0] : null;
  const pick = (s: Samples): number | null => {
    for (let k = 0; k + 1 < s.u.length; k++) if (s.u[k] < level && s.u[k + 1] >= level) return k;
    return null;
  };
  const found = refine(step, final, grid, pick, (s, k) => chordAgrees(s, k, level));
  return found === null ? null : crossing(found.s.t, found.s.u, found.k, level);
}

/** The last time |u − 1| leaves the band, or the reason there is none. */
function settling(step: StepData, final: number, grid: Samples): StepMeasure {
  const outside = (v: number): boolean => Math.abs(v - 1) > SETTLING_BAND;
  const { t, u } = grid;
  if (outside(u[u.length - 1]))
    return { reason: 'the response is not within ±1 % of its final value at the end of the time window; widen it with a time line' };
  if (!u.some(outside)) {
    return t[0] === 0 ? { value: 0, at: null } : { reason: 'the response is within ±1 % over the whole window; start the window at 0 to see it settle' };
  }
  const pick = (s: Samples): number | null => {
    for (let k = s.u.length - 2; k >= 0; k--) if (outside(s.u[k]) && !outside(s.u[k + 1])) return k;
    return null;
  };
  const level = (s: Samples, k: number): number => (s.u[k] > 1 ? 1 + SETTLING_BAND : 1 - SETTLING_BAND);
  const found = refine(step, final, grid, pick, (s, k) => chordAgrees(s, k, level(s, k)));
  if (found === null) return { reason: 'the settling time could not be found' };
  const { s, k } = found;
  return { value: crossing(s.t, s.u, k, level(s, k)), at: null };
}

/** How far the response goes past its final value, in % of it, and when; 0 % without a peak. */
function overshoot(step: StepData, final: number, grid: Samples): StepMeasure {
  const highest = (s: Samples): number => s.u.reduce((best, v, i) => (v > s.u[best] ? i : best), 0);
  const top = highest(grid);
  if (grid.u[top] <= 1 + NO_OVERSHOOT) return { value: 0, at: null };
  if (top === grid.u.length - 1) return { value: 100 * (grid.u[top] - 1), at: grid.t[top] };
  const flat = (s: Samples, k: number): boolean =>
    k > 0 && k < s.u.length - 1 && Math.max(s.u[k] - s.u[k - 1], s.u[k] - s.u[k + 1]) <= FLAT_PEAK * Math.abs(s.u[k]);
  const found = refine(step, final, grid, highest, flat, 1);
  const { s, k } = found ?? { s: grid, k: top };
  if (k === 0 || k === s.u.length - 1) return { value: 100 * (s.u[k] - 1), at: s.t[k] };
  const cubic = localCubic(s.t, s.u, k);
  const peak = brentMinimum((x) => -cubic(x), s.t[k - 1], s.t[k + 1], 1e-12 * (s.t[k + 1] - s.t[k - 1]));
  const better = Number.isFinite(peak) && cubic(peak) > s.u[k];
  return { value: 100 * ((better ? cubic(peak) : s.u[k]) - 1), at: better ? peak : s.t[k] };
}

/** Whether the chord and the cubic place the crossing of `level` in [k, k + 1] as good as together. */
function chordAgrees(s: Samples, k: number, level: number): boolean {
  const { t, u } = s;
  const chord = t[k] + ((level - u[k]) / (u[k + 1] - u[k])) * (t[k + 1] - t[k]);
  return Math.abs(crossing(t, u, k, level) - chord) <= CHORD_AGREES * (t[k + 1] - t[k]);
}

/** Where u crosses `level` between points k and k + 1 (which bracket it), on the local cubic. */
function crossing(t: number[], u: number[], k: number, level: number): number {
  const cubic = localCubic(t, u, k);
  const root = brent((x) => cubic(x) - level, t[k], t[k + 1], 1e-12 * (t[k + 1] - t[k]), 200, u[k] - level, u[k + 1] - level);
  // The cubic through four points can miss a bracket its two middle points make; fall back to the chord.
  return Number.isFinite(root) ? root : t[k] + ((level - u[k]) / (u[k + 1] - u[k])) * (t[k + 1] - t[k]);
}

/** The Lagrange cubic through the four points around the interval [k, k + 1] (fewer at the ends). */
function localCubic(t: number[], u: number[], k: number): (x: number) => number {
  const lo = Math.max(0, Math.min(k - 1, t.length - 4));
  const idx = [lo, lo + 1, lo + 2, lo + 3].filter((i) => i < t.length);
  return (x) => {
    let sum = 0;
    for (const i of idx) {
      let w = u[i];
      for (const j of idx) if (j !== i) w *= (x - t[j]) / (t[i] - t[j]);
      sum += w;
    }
    return sum;
  };
}
