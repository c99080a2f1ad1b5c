// Brent's method for a root bracketed by [a, b] (Brent 1973, Algorithms for Minimization without
// Derivatives, ch. 4; the form of Press et al., Numerical Recipes, "zbrent"): inverse quadratic
// interpolation or secant steps, falling back to bisection, so it never leaves the bracket and
// converges at least as fast as bisection. No allocation inside the iteration.

/** Most function evaluations a root search makes. */
export const ROOT_ITERATIONS = 100;

/**
 * A root of f in [a, b], given f(a) = fa and f(b) = fb of opposite signs (or one of them zero),
 * to within `tolerance` in x.
 */
export function brentRoot(f: (x: number) => number, a: number, b: number, fa: number, fb: number, tolerance: number): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  let c = b;
  let fc = fb;
  let d = b - a;
  let e = d;
  for (let iteration = 0; iteration < ROOT_ITERATIONS; iteration++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
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
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tolerance;
    const half = 0.5 * (c - b);
    if (Math.abs(half) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * half * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * half * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      p = Math.abs(p);
      if (2 * p < Math.min(3 * half * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = half;
        e = d;
      }
    } else {
      d = half;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : half > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}
