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

/** A root search's state carried from one stage of a rating to the next (see `warmRoot`). */
export interface WarmStart {
  /** The previous stage's root, or NaN when there is none. */
  root: number;
  /** The slope of the previous stage's function near its root, or NaN. */
  slope: number;
}

/**
 * The root of a falling f in [low, high] (f(low) >= 0 >= f(high) = fHigh), started from `guess`
 * (e.g. the previous stage's root extrapolated) with the previous stage's slope (fHigh may be NaN:
 * not yet evaluated, then f(high) is only evaluated when needed): a Newton step on
 * that slope, then secant steps, each kept inside the bracket the evaluations have narrowed (a step
 * that leaves it bisects instead). Accepted when a step is within `tolerance` of the root's
 * estimate; after six steps, Brent's method on the bracket. On a smooth rating the guess is close
 * and two evaluations suffice. `state.slope` is updated for the next stage.
 */
export function warmRoot(f: (x: number) => number, low: number, high: number, fHigh: number, guess: number, state: WarmStart, tolerance: number): number {
  let a = low;
  let fa = NaN;
  let b = high;
  let fb = fHigh;
  let x = guess > low && guess < high ? guess : 0.5 * (low + high);
  let fx = f(x);
  if (!(state.slope < 0) && Number.isNaN(fb)) fb = f(b);
  let slope = state.slope < 0 ? state.slope : (fb - fx) / (b - x) || -1;
  for (let step = 0; step < 6; step++) {
    if (fx === 0) return x;
    if (fx > 0) {
      a = x;
      fa = fx;
    } else {
      b = x;
      fb = fx;
    }
    let next = x - fx / slope;
    if (!(next > a && next < b)) next = 0.5 * (a + b);
    if (Math.abs(next - x) <= tolerance) {
      state.slope = slope;
      return next;
    }
    const fNext = f(next);
    const secant = (fNext - fx) / (next - x);
    if (secant < 0) slope = secant;
    x = next;
    fx = fNext;
  }
  state.slope = slope;
  if (Number.isNaN(fb)) {
    fb = f(b);
    if (fb >= 0) return b;
  }
  if (Number.isNaN(fa)) {
    fa = f(a);
    if (fa <= 0) return a;
  }
  return brentRoot(f, a, b, fa, fb, tolerance);
}
