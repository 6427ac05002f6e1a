/**
 * The step response by numerical integration of E·z′ + F·z = b (a unit step at t = 0, every
 * state at rest before it), with TR-BDF2: a trapezoidal stage to t + γh, then a BDF2 stage
 * to t + h, γ = 2 − √2, so both stages solve with the one matrix E + d·h·F, d = 1 − 1/√2.
 * It is second order and L-stable: stiff modes decay without ringing, which the trapezoidal
 * rule alone would leave on read currents and algebraic nodes.
 *
 * Step size: every step's local error is estimated against a third-order quadrature over its
 * three points (`ESTIMATE`), and each output interval is walked in steps of its length / 2^k,
 * halved when the estimate is over the tolerance and doubled when it is well inside it. Step sizes therefore repeat, and each
 * matrix E + c·F is factored once and kept (a few dozen at most).
 *
 * The start: the response jumps at t = 0 where a node is tied to the drive without a
 * capacitor (or a capacitor hangs on the drive). Two backward-Euler steps of 1e-12 of the
 * window find that state just after the step (charges and fluxes as they must be, every
 * algebraic unknown consistent with them), from which the integration proper starts at t = 0.
 */
import type { Factorization, LinearSolver } from './numeric.js';
import { createLinearSolver } from './linear-solver.js';
import type { DescriptorSystem } from './time-system.js';
import { multiply } from './time-system.js';

const D = 1 - Math.SQRT1_2;
const GAMMA = 2 - Math.SQRT2;
/** BDF2 stage: z₁ = A·z_γ − B·z₀ + d·h·z₁′. */
const BDF_A = 1 / (GAMMA * (2 - GAMMA));
const BDF_B = ((1 - GAMMA) * (1 - GAMMA)) / (GAMMA * (2 - GAMMA));

/**
 * The weights of the third-order quadrature over the step's three points 0, γ and 1: the
 * second-order step is compared with it for an estimate of its local error (as Hosea and
 * Shampine's TR-BDF2 does), at the cost of one more solve with the step's matrix.
 */
const W_GAMMA = 1 / (6 * GAMMA * (1 - GAMMA));
const W_ONE = 0.5 - 1 / (6 * (1 - GAMMA));
const ESTIMATE = [1 - W_GAMMA - W_ONE, W_GAMMA, W_ONE] as const;

/** Each step's local error, relative to the size of the state it is in. */
export const RELATIVE_TOLERANCE = 1e-9;
/**
 * Steps an integration may take before it loosens its tolerance tenfold (pro rata over the
 * time it has covered), down to `LOOSEST_TOLERANCE`: a response that rings for thousands of
 * periods in its window is drawn in a moment, a little less exactly, rather than in minutes.
 */
const STEP_BUDGET = 100_000;
const LOOSEST_TOLERANCE = 1e-5;
/** A state below this fraction of the largest of its group is measured against that fraction. */
const ERROR_FLOOR = 1e-6;
/** The start's backward-Euler steps, as a fraction of the last time asked for. */
const START_STEP = 1e-12;
/** Halvings of an output interval before the integration gives up. */
const MAX_HALVINGS = 60;
/** Factored matrices kept at once. */
const MAX_MATRICES = 48;

/** `tolerance`: the loosest relative tolerance the steps kept to. */
export type Integration = { ok: true; tolerance: number } | { ok: false; reason: string };

/**
 * Integrates from rest and calls `visit(k, z)` with the state at each `times[k]` (ascending,
 * ≥ 0; at 0 the state just after the step). With `start`, it goes on from that state at
 * that time instead. Stops at the first failure, which it names.
 */
export function integrateStep(
  system: DescriptorSystem,
  times: ArrayLike<number>,
  visit: (k: number, z: Float64Array) => void,
  start?: { t: number; z: Float64Array },
): Integration {
  const end = times.length > 0 ? times[times.length - 1] : 0;
  const work = new Stepper(system);
  let z: Float64Array;
  let t: number;
  if (start) {
    z = start.z;
    t = start.t;
  } else {
    // The state just after the step, from two tiny backward-Euler steps.
    const kick = START_STEP * (end > 0 ? end : 1);
    z = new Float64Array(system.n);
    for (let i = 0; i < 2; i++) {
      const next = work.backwardEuler(z, kick);
      if (next === null) return { ok: false, reason: 'the network’s equations are singular at the instant of the step' };
      z = next;
    }
    // The kicks took time too: the integration goes on from where they ended.
    t = 2 * kick;
  }
  work.remember(z);
  let deriv = work.rate(z);
  let k = 0;
  for (; k < times.length && times[k] <= t; k++) visit(k, z);
  let segment = NaN;
  let depth = 0;
  let tolerance = RELATIVE_TOLERANCE;
  let steps = 0;
  const from = t;
  const span = end - from;
  for (; k < times.length; k++) {
    const length = times[k] - t;
    // Equal output intervals differ in their last bits; one length keeps the factored matrices in use.
    if (!(Math.abs(length - segment) <= 1e-9 * length)) {
      const h = segment / 2 ** depth;
      segment = length;
      depth = Number.isFinite(h) ? Math.max(0, Math.ceil(Math.log2(segment / h) - 1e-9)) : 0;
    }
    let done = 0;
    while (done < 1) {
      const part = 2 ** -depth;
      if (done + part > 1) {
        depth++;
        continue;
      }
      const h = segment * part;
      const next = work.trBdf2(z, deriv, h);
      if (next === null) return { ok: false, reason: 'the network’s equations are singular in the time domain' };
      if (++steps > STEP_BUDGET * Math.max(0.1, (t + done * segment - from) / span) && tolerance < LOOSEST_TOLERANCE) {
        tolerance *= 10;
        steps = 0;
      }
      const error = work.error(next.error, next.z) * (RELATIVE_TOLERANCE / tolerance);
      if (!Number.isFinite(error)) return { ok: false, reason: 'the response grows without bound: the network is unstable' };
      if (error > 1) {
        if (++depth > MAX_HALVINGS) return { ok: false, reason: 'the time steps became too small to follow the response' };
        continue;
      }
      z = next.z;
      deriv = next.rate;
      work.remember(z);
      done += part;
      // Doubling h multiplies the local error (third order in h) by 8; keep a margin.
      if (error < 0.05 && depth > 0 && (done / (2 * part)) % 1 === 0) depth--;
    }
    t = times[k];
    visit(k, z);
  }
  return { ok: true, tolerance };
}

/** The arithmetic of one integration: factored matrices by coefficient, work vectors, error scales. */
class Stepper {
  private readonly system: DescriptorSystem;
  private readonly matrices = new Map<number, { fact: Factorization | null; solver: LinearSolver }>();
  private readonly zeroIm: Float64Array;
  private readonly outIm: Float64Array;
  private readonly rhs: Float64Array;
  private readonly tmp: Float64Array;
  private readonly valRe: Float64Array;
  private readonly valIm: Float64Array;
  /** The largest size each unknown has reached, and the largest of each group. */
  private readonly peak: Float64Array;
  private readonly groupPeak = new Float64Array(2);

  constructor(system: DescriptorSystem) {
    this.system = system;
    const n = system.n;
    this.zeroIm = new Float64Array(n);
    this.outIm = new Float64Array(n);
    this.rhs = new Float64Array(n);
    this.tmp = new Float64Array(n);
    this.valRe = new Float64Array(system.rows.length);
    this.valIm = new Float64Array(system.rows.length);
    this.peak = new Float64Array(n);
  }

  /** E·z′ = b − F·z at state z. */
  rate(z: Float64Array): Float64Array {
    const out = new Float64Array(this.system.n);
    multiply(this.system, this.system.f, z, out);
    const b = this.system.b;
    for (let i = 0; i < out.length; i++) out[i] = b[i] - out[i];
    return out;
  }

  /** (E + h·F)·z₁ = E·z₀ + h·b. */
  backwardEuler(z0: Float64Array, h: number): Float64Array | null {
    const { system, rhs } = this;
    multiply(system, system.e, z0, rhs);
    for (let i = 0; i < rhs.length; i++) rhs[i] += h * system.b[i];
    return this.solve(h, rhs);
  }

  /**
   * One TR-BDF2 step of size h from z₀, where E·z₀′ = r₀: the new state, its rate, and an
   * estimate of the step's local error (see `ESTIMATE`).
   */
  trBdf2(z0: Float64Array, r0: Float64Array, h: number): { z: Float64Array; rate: Float64Array; error: Float64Array } | null {
    const { system, rhs, tmp } = this;
    const c = D * h;
    const b = system.b;
    // Trapezoidal stage: (E + d·h·F)·z_γ = E·z₀ + d·h·(r₀ + b).
    multiply(system, system.e, z0, rhs);
    for (let i = 0; i < rhs.length; i++) rhs[i] += c * (r0[i] + b[i]);
    const zg = this.solve(c, rhs);
    if (zg === null) return null;
    // BDF2 stage: (E + d·h·F)·z₁ = E·(A·z_γ − B·z₀) + d·h·b.
    for (let i = 0; i < tmp.length; i++) tmp[i] = BDF_A * zg[i] - BDF_B * z0[i];
    multiply(system, system.e, tmp, rhs);
    for (let i = 0; i < rhs.length; i++) rhs[i] += c * b[i];
    const z1 = this.solve(c, rhs);
    if (z1 === null) return null;
    // The error: E·(z₁ − z₀) against h·(w₀·r₀ + w_γ·r_γ + w₁·r₁), filtered by the step's own matrix.
    const rg = this.rate(zg);
    const r1 = this.rate(z1);
    for (let i = 0; i < tmp.length; i++) tmp[i] = z1[i] - z0[i];
    multiply(system, system.e, tmp, rhs);
    for (let i = 0; i < rhs.length; i++) rhs[i] -= h * (ESTIMATE[0] * r0[i] + ESTIMATE[1] * rg[i] + ESTIMATE[2] * r1[i]);
    const error = this.solve(c, rhs);
    return error === null ? null : { z: z1, rate: r1, error };
  }

  /** The largest local error of the differential unknowns, in units of the tolerance. */
  error(estimate: Float64Array, z: Float64Array): number {
    const { differential, group } = this.system;
    const floor = [0, 0];
    for (let i = 0; i < z.length; i++) {
      const m = Math.max(this.peak[i], Math.abs(z[i]));
      if (m > floor[group[i]]) floor[group[i]] = m;
    }
    floor[0] = Math.max(floor[0], this.groupPeak[0]) * ERROR_FLOOR;
    floor[1] = Math.max(floor[1], this.groupPeak[1]) * ERROR_FLOOR;
    let worst = 0;
    for (let i = 0; i < z.length; i++) {
      if (differential[i] === 0) continue;
      const d = Math.abs(estimate[i]);
      if (Number.isNaN(d) || !Number.isFinite(z[i])) return Infinity;
      if (d === 0) continue;
      const scale = Math.max(this.peak[i], Math.abs(z[i]), floor[group[i]]);
      const e = d / (RELATIVE_TOLERANCE * scale);
      if (e > worst) worst = e;
    }
    return worst;
  }

  /** Keeps the sizes an accepted state reached. */
  remember(z: Float64Array): void {
    const { group } = this.system;
    for (let i = 0; i < z.length; i++) {
      const m = Math.abs(z[i]);
      if (m > this.peak[i]) this.peak[i] = m;
      if (m > this.groupPeak[group[i]]) this.groupPeak[group[i]] = m;
    }
  }

  /** (E + c·F)⁻¹·rhs, the matrix factored once per c; null where it is singular. */
  private solve(c: number, rhs: Float64Array): Float64Array | null {
    let kept = this.matrices.get(c);
    if (kept === undefined) {
      kept = this.factor(c);
      this.matrices.set(c, kept);
    }
    const fact = kept.fact;
    if (fact === null) return null;
    const out = new Float64Array(this.system.n);
    fact.solve(rhs, this.zeroIm, out, this.outIm);
    return out;
  }

  /** A factorisation lives until its solver's next factor call: one solver per matrix kept, the oldest's reused. */
  private factor(c: number): { fact: Factorization | null; solver: LinearSolver } {
    const { system, valRe } = this;
    for (let s = 0; s < valRe.length; s++) valRe[s] = system.e[s] + c * system.f[s];
    let solver: LinearSolver | undefined;
    if (this.matrices.size >= MAX_MATRICES) {
      const [oldest, entry] = this.matrices.entries().next().value as [number, { solver: LinearSolver }];
      this.matrices.delete(oldest);
      solver = entry.solver;
    }
    solver ??= createLinearSolver(system.n, system.rows, system.cols);
    const fact = solver.factor(valRe, this.valIm);
    return { fact: fact.singular ? null : fact, solver };
  }
}
