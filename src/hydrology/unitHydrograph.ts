// NRCS dimensionless unit hydrograph (NEH Part 630 ch. 16, 2007). SI inside: m2, m, s, m3/s.

/** cfs per (mi2 * in / h): 5280^2 ft2 * (1/12) ft / 3600 s = 645.333 (the constant behind "484"). */
export const CFS_PER_SQUARE_MILE_INCH_PER_HOUR = (5280 * 5280) / 12 / 3600;

/** The standard peak rate factor (NEH 630 ch. 16: qp = 484 A Q / Tp, A mi2, Q in, Tp h, qp cfs). */
export const STANDARD_PEAK_RATE_FACTOR = 484;

/**
 * NEH Part 630 ch. 16 Table 16-1: ratios for the dimensionless unit hydrograph, [t/Tp, q/qp].
 * (The table's mass-curve column Qa/Q is not needed here; the tests check it against these ordinates.)
 */
export const TABLE_16_1: readonly (readonly [number, number])[] = [
  [0, 0], [0.1, 0.03], [0.2, 0.1], [0.3, 0.19], [0.4, 0.31], [0.5, 0.47], [0.6, 0.66], [0.7, 0.82],
  [0.8, 0.93], [0.9, 0.99], [1, 1], [1.1, 0.99], [1.2, 0.93], [1.3, 0.86], [1.4, 0.78], [1.5, 0.68],
  [1.6, 0.56], [1.7, 0.46], [1.8, 0.39], [1.9, 0.33], [2, 0.28], [2.2, 0.207], [2.4, 0.147],
  [2.6, 0.107], [2.8, 0.077], [3, 0.055], [3.2, 0.04], [3.4, 0.029], [3.6, 0.021], [3.8, 0.015],
  [4, 0.011], [4.5, 0.005], [5, 0],
];

/** A dimensionless unit hydrograph: q/qp as a function of t/Tp, zero beyond `end`. */
export interface DimensionlessShape {
  ratio(x: number): number;
  end: number;
  /** Where the shape comes from, for reports. */
  source: string;
}

/** Peak rate factor -> the dimensionless area K = integral of q/qp d(t/Tp) = 645.333 / PRF. */
export function shapeArea(peakRateFactor: number): number {
  return CFS_PER_SQUARE_MILE_INCH_PER_HOUR / peakRateFactor;
}

/** Table 16-1 read with linear interpolation. */
export const STANDARD_SHAPE: DimensionlessShape = {
  end: 5,
  source: "NEH 630 ch. 16 Table 16-1 (peak rate factor 484)",
  ratio(x: number): number {
    if (!(x > 0) || x >= 5) return 0;
    let i = 1;
    while (TABLE_16_1[i][0] < x) i++;
    const [x0, y0] = TABLE_16_1[i - 1];
    const [x1, y1] = TABLE_16_1[i];
    return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
  },
};

/** Natural log of the gamma function (Lanczos approximation, g = 7, n = 9; accurate to ~1e-15). */
export function logGamma(z: number): number {
  const c = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
    12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  if (z < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * z)) - logGamma(1 - z);
  const x = z - 1;
  let a = c[0];
  const t = x + 7.5;
  for (let i = 1; i < 9; i++) a += c[i] / (x + i);
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(a);
}

/**
 * Area under the gamma-equation dimensionless unit hydrograph q/qp = x^m e^(m (1 - x)) (NEH 630 ch. 16,
 * gamma-equation DUH; its Table 16-5 relates m and the peak rate factor): e^m Gamma(m + 1) / m^(m + 1).
 */
export function gammaShapeArea(m: number): number {
  return Math.exp(m + logGamma(m + 1) - (m + 1) * Math.log(m));
}

/** Shape parameter m of the gamma-equation DUH with a given peak rate factor (bisection on the area). */
export function gammaShapeParameter(peakRateFactor: number): number {
  const target = shapeArea(peakRateFactor);
  let lo = 0.01;
  let hi = 200;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    // The area falls as m grows.
    if (gammaShapeArea(mid) > target) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** The gamma-equation DUH for a peak rate factor, cut where q/qp has fallen below 1e-4 after the peak. */
export function gammaShape(peakRateFactor: number): DimensionlessShape {
  const m = gammaShapeParameter(peakRateFactor);
  const ratio = (x: number) => (x > 0 ? Math.exp(m * (Math.log(x) + 1 - x)) : 0);
  let end = 1;
  while (end < 100 && ratio(end) >= 1e-4) end += 0.1;
  return {
    end,
    source: `gamma-equation DUH of NEH 630 ch. 16, m = ${m.toFixed(3)} (peak rate factor ${peakRateFactor})`,
    ratio: (x: number) => (x >= end ? 0 : ratio(x)),
  };
}

/**
 * Table 16-1 for the standard factor 484; the gamma-equation DUH for any other. Other factors are used
 * where the land is flatter or steeper than average: NEH 630 ch. 16 describes values near 300 for flat,
 * swampy land and near 600 for steep terrain; the Delmarva unit hydrograph has about 284 (Welle, Woodward
 * & Moody 1980). (These from memory.)
 */
export function dimensionlessShape(peakRateFactor: number): DimensionlessShape {
  return peakRateFactor === STANDARD_PEAK_RATE_FACTOR ? STANDARD_SHAPE : gammaShape(peakRateFactor);
}

/**
 * Peak discharge (m3/s) of a unit hydrograph: qp = A Q / (K Tp) with K = 645.333 / PRF; in US units this
 * is qp = PRF A Q / Tp (cfs, mi2, in, h), for 484 in SI 0.2083 A Q / Tp (m3/s, km2, mm, h)
 * (NEH 630 ch. 16; Bedient et al. 2013 eq 2-16).
 */
export function peakRate(area: number, runoff: number, timeToPeak: number, peakRateFactor = STANDARD_PEAK_RATE_FACTOR): number {
  return (area * runoff) / (shapeArea(peakRateFactor) * timeToPeak);
}

/** Time to peak Tp = D/2 + L with the lag L = 0.6 Tc (NEH 630 ch. 16; with Tc + D = 1.7 Tp this gives D = 0.133 Tc). */
export function timeToPeak(unitDuration: number, tc: number): number {
  return unitDuration / 2 + 0.6 * tc;
}

export interface UnitHydrograph {
  /** Ordinates (m3/s per metre of runoff) at t = j * step, j = 0, 1, ... */
  ordinates: Float64Array;
  step: number;
  timeToPeak: number;
  /** Factor applied to the sampled shape so the ordinates hold exactly one unit depth over the area. */
  volumeScale: number;
}

/**
 * The unit hydrograph of an area (m2) for a unit duration `step` (s) and time to peak (s), sampled at
 * the step from the dimensionless shape with qp = A / (K Tp) per metre of runoff, then scaled so that
 * its trapezoidal volume is exactly the area times one metre (the sampled Table 16-1 holds about
 * 0.2 % more than 645.333/484; sampling adds or removes a little more).
 */
export function unitHydrograph(area: number, step: number, tp: number, peakRateFactor = STANDARD_PEAK_RATE_FACTOR): UnitHydrograph {
  const shape = dimensionlessShape(peakRateFactor);
  const qp = peakRate(area, 1, tp, peakRateFactor);
  const count = Math.ceil((shape.end * tp) / step) + 1;
  const ordinates = new Float64Array(count);
  let sum = 0;
  for (let j = 0; j < count; j++) {
    ordinates[j] = qp * shape.ratio((j * step) / tp);
    sum += ordinates[j];
  }
  // Trapezoidal volume: the first and last ordinates are zero, so it is the plain sum times the step.
  const scale = area / (sum * step);
  for (let j = 0; j < count; j++) ordinates[j] *= scale;
  return { ordinates, step, timeToPeak: tp, volumeScale: scale };
}

/** Discrete convolution: flows (m3/s) at t = n * step from runoff increments (m) of each unit duration. */
export function convolve(excess: ArrayLike<number>, uh: UnitHydrograph): Float64Array {
  const u = uh.ordinates;
  const flows = new Float64Array(excess.length + u.length);
  for (let k = 0; k < excess.length; k++) {
    const e = excess[k];
    if (e === 0) continue;
    // Increment k falls in [k step, (k + 1) step]; its unit hydrograph starts at k step.
    for (let j = 1; j < u.length; j++) flows[k + j] += e * u[j];
  }
  return flows;
}
