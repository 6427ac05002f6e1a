/**
 * A transfer-function source in the nodal matrix, whose entries are at most quadratic in
 * s: H(s) = N(s)/D(s) is realised in controllable canonical form. With σ = s/ω0 and
 * m = max(deg N, deg D), states w_k = σ^k·w_0 (k < m) carry the powers, D(σ)·w_0 is the
 * controlling voltage and N(σ)·w_0 the output; each row is linear in s. ω0 is chosen so
 * that D's lowest and highest coefficients are alike, which keeps the rows balanced.
 */
import type { TransferSource } from './circuit.js';

type Add = (row: number, col: number, k0: number, k1?: number) => void;

/** The count of unknowns the source needs: max(m, 1) states, then its output current. */
export function transferUnknowns(el: TransferSource): number {
  return Math.max(el.num.length, el.den.length, 2);
}

/** The frequency scale ω0 of a polynomial: |c_low/c_high|^(1/(high − low)) over its non-zero coefficients, else 1. */
function scaleOf(p: number[]): number {
  const nonzero = p.map((c, k) => (c !== 0 ? k : -1)).filter((k) => k >= 0);
  if (nonzero.length < 2) return 1;
  const lo = nonzero[0];
  const hi = nonzero[nonzero.length - 1];
  const w = Math.abs(p[lo] / p[hi]) ** (1 / (hi - lo));
  return Number.isFinite(w) && w > 0 ? w : 1;
}

/**
 * Stamps the source; `first` is its first unknown (states from there, the output current
 * last). `u` maps a circuit node to its unknown (−1 for ground).
 */
export function stampTransfer(el: TransferSource, first: number, add: Add, u: (node: number) => number): void {
  const states = transferUnknowns(el) - 1;
  const w0 = scaleOf(el.den.length > 1 ? el.den : el.num);
  const scaled = (p: number[]) => p.map((c, k) => c * w0 ** k);
  const d = scaled(el.den);
  const n = scaled(el.num);
  const big = Math.max(...d.map(Math.abs));
  const w = (k: number) => first + k;
  const io = first + states;
  // Σ c_k·σ^k·w_0: the states below m, and σ·w_{m−1} for the top power.
  const poly = (row: number, c: number[], sign: number) =>
    c.forEach((ck, k) => {
      if (k < states) add(row, w(k), (sign * ck) / big);
      else add(row, w(states - 1), 0, (sign * ck) / big / w0);
    });
  for (let k = 1; k < states; k++) {
    add(w(k), w(k), 1);
    add(w(k), w(k - 1), 0, -1 / w0);
  }
  // D(σ)·w_0 = V(cp) − V(cn)
  poly(w(0), d, 1);
  add(w(0), u(el.cp), -1 / big);
  add(w(0), u(el.cn), 1 / big);
  // V(op) − V(on) = N(σ)·w_0, the output current leaving at op.
  add(u(el.op), io, -1);
  add(u(el.on), io, 1);
  add(io, u(el.op), 1);
  add(io, u(el.on), -1);
  poly(io, n, -big);
}
