/**
 * Modified nodal analysis at s = jω. Every entry of the system matrix is a polynomial in s
 * of degree at most two, A(s) = A0 + s·A1 + s²·A2, with real coefficients: capacitors with
 * series parasitics and inductors carry branch currents, so no entry is ever a ratio and
 * 0 Hz needs no special case (capacitors open, inductors short fall out of the equations).
 * The exact derivative dA/dω comes from the same coefficients, which gives group delay and
 * slopes from one extra back-substitution.
 */
import type { Circuit, Element, NodeIndex, SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import { internalError } from './diagnostic.js';
import { stampTransfer, transferUnknowns } from './mna-transfer.js';
import { StampList } from './stamp-list.js';

/** A current as a linear form over the unknowns: I = Σ (c0[k] + s·c1[k])·x[index[k]]. */
export interface LinearForm {
  index: Int32Array;
  c0: Float64Array;
  c1: Float64Array;
}

/** A real right-hand side given sparsely. */
export interface SparseVector {
  index: Int32Array;
  value: Float64Array;
}

export interface MnaSystem {
  /** Number of unknowns: node voltages (ground excluded), then branch currents. */
  readonly n: number;
  /** The unique pattern slots and their polynomial coefficients. */
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  readonly c0: Float64Array;
  readonly c1: Float64Array;
  readonly c2: Float64Array;
  /** Unknown index of each circuit node; −1 for ground. */
  readonly nodeUnknown: Int32Array;
  /** The right-hand side of a unit drive; null without a drive. */
  readonly driveRhs: SparseVector | null;
  /** The row of each loop break's link, by designator: a 1 there is its test voltage. */
  readonly breakRows: ReadonlyMap<string, number>;
  /**
   * The current through a resistor, capacitor or inductor (first node → second), by
   * designator; undefined for any other name. Made on demand: most parts are never asked.
   */
  currentForm(name: string): LinearForm | undefined;
}

/**
 * Builds the system of a circuit and a null system when it breaks an invariant. The
 * elaborator has checked every value and name of a cell, so a broken invariant is a fault of
 * Rolloff's own and becomes the one internal-error diagnostic, at the element's line.
 */
export function buildMna(circuit: Circuit): { system: MnaSystem | null; diagnostics: Diagnostic[] } {
  const diagnostics: Diagnostic[] = [];
  const fail = (range: SourceRange, message: string): void => {
    diagnostics.push(internalError(new Error(message), range));
  };
  const nodeCount = circuit.nodeNames.length;
  const nodeUnknown = new Int32Array(Math.max(nodeCount, 1));
  nodeUnknown[0] = -1;
  for (let k = 1; k < nodeCount; k++) nodeUnknown[k] = k - 1;
  let unknowns = Math.max(nodeCount - 1, 0);
  const nodeOk = (node: NodeIndex): boolean => Number.isInteger(node) && node >= 0 && node < nodeCount;
  const u = (node: NodeIndex): number => nodeUnknown[node];
  const positive = (v: number | undefined): v is number => typeof v === 'number' && Number.isFinite(v) && v > 0;
  const finite = (v: number | undefined): v is number => typeof v === 'number' && Number.isFinite(v);
  const nonNegative = (v: number | undefined): boolean => v === undefined || (Number.isFinite(v) && v >= 0);

  // First pass: check values and nodes, and give branch currents where a part needs one.
  const elements = circuit.elements;
  const branch = new Int32Array(elements.length).fill(-1);
  const breakRows = new Map<string, number>();
  let coupled = false;
  for (let index = 0; index < elements.length; index++) {
    const el = elements[index];
    switch (el.kind) {
      case 'resistor': {
        if (!nodeOk(el.a) || !nodeOk(el.b)) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        if (!positive(el.value)) {
          fail(el.range, `${el.name}: a resistor needs a value above 0 Ω`);
          break;
        }
        break;
      }
      case 'capacitor': {
        if (!nodeOk(el.a) || !nodeOk(el.b)) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        if (!positive(el.value)) {
          fail(el.range, `${el.name}: a capacitor needs a value above 0 F`);
          break;
        }
        if (!nonNegative(el.esr) || !nonNegative(el.esl)) {
          fail(el.range, `${el.name}: esr and esl cannot be negative`);
          break;
        }
        if ((el.esr ?? 0) > 0 || (el.esl ?? 0) > 0) branch[index] = unknowns++;
        break;
      }
      case 'inductor': {
        if (!nodeOk(el.a) || !nodeOk(el.b)) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        if (!positive(el.value)) {
          fail(el.range, `${el.name}: an inductor needs a value above 0 H`);
          break;
        }
        if (!nonNegative(el.dcr)) {
          fail(el.range, `${el.name}: dcr cannot be negative`);
          break;
        }
        branch[index] = unknowns++;
        break;
      }
      case 'opamp': {
        if (!nodeOk(el.p) || !nodeOk(el.n) || !nodeOk(el.o)) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        if (el.gain !== undefined && !(finite(el.gain) && el.gain !== 0)) {
          fail(el.range, `${el.name}: the op-amp gain must be a finite, non-zero number`);
          break;
        }
        if (el.gbw !== undefined && !positive(el.gbw)) {
          fail(el.range, `${el.name}: gbw must be above 0 Hz`);
          break;
        }
        if (el.pole2 !== undefined && !(positive(el.pole2) && el.gbw !== undefined)) {
          fail(el.range, `${el.name}: pole2 must be above 0 Hz, and comes with gbw`);
          break;
        }
        if (!nonNegative(el.zout)) {
          fail(el.range, `${el.name}: zout cannot be negative`);
          break;
        }
        branch[index] = unknowns++;
        break;
      }
      case 'vcvs':
      case 'ccvs': {
        if (!nodeOk(el.op) || !nodeOk(el.on) || (el.kind === 'vcvs' && (!nodeOk(el.cp) || !nodeOk(el.cn)))) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        const k = el.kind === 'vcvs' ? el.gain : el.rm;
        if (!finite(k)) {
          fail(el.range, `${el.name}: the gain must be a finite number`);
          break;
        }
        branch[index] = unknowns++;
        break;
      }
      case 'vccs':
      case 'cccs': {
        if (!nodeOk(el.op) || !nodeOk(el.on) || (el.kind === 'vccs' && (!nodeOk(el.cp) || !nodeOk(el.cn)))) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        const k = el.kind === 'vccs' ? el.gm : el.gain;
        if (!finite(k)) {
          fail(el.range, `${el.name}: the gain must be a finite number`);
          break;
        }
        break;
      }
      case 'transfer': {
        if (![el.op, el.on, el.cp, el.cn].every(nodeOk)) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        if (el.den.length === 0 || el.den[el.den.length - 1] === 0 || !el.num.concat(el.den).every(finite)) {
          fail(el.range, `${el.name}: a transfer function needs finite coefficients and a denominator that is not 0`);
          break;
        }
        branch[index] = unknowns;
        unknowns += transferUnknowns(el);
        break;
      }
      case 'loop-break': {
        if (!nodeOk(el.from) || !nodeOk(el.to) || el.from === el.to) {
          fail(el.range, `${el.name} needs two different nodes that exist`);
          break;
        }
        branch[index] = unknowns++;
        breakRows.set(el.name, branch[index]);
        break;
      }
      case 'transformer': {
        if (![el.p1, el.p2, el.s1, el.s2].every(nodeOk)) {
          fail(el.range, `${el.name} names a node that does not exist`);
          break;
        }
        if (!positive(el.turns)) {
          fail(el.range, `${el.name}: the turns ratio must be above 0`);
          break;
        }
        branch[index] = unknowns++;
        break;
      }
      case 'coupling':
        coupled = true;
        break;
    }
  }
  const drive = circuit.drive;
  let driveBranch = -1;
  if (drive) {
    if (!nodeOk(drive.p) || !nodeOk(drive.n)) fail(drive.range, 'the drive names a node that does not exist');
    else if (drive.kind === 'voltage') driveBranch = unknowns++;
  }
  if (diagnostics.length > 0) return { system: null, diagnostics };

  // Designator → element index of every two-terminal part, made only when something asks.
  let parts: Map<string, number> | null = null;
  const formCache = new Map<string, LinearForm>();
  const currentForm = (name: string): LinearForm | undefined => {
    const hit = formCache.get(name);
    if (hit) return hit;
    if (parts === null) {
      parts = new Map();
      elements.forEach((el, i) => {
        if (el.kind === 'resistor' || el.kind === 'capacitor' || el.kind === 'inductor') parts!.set(el.name, i);
      });
    }
    const i = parts.get(name);
    if (i === undefined) return undefined;
    const el = elements[i] as Element & { kind: 'resistor' | 'capacitor' | 'inductor' };
    let f: LinearForm;
    if (branch[i] >= 0) f = form([branch[i]], [1], [0]);
    else if (el.kind === 'resistor') f = form([u(el.a), u(el.b)], [1 / el.value, -1 / el.value], [0, 0]);
    else f = form([u(el.a), u(el.b)], [0, 0], [el.value, -el.value]);
    formCache.set(name, f);
    return f;
  };
  const inductors = new Map<string, { value: number; index: number }>();
  if (coupled) {
    elements.forEach((el, i) => {
      if (el.kind === 'inductor') inductors.set(el.name, { value: el.value, index: branch[i] });
    });
  }

  const n = unknowns;
  const stamps = new StampList(n);
  const add = (r: number, c: number, k0: number, k1 = 0, k2 = 0): void => {
    if (r < 0 || c < 0) return;
    stamps.add(r, c, k0, k1, k2);
  };
  /** A current leaving the element at node `into` enters the network there. */
  const kcl = (a: number, b: number, col: number): void => {
    add(a, col, 1);
    add(b, col, -1);
  };

  for (let index = 0; index < elements.length; index++) {
    const el = elements[index];
    switch (el.kind) {
      case 'resistor': {
        const a = u(el.a);
        const b = u(el.b);
        const g = 1 / el.value;
        add(a, a, g);
        add(b, b, g);
        add(a, b, -g);
        add(b, a, -g);
        break;
      }
      case 'capacitor': {
        const a = u(el.a);
        const b = u(el.b);
        const c = el.value;
        const br = branch[index];
        if (br < 0) {
          add(a, a, 0, c);
          add(b, b, 0, c);
          add(a, b, 0, -c);
          add(b, a, 0, -c);
        } else {
          // s·C·(Va − Vb) − (1 + s·C·esr + s²·C·esl)·I = 0: the series branch, multiplied out.
          kcl(a, b, br);
          add(br, a, 0, c);
          add(br, b, 0, -c);
          add(br, br, -1, -c * (el.esr ?? 0), -c * (el.esl ?? 0));
        }
        break;
      }
      case 'inductor': {
        const a = u(el.a);
        const b = u(el.b);
        const br = branch[index];
        kcl(a, b, br);
        add(br, a, 1);
        add(br, b, -1);
        add(br, br, -(el.dcr ?? 0), -el.value);
        break;
      }
      case 'coupling': {
        const l1 = inductors.get(el.l1);
        const l2 = inductors.get(el.l2);
        if (!l1 || !l2) {
          fail(el.range, `couple names ${!l1 ? el.l1 : el.l2}, which is not an inductor of this network`);
          break;
        }
        if (l1 === l2) {
          fail(el.range, 'an inductor cannot be coupled to itself');
          break;
        }
        if (!(Number.isFinite(el.k) && el.k > 0 && el.k <= 1)) {
          fail(el.range, 'the coupling factor must lie in 0 < k ≤ 1');
          break;
        }
        const m = el.k * Math.sqrt(l1.value * l2.value);
        add(l1.index, l2.index, 0, -m);
        add(l2.index, l1.index, 0, -m);
        break;
      }
      case 'opamp': {
        const br = branch[index];
        // (1/A(s))·(Vo + zout·Io) − (Vp − Vn) = 0 with 1/A = (1/G + s/(2π·gbw))·(1 + s/(2π·pole2)):
        // finite for the ideal op-amp too, where it reduces to the nullor Vp = Vn.
        const g0 = el.gain !== undefined ? 1 / el.gain : 0;
        const g1 = el.gbw !== undefined ? 1 / (2 * Math.PI * el.gbw) : 0;
        const b = el.pole2 !== undefined ? 1 / (2 * Math.PI * el.pole2) : 0;
        const [a0, a1, a2] = [g0, g1 + g0 * b, g1 * b];
        const z = el.zout ?? 0;
        add(u(el.o), br, -1);
        add(br, u(el.o), a0, a1, a2);
        add(br, br, z * a0, z * a1, z * a2);
        add(br, u(el.p), -1);
        add(br, u(el.n), 1);
        break;
      }
      case 'vcvs': {
        const br = branch[index];
        kcl(u(el.on), u(el.op), br);
        add(br, u(el.op), 1);
        add(br, u(el.on), -1);
        add(br, u(el.cp), -el.gain);
        add(br, u(el.cn), el.gain);
        break;
      }
      case 'transfer':
        stampTransfer(el, branch[index], add, u);
        break;
      case 'loop-break': {
        // A link carrying current from → to; its row V(to) − V(from) = 0 takes the test voltage.
        const br = branch[index];
        kcl(u(el.from), u(el.to), br);
        add(br, u(el.to), 1);
        add(br, u(el.from), -1);
        break;
      }
      case 'transformer': {
        // The primary current I enters at p1; I/turns leaves the secondary at s1, so the
        // power in equals the power out. Branch row: V(s1, s2) − turns·V(p1, p2) = 0.
        const br = branch[index];
        const t = el.turns;
        kcl(u(el.p1), u(el.p2), br);
        add(u(el.s1), br, -1 / t);
        add(u(el.s2), br, 1 / t);
        add(br, u(el.s1), 1);
        add(br, u(el.s2), -1);
        add(br, u(el.p1), -t);
        add(br, u(el.p2), t);
        break;
      }
      case 'vccs': {
        const op = u(el.op);
        const on = u(el.on);
        const cp = u(el.cp);
        const cn = u(el.cn);
        add(op, cp, -el.gm);
        add(op, cn, el.gm);
        add(on, cp, el.gm);
        add(on, cn, -el.gm);
        break;
      }
      case 'cccs': {
        const f = currentForm(el.control);
        if (!f) {
          fail(el.range, `${el.name} is controlled by ${el.control}, which is not a resistor, capacitor or inductor of this network`);
          break;
        }
        for (let t = 0; t < f.index.length; t++) {
          add(u(el.op), f.index[t], -el.gain * f.c0[t], -el.gain * f.c1[t]);
          add(u(el.on), f.index[t], el.gain * f.c0[t], el.gain * f.c1[t]);
        }
        break;
      }
      case 'ccvs': {
        const f = currentForm(el.control);
        if (!f) {
          fail(el.range, `${el.name} is controlled by ${el.control}, which is not a resistor, capacitor or inductor of this network`);
          break;
        }
        const br = branch[index];
        kcl(u(el.on), u(el.op), br);
        add(br, u(el.op), 1);
        add(br, u(el.on), -1);
        for (let t = 0; t < f.index.length; t++) add(br, f.index[t], -el.rm * f.c0[t], -el.rm * f.c1[t]);
        break;
      }
    }
  }
  let driveRhs: SparseVector | null = null;
  if (drive) {
    if (drive.kind === 'voltage') {
      kcl(u(drive.n), u(drive.p), driveBranch);
      add(driveBranch, u(drive.p), 1);
      add(driveBranch, u(drive.n), -1);
      driveRhs = { index: Int32Array.of(driveBranch), value: Float64Array.of(1) };
    } else {
      driveRhs = currentInjection(nodeUnknown, drive.p, drive.n);
    }
  }
  if (diagnostics.length > 0) return { system: null, diagnostics };
  const s = stamps.finish();
  return {
    system: { n, rows: s.rows, cols: s.cols, c0: s.c0, c1: s.c1, c2: s.c2, nodeUnknown, driveRhs, breakRows, currentForm },
    diagnostics,
  };
}

/** The right-hand side of a unit current pushed into node p and out of node n. */
export function currentInjection(nodeUnknown: Int32Array, p: NodeIndex, n: NodeIndex): SparseVector {
  const index: number[] = [];
  const value: number[] = [];
  const a = nodeUnknown[p];
  const b = nodeUnknown[n];
  if (a >= 0) {
    index.push(a);
    value.push(1);
  }
  if (b >= 0) {
    index.push(b);
    value.push(-1);
  }
  return { index: Int32Array.from(index), value: Float64Array.from(value) };
}

/** Fills the slot values of A(jω). */
export function assemble(sys: MnaSystem, omega: number, valRe: Float64Array, valIm: Float64Array): void {
  const { c0, c1, c2 } = sys;
  const w2 = omega * omega;
  for (let k = 0; k < c0.length; k++) {
    valRe[k] = c0[k] - w2 * c2[k];
    valIm[k] = omega * c1[k];
  }
}

/**
 * out = −(dA/dω)·x, the right-hand side whose solution is dx/dω (the drive does not change
 * with frequency). dA/dω = j·A1 − 2ω·A2.
 */
export function derivativeRhs(sys: MnaSystem, omega: number, xRe: Float64Array, xIm: Float64Array, outRe: Float64Array, outIm: Float64Array): void {
  const { rows, cols, c1, c2 } = sys;
  outRe.fill(0, 0, sys.n);
  outIm.fill(0, 0, sys.n);
  for (let k = 0; k < rows.length; k++) {
    const a = c1[k];
    const b = -2 * omega * c2[k];
    if (a === 0 && b === 0) continue;
    const xr = xRe[cols[k]];
    const xi = xIm[cols[k]];
    // (b + j·a)·x
    outRe[rows[k]] -= b * xr - a * xi;
    outIm[rows[k]] -= b * xi + a * xr;
  }
}

function form(index: number[], c0: number[], c1: number[]): LinearForm {
  const keep: number[] = [];
  for (let k = 0; k < index.length; k++) if (index[k] >= 0) keep.push(k);
  return {
    index: Int32Array.from(keep.map((k) => index[k])),
    c0: Float64Array.from(keep.map((k) => c0[k])),
    c1: Float64Array.from(keep.map((k) => c1[k])),
  };
}
