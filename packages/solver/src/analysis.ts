/**
 * Solving a circuit over its sweep: one factorisation per frequency, then the drive and
 * every impedance test current as right-hand sides, and for each of them one more
 * back-substitution for the exact derivative dx/dω. Traces are read from those solutions;
 * trace-values.ts turns each into magnitude, dB, unwrapped phase and group delay −dφ/dω.
 */
import type { Circuit, Probe, TraceSpec } from './circuit.js';
import type { Diagnostic, TraceResult } from './result.js';
import { buildMna, assemble, derivativeRhs, currentInjection } from './mna.js';
import type { LinearForm, MnaSystem, SparseVector } from './mna.js';
import { createLinearSolver } from './linear-solver.js';
import type { LinearSolver } from './numeric.js';
import { DEFAULT_MAX_POINTS, defaultGrid, gridFromSpec, scanFrequencies } from './sweep.js';
import { formatFrequencyList } from './units.js';
import { internalError } from './diagnostic.js';
import { traceResult } from './trace-values.js';
import type { TraceProbe } from './trace-values.js';

const TWO_PI = 2 * Math.PI;

/** How one trace is read from the solutions. */
type Reader =
  /** Σ factor·x[unknown]: a node voltage, a difference, a sum of traces. */
  | { kind: 'voltage'; rhs: number; unknowns: number[]; factors: number[] }
  /** sign·V(num)/V(den); −1 for a loop read at a loop break. */
  | { kind: 'ratio'; rhs: number; num: number; den: number; sign: 1 | -1 }
  | { kind: 'current'; rhs: number; form: LinearForm };

/** A trace that the AC analysis computes. */
export interface TracePlan {
  spec: TraceSpec;
  /** Index into `Circuit.traces`. */
  specIndex: number;
  reader: Reader | null;
}

/** Values of every planned trace at one frequency: H and dH/dω. */
export interface PointValues {
  re: Float64Array;
  im: Float64Array;
  dRe: Float64Array;
  dIm: Float64Array;
}

export interface SolveOptions {
  maxPoints?: number;
  /** Force the dense or the sparse LU (tests, the bench); default by size. */
  linearSolver?: 'auto' | 'dense' | 'sparse';
}

/**
 * Exact solves at any frequency for a fixed network: the one place that assembles, factors
 * and back-substitutes. Readouts and requirements call it between grid points.
 */
export class Evaluator {
  readonly system: MnaSystem;
  readonly solver: LinearSolver;
  readonly plans: TracePlan[];
  /** Solves made so far, grid included (for the bench and tests). */
  solves = 0;
  private readonly rhs: { re: Float64Array; im: Float64Array }[];
  private readonly x: { re: Float64Array; im: Float64Array; dRe: Float64Array; dIm: Float64Array }[];
  private readonly valRe: Float64Array;
  private readonly valIm: Float64Array;
  private readonly tRe: Float64Array;
  private readonly tIm: Float64Array;
  private readonly cache = new Map<number, PointValues | null>();

  constructor(system: MnaSystem, solver: LinearSolver, plans: TracePlan[], rhs: SparseVector[]) {
    this.system = system;
    this.solver = solver;
    this.plans = plans;
    const n = system.n;
    this.rhs = rhs.map((v) => {
      const re = new Float64Array(n);
      for (let k = 0; k < v.index.length; k++) re[v.index[k]] += v.value[k];
      return { re, im: new Float64Array(n) };
    });
    this.x = rhs.map(() => ({
      re: new Float64Array(n),
      im: new Float64Array(n),
      dRe: new Float64Array(n),
      dIm: new Float64Array(n),
    }));
    this.valRe = new Float64Array(system.rows.length);
    this.valIm = new Float64Array(system.rows.length);
    this.tRe = new Float64Array(n);
    this.tIm = new Float64Array(n);
  }

  /**
   * Solve at f (Hz) and write H and dH/dω of every plan into the arrays at position `at`.
   * Returns false, writing NaN, where the network is singular.
   */
  solveInto(f: number, out: PointValues, at: number): boolean {
    this.solves++;
    const omega = TWO_PI * f;
    const sys = this.system;
    assemble(sys, omega, this.valRe, this.valIm);
    const fact = this.solver.factor(this.valRe, this.valIm);
    const ok = !fact.singular && Number.isFinite(omega);
    if (ok) {
      for (let r = 0; r < this.rhs.length; r++) {
        const x = this.x[r];
        fact.solve(this.rhs[r].re, this.rhs[r].im, x.re, x.im);
        derivativeRhs(sys, omega, x.re, x.im, this.tRe, this.tIm);
        fact.solve(this.tRe, this.tIm, x.dRe, x.dIm);
      }
    }
    for (let t = 0; t < this.plans.length; t++) {
      const reader = this.plans[t].reader;
      const k = at + t;
      if (!ok || reader === null) {
        out.re[k] = NaN;
        out.im[k] = NaN;
        out.dRe[k] = NaN;
        out.dIm[k] = NaN;
        continue;
      }
      const x = this.x[reader.rhs];
      let hr = 0;
      let hi = 0;
      let dr = 0;
      let di = 0;
      switch (reader.kind) {
        case 'voltage': {
          for (let q = 0; q < reader.unknowns.length; q++) {
            const j = reader.unknowns[q];
            const c = reader.factors[q];
            hr += c * x.re[j];
            hi += c * x.im[j];
            dr += c * x.dRe[j];
            di += c * x.dIm[j];
          }
          break;
        }
        case 'ratio': {
          const ar = reader.num >= 0 ? x.re[reader.num] : 0;
          const ai = reader.num >= 0 ? x.im[reader.num] : 0;
          const adr = reader.num >= 0 ? x.dRe[reader.num] : 0;
          const adi = reader.num >= 0 ? x.dIm[reader.num] : 0;
          const br = reader.den >= 0 ? x.re[reader.den] : 0;
          const bi = reader.den >= 0 ? x.im[reader.den] : 0;
          const bdr = reader.den >= 0 ? x.dRe[reader.den] : 0;
          const bdi = reader.den >= 0 ? x.dIm[reader.den] : 0;
          const d = br * br + bi * bi;
          hr = (ar * br + ai * bi) / d;
          hi = (ai * br - ar * bi) / d;
          // H' = (a' − H·b') / b
          const nr = adr - (hr * bdr - hi * bdi);
          const ni = adi - (hr * bdi + hi * bdr);
          dr = (nr * br + ni * bi) / d;
          di = (ni * br - nr * bi) / d;
          if (reader.sign < 0) [hr, hi, dr, di] = [-hr, -hi, -dr, -di];
          break;
        }
        case 'current': {
          const f0 = reader.form;
          for (let q = 0; q < f0.index.length; q++) {
            const j = f0.index[q];
            const c0 = f0.c0[q];
            const c1 = f0.c1[q];
            // coefficient (c0 + jω·c1), its derivative j·c1
            const kr = c0;
            const ki = omega * c1;
            hr += kr * x.re[j] - ki * x.im[j];
            hi += kr * x.im[j] + ki * x.re[j];
            dr += kr * x.dRe[j] - ki * x.dIm[j] - c1 * x.im[j];
            di += kr * x.dIm[j] + ki * x.dRe[j] + c1 * x.re[j];
          }
          break;
        }
      }
      out.re[k] = hr;
      out.im[k] = hi;
      out.dRe[k] = dr;
      out.dIm[k] = di;
    }
    return ok;
  }

  /** An exact solve at f, cached; null where singular. */
  at(f: number): PointValues | null {
    const hit = this.cache.get(f);
    if (hit !== undefined) return hit;
    const t = this.plans.length;
    const out: PointValues = {
      re: new Float64Array(t),
      im: new Float64Array(t),
      dRe: new Float64Array(t),
      dIm: new Float64Array(t),
    };
    const ok = this.solveInto(f, out, 0);
    const value = ok ? out : null;
    if (this.cache.size > 4096) this.cache.clear();
    this.cache.set(f, value);
    return value;
  }
}

/** A computed trace with the derivative kept for readouts. */
export interface TraceData {
  plan: TracePlan;
  /** Index into `Evaluator.plans`. */
  index: number;
  result: TraceResult;
  dRe: Float64Array;
  dIm: Float64Array;
}

export interface AcAnalysis {
  frequencies: Float64Array;
  traces: TraceData[];
  evaluator: Evaluator;
  /** Grid frequencies where the network was singular. */
  singular: number[];
}

/** Builds the network, picks the grid and solves every AC trace over it. */
export function solveCircuit(circuit: Circuit, options: SolveOptions = {}): { analysis: AcAnalysis | null; diagnostics: Diagnostic[] } {
  const diagnostics: Diagnostic[] = [];
  const { system, diagnostics: built } = buildMna(circuit);
  diagnostics.push(...built);
  if (!system) return { analysis: null, diagnostics };

  const rhs: SparseVector[] = [];
  // The right-hand sides of test sources (an impedance's current, a loop break's voltage), by what they test.
  const testRhs = new Map<string, number>();
  // The drive, when any trace needs it, is right-hand side 0.
  const needsDrive = circuit.traces.some((t) => isAc(t) && t.probe.kind !== 'impedance' && t.probe.kind !== 'loop-break');
  if (needsDrive && system.driveRhs) rhs.push(system.driveRhs);
  const drive = rhs.length > 0 ? 0 : -1;
  const plans: TracePlan[] = [];
  // Step and noise traces are not computed; the elaborator has said so on their lines.
  circuit.traces.forEach((spec, specIndex) => {
    if (!isAc(spec)) return;
    const reader = makeReader(spec.probe, system, rhs, testRhs, drive, circuit);
    if (typeof reader === 'string') {
      // The elaborator checked the trace's nodes, parts and drive: this is a broken invariant.
      diagnostics.push(internalError(reader, spec.range));
      plans.push({ spec, specIndex, reader: null });
      return;
    }
    plans.push({ spec, specIndex, reader });
  });
  const solver = createLinearSolver(system.n, system.rows, system.cols, options.linearSolver ?? 'auto');
  const evaluator = new Evaluator(system, solver, plans, rhs);
  const maxPoints = options.maxPoints ?? DEFAULT_MAX_POINTS;

  let frequencies: Float64Array;
  if (circuit.sweep) {
    const grid = gridFromSpec(circuit.sweep, maxPoints);
    if (grid.error !== null) {
      // The elaborator checked the sweep against the same limit: this is a broken invariant.
      diagnostics.push(internalError(grid.error));
      return { analysis: null, diagnostics };
    }
    frequencies = grid.frequencies;
  } else {
    const scan = scanFrequencies();
    const activity = new Float64Array(scan.length);
    if (plans.length > 0) {
      const values = scanValues(plans.length);
      for (let k = 0; k < scan.length; k++) {
        if (!evaluator.solveInto(scan[k], values, 0)) continue;
        activity[k] = maxActivity(scan[k], values);
      }
    }
    frequencies = defaultGrid(scan, activity, maxPoints);
  }

  const count = frequencies.length;
  const t = plans.length;
  const grid: PointValues = {
    re: new Float64Array(count * t),
    im: new Float64Array(count * t),
    dRe: new Float64Array(count * t),
    dIm: new Float64Array(count * t),
  };
  const singular: number[] = [];
  if (t > 0) {
    for (let k = 0; k < count; k++) {
      if (!evaluator.solveInto(frequencies[k], grid, k * t)) singular.push(frequencies[k]);
    }
  }
  const traces: TraceData[] = plans.map((plan, index) => {
    const re = new Float64Array(count);
    const im = new Float64Array(count);
    const dRe = new Float64Array(count);
    const dIm = new Float64Array(count);
    for (let k = 0; k < count; k++) {
      re[k] = grid.re[k * t + index];
      im[k] = grid.im[k * t + index];
      dRe[k] = grid.dRe[k * t + index];
      dIm[k] = grid.dIm[k * t + index];
    }
    const probe: TraceProbe = (f) => {
      const v = evaluator.at(f);
      return v ? { re: v.re[index], im: v.im[index], dRe: v.dRe[index], dIm: v.dIm[index] } : null;
    };
    return { plan, index, result: traceResult(plan.spec, frequencies, re, im, dRe, dIm, probe), dRe, dIm };
  });
  if (singular.length > 0) {
    const where = circuit.drive?.range ?? circuit.traces[0]?.range ?? { line: 1, column: 1, endColumn: 1 };
    diagnostics.push({
      severity: 'warning',
      line: where.line,
      column: where.column,
      endColumn: where.endColumn,
      message: `the network is singular at ${formatFrequencyList(singular)}; the traces have no value there`,
      hint: 'a loop of inductors or voltage sources, or a node left floating by capacitors, makes the equations singular at 0 Hz',
      code: 'singular',
    });
  }
  return { analysis: { frequencies, traces, evaluator, singular }, diagnostics };
}

function isAc(spec: TraceSpec): boolean {
  return spec.kind !== 'noise' && spec.kind !== 'step';
}

function makeReader(probe: Probe, sys: MnaSystem, rhs: SparseVector[], testRhs: Map<string, number>, drive: number, circuit: Circuit): Reader | string {
  const nodeOk = (k: number): boolean => Number.isInteger(k) && k >= 0 && k < circuit.nodeNames.length;
  switch (probe.kind) {
    case 'voltage':
      if (!nodeOk(probe.p) || !nodeOk(probe.n)) return 'the trace names a node that does not exist';
      if (drive < 0) return 'this trace needs a drive: add a `drive` line';
      return voltageReader(sys, drive, [probe.p, probe.n], [1, -1]);
    case 'sum':
      if (!probe.terms.every((t) => nodeOk(t.node))) return 'the trace names a node that does not exist';
      if (drive < 0) return 'this trace needs a drive: add a `drive` line';
      return voltageReader(
        sys,
        drive,
        probe.terms.map((t) => t.node),
        probe.terms.map((t) => t.factor),
      );
    case 'ratio':
      if (!nodeOk(probe.num) || !nodeOk(probe.den)) return 'the trace names a node that does not exist';
      if (probe.den === 0) return 'a ratio cannot divide by the ground voltage, which is 0';
      if (drive < 0) return 'this trace needs a drive: add a `drive` line';
      return { kind: 'ratio', rhs: drive, num: sys.nodeUnknown[probe.num], den: sys.nodeUnknown[probe.den], sign: 1 };
    case 'loop-break': {
      const row = sys.breakRows.get(probe.element);
      const el = circuit.elements.find((e) => e.name === probe.element);
      if (row === undefined || el?.kind !== 'loop-break') return `${probe.element} is not a loop break of this network`;
      const key = `break ${probe.element}`;
      let index = testRhs.get(key);
      if (index === undefined) {
        index = rhs.length;
        rhs.push({ index: Int32Array.of(row), value: Float64Array.of(1) });
        testRhs.set(key, index);
      }
      return { kind: 'ratio', rhs: index, num: sys.nodeUnknown[el.from], den: sys.nodeUnknown[el.to], sign: -1 };
    }
    case 'current': {
      const form = sys.currentForm(probe.element);
      if (!form) return `${probe.element} is not a resistor, capacitor or inductor of this network`;
      if (drive < 0) return 'this trace needs a drive: add a `drive` line';
      return { kind: 'current', rhs: drive, form };
    }
    case 'impedance': {
      if (!nodeOk(probe.p) || !nodeOk(probe.n)) return 'the trace names a node that does not exist';
      if (probe.p === probe.n) return 'an impedance needs two different nodes';
      const key = `${probe.p},${probe.n}`;
      let index = testRhs.get(key);
      if (index === undefined) {
        index = rhs.length;
        rhs.push(currentInjection(sys.nodeUnknown, probe.p, probe.n));
        testRhs.set(key, index);
      }
      return voltageReader(sys, index, [probe.p, probe.n], [1, -1]);
    }
  }
}

/** Σ factor·V(node) read from right-hand side `rhs`; ground's terms are 0 and left out. */
function voltageReader(sys: MnaSystem, rhs: number, nodes: number[], factors: number[]): Reader {
  const unknowns: number[] = [];
  const kept: number[] = [];
  nodes.forEach((node, q) => {
    const j = sys.nodeUnknown[node];
    if (j < 0) return;
    unknowns.push(j);
    kept.push(factors[q]);
  });
  return { kind: 'voltage', rhs, unknowns, factors: kept };
}

function scanValues(t: number): PointValues {
  return { re: new Float64Array(t), im: new Float64Array(t), dRe: new Float64Array(t), dIm: new Float64Array(t) };
}

/** See `ACTIVITY_THRESHOLD`: the largest departure of d(ln H)/d(ln ω) from an integer slope. */
function maxActivity(f: number, v: PointValues): number {
  const omega = TWO_PI * f;
  let best = 0;
  for (let t = 0; t < v.re.length; t++) {
    const hr = v.re[t];
    const hi = v.im[t];
    const m = hr * hr + hi * hi;
    if (!(m > 0) || !Number.isFinite(m)) continue;
    // ω·H'/H
    const lr = (omega * (v.dRe[t] * hr + v.dIm[t] * hi)) / m;
    const li = (omega * (v.dIm[t] * hr - v.dRe[t] * hi)) / m;
    const a = Math.abs(li) + Math.abs(lr - Math.round(lr));
    if (Number.isFinite(a) && a > best) best = a;
  }
  return best;
}
