/** Brent's method: bracketed root finding that never leaves its bracket. */

/**
 * A root of g in [a, b], where g(a) and g(b) have opposite signs (or one is 0), to within
 * `xtol` (absolute) plus a few ulps of the root. NaN when the bracket is not one or g
 * returns a non-number inside it. `ga` and `gb`, when given, are the values at the ends
 * (already known, as on a grid: a recomputation could differ in the last bit and lose the
 * bracket).
 */
export function brent(
  g: (x: number) => number,
  a: number,
  b: number,
  xtol: number,
  maxIter = 200,
  ga?: number,
  gb?: number,
): number {
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
