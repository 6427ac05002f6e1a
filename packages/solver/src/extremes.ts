/**
 * The true largest or smallest value of a pointwise measure over a frequency range, not the
 * best grid point: a resonance narrower than the grid spacing lies between two points whose
 * exact slopes point at it. Every place where the slope of the measure changes sign the
 * wanted way is a candidate, refined by Brent's method on the exact slope; where no exact
 * slope exists (group delay), each local extremum of the grid is refined by Brent's
 * minimiser on exact values. Ends of the range are solved exactly.
 */
import type { TraceView } from './trace-view.js';
import { solveBetween } from './trace-view.js';
import { groupDelayOf, logSlopeOf } from './trace-values.js';
import { brentMinimum } from './roots.js';

export type PointMeasure = 'gain' | 'magnitude' | 'phase' | 'delay';

export interface Extreme {
  value: number;
  /** Hz. */
  at: number;
}

/** Intervals refined per search, most promising first (a trace of grid noise stops here). */
const MAX_REFINED = 48;
const LN_TOL = 1e-12;

/** The measure at f from an exact solve; NaN where the network is singular. */
export function measureAt(view: TraceView, measure: PointMeasure, f: number): number {
  const v = view.value(f);
  if (!v) return NaN;
  switch (measure) {
    case 'gain':
      return 20 * Math.log10(Math.hypot(v.re, v.im));
    case 'magnitude':
      return Math.hypot(v.re, v.im);
    case 'delay':
      return groupDelayOf(v.re, v.im, v.dRe, v.dIm);
    case 'phase':
      return view.phaseAt(f);
  }
}

/** The measure at grid point k, as the trace holds it. */
function measureOnGrid(view: TraceView, measure: PointMeasure, k: number): number {
  const r = view.trace.result;
  switch (measure) {
    case 'gain':
      return r.magnitudeDb[k] as number;
    case 'magnitude':
      return r.magnitude[k] as number;
    case 'delay':
      return r.groupDelay[k] as number;
    case 'phase':
      return r.phaseDeg[k] as number;
  }
}

/** The sign-carrying slope of the measure with ω from H and dH/dω; NaN for delay (no exact slope). */
function slopeOf(measure: PointMeasure, re: number, im: number, dRe: number, dIm: number): number {
  switch (measure) {
    case 'gain':
    case 'magnitude':
      return logSlopeOf(re, im, dRe, dIm);
    case 'phase':
      return -groupDelayOf(re, im, dRe, dIm);
    case 'delay':
      return NaN;
  }
}

interface Sample {
  f: number;
  m: number;
  slope: number;
}

/**
 * The largest (`max`) or smallest (`min`) value of the measure over [from, to], with where
 * it is. NaN as value (with its frequency) when the trace has no value somewhere in the
 * range; null when the range holds nothing.
 */
export function extremeOver(view: TraceView, measure: PointMeasure, from: number, to: number, want: 'max' | 'min'): Extreme | null {
  if (!(from <= to)) return null;
  const samples = sampleRange(view, measure, from, to);
  const missing = samples.find((s) => Number.isNaN(s.m));
  if (missing) return { value: NaN, at: missing.f };
  let best: Extreme = { value: samples[0].m, at: samples[0].f };
  for (const s of samples) if (better(want, s.m, best.value)) best = { value: s.m, at: s.f };
  for (const e of refinedExtrema(view, measure, samples, want)) if (better(want, e.value, best.value)) best = e;
  return best;
}

/**
 * The highest peak (`max`) or deepest dip (`min`) of the measure strictly inside (from, to):
 * a true local extremum, refined between grid points, never an end of the range. NaN as
 * value (with its frequency) when the trace has no value somewhere in the range; null when
 * the range holds no such extremum.
 */
export function innerExtreme(view: TraceView, measure: PointMeasure, from: number, to: number, want: 'max' | 'min'): Extreme | null {
  if (!(from < to)) return null;
  const samples = sampleRange(view, measure, from, to);
  const missing = samples.find((s) => Number.isNaN(s.m));
  if (missing) return { value: NaN, at: missing.f };
  // A grid point better than both neighbours counts too: refinement cannot start from an exact null, whose slope has no value.
  const inner: Extreme[] = [];
  for (let q = 1; q + 1 < samples.length; q++) {
    const m = samples[q].m;
    if (better(want, m, samples[q - 1].m) && better(want, m, samples[q + 1].m)) inner.push({ value: m, at: samples[q].f });
  }
  let best: Extreme | null = null;
  for (const e of [...inner, ...refinedExtrema(view, measure, samples, want)]) {
    if (e.at > from && e.at < to && (best === null || better(want, e.value, best.value))) best = e;
  }
  return best;
}

const better = (want: 'max' | 'min', a: number, b: number): boolean => (want === 'max' ? a > b : a < b);

/** Every local extremum of the wanted kind between the samples, refined on exact solves (the most promising first). */
function refinedExtrema(view: TraceView, measure: PointMeasure, samples: Sample[], want: 'max' | 'min'): Extreme[] {
  const candidates: { lo: number; hi: number; promise: number }[] = [];
  const sign = want === 'max' ? 1 : -1;
  if (measure === 'delay') {
    for (let q = 1; q + 1 < samples.length; q++) {
      const m = samples[q].m;
      if (!better(want, samples[q - 1].m, m) && !better(want, samples[q + 1].m, m)) candidates.push({ lo: q - 1, hi: q + 1, promise: sign * m });
    }
    // Without slopes, a peak in the first or last interval leaves no sample better than both
    // its neighbours (the samples can rise all the way to the range's end): search those too.
    const last = samples.length - 1;
    const ends = last >= 1 ? [0, last - 1] : [];
    for (const lo of ends) candidates.push({ lo, hi: lo + 1, promise: sign * Math.max(sign * samples[lo].m, sign * samples[lo + 1].m) });
  } else {
    for (let q = 0; q + 1 < samples.length; q++) {
      // Rising into the interval and falling out of it (for a maximum): an extremum inside.
      if (sign * samples[q].slope > 0 && sign * samples[q + 1].slope < 0) {
        candidates.push({ lo: q, hi: q + 1, promise: sign * Math.max(sign * samples[q].m, sign * samples[q + 1].m) });
      }
    }
  }
  candidates.sort((a, b) => b.promise - a.promise);
  const out: Extreme[] = [];
  for (const c of candidates.slice(0, MAX_REFINED)) {
    const a = samples[c.lo];
    const b = samples[c.hi];
    const f = measure === 'delay' ? refineByValue(view, a.f, b.f, want) : refineBySlope(view, measure, a, b);
    if (!Number.isFinite(f)) continue;
    const m = measureAt(view, measure, f);
    if (!Number.isNaN(m)) out.push({ value: m, at: f });
  }
  return out;
}

/** The range's ends (exact) and the grid points strictly inside it. */
function sampleRange(view: TraceView, measure: PointMeasure, from: number, to: number): Sample[] {
  const exact = (f: number): Sample => {
    const v = view.value(f);
    return { f, m: measureAt(view, measure, f), slope: v ? slopeOf(measure, v.re, v.im, v.dRe, v.dIm) : NaN };
  };
  const r = view.trace.result;
  const out: Sample[] = [exact(from)];
  for (let k = 0; k < view.f.length; k++) {
    const f = view.f[k];
    if (f > from && f < to) {
      out.push({ f, m: measureOnGrid(view, measure, k), slope: slopeOf(measure, r.re[k] as number, r.im[k] as number, view.trace.dRe[k], view.trace.dIm[k]) });
    }
  }
  if (to !== from) out.push(exact(to));
  return out;
}

/** Where the exact slope vanishes between two samples whose slopes have opposite signs. */
function refineBySlope(view: TraceView, measure: PointMeasure, a: Sample, b: Sample): number {
  const slope = (f: number): number => {
    const v = view.value(f);
    return v ? slopeOf(measure, v.re, v.im, v.dRe, v.dIm) : NaN;
  };
  return solveBetween(a.f, b.f, slope, a.slope, b.slope);
}

/** The extremum of the exact group delay between two frequencies, by Brent's minimiser on ln f. */
function refineByValue(view: TraceView, fa: number, fb: number, want: 'max' | 'min'): number {
  const sign = want === 'max' ? -1 : 1;
  const g = (f: number): number => sign * measureAt(view, 'delay', f);
  if (fa > 0) return Math.exp(brentMinimum((u) => g(Math.exp(u)), Math.log(fa), Math.log(fb), LN_TOL));
  return brentMinimum(g, fa, fb, LN_TOL * fb);
}
