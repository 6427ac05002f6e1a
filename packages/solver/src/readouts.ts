/**
 * Readouts: numbers a designer reads off a trace. Each is bracketed on the grid and then
 * found by Brent's method on exact solves between grid points, so that corners, crossovers
 * and margins are as accurate as the solver (well inside 1e-6 relative), never grid values.
 *
 * Definitions (they follow the cell language; where it is silent, the choice is noted):
 * - The passband level of a low-pass response is its exact 0 Hz value (the first sweep
 *   point when the network has no finite, non-zero value at 0 Hz); of a
 *   high-pass response, its high-frequency limit when that has settled (checked with exact
 *   solves 3 and 6 decades above the sweep), else the last sweep point; of a band-pass
 *   response, its peak.
 * - `corner` is where the response is 3.0103 dB (half power) below the passband level:
 *   the first such crossing above the low-pass plateau, or below the high-pass one.
 *   Band-pass and band-stop responses have `corner-low`, `corner-high`, `bandwidth`,
 *   `center` (√(low·high) for band-pass, the deepest point for band-stop) and
 *   `q` = center / bandwidth.
 * - `low-frequency-gain` is the passband level of the low end in dB.
 * - `peak` is the highest point of the sweep (refined exactly) in dB above a level that
 *   depends on the shape: above the low-frequency level for low-pass, band-stop and flat
 *   responses, above the high-frequency level for high-pass ones, 0 when nothing rises above
 *   it; for a band-pass response it is the peak gain itself. Where there is an interior
 *   peak it carries its frequency as `at`, and `peak-frequency` gives that frequency too.
 * - `rolloff` is the change in dB over the last decade of the sweep (an exact solve a
 *   decade below its end).
 * - Loops get the readouts above and `crossover` where |T| falls through 1,
 *   `phase-margin` = 180° + ∠T there (in (−180°, 180°], with the crossover as `at`),
 *   `phase-crossover` where ∠T first passes an odd multiple of 180°, `gain-margin` = −|T|
 *   in dB there (with it as `at`), +∞ when the phase never gets there in the sweep.
 * - Impedance traces: `min-impedance` with `at`, and the shape readouts above.
 */
import type { Readout, ReadoutId } from './result.js';
import type { AcAnalysis, PointValues, TraceData } from './analysis.js';
import { phaseNear } from './analysis.js';
import { brent } from './roots.js';

export type Shape = 'low-pass' | 'high-pass' | 'band-pass' | 'band-stop' | 'flat' | 'unknown';

export interface TraceReadouts {
  trace: TraceData;
  shape: Shape;
  readouts: Readout[];
}

/** 20·log10(√2): half power. */
export const HALF_POWER_DB = 10 * Math.log10(2);
/** An end of the sweep is a plateau when its slope is below this, in dB/decade. */
const FLAT_SLOPE = 10;
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

  /** Sign-carrying d|H|²/dω at f (exact): zero at a peak or a dip. */
  slopeSign(f: number): number {
    const v = this.value(f);
    return v ? v.re * v.dRe + v.im * v.dIm : NaN;
  }

  /** Same on the grid, from the derivative kept with the trace. */
  gridSlopeSign(k: number): number {
    const r = this.trace.result;
    return (r.re[k] as number) * this.trace.dRe[k] + (r.im[k] as number) * this.trace.dIm[k];
  }

  /** d(dB)/d(decade) on the grid at index k. */
  gridSlopeDb(k: number): number {
    const r = this.trace.result;
    const re = r.re[k] as number;
    const im = r.im[k] as number;
    const m = re * re + im * im;
    const omega = 2 * Math.PI * this.f[k];
    if (omega === 0) return 0;
    return (20 * omega * (re * this.trace.dRe[k] + im * this.trace.dIm[k])) / m;
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

/** The root of h between grid points a and b (in either order), with the grid's values there. */
function solveBetweenGrid(view: TraceView, a: number, b: number, h: (f: number) => number, grid: (k: number) => number): number {
  const [lo, hi] = view.f[a] <= view.f[b] ? [a, b] : [b, a];
  return solveBetween(view.f[lo], view.f[hi], h, grid(lo), grid(hi));
}

/** Indices of the grid points where the trace has a value. */
function finiteIndices(db: Float64Array): number[] {
  const out: number[] = [];
  for (let k = 0; k < db.length; k++) if (!Number.isNaN(db[k])) out.push(k);
  return out;
}

const readout = (trace: string, name: ReadoutId, value: number, unit: string, at: number | null = null): Readout => ({ trace, name, value, unit, at });

/** Every readout of a trace, by its kind. */
export function computeReadouts(analysis: AcAnalysis, trace: TraceData): TraceReadouts {
  const view = new TraceView(analysis, trace);
  const label = trace.result.label;
  const kind = trace.result.kind;
  const out: Readout[] = [];
  const idx = finiteIndices(view.db);
  if (idx.length < 2) return { trace, shape: 'unknown', readouts: out };
  const shape = analyseShape(view, idx);

  if (kind !== 'impedance') {
    out.push(readout(label, 'low-frequency-gain', shape.lowDb, 'dB'));
  }
  out.push(...shapeReadouts(view, idx, shape, label, kind !== 'impedance'));
  if (kind === 'loop') out.push(...stabilityReadouts(analysis, trace));
  if (kind !== 'impedance') {
    const r = rolloff(view, idx);
    if (Number.isFinite(r)) out.push(readout(label, 'rolloff', r, 'dB/decade'));
  } else {
    const m = minimum(view, idx);
    if (m) out.push(readout(label, 'min-impedance', m.value, trace.result.unit, m.at));
  }
  return { trace, shape: shape.shape, readouts: out };
}

interface ShapeInfo {
  shape: Shape;
  lowDb: number;
  highDb: number;
}

function analyseShape(view: TraceView, idx: number[]): ShapeInfo {
  const first = idx[0];
  const last = idx[idx.length - 1];
  const db = view.db;
  // The low-frequency level is the exact 0 Hz value wherever that is finite and not 0.
  let lowDb = db[first];
  if (view.f[first] > 0) {
    const dc = view.dbAt(0);
    if (Number.isFinite(dc)) lowDb = dc;
  }
  // The high plateau, from exact solves far above the sweep when they have settled.
  let highDb = db[last];
  const fl = view.f[last];
  if (fl > 0) {
    const a = view.dbAt(fl * 1e3);
    const b = view.dbAt(fl * 1e6);
    if (Number.isFinite(a) && Number.isFinite(b) && Math.abs(a - b) < 1e-7 && Math.abs(b - db[last]) < 1) highDb = b;
  }
  const lowSlope = view.gridSlopeDb(first);
  const highSlope = view.gridSlopeDb(last);
  const lowFlat = Math.abs(lowSlope) < FLAT_SLOPE;
  const highFlat = Math.abs(highSlope) < FLAT_SLOPE;
  let maxK = first;
  let minK = first;
  for (const k of idx) {
    if (db[k] > db[maxK]) maxK = k;
    if (db[k] < db[minK]) minK = k;
  }
  const interiorMax = maxK !== first && maxK !== last;
  const interiorMin = minK !== first && minK !== last;
  let shape: Shape;
  if (lowFlat && !highFlat) shape = highSlope < 0 ? 'low-pass' : 'high-pass';
  else if (!lowFlat && highFlat) shape = lowSlope > 0 ? 'high-pass' : 'low-pass';
  else if (!lowFlat && !highFlat) {
    if (lowSlope > 0 && highSlope < 0) shape = interiorMax ? 'band-pass' : 'low-pass';
    else if (lowSlope < 0 && highSlope < 0) shape = 'low-pass';
    else if (lowSlope > 0 && highSlope > 0) shape = 'high-pass';
    else shape = interiorMin ? 'band-stop' : 'unknown';
  } else {
    const floor = Math.min(lowDb, highDb) - HALF_POWER_DB;
    if (interiorMin && db[minK] < floor) shape = 'band-stop';
    else if (highDb < lowDb - HALF_POWER_DB) shape = 'low-pass';
    else if (lowDb < highDb - HALF_POWER_DB) shape = 'high-pass';
    else shape = 'flat';
  }
  if (shape === 'band-pass' && !interiorMax) shape = 'unknown';
  return { shape, lowDb, highDb };
}

/** The first crossing of `target` (dB) scanning idx in the given order, refined exactly. */
function crossing(view: TraceView, order: number[], target: number): number {
  const db = view.db;
  for (let q = 0; q + 1 < order.length; q++) {
    const a = order[q];
    const b = order[q + 1];
    if (db[a] >= target && db[b] < target) {
      return solveBetweenGrid(view, a, b, (f) => view.dbAt(f) - target, (k) => db[k] - target);
    }
  }
  return NaN;
}

/** An interior extremum at grid index k refined to where d|H|/dω = 0. */
function refineExtremum(view: TraceView, idx: number[], pos: number, isMax: boolean): number {
  const k = idx[pos];
  const s = view.gridSlopeSign(k);
  if (s === 0) return view.f[k];
  // Still climbing towards a maximum (or falling towards a minimum): it lies to the right.
  const nb = s > 0 === isMax ? idx[pos + 1] : idx[pos - 1];
  if (nb === undefined) return view.f[k];
  const sn = view.gridSlopeSign(nb);
  if (!(Math.sign(sn) === -Math.sign(s))) return view.f[k];
  const r = solveBetweenGrid(view, k, nb, (f) => view.slopeSign(f), (q) => view.gridSlopeSign(q));
  return Number.isNaN(r) ? view.f[k] : r;
}

function shapeReadouts(view: TraceView, idx: number[], info: ShapeInfo, label: string, withPeak: boolean): Readout[] {
  const out: Readout[] = [];
  const db = view.db;
  let maxPos = 0;
  let minPos = 0;
  for (let p = 0; p < idx.length; p++) {
    if (db[idx[p]] > db[idx[maxPos]]) maxPos = p;
    if (db[idx[p]] < db[idx[minPos]]) minPos = p;
  }
  const interiorMax = maxPos > 0 && maxPos < idx.length - 1;
  let peakF = NaN;
  let peakDb = db[idx[maxPos]];
  if (interiorMax) {
    peakF = refineExtremum(view, idx, maxPos, true);
    const v = view.dbAt(peakF);
    if (Number.isFinite(v) && v >= peakDb) peakDb = v;
    else peakF = view.f[idx[maxPos]];
  }
  const up = idx;
  const down = [...idx].reverse();
  switch (info.shape) {
    case 'low-pass': {
      const c = crossing(view, up, info.lowDb - HALF_POWER_DB);
      if (Number.isFinite(c)) out.push(readout(label, 'corner', c, 'Hz'));
      break;
    }
    case 'high-pass': {
      const c = crossing(view, down, info.highDb - HALF_POWER_DB);
      if (Number.isFinite(c)) out.push(readout(label, 'corner', c, 'Hz'));
      break;
    }
    case 'band-pass': {
      // Outwards from the refined peak, which may lie well between grid points (high Q).
      const target = peakDb - HALF_POWER_DB;
      const peak = Number.isFinite(peakF) ? peakF : view.f[idx[maxPos]];
      const lo = crossingFrom(view, peak, peakDb, idx.filter((k) => view.f[k] < peak).reverse(), target, 'down');
      const hi = crossingFrom(view, peak, peakDb, idx.filter((k) => view.f[k] > peak), target, 'down');
      pushBand(out, label, lo, hi, Math.sqrt(lo * hi));
      break;
    }
    case 'band-stop': {
      const center = minPos > 0 && minPos < idx.length - 1 ? refineExtremum(view, idx, minPos, false) : view.f[idx[minPos]];
      const depth = Math.min(view.dbAt(center), db[idx[minPos]]);
      const lo = crossingFrom(view, center, depth, idx.filter((k) => view.f[k] < center).reverse(), info.lowDb - HALF_POWER_DB, 'up');
      const hi = crossingFrom(view, center, depth, idx.filter((k) => view.f[k] > center), info.highDb - HALF_POWER_DB, 'up');
      pushBand(out, label, lo, hi, center);
      break;
    }
    default:
      break;
  }
  const peakAt = interiorMax && Number.isFinite(peakF) ? peakF : null;
  if (withPeak) {
    const level = info.shape === 'high-pass' ? info.highDb : info.lowDb;
    if (info.shape === 'band-pass') out.push(readout(label, 'peak', peakDb, 'dB', peakAt));
    else if (info.shape !== 'unknown') {
      const above = peakDb - level;
      out.push(above > 0 ? readout(label, 'peak', above, 'dB', peakAt) : readout(label, 'peak', 0, 'dB'));
    }
  }
  if (interiorMax && Number.isFinite(peakF)) out.push(readout(label, 'peak-frequency', peakF, 'Hz'));
  return out;
}

/**
 * Scanning outwards from an exact point (f0, db0) through grid points `order`, the first
 * place where the response falls below `target` ('down', away from a peak) or climbs back
 * to it ('up', away from a dip), refined exactly.
 */
function crossingFrom(view: TraceView, f0: number, db0: number, order: number[], target: number, way: 'down' | 'up'): number {
  const db = view.db;
  const crosses = (a: number, b: number): boolean => (way === 'down' ? a >= target && b < target : a < target && b >= target);
  let pf = f0;
  let pv = db0;
  for (const k of order) {
    if (crosses(pv, db[k])) {
      const [lo, hi, hl, hh] = pf < view.f[k] ? [pf, view.f[k], pv, db[k]] : [view.f[k], pf, db[k], pv];
      return solveBetween(lo, hi, (f) => view.dbAt(f) - target, hl - target, hh - target);
    }
    pf = view.f[k];
    pv = db[k];
  }
  return NaN;
}

function pushBand(out: Readout[], label: string, lo: number, hi: number, center: number): void {
  if (Number.isFinite(lo)) out.push(readout(label, 'corner-low', lo, 'Hz'));
  if (Number.isFinite(hi)) out.push(readout(label, 'corner-high', hi, 'Hz'));
  if (Number.isFinite(lo) && Number.isFinite(hi)) {
    out.push(readout(label, 'bandwidth', hi - lo, 'Hz'));
    if (Number.isFinite(center)) {
      out.push(readout(label, 'center', center, 'Hz'));
      out.push(readout(label, 'q', center / (hi - lo), ''));
    }
  } else if (Number.isFinite(center)) {
    out.push(readout(label, 'center', center, 'Hz'));
  }
}

function rolloff(view: TraceView, idx: number[]): number {
  const last = idx[idx.length - 1];
  const f = view.f[last];
  if (!(f > 0)) return NaN;
  return view.db[last] - view.dbAt(f / 10);
}

function minimum(view: TraceView, idx: number[]): { value: number; at: number } | null {
  const mag = view.trace.result.magnitude;
  let pos = 0;
  for (let p = 0; p < idx.length; p++) if (mag[idx[p]] < mag[idx[pos]]) pos = p;
  let at = view.f[idx[pos]];
  let value = mag[idx[pos]] as number;
  if (pos > 0 && pos < idx.length - 1) {
    const f = refineExtremum(view, idx, pos, false);
    const m = view.magnitude(f);
    if (Number.isFinite(m) && m <= value) {
      at = f;
      value = m;
    }
  }
  return Number.isFinite(value) ? { value, at } : null;
}

/** Wraps an angle in degrees into (−180°, 180°]. */
export function wrapDegrees(a: number): number {
  let w = a - 360 * Math.floor((a + 180) / 360);
  if (w <= -180) w += 360;
  return w;
}

/** crossover, phase-margin, phase-crossover and gain-margin of a trace read as a loop gain. */
export function stabilityReadouts(analysis: AcAnalysis, trace: TraceData): Readout[] {
  const view = new TraceView(analysis, trace);
  const label = trace.result.label;
  const idx = finiteIndices(view.db);
  const out: Readout[] = [];
  if (idx.length < 2) return out;
  const fc = crossing(view, idx, 0);
  if (Number.isFinite(fc)) {
    out.push(readout(label, 'crossover', fc, 'Hz'));
    const pm = wrapDegrees(180 + view.phaseAt(fc));
    if (Number.isFinite(pm)) out.push(readout(label, 'phase-margin', pm, 'deg', fc));
  }
  const ph = view.phase;
  const phaseIdx = idx.filter((k) => Number.isFinite(ph[k]));
  let fpc = NaN;
  for (let q = 0; q + 1 < phaseIdx.length; q++) {
    const a = phaseIdx[q];
    const b = phaseIdx[q + 1];
    const ia = Math.floor((ph[a] - 180) / 360);
    const ib = Math.floor((ph[b] - 180) / 360);
    if (ia === ib) continue;
    const boundary = 180 + 360 * Math.max(ia, ib);
    fpc = solveBetweenGrid(view, a, b, (f) => view.phaseAt(f) - boundary, (k) => ph[k] - boundary);
    break;
  }
  if (Number.isFinite(fpc)) {
    out.push(readout(label, 'phase-crossover', fpc, 'Hz'));
    out.push(readout(label, 'gain-margin', -view.dbAt(fpc), 'dB', fpc));
  } else {
    out.push(readout(label, 'gain-margin', Infinity, 'dB'));
  }
  return out;
}
