/** Brent's methods: bracketed root finding that never leaves its bracket, and bracketed minimisation. */

/**
 * A root of g in [a, b], where g(a) and g(b) have opposite signs (or one is 0), to within
 * `xtol` (absolute) plus a few ulps of the root. NaN when the bracket is not one or g
 * returns a non-number inside it. `ga` and `gb`, when given, are the values at the ends
 * (already known, as on a grid: a recomputation could differ in the last bit and lose the
 * bracket).
 */
export function brent(g: (x: number) => number, a: number, b: number, xtol: number, maxIter = 200, ga?: number, gb?: number): number {
  let fa = ga ?? g(a);
  let fb = gb ?? g(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  // ±∞ at an end (an exact null on a dB scale) still brackets; NaN does not.
  if (Number.isNaN(fa) || Number.isNaN(fb) || Math.sign(fa) === Math.sign(fb)) return NaN;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 0; iter < maxIter; iter++) {
    if (Math.sign(fb) === Math.sign(fc)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb) && Number.isFinite(fa) && Number.isFinite(fc)) {
      // Inverse quadratic interpolation, or the secant step when only two points differ.
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = g(b);
    if (Number.isNaN(fb)) return NaN;
  }
  return b;
}

const GOLDEN = 0.5 * (3 - Math.sqrt(5));

/**
 * Brent's minimiser: the x in [a, b] where g is least (a local minimum, or an end), to
 * within `xtol` plus a few ulps; golden-section steps where a parabola through the last
 * three points cannot be trusted. A NaN from g counts as worse than any number.
 */
export function brentMinimum(g: (x: number) => number, a: number, b: number, xtol: number, maxIter = 100): number {
  const value = (x: number): number => {
    const y = g(x);
    return Number.isNaN(y) ? Infinity : y;
  };
  let x = a + GOLDEN * (b - a);
  let w = x;
  let v = x;
  let fx = value(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  for (let iter = 0; iter < maxIter; iter++) {
    const m = 0.5 * (a + b);
    const tol = 2 * Number.EPSILON * Math.abs(x) + 0.5 * xtol;
    if (Math.abs(x - m) <= 2 * tol - 0.5 * (b - a)) break;
    let golden = true;
    if (Math.abs(e) > tol) {
      // A parabola through x, w and v.
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      if (Math.abs(p) < Math.abs(0.5 * q * e) && p > q * (a - x) && p < q * (b - x)) {
        e = d;
        d = p / q;
        const u = x + d;
        if (u - a < 2 * tol || b - u < 2 * tol) d = x < m ? tol : -tol;
        golden = false;
      }
    }
    if (golden) {
      e = (x < m ? b : a) - x;
      d = GOLDEN * e;
    }
    const u = Math.abs(d) >= tol ? x + d : x + (d > 0 ? tol : -tol);
    const fu = value(u);
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return x;
}
