/**
 * Random networks: the dense and the sparse path agree to 1e-10 relative on every trace, and
 * the assembled MNA system solved by either agrees with mathjs `lusolve` (mathjs lusolve, a
 * general-purpose reference library) and satisfies A·x ≈ b.
 */
import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { solveCircuit } from '../src/analysis.js';
import { assemble, buildMna } from '../src/mna.js';
import { DenseSolver } from '../src/dense.js';
import { SparseSolver } from '../src/sparse.js';
import type { Circuit } from '../src/circuit.js';
import { net } from './helpers/net.js';

function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A connected random network of R, C (some with esr/esl), L (some coupled), controlled sources and op-amps. */
function randomNetwork(seed: number, nodes: number): Circuit {
  const r = rng(seed);
  const n = net();
  const name = (k: number): string => (k === 0 ? 'gnd' : `n${k}`);
  const pick = (): number => Math.floor(r() * (nodes + 1));
  const decade = (lo: number, hi: number): number => Math.pow(10, lo + (hi - lo) * r());
  n.vdrive('n1');
  // A spanning tree of resistors keeps every node tied to ground.
  for (let k = 2; k <= nodes; k++) n.R(`Rt${k}`, name(k), name(Math.floor(r() * (k - 1)) + 1), decade(1, 5));
  n.R('Rg', name(nodes), 'gnd', decade(2, 4));
  let li = 0;
  let ccvs = false;
  for (let e = 0; e < nodes * 2; e++) {
    let a = pick();
    let b = pick();
    if (a === b) b = (a + 1) % (nodes + 1);
    if (a === 0 && b === 0) a = 1;
    const kind = r();
    if (kind < 0.3) n.R(`R${e}`, name(a), name(b), decade(1, 6));
    else if (kind < 0.6) n.C(`C${e}`, name(a), name(b), decade(-10, -6), r() < 0.3 ? decade(-2, 1) : 0, r() < 0.2 ? decade(-9, -7) : 0);
    else if (kind < 0.8) {
      n.L(`L${li}`, name(a), name(b), decade(-5, -2), r() < 0.5 ? decade(-1, 1) : 0);
      if (li > 0 && r() < 0.5) n.couple(`L${li - 1}`, `L${li}`, 0.2 + 0.7 * r());
      li++;
    } else if (kind < 0.85) n.vccs(`G${e}`, name(a), name(b), name(pick()), name(pick()), decade(-5, -3));
    else if (kind < 0.9) n.cccs(`F${e}`, name(a), name(b), 'Rg', 0.5 * r());
    else if (kind < 0.95 && !ccvs && a !== 0) {
      // One transresistance only: two voltage sources across one node pair would be a loop.
      n.ccvs(`H${e}`, name(a), 'gnd', 'Rt2', decade(0, 2));
      ccvs = true;
    }
  }
  // One buffered output through a one-pole op-amp.
  n.opamp('U1', name(nodes), 'fb', 'o', { gain: 1e5, gbw: 1e7, zout: 10 });
  n.R('Rf', 'o', 'fb', 1e4).R('Ri', 'fb', 'gnd', 1e3).R('Ro', 'o', 'gnd', 1e4);
  for (let k = 1; k <= nodes; k += Math.max(1, Math.floor(nodes / 4))) n.v(`v${k}`, name(k));
  n.v('out', 'o').i('iRg', 'Rg');
  n.at(0.3, 10, 1e3, 5e4, 1e6);
  return n.build();
}

describe('dense and sparse paths on random networks', { timeout: 30_000 }, () => {
  for (const [seed, nodes] of [
    [1, 6],
    [2, 10],
    [3, 25],
    [4, 40],
    [9, 80],
    [10, 120],
  ] as const) {
    it(`agree to 1e-10 relative (seed ${seed}, ${nodes} nodes)`, () => {
      const c = randomNetwork(seed, nodes);
      const d = solveCircuit(c, { linearSolver: 'dense' });
      const s = solveCircuit(c, { linearSolver: 'sparse' });
      expect(d.diagnostics).toEqual([]);
      expect(s.diagnostics).toEqual([]);
      expect(d.analysis!.evaluator.solver.kind).toBe('dense');
      expect(s.analysis!.evaluator.solver.kind).toBe('sparse');
      const dt = d.analysis!.traces;
      const st = s.analysis!.traces;
      let compared = 0;
      for (let t = 0; t < dt.length; t++) {
        for (let k = 0; k < dt[t].result.re.length; k++) {
          const ar = dt[t].result.re[k];
          const ai = dt[t].result.im[k];
          const br = st[t].result.re[k];
          const bi = st[t].result.im[k];
          const scale = Math.hypot(ar, ai);
          if (!(scale > 1e-12)) continue;
          expect(Math.hypot(ar - br, ai - bi) / scale).toBeLessThan(1e-10);
          // the derivative (group delay) too
          // ω·dH/dω is on the scale of H; compare it there (an exact 0 derivative stays comparable).
          const w = 2 * Math.PI * d.analysis!.frequencies[k];
          const ds = scale + w * Math.hypot(dt[t].dRe[k], dt[t].dIm[k]);
          expect((w * Math.hypot(dt[t].dRe[k] - st[t].dRe[k], dt[t].dIm[k] - st[t].dIm[k])) / ds).toBeLessThan(1e-9);
          compared++;
        }
      }
      expect(compared).toBeGreaterThan(10);
    });
  }

  it('the assembled MNA systems agree with mathjs lusolve, and A·x ≈ b (mathjs lusolve, a general-purpose reference library)', () => {
    for (const seed of [7, 8]) {
      const c = randomNetwork(seed, 8);
      const sys = buildMna(c).system!;
      const n = sys.n;
      for (const f of [1, 1e3, 1e6]) {
        const re = new Float64Array(sys.rows.length);
        const im = new Float64Array(sys.rows.length);
        assemble(sys, 2 * Math.PI * f, re, im);
        const rows: math.Complex[][] = Array.from({ length: n }, () => Array.from({ length: n }, () => math.complex(0, 0)));
        for (let k = 0; k < sys.rows.length; k++)
          rows[sys.rows[k]][sys.cols[k]] = math.add(rows[sys.rows[k]][sys.cols[k]], math.complex(re[k], im[k])) as math.Complex;
        const br = new Float64Array(n);
        for (let k = 0; k < sys.driveRhs!.index.length; k++) br[sys.driveRhs!.index[k]] = sys.driveRhs!.value[k];
        const ref = math.lusolve(math.matrix(rows), math.matrix(Array.from(br, (v) => [math.complex(v, 0)]))).toArray() as unknown as math.Complex[][];
        for (const solver of [new DenseSolver(n, sys.rows, sys.cols), new SparseSolver(n, sys.rows, sys.cols)]) {
          const fact = solver.factor(re, im);
          const xr = new Float64Array(n);
          const xi = new Float64Array(n);
          fact.solve(br, new Float64Array(n), xr, xi);
          let err = 0;
          let size = 0;
          for (let i = 0; i < n; i++) {
            const v = math.complex(ref[i][0]);
            err = Math.max(err, Math.hypot(xr[i] - v.re, xi[i] - v.im));
            size = Math.max(size, Math.hypot(v.re, v.im));
          }
          expect(err / size).toBeLessThan(1e-9);
          // residual, row by row, relative to the row's size
          const rr = new Float64Array(n);
          const ri = new Float64Array(n);
          const rs = new Float64Array(n);
          for (let k = 0; k < sys.rows.length; k++) {
            const i = sys.rows[k];
            const j = sys.cols[k];
            rr[i] += re[k] * xr[j] - im[k] * xi[j];
            ri[i] += re[k] * xi[j] + im[k] * xr[j];
            rs[i] += Math.hypot(re[k], im[k]) * Math.hypot(xr[j], xi[j]);
          }
          for (let i = 0; i < n; i++) expect(Math.hypot(rr[i] - br[i], ri[i]) / Math.max(rs[i], Math.abs(br[i]))).toBeLessThan(1e-12);
        }
      }
    }
  });

  it('a large ladder goes sparse and matches the dense path; its pivot sequence is made once for the whole sweep', () => {
    const n = net().vdrive('n0');
    for (let k = 0; k < 150; k++) n.R(`R${k}`, `n${k}`, `n${k + 1}`, 1e3).C(`C${k}`, `n${k + 1}`, 'gnd', 1e-9);
    n.v('end', 'n150').v('mid', 'n75');
    n.log(0.1, 1e7, 10);
    const c = n.build();
    const s = solveCircuit(c);
    const d = solveCircuit(c, { linearSolver: 'dense' });
    const solver = s.analysis!.evaluator.solver;
    expect(solver.kind).toBe('sparse');
    expect((solver as SparseSolver).orderings).toBe(1);
    for (let t = 0; t < 2; t++) {
      for (let k = 0; k < s.analysis!.frequencies.length; k++) {
        const a = s.analysis!.traces[t].result;
        const b = d.analysis!.traces[t].result;
        const m = Math.hypot(b.re[k], b.im[k]);
        if (m < 1e-200) continue;
        expect(Math.hypot(a.re[k] - b.re[k], a.im[k] - b.im[k]) / m).toBeLessThan(1e-10);
      }
    }
  });

  it('a pivot sequence made at 100 kHz goes bad at 0 Hz: the sparse LU re-pivots (never a false "singular") and keeps both sequences', () => {
    const n = net().vdrive('n0');
    for (let k = 0; k < 30; k++) n.R(`R${k}`, `n${k}`, `n${k + 1}`, 1e3).C(`C${k}`, `n${k + 1}`, 'gnd', 1e-6);
    n.C('Cx', 'n30', 'x', 1e-6).C('Cy', 'x', 'y', 1e-6).R('Ry', 'y', 'gnd', 1e3).L('Lx', 'x', 'gnd', 1e-3);
    const sys = buildMna(n.build()).system!;
    const sparse = new SparseSolver(sys.n, sys.rows, sys.cols);
    const dense = new DenseSolver(sys.n, sys.rows, sys.cols);
    const re = new Float64Array(sys.rows.length);
    const im = new Float64Array(sys.rows.length);
    const b = new Float64Array(sys.n);
    b[sys.driveRhs!.index[0]] = 1;
    const zero = new Float64Array(sys.n);
    for (const f of [1e5, 0, 1e5, 0, 10]) {
      assemble(sys, 2 * Math.PI * f, re, im);
      const fs = sparse.factor(re, im);
      expect(fs.singular).toBe(false);
      const xs = [new Float64Array(sys.n), new Float64Array(sys.n)];
      fs.solve(b, zero, xs[0], xs[1]);
      const xd = [new Float64Array(sys.n), new Float64Array(sys.n)];
      dense.factor(re, im).solve(b, zero, xd[0], xd[1]);
      for (let i = 0; i < sys.n; i++) expect(Math.abs(xs[0][i] - xd[0][i]) + Math.abs(xs[1][i] - xd[1][i])).toBeLessThan(1e-12);
    }
    expect(sparse.orderings).toBe(2);
  });

  it('the sparse path re-pivots at 0 Hz, where capacitor entries vanish, and stays exact', () => {
    // Nodes tied only by capacitors at the end of a long chain: at 0 Hz their columns change.
    const n = net().vdrive('n0');
    for (let k = 0; k < 80; k++) n.R(`R${k}`, `n${k}`, `n${k + 1}`, 1e3).C(`C${k}`, `n${k + 1}`, 'gnd', 1e-9);
    n.C('Cx', 'n80', 'x', 1e-9).C('Cy', 'x', 'y', 1e-9).R('Ry', 'y', 'gnd', 1e3).L('Lx', 'x', 'gnd', 1e-3);
    n.v('y', 'y').v('n80', 'n80');
    n.sweep = { kind: 'linear', from: 0, to: 1e5, points: 11 };
    const c = n.build();
    const s = solveCircuit(c, { linearSolver: 'sparse' });
    const d = solveCircuit(c, { linearSolver: 'dense' });
    expect(s.diagnostics).toEqual([]);
    for (let t = 0; t < 2; t++) {
      const a = s.analysis!.traces[t].result;
      const b = d.analysis!.traces[t].result;
      for (let k = 0; k < a.re.length; k++) {
        const m = Math.hypot(b.re[k], b.im[k]);
        if (m === 0) expect(Math.hypot(a.re[k], a.im[k])).toBeLessThan(1e-15);
        else expect(Math.hypot(a.re[k] - b.re[k], a.im[k] - b.im[k]) / m).toBeLessThan(1e-10);
      }
    }
  });
});
