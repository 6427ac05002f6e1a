/**
 * What one solved trace gives from H and dH/dω at each frequency: the phase, unwrapped with
 * exact solves where the grid is too coarse to tell the branch, the group delay, the slope of
 * ln|H|, and the trace's TraceResult. The sweep solve (analysis.ts) feeds it.
 */
import type { TraceSpec } from './circuit.js';
import type { TraceResult } from './result.js';

const TWO_PI = 2 * Math.PI;
const DEG = 180 / Math.PI;

export type SolvedKind = TraceResult['kind'];

/** Phase (degrees) of H, unwrapped against a neighbouring phase `near`. */
export function phaseNear(re: number, im: number, near: number): number {
  if ((re === 0 && im === 0) || !Number.isFinite(re) || !Number.isFinite(im)) return NaN;
  const raw = Math.atan2(im, re) * DEG;
  if (!Number.isFinite(near)) return raw <= -180 ? raw + 360 : raw;
  return raw + 360 * Math.round((near - raw) / 360);
}

/** Group delay −dφ/dω (s) from H and dH/dω. */
export function groupDelayOf(re: number, im: number, dRe: number, dIm: number): number {
  // Scaled by the larger part, so that a response far below 1e-154 does not square to 0.
  const s = Math.max(Math.abs(re), Math.abs(im));
  if (!(s > 0) || !Number.isFinite(s)) return NaN;
  const r = re / s;
  const i = im / s;
  return -(r * dIm - i * dRe) / s / (r * r + i * i);
}

/** d(ln|H|)/dω (1/rad·s) from H and dH/dω, scaled like `groupDelayOf`; its sign is the sign of d|H|/dω. */
export function logSlopeOf(re: number, im: number, dRe: number, dIm: number): number {
  const s = Math.max(Math.abs(re), Math.abs(im));
  if (!(s > 0) || !Number.isFinite(s)) return NaN;
  const r = re / s;
  const i = im / s;
  return (r * dRe + i * dIm) / s / (r * r + i * i);
}

/** An exact solve of one trace at f, for unwrapping between grid points. */
export type TraceProbe = (f: number) => { re: number; im: number; dRe: number; dIm: number } | null;

/** Steps that still disagree after this many halvings keep the derivative's choice. */
const UNWRAP_DEPTH = 8;
/** Extra solves one trace may spend on unwrapping (a genuine phase jump never settles). */
const UNWRAP_BUDGET = 256;

/**
 * The phase at f1 (degrees) continued from φ0 at f0. The nearest branch and the branch the
 * exact group delays predict (trapezoid rule) usually agree; where they do not, the step is
 * halved with an exact solve at its middle, so the unwrapping follows the true phase even
 * on a coarse or explicit grid.
 */
function unwrapStep(
  f0: number,
  p0: number,
  t0: number,
  f1: number,
  re1: number,
  im1: number,
  t1: number,
  probe: TraceProbe | undefined,
  depth: number,
  budget: { solves: number },
): number {
  const nearest = phaseNear(re1, im1, p0);
  if (!Number.isFinite(t0) || !Number.isFinite(t1)) return nearest;
  const predicted = phaseNear(re1, im1, p0 - 0.5 * (t0 + t1) * TWO_PI * (f1 - f0) * DEG);
  if (predicted === nearest || !probe) return nearest;
  if (depth >= UNWRAP_DEPTH || budget.solves <= 0) return predicted;
  const fm = f0 > 0 ? Math.sqrt(f0 * f1) : 0.5 * (f0 + f1);
  budget.solves--;
  const v = probe(fm);
  if (!v) return nearest;
  const tm = groupDelayOf(v.re, v.im, v.dRe, v.dIm);
  const pm = unwrapStep(f0, p0, t0, fm, v.re, v.im, tm, probe, depth + 1, budget);
  if (!Number.isFinite(pm)) return nearest;
  return unwrapStep(fm, pm, tm, f1, re1, im1, t1, probe, depth + 1, budget);
}

/** The TraceResult of a solved trace: magnitudes, unwrapped phase, group delay. */
export function traceResult(
  spec: TraceSpec,
  frequencies: Float64Array,
  re: Float64Array,
  im: Float64Array,
  dRe: Float64Array,
  dIm: Float64Array,
  probe?: TraceProbe,
): TraceResult {
  const count = frequencies.length;
  const magnitude = new Float64Array(count);
  const magnitudeDb = new Float64Array(count);
  const phaseDeg = new Float64Array(count);
  const groupDelay = new Float64Array(count);
  let prevPhase = NaN;
  let prevDelay = NaN;
  let prevF = NaN;
  const budget = { solves: UNWRAP_BUDGET };
  for (let k = 0; k < count; k++) {
    const m = Math.hypot(re[k], im[k]);
    magnitude[k] = m;
    magnitudeDb[k] = 20 * Math.log10(m);
    const tau = groupDelayOf(re[k], im[k], dRe[k], dIm[k]);
    groupDelay[k] = tau;
    const phase = Number.isFinite(prevPhase)
      ? unwrapStep(prevF, prevPhase, prevDelay, frequencies[k], re[k], im[k], tau, probe, 0, budget)
      : phaseNear(re[k], im[k], NaN);
    phaseDeg[k] = phase;
    if (Number.isFinite(phase)) {
      prevPhase = phase;
      prevDelay = tau;
      prevF = frequencies[k];
    }
  }
  return {
    label: spec.label,
    expr: spec.expr,
    kind: spec.kind as SolvedKind,
    unit: spec.unit,
    re,
    im,
    magnitude,
    magnitudeDb,
    phaseDeg,
    groupDelay,
  };
}
