// Monotone piecewise cubic Hermite interpolation: Fritsch & Carlson (1980), "Monotone piecewise
// cubic interpolation", SIAM J. Numer. Anal. 17(2):238-246.

/** Tangents at each point that keep the interpolant monotone between monotone data. */
export function fritschCarlsonTangents(x: readonly number[], y: readonly number[]): Float64Array {
  const n = x.length;
  const m = new Float64Array(n);
  if (n < 2) return m;
  const delta = new Float64Array(n - 1);
  for (let k = 0; k < n - 1; k++) delta[k] = (y[k + 1] - y[k]) / (x[k + 1] - x[k]);
  m[0] = delta[0];
  m[n - 1] = delta[n - 2];
  for (let k = 1; k < n - 1; k++) m[k] = delta[k - 1] * delta[k] <= 0 ? 0 : (delta[k - 1] + delta[k]) / 2;
  for (let k = 0; k < n - 1; k++) {
    if (delta[k] === 0) {
      m[k] = 0;
      m[k + 1] = 0;
      continue;
    }
    const a = m[k] / delta[k];
    const b = m[k + 1] / delta[k];
    const s = a * a + b * b;
    if (s > 9) {
      const t = 3 / Math.sqrt(s);
      m[k] = t * a * delta[k];
      m[k + 1] = t * b * delta[k];
    }
  }
  return m;
}

/** Evaluates the Hermite cubic through (x, y) with tangents m at `at` (x[0] <= at <= x[n-1]). */
export function hermite(x: readonly number[], y: readonly number[], m: Float64Array, at: number): number {
  let k = 0;
  const n = x.length;
  while (k < n - 2 && at > x[k + 1]) k++;
  const h = x[k + 1] - x[k];
  const t = (at - x[k]) / h;
  const t2 = t * t;
  const t3 = t2 * t;
  return (
    (2 * t3 - 3 * t2 + 1) * y[k] + (t3 - 2 * t2 + t) * h * m[k] + (-2 * t3 + 3 * t2) * y[k + 1] + (t3 - t2) * h * m[k + 1]
  );
}
