/**
 * Readouts: numbers a designer reads off a trace. Each is bracketed on the grid and then
 * found by Brent's method on exact solves between grid points, so that corners, crossovers,
 * peaks and margins are as accurate as the solver (well inside 1e-6 relative), never grid
 * values, and do not move when the sweep widens past the trace's features.
 *
 * Which readouts a trace gets follows what it is:
 * - a transfer (a node, a difference, a ratio, a current): its shape's readouts below;
 * - a loop gain: `low-frequency-gain`, the stability readouts and `rolloff`, never a
 *   corner or a Q, which mean nothing for a loop;
 * - an impedance: `min-impedance` (with `at`), and the band readouts of a resonance
 *   (a tank's peak) — never a single corner, which an impedance does not have.
 *
 * Definitions (they follow the cell language; where it is silent, the choice is noted):
 * - The levels of the ends are the network's own: the exact 0 Hz value (when it is finite
 *   and not 0; else the first sweep point), and the high-frequency limit, found by exact
 *   solves decades above the sweep until the slope has died out (else the last point).
 * - The shape: low-pass when the low end is a plateau and the response falls from it
 *   (whatever floor it reaches later, such as an op-amp's feed-through), high-pass the
 *   other way round, band-pass when an interior peak stands above both ends, band-stop when
 *   both ends are plateaus at about the same level with a dip between them.
 * - `corner` is where the response is 3.0103 dB (half power) below the passband level:
 *   the first such crossing above the low-pass plateau, or below the high-pass one.
 *   Band-pass and band-stop responses have `corner-low`, `corner-high`, `bandwidth`,
 *   `center` (√(low·high) for band-pass, the deepest point for band-stop) and
 *   `q` = center / bandwidth.
 * - `low-frequency-gain` is the low level in dB, for shapes where it is the passband
 *   (not for a band-pass or a high-pass response).
 * - `peak` is the true highest point of the sweep (`extremeOver`: between grid points too)
 *   in dB above the passband level: the low level for low-pass, band-stop and flat
 *   responses, the high level for high-pass ones, 0 when nothing rises above it; for a
 *   band-pass response it is the peak gain itself. Where there is an interior peak it
 *   carries its frequency as `at`, and `peak-frequency` gives that frequency too.
 * - `rolloff` is the asymptotic slope above the sweep: exact slopes decades above its end
 *   until they settle on a whole number of 20 dB/decade (n poles more than zeros).
 * - Loops: `crossover` where |T| falls through 1, `phase-margin` = 180° + ∠T there (in
 *   (−180°, 180°], with the crossover as `at`), `phase-crossover` where ∠T first passes an
 *   odd multiple of 180°, `gain-margin` = −|T| in dB there (with it as `at`), +∞ when the
 *   phase never gets there in the sweep.
 * No readout is NaN or ±∞, except a gain margin of +∞.
 */
import type { Readout, ReadoutId } from './result.js';
import type { AcAnalysis, TraceData } from './analysis.js';
import { TraceView, solveBetween } from './trace-view.js';
import { extremeOver } from './extremes.js';

export type Shape = 'low-pass' | 'high-pass' | 'band-pass' | 'band-stop' | 'flat' | 'unknown';

export interface TraceReadouts {
  trace: TraceData;
  shape: Shape;
  /** The passband level in dB that `peak` is measured above (NaN where there is none: a band-pass, loop or impedance trace). */
  level: number;
  readouts: Readout[];
}

/** 20·log10(√2): half power. */
export const HALF_POWER_DB = 10 * Math.log10(2);
/** An end of the sweep is a plateau when its slope is below this, in dB/decade. */
const FLAT_SLOPE = 10;
/** Two plateaus closer than this (dB) are the two passbands of one band-stop response. */
const SAME_LEVEL_DB = 6;
/** A limit has settled when its slope is below this, in dB/decade. */
const SETTLED_SLOPE = 1e-10;
/** An asymptotic slope has settled when it is this close to a whole multiple of 20 dB/decade. */
const SETTLED_ORDER = 1e-3;
/** Decades above the sweep's end where the limits are looked for. */
const FAR_DECADES = [1, 2, 3, 4, 6, 8, 10, 12];

/** The root of h between grid points a and b (in either order), with the grid's values there. */
function solveBetweenGrid(view: TraceView, a: number, b: number, h: (f: number) => number, grid: (k: number) => number): number {
  const [lo, hi] = view.f[a] <= view.f[b] ? [a, b] : [b, a];
  return solveBetween(view.f[lo], view.f[hi], h, grid(lo), grid(hi));
}

/** Indices of the grid points where the trace has a finite, non-zero value. */
function finiteIndices(db: Float64Array): number[] {
  const out: number[] = [];
  for (let k = 0; k < db.length; k++) if (Number.isFinite(db[k])) out.push(k);
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
  if (idx.length < 2) return { trace, shape: 'unknown', level: NaN, readouts: out };
  const info = analyseShape(view, idx);

  if (kind === 'loop') {
    out.push(readout(label, 'low-frequency-gain', info.lowDb, 'dB'));
    out.push(...stabilityReadouts(analysis, trace));
  } else if (kind === 'impedance') {
    // A tank's band readouts; its peak in dB would be in dBΩ, which no requirement reads.
    if (info.shape === 'band-pass') out.push(...shapeReadouts(view, idx, info, label).filter((r) => r.name !== 'peak'));
    const m = extremeOver(view, 'magnitude', view.f[0], view.f[view.f.length - 1], 'min');
    if (m && Number.isFinite(m.value)) out.push(readout(label, 'min-impedance', m.value, trace.result.unit, m.at));
  } else {
    if (info.shape !== 'band-pass' && info.shape !== 'high-pass' && (info.shape !== 'unknown' || info.lowFlat)) {
      out.push(readout(label, 'low-frequency-gain', info.lowDb, 'dB'));
    }
    out.push(...shapeReadouts(view, idx, info, label));
  }
  if (kind !== 'impedance') {
    const r = asymptoticSlope(view, idx);
    if (Number.isFinite(r)) out.push(readout(label, 'rolloff', r, 'dB/decade'));
  }
  const level = kind === 'loop' || kind === 'impedance' ? NaN : passbandLevel(info);
  return { trace, shape: info.shape, level, readouts: out.filter((r) => Number.isFinite(r.value) || r.name === 'gain-margin') };
}

interface ShapeInfo {
  shape: Shape;
  lowDb: number;
  highDb: number;
  lowFlat: boolean;
}

/** The high-frequency limit in dB: exact solves decades above f until the slope has died out; NaN if it never does. */
function highLimit(view: TraceView, f: number): number {
  if (!(f > 0)) return NaN;
  for (const d of FAR_DECADES) {
    const g = f * Math.pow(10, d);
    const slope = view.slopeDbAt(g);
    if (!Number.isFinite(slope)) return NaN;
    if (Math.abs(slope) < SETTLED_SLOPE) {
      const db = view.dbAt(g);
      return Number.isFinite(db) ? db : NaN;
    }
  }
  return NaN;
}

function analyseShape(view: TraceView, idx: number[]): ShapeInfo {
  const first = idx[0];
  const last = idx[idx.length - 1];
  const db = view.db;
  const lowSlope = view.gridSlopeDb(first);
  const highSlope = view.gridSlopeDb(last);
  const lowFlat = Math.abs(lowSlope) < FLAT_SLOPE;
  const highFlat = Math.abs(highSlope) < FLAT_SLOPE;
  // The levels of the ends are the network's: its exact 0 Hz value, its high-frequency limit.
  let lowDb = db[first];
  if (view.f[first] > 0) {
    const dc = view.dbAt(0);
    if (Number.isFinite(dc)) lowDb = dc;
  }
  let highDb = db[last];
  if (highFlat) {
    const limit = highLimit(view, view.f[last]);
    if (Number.isFinite(limit)) highDb = limit;
  }
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
    // Two plateaus: a dip or a peak between two at about one level is a band; otherwise the
    // higher plateau is the passband and the lower one a floor (an op-amp's feed-through, say).
    const sameLevel = Math.abs(lowDb - highDb) < SAME_LEVEL_DB;
    if (sameLevel && interiorMin && db[minK] < Math.min(lowDb, highDb) - HALF_POWER_DB) shape = 'band-stop';
    else if (sameLevel && interiorMax && db[maxK] > Math.max(lowDb, highDb) + HALF_POWER_DB) shape = 'band-pass';
    else if (highDb < lowDb - HALF_POWER_DB) shape = 'low-pass';
    else if (lowDb < highDb - HALF_POWER_DB) shape = 'high-pass';
    else shape = 'flat';
  }
  if (shape === 'band-pass' && !interiorMax) shape = 'unknown';
  return { shape, lowDb, highDb, lowFlat };
}

/** The first crossing of `target` (dB) scanning idx in the given order, refined exactly. */
function crossing(view: TraceView, order: number[], target: number): number {
  const db = view.db;
  for (let q = 0; q + 1 < order.length; q++) {
    const a = order[q];
    const b = order[q + 1];
    if (db[a] >= target && db[b] < target) {
      return solveBetweenGrid(
        view,
        a,
        b,
        (f) => view.dbAt(f) - target,
        (k) => db[k] - target,
      );
    }
  }
  return NaN;
}

function shapeReadouts(view: TraceView, idx: number[], info: ShapeInfo, label: string): Readout[] {
  const out: Readout[] = [];
  const fFirst = view.f[idx[0]];
  const fLast = view.f[idx[idx.length - 1]];
  const top = extremeOver(view, 'gain', fFirst, fLast, 'max');
  const peakDb = top ? top.value : NaN;
  const interiorMax = top !== null && top.at > fFirst && top.at < fLast;
  const peakF = interiorMax ? top.at : NaN;
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
      if (!interiorMax) break;
      const target = peakDb - HALF_POWER_DB;
      const lo = crossingFrom(view, peakF, peakDb, idx.filter((k) => view.f[k] < peakF).reverse(), target, 'down');
      const hi = crossingFrom(
        view,
        peakF,
        peakDb,
        idx.filter((k) => view.f[k] > peakF),
        target,
        'down',
      );
      pushBand(out, label, lo, hi, Math.sqrt(lo * hi));
      break;
    }
    case 'band-stop': {
      const dip = extremeOver(view, 'gain', fFirst, fLast, 'min');
      if (!dip) break;
      const center = dip.at;
      const lo = crossingFrom(view, center, dip.value, idx.filter((k) => view.f[k] < center).reverse(), info.lowDb - HALF_POWER_DB, 'up');
      const hi = crossingFrom(
        view,
        center,
        dip.value,
        idx.filter((k) => view.f[k] > center),
        info.highDb - HALF_POWER_DB,
        'up',
      );
      pushBand(out, label, lo, hi, center);
      break;
    }
    default:
      break;
  }
  if (info.shape === 'band-pass') {
    if (interiorMax) out.push(readout(label, 'peak', peakDb, 'dB', peakF));
  } else if (info.shape !== 'unknown') {
    const above = peakDb - passbandLevel(info);
    out.push(above > 0 ? readout(label, 'peak', above, 'dB', interiorMax ? peakF : null) : readout(label, 'peak', 0, 'dB'));
  }
  if (interiorMax) out.push(readout(label, 'peak-frequency', peakF, 'Hz'));
  return out;
}

/** The level a response's passband sits at: the high level of a high-pass one, the low level of a low-pass, band-stop or flat one; NaN for others. */
function passbandLevel(info: ShapeInfo): number {
  if (info.shape === 'band-pass' || info.shape === 'unknown') return NaN;
  return info.shape === 'high-pass' ? info.highDb : info.lowDb;
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

/**
 * The slope the response settles on above the sweep, in dB/decade: exact slopes decades
 * above its last point until two in a row agree on a whole multiple of 20 dB/decade (the
 * excess of poles over zeros). NaN when it does not settle before the values underflow.
 */
function asymptoticSlope(view: TraceView, idx: number[]): number {
  const f = view.f[idx[idx.length - 1]];
  if (!(f > 0)) return NaN;
  let previous = view.gridSlopeDb(idx[idx.length - 1]);
  for (const d of FAR_DECADES) {
    const slope = view.slopeDbAt(f * Math.pow(10, d));
    if (!Number.isFinite(slope)) return NaN;
    const whole = 20 * Math.round(slope / 20);
    if (Math.abs(slope - whole) < SETTLED_ORDER && Math.abs(previous - whole) < SETTLED_ORDER) return whole === 0 ? 0 : whole;
    previous = slope;
  }
  return NaN;
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
    fpc = solveBetweenGrid(
      view,
      a,
      b,
      (f) => view.phaseAt(f) - boundary,
      (k) => ph[k] - boundary,
    );
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
