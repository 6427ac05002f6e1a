/**
 * What the dense and sparse complex LU kernels share: the factorisation interface and the
 * tolerances that decide when a pivot is too small.
 */

/**
 * A pivot of the equilibrated matrix (every row and column scaled to a largest entry of 1)
 * whose whole remaining row or column is below this size means the matrix is singular.
 * Relative by construction, never a test for `=== 0`.
 */
export const SINGULAR_TOLERANCE = 1e-13;

/** A factorised matrix, reused for as many right-hand sides as needed. */
export interface Factorization {
  readonly n: number;
  /** True when the matrix is singular to working precision; `solve` then fills NaN. */
  readonly singular: boolean;
  /** x = A⁻¹·b for the matrix last factored. b and x must not be the same arrays. */
  solve(bRe: Float64Array, bIm: Float64Array, xRe: Float64Array, xIm: Float64Array): void;
}

/**
 * A solver bound to one sparsity pattern: slot k of every values array sits at
 * (rows[k], cols[k]). Each `factor` call returns a factorisation that stays valid until the
 * next `factor` call on the same solver.
 */
export interface LinearSolver {
  readonly n: number;
  readonly kind: 'dense' | 'sparse';
  factor(valRe: Float64Array, valIm: Float64Array): Factorization;
}

/**
 * Row-then-column equilibration factors for a matrix given as slots: afterwards every row
 * and every column of R·A·C has a largest entry (by |re| + |im|) of exactly 1. Empty rows
 * and columns get the factor 1.
 */
export function equilibrate(
  n: number,
  rows: Int32Array,
  cols: Int32Array,
  valRe: Float64Array,
  valIm: Float64Array,
  rowScale: Float64Array,
  colScale: Float64Array,
): void {
  rowScale.fill(0, 0, n);
  colScale.fill(0, 0, n);
  const nnz = rows.length;
  for (let k = 0; k < nnz; k++) {
    const m = Math.abs(valRe[k]) + Math.abs(valIm[k]);
    const r = rows[k];
    if (m > rowScale[r]) rowScale[r] = m;
  }
  for (let i = 0; i < n; i++) rowScale[i] = rowScale[i] > 0 && Number.isFinite(rowScale[i]) ? 1 / rowScale[i] : 1;
  for (let k = 0; k < nnz; k++) {
    const m = (Math.abs(valRe[k]) + Math.abs(valIm[k])) * rowScale[rows[k]];
    const c = cols[k];
    if (m > colScale[c]) colScale[c] = m;
  }
  for (let j = 0; j < n; j++) colScale[j] = colScale[j] > 0 && Number.isFinite(colScale[j]) ? 1 / colScale[j] : 1;
}
