/**
 * The default window of a step trace: about ten times the network's slowest time constant.
 * The slowest natural frequencies are the eigenvalues s of (s·E + F)·v = 0 nearest 0, so
 * they are the largest of μ = 1/(σ − s) for the operator (F + σ·E)⁻¹·E, which a few Arnoldi
 * steps from the drive's own direction find (so only modes the drive excites count). The
 * small shift σ, far below any rate of the network, lets a network that integrates the drive
 * (a capacitor charged by a current, F singular) be factored; its modes at s = 0 are then
 * left out, since they never settle.
 */
import { createLinearSolver } from './linear-solver.js';
import type { DescriptorSystem } from './time-system.js';
import { multiply } from './time-system.js';

/** Arnoldi steps: the slowest few modes converge first. */
const KRYLOV = 12;
/** The shift, as a fraction of the network's largest rate |F|/|E|. */
const SHIFT = 1e-9;
/** A mode this close to s = 0 (in units of the shift) integrates rather than decays. */
const ZERO_MODE = 10;
/** A Ritz value μ below this fraction of the largest is a mode at s = ∞. */
const INFINITE_MODE = 1e-9;
/** A lightly damped mode counts with at most this many of its periods (÷ 2π) as its time constant. */
const MAX_Q_TIME = 100;

/**
 * The slowest time constant the drive excites, in s (null for a network without one: all
 * resistive, or nothing but integrators), and whether a mode it excites grows.
 */
export function naturalTime(system: DescriptorSystem): { tau: number | null; growing: boolean } {
  const none = { tau: null, growing: false };
  const { n, e, f, rows, cols } = system;
  let maxE = 0;
  let maxF = 0;
  for (let s = 0; s < e.length; s++) {
    maxE = Math.max(maxE, Math.abs(e[s]));
    maxF = Math.max(maxF, Math.abs(f[s]));
  }
  if (maxE === 0 || maxF === 0) return none;
  const sigma = (SHIFT * maxF) / maxE;
  const val = new Float64Array(e.length);
  for (let s = 0; s < e.length; s++) val[s] = f[s] + sigma * e[s];
  const fact = createLinearSolver(n, rows, cols).factor(val, new Float64Array(e.length));
  if (fact.singular) return none;
  const zero = new Float64Array(n);
  const im = new Float64Array(n);
  const apply = (v: Float64Array): Float64Array => {
    const ev = new Float64Array(n);
    multiply(system, e, v, ev);
    const out = new Float64Array(n);
    fact.solve(ev, zero, out, im);
    return out;
  };
  const start = new Float64Array(n);
  fact.solve(system.b, zero, start, im);
  const mu = ritzValues(apply, apply(start), Math.min(KRYLOV, n));
  let slowest: number | null = null;
  let growing = false;
  // μ ≈ 0 is s = ∞: an algebraic unknown, not a mode (rounding gives it any sign).
  const largest = mu.reduce((a, m) => Math.max(a, Math.hypot(m.re, m.im)), 0);
  for (const m of mu) {
    const size = m.re * m.re + m.im * m.im;
    if (!(Math.sqrt(size) > INFINITE_MODE * largest)) continue;
    // s = σ − 1/μ
    const re = sigma - m.re / size;
    const im2 = m.im / size;
    const mag = Math.hypot(re, im2);
    if (mag < ZERO_MODE * sigma) continue;
    if (re > 0) growing = true;
    const tau = 1 / Math.max(Math.abs(re), mag / MAX_Q_TIME);
    if (slowest === null || tau > slowest) slowest = tau;
  }
  return { tau: slowest, growing };
}

interface Complex {
  re: number;
  im: number;
}

/** The eigenvalues of the Arnoldi matrix of `apply` from `start` (at most m steps). */
function ritzValues(apply: (v: Float64Array) => Float64Array, start: Float64Array, m: number): Complex[] {
  const norm = (v: Float64Array): number => Math.sqrt(v.reduce((a, x) => a + x * x, 0));
  const first = norm(start);
  if (!(first > 0) || !Number.isFinite(first)) return [];
  const basis = [start.map((x) => x / first)];
  const h: number[][] = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  let size = m;
  for (let j = 0; j < m; j++) {
    const w = apply(basis[j]);
    for (let i = 0; i <= j; i++) {
      const v = basis[i];
      let dot = 0;
      for (let k = 0; k < w.length; k++) dot += v[k] * w[k];
      h[i][j] = dot;
      for (let k = 0; k < w.length; k++) w[k] -= dot * v[k];
    }
    const next = norm(w);
    let scale = 0;
    for (let i = 0; i <= j; i++) scale = Math.max(scale, Math.abs(h[i][j]));
    if (j + 1 === m || !(next > 1e-12 * scale)) {
      size = j + 1;
      break;
    }
    h[j + 1][j] = next;
    basis.push(w.map((x) => x / next));
  }
  let scale = 0;
  for (let i = 0; i < size; i++) for (let j = 0; j < size; j++) scale = Math.max(scale, Math.abs(h[i][j]));
  if (!(scale > 0)) return [];
  const scaled = h.slice(0, size).map((row) => row.slice(0, size).map((x) => x / scale));
  return polynomialRoots(hessenbergPolynomial(scaled)).map((r) => ({ re: r.re * scale, im: r.im * scale }));
}

/** det(x·I − H) of an upper Hessenberg matrix, coefficients in ascending powers (monic). */
function hessenbergPolynomial(h: number[][]): number[] {
  const m = h.length;
  const p: number[][] = [[1]];
  for (let k = 1; k <= m; k++) {
    // (x − h[k−1][k−1])·p[k−1]
    const prev = p[k - 1];
    const next = new Array<number>(k + 1).fill(0);
    for (let d = 0; d < prev.length; d++) {
      next[d + 1] += prev[d];
      next[d] -= h[k - 1][k - 1] * prev[d];
    }
    let product = 1;
    for (let i = k - 1; i >= 1; i--) {
      product *= h[i][i - 1];
      const c = h[i - 1][k - 1] * product;
      const q = p[i - 1];
      for (let d = 0; d < q.length; d++) next[d] -= c * q[d];
    }
    p.push(next);
  }
  return p[m];
}

/** Every root of a monic polynomial (ascending coefficients), by the Durand–Kerner iteration. */
function polynomialRoots(c: number[]): Complex[] {
  const m = c.length - 1;
  if (m < 1) return [];
  let bound = 1;
  for (let d = 0; d < m; d++) bound = Math.max(bound, 1 + Math.abs(c[d]));
  const roots: Complex[] = Array.from({ length: m }, (_, k) => {
    const a = (2 * Math.PI * k) / m + 0.4;
    return { re: 0.5 * bound * Math.cos(a), im: 0.5 * bound * Math.sin(a) };
  });
  for (let iter = 0; iter < 500; iter++) {
    let moved = 0;
    for (let k = 0; k < m; k++) {
      const z = roots[k];
      // p(z) by Horner.
      let pr = 1;
      let pi = 0;
      for (let d = m - 1; d >= 0; d--) {
        const r = pr * z.re - pi * z.im + c[d];
        pi = pr * z.im + pi * z.re;
        pr = r;
      }
      // Π (z − z_j), j ≠ k
      let qr = 1;
      let qi = 0;
      for (let j = 0; j < m; j++) {
        if (j === k) continue;
        const dr = z.re - roots[j].re;
        const di = z.im - roots[j].im;
        const r = qr * dr - qi * di;
        qi = qr * di + qi * dr;
        qr = r;
      }
      const den = qr * qr + qi * qi;
      if (!(den > 0)) continue;
      const sr = (pr * qr + pi * qi) / den;
      const si = (pi * qr - pr * qi) / den;
      z.re -= sr;
      z.im -= si;
      moved = Math.max(moved, Math.hypot(sr, si));
    }
    if (moved < 1e-14) break;
  }
  return roots;
}
