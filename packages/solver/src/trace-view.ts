/**
 * One trace read at any frequency: exact solves between grid points (cached by the
 * evaluator), its phase on the grid's branch, and the exact slopes that place extrema and
 * crossings. Readouts, requirements and the extreme search share it.
 */
import type { AcAnalysis, PointValues, TraceData } from './analysis.js';
import { logSlopeOf, phaseNear } from './trace-values.js';
import { brent } from './roots.js';

/** Root tolerance in ln f: 1e-13 relative in frequency. */
const LN_TOL = 1e-13;

/** Exact values of one trace at any frequency, unwrapped against the grid. */
export class TraceView {
  readonly analysis: AcAnalysis;
  readonly trace: TraceData;
  readonly f: Float64Array;
  readonly db: Float64Array;
  readonly phase: Float64Array;

  constructor(analysis: AcAnalysis, trace: TraceData) {
    this.analysis = analysis;
    this.trace = trace;
    this.f = analysis.frequencies;
    this.db = trace.result.magnitudeDb as Float64Array;
    this.phase = trace.result.phaseDeg as Float64Array;
  }

  /** H and dH/dω at f from an exact solve; null where singular. */
  value(f: number): { re: number; im: number; dRe: number; dIm: number } | null {
    const v: PointValues | null = this.analysis.evaluator.at(f);
    if (v === null) return null;
    const t = this.trace.index;
    return { re: v.re[t], im: v.im[t], dRe: v.dRe[t], dIm: v.dIm[t] };
  }

  magnitude(f: number): number {
    const v = this.value(f);
    return v ? Math.hypot(v.re, v.im) : NaN;
  }

  dbAt(f: number): number {
    return 20 * Math.log10(this.magnitude(f));
  }

  /** Unwrapped phase (degrees) at f, on the branch of the grid phase around f. */
  phaseAt(f: number): number {
    const v = this.value(f);
    if (!v) return NaN;
    return phaseNear(v.re, v.im, this.gridPhaseNear(f));
  }

  /** The grid phase interpolated at f (log-frequency), from the nearest finite points. */
  gridPhaseNear(f: number): number {
    const fs = this.f;
    const ph = this.phase;
    let lo = -1;
    let hi = -1;
    for (let k = 0; k < fs.length; k++) {
      if (!Number.isFinite(ph[k])) continue;
      if (fs[k] <= f) lo = k;
      if (fs[k] >= f) {
        hi = k;
        break;
      }
    }
    if (lo < 0 && hi < 0) return NaN;
    if (lo < 0) return ph[hi];
    if (hi < 0 || hi === lo) return ph[lo];
    const a = fs[lo] > 0 ? Math.log(fs[lo]) : NaN;
    const b = Math.log(fs[hi]);
    const x = Math.log(f);
    const t = Number.isFinite(a) && b > a ? (x - a) / (b - a) : (f - fs[lo]) / (fs[hi] - fs[lo]);
    return ph[lo] + t * (ph[hi] - ph[lo]);
  }

  /** Sign-carrying d|H|/dω at f (exact): zero at a peak or a dip. */
  slopeSign(f: number): number {
    const v = this.value(f);
    return v ? logSlopeOf(v.re, v.im, v.dRe, v.dIm) : NaN;
  }

  /** Same on the grid, from the derivative kept with the trace. */
  gridSlopeSign(k: number): number {
    const r = this.trace.result;
    return logSlopeOf(r.re[k] as number, r.im[k] as number, this.trace.dRe[k], this.trace.dIm[k]);
  }

  /** d(dB)/d(decade) on the grid at index k. */
  gridSlopeDb(k: number): number {
    return this.slopeDb(this.f[k], this.gridSlopeSign(k));
  }

  /** d(dB)/d(decade) at f (exact). */
  slopeDbAt(f: number): number {
    return this.slopeDb(f, this.slopeSign(f));
  }

  /** A slope d(ln|H|)/dω at f in dB per decade: 20·ω·d(ln|H|)/dω. */
  private slopeDb(f: number, logSlope: number): number {
    const omega = 2 * Math.PI * f;
    if (omega === 0) return 0;
    return 20 * omega * logSlope;
  }
}

/**
 * A root of h between two frequencies, found on ln f (or on f when fa is 0 Hz). `ha`, `hb`
 * are h at the ends from the grid, which define the bracket.
 */
export function solveBetween(fa: number, fb: number, h: (f: number) => number, ha?: number, hb?: number): number {
  if (fa > 0) {
    const la = Math.log(fa);
    const lb = Math.log(fb);
    // The ends are solved at exactly fa and fb: exp(log(f)) can differ from f in the last bit.
    const at = (u: number): number => (u === la ? fa : u === lb ? fb : Math.exp(u));
    const x = brent((u) => h(at(u)), la, lb, LN_TOL, 200, ha, hb);
    return Number.isNaN(x) ? NaN : at(x);
  }
  return brent(h, fa, fb, LN_TOL * fb, 200, ha, hb);
}
