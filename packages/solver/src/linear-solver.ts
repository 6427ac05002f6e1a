/** Chooses the dense or the sparse complex LU for a network's pattern, by size. */
import { DenseSolver } from './dense.js';
import { SparseSolver } from './sparse.js';
import type { LinearSolver } from './numeric.js';

/**
 * Up to this many unknowns the dense kernel (partial pivoting at every frequency) is used.
 * MNA matrices are so sparse that the sparse LU already wins from about 10 unknowns
 * (BENCHMARKS.md), so only the smallest networks stay dense.
 */
export const DENSE_LIMIT = 8;

/** A solver for an n×n pattern given as slots (rows[k], cols[k]). */
export function createLinearSolver(n: number, rows: Int32Array, cols: Int32Array, kind: 'auto' | 'dense' | 'sparse' = 'auto'): LinearSolver {
  const useDense = kind === 'dense' || (kind === 'auto' && n <= DENSE_LIMIT);
  return useDense ? new DenseSolver(n, rows, cols) : new SparseSolver(n, rows, cols);
}
