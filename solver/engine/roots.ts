/**
 * Brent's bracketing root finder (R. P. Brent, "Algorithms for Minimization without
 * Derivatives", Prentice-Hall 1973, ch. 4 — the "zeroin" algorithm): inverse quadratic
 * interpolation and secant steps, falling back to bisection so the bracket always shrinks.
 *
 * Input: g continuous on [a, b] with g(a)·g(b) ≤ 0 (fa, fb given). Output: x with the bracket
 * narrowed to 2·(2ε|x| + tol), or the last iterate after maxIter evaluations.
 * Cost: usually 6–12 evaluations of g for tol ≈ 1e-13 relative.
 * Evaluation failure: when g returns NaN the search stops and returns NaN.
 */
export function brentRoot(
  g: (x: number) => number,
  a: number,
  b: number,
  fa: number,
  fb: number,
  tol: number,
  maxIter = 100,
): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(fa * fb < 0)) return Number.NaN;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 0; iter < maxIter; iter++) {
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const xm = 0.5 * (c - b);
    if (Math.abs(xm) <= tol1 || fb === 0) return b;
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * xm * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * xm * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      p = Math.abs(p);
      if (2 * p < Math.min(3 * xm * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm;
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : xm > 0 ? tol1 : -tol1;
    fb = g(b);
    if (Number.isNaN(fb)) return Number.NaN;
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
  }
  return b;
}
