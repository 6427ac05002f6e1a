/**
 * Sparse complex LU for large networks.
 *
 * Once per network (and again only when a pivot goes bad): a Markowitz ordering with
 * threshold pivoting, chosen on the numeric values at one frequency, and the symbolic
 * analysis of that pivot sequence (the filled row patterns of L and U). At every frequency:
 * a numeric refactorisation along the same pivot sequence and pattern (row-wise IKJ
 * elimination), which checks each pivot against its row. When a pivot falls below the
 * threshold at some frequency, a new Markowitz ordering is made from that frequency's
 * values and kept beside the old one, so a sweep settles on a few sequences.
 */
import { SINGULAR_TOLERANCE, equilibrate } from './numeric.js';
import type { Factorization, LinearSolver } from './numeric.js';
import { symbolicPlan } from './sparse-plan.js';
import type { Plan } from './sparse-plan.js';

/** Markowitz accepts a pivot of at least this fraction of its row's largest entry. */
const CHOOSE_THRESHOLD = 0.1;
/** A stored pivot sequence is reused while every pivot stays above this fraction. */
const ACCEPT_THRESHOLD = 1e-3;
/** Columns examined per Markowitz step once a candidate exists (Zlatev's restricted search). */
const SEARCH_COLUMNS = 4;
/** Pivot sequences kept per network. */
const MAX_PLANS = 4;

type Outcome = 'ok' | 'unstable' | 'singular';

/** Sparse LU bound to one pattern; see the module comment. */
export class SparseSolver implements LinearSolver {
  readonly kind = 'sparse' as const;
  readonly n: number;
  /** How many pivot sequences have been built (for tests and the bench). */
  orderings = 0;
  private readonly rows: Int32Array;
  private readonly cols: Int32Array;
  private readonly rowPtr: Int32Array;
  private readonly rowSlots: Int32Array;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;
  private readonly sRe: Float64Array;
  private readonly sIm: Float64Array;
  private readonly wRe: Float64Array;
  private readonly wIm: Float64Array;
  private plans: Plan[] = [];
  private readonly fact: SparseFactorization;

  constructor(n: number, rows: Int32Array, cols: Int32Array) {
    this.n = n;
    this.rows = rows;
    this.cols = cols;
    const nnz = rows.length;
    this.rowPtr = new Int32Array(n + 1);
    for (let k = 0; k < nnz; k++) this.rowPtr[rows[k] + 1]++;
    for (let i = 0; i < n; i++) this.rowPtr[i + 1] += this.rowPtr[i];
    this.rowSlots = new Int32Array(nnz);
    const fill = this.rowPtr.slice(0, n);
    for (let k = 0; k < nnz; k++) this.rowSlots[fill[rows[k]]++] = k;
    this.rowScale = new Float64Array(n);
    this.colScale = new Float64Array(n);
    this.sRe = new Float64Array(nnz);
    this.sIm = new Float64Array(nnz);
    this.wRe = new Float64Array(n);
    this.wIm = new Float64Array(n);
    this.fact = new SparseFactorization(n, this.rowScale, this.colScale);
  }

  factor(valRe: Float64Array, valIm: Float64Array): Factorization {
    const f = this.fact;
    f.plan = null;
    f.singular = true;
    const n = this.n;
    const rows = this.rows;
    const cols = this.cols;
    const nnz = rows.length;
    const rs = this.rowScale;
    const cs = this.colScale;
    const sRe = this.sRe;
    const sIm = this.sIm;
    equilibrate(n, rows, cols, valRe, valIm, rs, cs);
    for (let k = 0; k < nnz; k++) {
      const s = rs[rows[k]] * cs[cols[k]];
      const a = valRe[k] * s;
      const b = valIm[k] * s;
      // NaN or ±∞ anywhere makes this frequency singular.
      if (a - a !== 0 || b - b !== 0) return f;
      sRe[k] = a;
      sIm[k] = b;
    }
    for (let p = 0; p < this.plans.length; p++) {
      const plan = this.plans[p];
      const outcome = this.refactor(plan);
      if (outcome === 'singular') return f;
      if (outcome === 'ok') {
        if (p > 0) {
          this.plans.splice(p, 1);
          this.plans.unshift(plan);
        }
        f.plan = plan;
        f.singular = false;
        return f;
      }
    }
    const plan = this.order();
    if (plan === null) return f;
    this.plans.unshift(plan);
    if (this.plans.length > MAX_PLANS) this.plans.length = MAX_PLANS;
    // The sequence was chosen on these very values, so only singularity can stop it now.
    if (this.refactor(plan) === 'singular') return f;
    f.plan = plan;
    f.singular = false;
    return f;
  }

  /** Numeric IKJ elimination along a stored pivot sequence. */
  private refactor(plan: Plan): Outcome {
    const n = this.n;
    const { rowPerm, colInv, lPtr, lCol, uPtr, uCol, lRe, lIm, uRe, uIm, dRe, dIm } = plan;
    const wr = this.wRe;
    const wi = this.wIm;
    const sRe = this.sRe;
    const sIm = this.sIm;
    const cols = this.cols;
    const rowPtr = this.rowPtr;
    const rowSlots = this.rowSlots;
    for (let i = 0; i < n; i++) {
      const l0 = lPtr[i];
      const l1 = lPtr[i + 1];
      const u0 = uPtr[i];
      const u1 = uPtr[i + 1];
      for (let p = l0; p < l1; p++) {
        wr[lCol[p]] = 0;
        wi[lCol[p]] = 0;
      }
      for (let q = u0; q < u1; q++) {
        wr[uCol[q]] = 0;
        wi[uCol[q]] = 0;
      }
      const orig = rowPerm[i];
      for (let t = rowPtr[orig]; t < rowPtr[orig + 1]; t++) {
        const s = rowSlots[t];
        const c = colInv[cols[s]];
        wr[c] += sRe[s];
        wi[c] += sIm[s];
      }
      for (let p = l0; p < l1; p++) {
        const k = lCol[p];
        const ar = wr[k];
        const ai = wi[k];
        const lr = ar * dRe[k] - ai * dIm[k];
        const li = ar * dIm[k] + ai * dRe[k];
        lRe[p] = lr;
        lIm[p] = li;
        if (lr === 0 && li === 0) continue;
        for (let q = uPtr[k] + 1; q < uPtr[k + 1]; q++) {
          const j = uCol[q];
          const ur = uRe[q];
          const ui = uIm[q];
          wr[j] -= lr * ur - li * ui;
          wi[j] -= lr * ui + li * ur;
        }
      }
      let rowMax = 0;
      for (let q = u0; q < u1; q++) {
        const j = uCol[q];
        const m = Math.abs(wr[j]) + Math.abs(wi[j]);
        if (m > rowMax) rowMax = m;
        uRe[q] = wr[j];
        uIm[q] = wi[j];
      }
      if (!(rowMax >= SINGULAR_TOLERANCE)) return 'singular';
      const pr = uRe[u0];
      const pi = uIm[u0];
      const pm = Math.abs(pr) + Math.abs(pi);
      // Past a pivot that is too small the rest of the elimination means nothing, so no
      // verdict on singularity either: a new pivot sequence decides.
      if (pm < ACCEPT_THRESHOLD * rowMax) return 'unstable';
      const d = pr * pr + pi * pi;
      dRe[i] = pr / d;
      dIm[i] = -pi / d;
    }
    return 'ok';
  }

  /** Markowitz ordering with threshold pivoting on the current scaled values; null if singular. */
  private order(): Plan | null {
    this.orderings++;
    const n = this.n;
    const nnz = this.rows.length;
    let cap = Math.max(16, nnz * 2);
    let eRe = new Float64Array(cap);
    let eIm = new Float64Array(cap);
    let used = 0;
    const rowMap: Map<number, number>[] = new Array(n);
    const colMap: Map<number, number>[] = new Array(n);
    for (let i = 0; i < n; i++) {
      rowMap[i] = new Map();
      colMap[i] = new Map();
    }
    for (let k = 0; k < nnz; k++) {
      const r = this.rows[k];
      const c = this.cols[k];
      let e = rowMap[r].get(c);
      if (e === undefined) {
        e = used++;
        eRe[e] = 0;
        eIm[e] = 0;
        rowMap[r].set(c, e);
        colMap[c].set(r, e);
      }
      eRe[e] += this.sRe[k];
      eIm[e] += this.sIm[k];
    }
    // Columns bucketed by their active count.
    const buckets: Set<number>[] = [];
    for (let c = 0; c <= n; c++) buckets.push(new Set());
    const colCount = new Int32Array(n);
    for (let j = 0; j < n; j++) {
      colCount[j] = colMap[j].size;
      buckets[colCount[j]].add(j);
    }
    for (let i = 0; i < n; i++) if (rowMap[i].size === 0) return null;
    if (buckets[0].size > 0) return null;
    const recount = (j: number): void => {
      const c = colMap[j].size;
      if (c !== colCount[j]) {
        buckets[colCount[j]].delete(j);
        buckets[c].add(j);
        colCount[j] = c;
      }
    };
    const rowMaxStamp = new Int32Array(n).fill(-1);
    const rowMaxVal = new Float64Array(n);
    const rowPerm = new Int32Array(n);
    const colPerm = new Int32Array(n);
    const touched = new Set<number>();
    let previous: number[] = [];
    const colDone = new Uint8Array(n);
    for (let step = 0; step < n; step++) {
      const rowMaxOf = (i: number): number => {
        if (rowMaxStamp[i] === step) return rowMaxVal[i];
        let m = 0;
        for (const e of rowMap[i].values()) {
          const v = Math.abs(eRe[e]) + Math.abs(eIm[e]);
          if (v > m) m = v;
        }
        rowMaxStamp[i] = step;
        rowMaxVal[i] = m;
        return m;
      };
      let bestMk = Infinity;
      let bestRatio = 0;
      let bi = -1;
      let bj = -1;
      let examined = 0;
      let singular = false;
      /** Examines column j (count c); false when the matrix shows itself singular. */
      const examine = (j: number, c: number): boolean => {
        let colMax = 0;
        for (const e of colMap[j].values()) {
          const v = Math.abs(eRe[e]) + Math.abs(eIm[e]);
          if (v > colMax) colMax = v;
        }
        if (!(colMax >= SINGULAR_TOLERANCE)) return false;
        for (const [i, e] of colMap[j]) {
          const v = Math.abs(eRe[e]) + Math.abs(eIm[e]);
          const rm = rowMaxOf(i);
          if (!(rm >= SINGULAR_TOLERANCE)) return false;
          if (v < CHOOSE_THRESHOLD * rm) continue;
          const mk = (rowMap[i].size - 1) * (c - 1);
          const ratio = v / rm;
          // Ties go to the first candidate (the neighbourhood of the last pivot, which keeps
          // the factors' memory access local) unless another is much more stable.
          if (mk < bestMk || (mk === bestMk && ratio > 2 * bestRatio)) {
            bestMk = mk;
            bestRatio = ratio;
            bi = i;
            bj = j;
          }
        }
        examined++;
        return true;
      };
      let cMin = 1;
      while (cMin <= n && buckets[cMin].size === 0) cMin++;
      for (const j of previous) {
        if (colCount[j] !== cMin || colDone[j]) continue;
        if (!examine(j, cMin)) {
          singular = true;
          break;
        }
        if (bj >= 0 && (bestMk === 0 || examined >= SEARCH_COLUMNS)) break;
      }
      if (singular) return null;
      search: for (let c = cMin; c <= n && !(bj >= 0 && (bestMk === 0 || examined >= SEARCH_COLUMNS)); c++) {
        const bucket = buckets[c];
        if (bucket.size === 0) continue;
        for (const j of bucket) {
          if (!examine(j, c)) return null;
          if (bj >= 0 && (bestMk === 0 || examined >= SEARCH_COLUMNS)) break search;
        }
      }
      if (bj < 0) return null;
      rowPerm[step] = bi;
      colPerm[step] = bj;
      const pe = rowMap[bi].get(bj)!;
      const pr = eRe[pe];
      const pim = eIm[pe];
      const pd = pr * pr + pim * pim;
      const ir = pr / pd;
      const ii = -pim / pd;
      // The pivot row's other entries, copied before the row maps change.
      const pivotCols: number[] = [];
      const pivotRe: number[] = [];
      const pivotIm: number[] = [];
      for (const [j, e] of rowMap[bi]) {
        if (j === bj) continue;
        pivotCols.push(j);
        pivotRe.push(eRe[e]);
        pivotIm.push(eIm[e]);
      }
      touched.clear();
      for (const [i, e] of colMap[bj]) {
        if (i === bi) continue;
        const ar = eRe[e];
        const ai = eIm[e];
        const lr = ar * ir - ai * ii;
        const li = ar * ii + ai * ir;
        const row = rowMap[i];
        row.delete(bj);
        for (let t = 0; t < pivotCols.length; t++) {
          const j = pivotCols[t];
          const dr = lr * pivotRe[t] - li * pivotIm[t];
          const di = lr * pivotIm[t] + li * pivotRe[t];
          let f = row.get(j);
          if (f === undefined) {
            if (used === cap) {
              cap *= 2;
              const nr = new Float64Array(cap);
              nr.set(eRe);
              eRe = nr;
              const ni = new Float64Array(cap);
              ni.set(eIm);
              eIm = ni;
            }
            f = used++;
            eRe[f] = 0;
            eIm[f] = 0;
            row.set(j, f);
            colMap[j].set(i, f);
            touched.add(j);
          }
          eRe[f] -= dr;
          eIm[f] -= di;
        }
        if (row.size === 0) return null;
      }
      for (const j of pivotCols) {
        colMap[j].delete(bi);
        touched.add(j);
      }
      colMap[bj].clear();
      rowMap[bi].clear();
      buckets[colCount[bj]].delete(bj);
      colCount[bj] = 0;
      colDone[bj] = 1;
      for (const j of touched) recount(j);
      previous = Array.from(touched);
      if (buckets[0].size > 0) return null;
    }
    return symbolicPlan(this.n, this.rowPtr, this.rowSlots, this.cols, rowPerm, colPerm);
  }

  /** Entries of L and U in the current first pivot sequence (fill included). */
  get factorEntries(): number {
    const p = this.plans[0];
    return p ? p.lCol.length + p.uCol.length : 0;
  }
}

class SparseFactorization implements Factorization {
  readonly n: number;
  singular = true;
  plan: Plan | null = null;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;
  private readonly yRe: Float64Array;
  private readonly yIm: Float64Array;

  constructor(n: number, rowScale: Float64Array, colScale: Float64Array) {
    this.n = n;
    this.rowScale = rowScale;
    this.colScale = colScale;
    this.yRe = new Float64Array(n);
    this.yIm = new Float64Array(n);
  }

  solve(bRe: Float64Array, bIm: Float64Array, xRe: Float64Array, xIm: Float64Array): void {
    const n = this.n;
    const plan = this.plan;
    if (this.singular || plan === null) {
      xRe.fill(NaN, 0, n);
      xIm.fill(NaN, 0, n);
      return;
    }
    const { rowPerm, colPerm, lPtr, lCol, uPtr, uCol, lRe, lIm, uRe, uIm, dRe, dIm } = plan;
    const yr = this.yRe;
    const yi = this.yIm;
    const rs = this.rowScale;
    for (let i = 0; i < n; i++) {
      const r = rowPerm[i];
      let sr = bRe[r] * rs[r];
      let si = bIm[r] * rs[r];
      for (let p = lPtr[i]; p < lPtr[i + 1]; p++) {
        const k = lCol[p];
        sr -= lRe[p] * yr[k] - lIm[p] * yi[k];
        si -= lRe[p] * yi[k] + lIm[p] * yr[k];
      }
      yr[i] = sr;
      yi[i] = si;
    }
    for (let i = n - 1; i >= 0; i--) {
      let sr = yr[i];
      let si = yi[i];
      for (let q = uPtr[i] + 1; q < uPtr[i + 1]; q++) {
        const j = uCol[q];
        sr -= uRe[q] * yr[j] - uIm[q] * yi[j];
        si -= uRe[q] * yi[j] + uIm[q] * yr[j];
      }
      yr[i] = sr * dRe[i] - si * dIm[i];
      yi[i] = sr * dIm[i] + si * dRe[i];
    }
    const cs = this.colScale;
    for (let i = 0; i < n; i++) {
      const c = colPerm[i];
      xRe[c] = yr[i] * cs[c];
      xIm[c] = yi[i] * cs[c];
    }
  }
}
