/**
 * The network in the time domain: E·z′ + F·z = b·u(t), a descriptor system made from the MNA's
 * real coefficients (A(s) = A0 + s·A1 + s²·A2 gives F = A0 and E = A1). A column with an s²
 * entry (an esl, an op-amp's second pole) gets a derivative unknown y = x′ so that the
 * system stays first order, and each current a step trace reads (I = c0·x + c1·x′) gets an
 * unknown of its own, solved with the rest, so no derivative is ever taken numerically.
 */
import type { Probe } from './circuit.js';
import type { MnaSystem } from './mna.js';

export interface DescriptorSystem {
  /** Unknowns: the MNA's, then derivative unknowns, then read currents. */
  readonly n: number;
  /** The unique slots; E and F share the pattern (a zero where one has no entry). */
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  readonly e: Float64Array;
  readonly f: Float64Array;
  /** The right-hand side of a unit step of the drive. */
  readonly b: Float64Array;
  /** 1 for an unknown with an entry in E (a state that carries charge or flux), else 0. */
  readonly differential: Uint8Array;
  /** 0 for node voltages, 1 for every other unknown: the groups whose sizes set the error scale. */
  readonly group: Uint8Array;
}

/** How a step trace reads the state: Σ factor·z[index], or the ratio of two such sums. */
export interface StepReader {
  num: { index: number[]; factor: number[] };
  den: { index: number[]; factor: number[] } | null;
}

/** The descriptor system of a network and the readers of its step probes (null where a probe cannot be read). */
export function descriptorSystem(sys: MnaSystem, probes: Probe[]): { system: DescriptorSystem; readers: (StepReader | null)[] } {
  const n0 = sys.n;
  const slots = new Map<number, number>();
  const rows: number[] = [];
  const cols: number[] = [];
  const e: number[] = [];
  const f: number[] = [];
  // Enough room per row for every unknown the augmentation may add.
  const width = n0 + sys.rows.length + probes.length + 1;
  const add = (r: number, c: number, ev: number, fv: number): void => {
    const key = r * width + c;
    let s = slots.get(key);
    if (s === undefined) {
      s = rows.length;
      slots.set(key, s);
      rows.push(r);
      cols.push(c);
      e.push(0);
      f.push(0);
    }
    e[s] += ev;
    f[s] += fv;
  };
  const derivative = new Map<number, number>();
  let n = n0;
  for (let k = 0; k < sys.rows.length; k++) {
    if (sys.c2[k] !== 0 && !derivative.has(sys.cols[k])) derivative.set(sys.cols[k], n++);
  }
  for (let k = 0; k < sys.rows.length; k++) {
    add(sys.rows[k], sys.cols[k], sys.c1[k], sys.c0[k]);
    if (sys.c2[k] !== 0) add(sys.rows[k], derivative.get(sys.cols[k]) as number, sys.c2[k], 0);
  }
  // y − x′ = 0 for each derivative unknown.
  for (const [col, y] of derivative) {
    add(y, y, 0, 1);
    add(y, col, -1, 0);
  }
  const readers = probes.map((probe): StepReader | null => {
    const node = (k: number): number => sys.nodeUnknown[k];
    const sum = (nodes: number[], factors: number[]): StepReader['num'] => {
      const index: number[] = [];
      const factor: number[] = [];
      nodes.forEach((k, q) => {
        if (node(k) < 0) return;
        index.push(node(k));
        factor.push(factors[q]);
      });
      return { index, factor };
    };
    switch (probe.kind) {
      case 'voltage':
        return { num: sum([probe.p, probe.n], [1, -1]), den: null };
      case 'sum':
        return {
          num: sum(
            probe.terms.map((t) => t.node),
            probe.terms.map((t) => t.factor),
          ),
          den: null,
        };
      case 'ratio':
        return { num: sum([probe.num], [1]), den: sum([probe.den], [1]) };
      case 'current': {
        const form = sys.currentForm(probe.element);
        if (!form) return null;
        // w − c0·x − c1·x′ = 0: the current is an unknown of its own.
        const w = n++;
        add(w, w, 0, 1);
        for (let t = 0; t < form.index.length; t++) add(w, form.index[t], -form.c1[t], -form.c0[t]);
        return { num: { index: [w], factor: [1] }, den: null };
      }
      default:
        return null;
    }
  });
  const b = new Float64Array(n);
  if (sys.driveRhs) for (let k = 0; k < sys.driveRhs.index.length; k++) b[sys.driveRhs.index[k]] += sys.driveRhs.value[k];
  const differential = new Uint8Array(n);
  for (let s = 0; s < rows.length; s++) if (e[s] !== 0) differential[cols[s]] = 1;
  const group = new Uint8Array(n).fill(1);
  for (let k = 1; k < sys.nodeUnknown.length; k++) if (sys.nodeUnknown[k] >= 0) group[sys.nodeUnknown[k]] = 0;
  return {
    system: { n, rows: Int32Array.from(rows), cols: Int32Array.from(cols), e: Float64Array.from(e), f: Float64Array.from(f), b, differential, group },
    readers,
  };
}

/** The value a reader gives for state z: NaN for a ratio whose denominator is 0. */
export function readStep(reader: StepReader, z: Float64Array): number {
  const value = (s: StepReader['num']): number => {
    let v = 0;
    for (let q = 0; q < s.index.length; q++) v += s.factor[q] * z[s.index[q]];
    return v;
  };
  const num = value(reader.num);
  if (reader.den === null) return num;
  const den = value(reader.den);
  return den === 0 ? NaN : num / den;
}

/** out = M·z for the slot values m (E or F). */
export function multiply(system: DescriptorSystem, m: Float64Array, z: Float64Array, out: Float64Array): void {
  out.fill(0);
  const { rows, cols } = system;
  for (let s = 0; s < rows.length; s++) out[rows[s]] += m[s] * z[cols[s]];
}
