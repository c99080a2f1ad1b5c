// Rational method and modified rational hydrographs for small sites. SI inside: m2, m/s, s, m3/s.
import type { Hydrograph } from "../model.js";
import { intensity, idfRange, type IdfCurve } from "./idf.js";
import { summarize, type AreaHydrograph } from "./hydrograph.js";

/** Smallest Tc used with the rational method: 5 minutes (common practice). */
export const MIN_TC_RATIONAL = 5 * 60;

/**
 * Peak runoff Q = C i A (SI: m3/s from m/s and m2). In US units Q = 1.008 C i A (cfs, in/h, ac), the
 * 1.008 being 43,560 ft2 * (1/12) ft / 3600 s, usually taken as 1 (HEC-22 ch. 3, eq 3-1).
 */
export function rationalPeak(runoffCoefficient: number, rainfallIntensity: number, area: number): number {
  return runoffCoefficient * rainfallIntensity * area;
}

/**
 * Modified rational hydrograph of a storm of duration td >= tc: rises linearly to the peak over tc,
 * holds it until td, falls linearly to zero at td + tc (a triangle when td = tc).
 */
export function modifiedRationalHydrograph(peak: number, tc: number, td: number): Hydrograph {
  const times = td > tc ? [0, tc, td, td + tc] : [0, tc, 2 * tc];
  const flows = td > tc ? [0, peak, peak, 0] : [0, peak, 0];
  return { times: Float64Array.from(times), flows: Float64Array.from(flows) };
}

/**
 * Storage (m3) needed to hold a modified rational hydrograph (peak Qp, duration td, rise tc) to an
 * allowable release Qa, when the outflow rises linearly from zero to Qa while the inflow recedes to Qa:
 * V = Qp td - Qa (td + tc) / 2 (the inflow volume to that moment less the triangle of outflow; the tests
 * check it against direct integration).
 */
export function requiredStorage(peak: number, td: number, tc: number, allowable: number): number {
  if (allowable >= peak) return 0;
  return peak * td - (allowable * (td + tc)) / 2;
}

export interface DurationTrial {
  /** Storm duration (s). */
  duration: number;
  /** m/s. */
  intensity: number;
  /** m3/s. */
  peak: number;
  /** m3 (zero when the peak does not exceed the allowable release). */
  storage: number;
}

export interface CriticalDuration {
  trials: DurationTrial[];
  /** The trial needing the most storage (the first, td = tc, when none needs any). */
  critical: DurationTrial;
}

/**
 * Sweeps storm durations from tc upward in steps of `step` (s) up to `longest` (s, clipped to the IDF
 * table's range) and finds the one needing the most storage for the allowable release.
 */
export function criticalDuration(
  runoffCoefficient: number,
  area: number,
  tc: number,
  curve: IdfCurve,
  allowable: number,
  step = 60,
  longest = 24 * 3600,
): CriticalDuration {
  const end = Math.min(longest, idfRange(curve)[1]);
  const trials: DurationTrial[] = [];
  const count = Math.max(0, Math.floor((end - tc) / step + 1e-9));
  for (let n = 0; n <= count; n++) {
    const td = tc + n * step;
    const i = intensity(curve, td);
    const peak = rationalPeak(runoffCoefficient, i, area);
    trials.push({ duration: td, intensity: i, peak, storage: Math.max(0, requiredStorage(peak, td, tc, allowable)) });
  }
  let critical = trials[0];
  for (const trial of trials) if (trial.storage > critical.storage) critical = trial;
  return { trials, critical };
}

/** The modified rational hydrograph of an area (m2) with coefficient C for a storm of duration td (s). */
export function rationalAreaHydrograph(area: number, runoffCoefficient: number, tc: number, curve: IdfCurve, td: number): AreaHydrograph {
  const i = intensity(curve, td);
  const hydrograph = modifiedRationalHydrograph(rationalPeak(runoffCoefficient, i, area), tc, td);
  const summary = summarize(hydrograph);
  return {
    hydrograph,
    ...summary,
    rainfall: i * td,
    runoff: summary.volume / area,
    tc,
    unitDuration: null,
    unitTimeToPeak: null,
    stormDuration: td,
  };
}
