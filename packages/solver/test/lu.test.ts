/**
 * The complex LU kernels on their own: A·x ≈ b invariants, dense against sparse, both
 * against mathjs `lusolve` (mathjs lusolve, a general-purpose reference library), scaling
 * across many decades, and singular matrices judged by a relative tolerance.
 */
import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { DenseLU, DenseSolver, denseLU } from '../src/dense.js';
import { SparseSolver } from '../src/sparse.js';
import type { LinearSolver } from '../src/numeric.js';

/** A deterministic generator (mulberry32), so failures reproduce. */
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

interface Slots {
  n: number;
  rows: Int32Array;
  cols: Int32Array;
  re: Float64Array;
  im: Float64Array;
  scaleCol: number[];
}

/** A random sparse complex matrix with a strong but not dominant diagonal and some zero diagonals. */
function randomSlots(n: number, density: number, seed: number, spread = 0): Slots {
  const r = rng(seed);
  const rows: number[] = [];
  const cols: number[] = [];
  const re: number[] = [];
  const im: number[] = [];
  const scaleRow = Array.from({ length: n }, () => Math.pow(10, spread * (r() - 0.5)));
  const scaleCol = Array.from({ length: n }, () => Math.pow(10, spread * (r() - 0.5)));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const diag = i === j;
      // Every 7th diagonal is structurally zero, like the branch rows of MNA.
      if (diag && i % 7 === 3) continue;
      if (!diag && r() > density && j !== (i + 1) % n) continue;
      rows.push(i);
      cols.push(j);
      const mag = diag ? 2 + r() : r() - 0.5;
      re.push(mag * scaleRow[i] * scaleCol[j]);
      im.push((r() - 0.5) * scaleRow[i] * scaleCol[j]);
    }
  }
  return { n, rows: Int32Array.from(rows), cols: Int32Array.from(cols), re: Float64Array.from(re), im: Float64Array.from(im), scaleCol };
}

function multiply(s: Slots, xr: Float64Array, xi: Float64Array): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(s.n);
  const im = new Float64Array(s.n);
  for (let k = 0; k < s.rows.length; k++) {
    const a = s.re[k];
    const b = s.im[k];
    re[s.rows[k]] += a * xr[s.cols[k]] - b * xi[s.cols[k]];
    im[s.rows[k]] += a * xi[s.cols[k]] + b * xr[s.cols[k]];
  }
  return { re, im };
}

function solveWith(solver: LinearSolver, s: Slots, br: Float64Array, bi: Float64Array) {
  const f = solver.factor(s.re, s.im);
  const xr = new Float64Array(s.n);
  const xi = new Float64Array(s.n);
  f.solve(br, bi, xr, xi);
  return { f, xr, xi };
}

/** max |a − b| / max |b| */
function relErr(ar: Float64Array, ai: Float64Array, br: ArrayLike<number>, bi: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let k = 0; k < ar.length; k++) {
    num = Math.max(num, Math.hypot(ar[k] - br[k], ai[k] - bi[k]));
    den = Math.max(den, Math.hypot(br[k], bi[k]));
  }
  return num / den;
}

describe('dense and sparse complex LU', () => {
  for (const [n, seed] of [
    [5, 1],
    [12, 2],
    [40, 3],
    [90, 4],
  ] as const) {
    it(`agree with each other and satisfy A·x ≈ b (n = ${n})`, () => {
      const s = randomSlots(n, 0.15, seed);
      const r = rng(seed + 100);
      const br = Float64Array.from({ length: n }, () => r() - 0.5);
      const bi = Float64Array.from({ length: n }, () => r() - 0.5);
      const dense = solveWith(new DenseSolver(n, s.rows, s.cols), s, br, bi);
      const sparse = solveWith(new SparseSolver(n, s.rows, s.cols), s, br, bi);
      expect(dense.f.singular).toBe(false);
      expect(sparse.f.singular).toBe(false);
      expect(relErr(sparse.xr, sparse.xi, dense.xr, dense.xi)).toBeLessThan(1e-10);
      const ax = multiply(s, dense.xr, dense.xi);
      expect(relErr(ax.re, ax.im, br, bi)).toBeLessThan(1e-12);
      const ax2 = multiply(s, sparse.xr, sparse.xi);
      expect(relErr(ax2.re, ax2.im, br, bi)).toBeLessThan(1e-12);
    });
  }

  it('agree with mathjs lusolve (mathjs lusolve, a general-purpose reference library)', () => {
    for (const seed of [11, 12, 13]) {
      const n = 15;
      const s = randomSlots(n, 0.3, seed);
      const r = rng(seed);
      const br = Float64Array.from({ length: n }, () => r() - 0.5);
      const bi = Float64Array.from({ length: n }, () => r() - 0.5);
      const rows: math.Complex[][] = Array.from({ length: n }, () => Array.from({ length: n }, () => math.complex(0, 0)));
      for (let k = 0; k < s.rows.length; k++) rows[s.rows[k]][s.cols[k]] = math.complex(s.re[k], s.im[k]);
      const b = Array.from({ length: n }, (_, i) => [math.complex(br[i], bi[i])]);
      const ref = math.lusolve(math.matrix(rows), math.matrix(b)).toArray() as unknown as math.Complex[][];
      const rr = Float64Array.from(ref, (v) => math.complex(v[0]).re);
      const ri = Float64Array.from(ref, (v) => math.complex(v[0]).im);
      const dense = solveWith(new DenseSolver(n, s.rows, s.cols), s, br, bi);
      const sparse = solveWith(new SparseSolver(n, s.rows, s.cols), s, br, bi);
      expect(relErr(dense.xr, dense.xi, rr, ri)).toBeLessThan(1e-10);
      expect(relErr(sparse.xr, sparse.xi, rr, ri)).toBeLessThan(1e-10);
    }
  });

  it('keep every component accurate when rows and columns span 24 decades (equilibration)', () => {
    // Like a network with 1e-15 F next to 1e12 Ω: the unknowns differ by as many decades as
    // the columns (volts beside amps), and each must come out to full relative accuracy.
    const n = 30;
    const s = randomSlots(n, 0.2, 7, 24);
    const r = rng(8);
    const xr = Float64Array.from({ length: n }, (_, j) => (0.5 + r()) / s.scaleCol[j]);
    const xi = Float64Array.from({ length: n }, (_, j) => (r() - 0.5) / s.scaleCol[j]);
    const b = multiply(s, xr, xi);
    for (const solver of [new DenseSolver(n, s.rows, s.cols), new SparseSolver(n, s.rows, s.cols)]) {
      const got = solveWith(solver, s, b.re, b.im);
      expect(got.f.singular).toBe(false);
      for (let j = 0; j < n; j++) {
        expect(Math.hypot(got.xr[j] - xr[j], got.xi[j] - xi[j]) / Math.hypot(xr[j], xi[j])).toBeLessThan(1e-10);
      }
    }
  });

  it('factor once, solve many: one factorisation serves several right-hand sides', () => {
    const n = 8;
    const a = new Float64Array(n * n);
    const ai = new Float64Array(n * n);
    const r = rng(3);
    for (let k = 0; k < n * n; k++) {
      a[k] = r() - 0.5;
      ai[k] = r() - 0.5;
    }
    const lu = denseLU(n, a, ai);
    for (let t = 0; t < 3; t++) {
      const br = Float64Array.from({ length: n }, () => r());
      const bi = Float64Array.from({ length: n }, () => r());
      const xr = new Float64Array(n);
      const xi = new Float64Array(n);
      lu.solve(br, bi, xr, xi);
      for (let i = 0; i < n; i++) {
        let sr = 0;
        let si = 0;
        for (let j = 0; j < n; j++) {
          sr += a[i * n + j] * xr[j] - ai[i * n + j] * xi[j];
          si += a[i * n + j] * xi[j] + ai[i * n + j] * xr[j];
        }
        expect(Math.hypot(sr - br[i], si - bi[i])).toBeLessThan(1e-13);
      }
    }
  });

  it('call a matrix singular by a relative test, at any scale, and fill NaN', () => {
    for (const scale of [1e-30, 1, 1e30]) {
      // Row 2 = row 0 + row 1, exactly representable.
      const a = [1, 2, 0, 3, 1, 1, 4, 3, 1].map((v) => v * scale);
      const lu = new DenseLU(3).factor(a, new Float64Array(9));
      expect(lu.singular).toBe(true);
      const x = new Float64Array(3);
      lu.solve(Float64Array.of(1, 1, 1), new Float64Array(3), x, new Float64Array(3));
      expect(Number.isNaN(x[0])).toBe(true);
      const rows = Int32Array.of(0, 0, 1, 1, 1, 2, 2, 2);
      const cols = Int32Array.of(0, 1, 0, 1, 2, 0, 1, 2);
      const vals = Float64Array.from([1, 2, 3, 1, 1, 4, 3, 1].map((v) => v * scale));
      expect(new SparseSolver(3, rows, cols).factor(vals, new Float64Array(8)).singular).toBe(true);
    }
    // Tiny but regular: not singular.
    const tiny = new DenseLU(2).factor([1e-200, 0, 0, 1e-250], [0, 0, 0, 0]);
    expect(tiny.singular).toBe(false);
  });

  it('sparse refactor reuses its pivot sequence across values and re-pivots when a pivot vanishes', () => {
    const n = 70;
    const s = randomSlots(n, 0.05, 21);
    const solver = new SparseSolver(n, s.rows, s.cols);
    const r = rng(22);
    const br = Float64Array.from({ length: n }, () => r() - 0.5);
    const bi = new Float64Array(n);
    solveWith(solver, s, br, bi);
    expect(solver.orderings).toBe(1);
    // Perturb the values slightly: the same ordering serves.
    const s2 = { ...s, re: s.re.map((v) => v * (1 + 0.01 * (r() - 0.5))) };
    const got = solveWith(solver, s2, br, bi);
    expect(solver.orderings).toBe(1);
    const ax = multiply(s2, got.xr, got.xi);
    expect(relErr(ax.re, ax.im, br, bi)).toBeLessThan(1e-12);
    // Zero every value the first pivot sequence relied on in one row: a new ordering is made.
    const s3 = { ...s, re: Float64Array.from(s.re), im: Float64Array.from(s.im) };
    for (let k = 0; k < s.rows.length; k++) {
      if (s.rows[k] === s.cols[k] && s.rows[k] % 7 !== 3) {
        s3.re[k] = 1e-9;
        s3.im[k] = 0;
      }
    }
    const got3 = solveWith(solver, s3, br, bi);
    if (!got3.f.singular) {
      const ax3 = multiply(s3, got3.xr, got3.xi);
      expect(relErr(ax3.re, ax3.im, br, bi)).toBeLessThan(1e-10);
      expect(solver.orderings).toBeGreaterThan(1);
    }
  });
});
