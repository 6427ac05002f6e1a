/**
 * Dense complex LU with partial pivoting on split real/imaginary Float64Arrays, after row
 * and column equilibration so that element values spanning many decades (1e-15 F next to
 * 1e12 Ω) keep their accuracy. Factor once, solve many.
 */
import { SINGULAR_TOLERANCE, equilibrate } from './numeric.js';
import type { Factorization, LinearSolver } from './numeric.js';

const SINGULAR_SQ = SINGULAR_TOLERANCE * SINGULAR_TOLERANCE;

/** LU factors of one n×n complex matrix, stored row-major and overwritten in place. */
export class DenseLU implements Factorization {
  readonly n: number;
  singular = false;
  /** Factored values: unit-lower L below the diagonal, U on and above it. */
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  /** Row k of the factors is row perm[k] of the equilibrated matrix. */
  private readonly perm: Int32Array;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;
  private readonly yRe: Float64Array;
  private readonly yIm: Float64Array;

  constructor(n: number) {
    this.n = n;
    this.re = new Float64Array(n * n);
    this.im = new Float64Array(n * n);
    this.perm = new Int32Array(n);
    this.rowScale = new Float64Array(n);
    this.colScale = new Float64Array(n);
    this.yRe = new Float64Array(n);
    this.yIm = new Float64Array(n);
  }

  /** Factor the row-major matrix (aRe, aIm); the inputs are copied, not changed. */
  factor(aRe: ArrayLike<number>, aIm: ArrayLike<number>): this {
    const n = this.n;
    const re = this.re;
    const im = this.im;
    const rs = this.rowScale;
    const cs = this.colScale;
    this.singular = false;
    for (let i = 0; i < n; i++) {
      let m = 0;
      for (let j = 0; j < n; j++) {
        const v = Math.abs(aRe[i * n + j]) + Math.abs(aIm[i * n + j]);
        if (v > m) m = v;
      }
      rs[i] = m > 0 && Number.isFinite(m) ? 1 / m : 1;
      if (!Number.isFinite(m)) this.singular = true;
    }
    for (let j = 0; j < n; j++) {
      let m = 0;
      for (let i = 0; i < n; i++) {
        const v = (Math.abs(aRe[i * n + j]) + Math.abs(aIm[i * n + j])) * rs[i];
        if (v > m) m = v;
      }
      cs[j] = m > 0 ? 1 / m : 1;
    }
    for (let i = 0; i < n; i++) {
      const r = rs[i];
      for (let j = 0; j < n; j++) {
        const s = r * cs[j];
        re[i * n + j] = aRe[i * n + j] * s;
        im[i * n + j] = aIm[i * n + j] * s;
      }
    }
    if (this.singular) return this;
    this.decompose();
    return this;
  }

  /**
   * Factor a matrix given as pattern slots (rows[k], cols[k]) with values; used by the
   * sweep, where the network's pattern is fixed and the values change with frequency.
   */
  factorSlots(rows: Int32Array, cols: Int32Array, valRe: Float64Array, valIm: Float64Array): this {
    const n = this.n;
    const re = this.re;
    const im = this.im;
    const rs = this.rowScale;
    const cs = this.colScale;
    this.singular = false;
    equilibrate(n, rows, cols, valRe, valIm, rs, cs);
    re.fill(0);
    im.fill(0);
    for (let k = 0; k < rows.length; k++) {
      const vr = valRe[k];
      const vi = valIm[k];
      if (!Number.isFinite(vr) || !Number.isFinite(vi)) {
        this.singular = true;
        return this;
      }
      const s = rs[rows[k]] * cs[cols[k]];
      const p = rows[k] * n + cols[k];
      re[p] += vr * s;
      im[p] += vi * s;
    }
    this.decompose();
    return this;
  }

  private decompose(): void {
    const n = this.n;
    const re = this.re;
    const im = this.im;
    const perm = this.perm;
    for (let i = 0; i < n; i++) perm[i] = i;
    for (let k = 0; k < n; k++) {
      // Partial pivoting on the true modulus.
      let p = k;
      let best = -1;
      for (let i = k; i < n; i++) {
        const a = re[i * n + k];
        const b = im[i * n + k];
        const m = a * a + b * b;
        if (m > best) {
          best = m;
          p = i;
        }
      }
      if (!(best > SINGULAR_SQ)) {
        this.singular = true;
        return;
      }
      if (p !== k) {
        const rk = k * n;
        const rp = p * n;
        for (let j = 0; j < n; j++) {
          let t = re[rk + j];
          re[rk + j] = re[rp + j];
          re[rp + j] = t;
          t = im[rk + j];
          im[rk + j] = im[rp + j];
          im[rp + j] = t;
        }
        const t = perm[k];
        perm[k] = perm[p];
        perm[p] = t;
      }
      const rk = k * n;
      const pr = re[rk + k];
      const pi = im[rk + k];
      const d = pr * pr + pi * pi;
      const ir = pr / d;
      const ii = -pi / d;
      for (let i = k + 1; i < n; i++) {
        const ri = i * n;
        const ar = re[ri + k];
        const ai = im[ri + k];
        if (ar === 0 && ai === 0) continue;
        const lr = ar * ir - ai * ii;
        const li = ar * ii + ai * ir;
        re[ri + k] = lr;
        im[ri + k] = li;
        for (let j = k + 1; j < n; j++) {
          const ur = re[rk + j];
          const ui = im[rk + j];
          re[ri + j] -= lr * ur - li * ui;
          im[ri + j] -= lr * ui + li * ur;
        }
      }
    }
  }

  solve(bRe: Float64Array, bIm: Float64Array, xRe: Float64Array, xIm: Float64Array): void {
    const n = this.n;
    if (this.singular) {
      xRe.fill(NaN, 0, n);
      xIm.fill(NaN, 0, n);
      return;
    }
    const re = this.re;
    const im = this.im;
    const yr = this.yRe;
    const yi = this.yIm;
    const perm = this.perm;
    const rs = this.rowScale;
    for (let i = 0; i < n; i++) {
      const p = perm[i];
      let sr = bRe[p] * rs[p];
      let si = bIm[p] * rs[p];
      const ri = i * n;
      for (let j = 0; j < i; j++) {
        const lr = re[ri + j];
        const li = im[ri + j];
        sr -= lr * yr[j] - li * yi[j];
        si -= lr * yi[j] + li * yr[j];
      }
      yr[i] = sr;
      yi[i] = si;
    }
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      let sr = yr[i];
      let si = yi[i];
      for (let j = i + 1; j < n; j++) {
        const ur = re[ri + j];
        const ui = im[ri + j];
        sr -= ur * yr[j] - ui * yi[j];
        si -= ur * yi[j] + ui * yr[j];
      }
      const dr = re[ri + i];
      const di = im[ri + i];
      const d = dr * dr + di * di;
      yr[i] = (sr * dr + si * di) / d;
      yi[i] = (si * dr - sr * di) / d;
    }
    const cs = this.colScale;
    for (let j = 0; j < n; j++) {
      xRe[j] = yr[j] * cs[j];
      xIm[j] = yi[j] * cs[j];
    }
  }
}

/** Factor a dense row-major complex matrix once; solve it for any number of right-hand sides. */
export function denseLU(n: number, aRe: ArrayLike<number>, aIm: ArrayLike<number>): DenseLU {
  return new DenseLU(n).factor(aRe, aIm);
}

/** The dense path for a fixed pattern: the right choice for small networks. */
export class DenseSolver implements LinearSolver {
  readonly kind = 'dense' as const;
  readonly n: number;
  private readonly rows: Int32Array;
  private readonly cols: Int32Array;
  private readonly lu: DenseLU;

  constructor(n: number, rows: Int32Array, cols: Int32Array) {
    this.n = n;
    this.rows = rows;
    this.cols = cols;
    this.lu = new DenseLU(n);
  }

  factor(valRe: Float64Array, valIm: Float64Array): Factorization {
    return this.lu.factorSlots(this.rows, this.cols, valRe, valIm);
  }
}
