// Small helpers on hydrographs built by the hydrology: from a regular series, and their summary.
import type { Hydrograph } from "../model.js";

/**
 * A hydrograph from flows at t = n * step, leaving out the inner points of runs of zero flow (the
 * hydrograph is linear between points, so nothing changes) and the zeros after the last flow.
 */
export function regularHydrograph(step: number, flows: ArrayLike<number>): Hydrograph {
  let last = flows.length - 1;
  while (last > 0 && flows[last] === 0) last--;
  const end = Math.min(flows.length - 1, last + 1);
  const times: number[] = [];
  const values: number[] = [];
  for (let n = 0; n <= end; n++) {
    const q = flows[n];
    const innerZero = q === 0 && n > 0 && n < end && flows[n - 1] === 0 && flows[n + 1] === 0;
    if (innerZero) continue;
    times.push(n * step);
    values.push(q);
  }
  if (times.length < 2) {
    times.push(Math.max(step, (end + 1) * step));
    values.push(0);
  }
  return { times: Float64Array.from(times), flows: Float64Array.from(values) };
}

export interface HydrographSummary {
  /** m3/s. */
  peak: number;
  /** Seconds from the start of the storm. */
  timeOfPeak: number;
  /** m3. */
  volume: number;
}

/** The runoff hydrograph of one area for one storm, with what the reports show. */
export interface AreaHydrograph extends HydrographSummary {
  hydrograph: Hydrograph;
  /** Total rainfall (m). */
  rainfall: number;
  /** Total runoff depth (m): the hydrograph's volume over the area. */
  runoff: number;
  /** Tc used (s), after the method's minimum. */
  tc: number;
  /** NRCS: the unit duration (s), which is also the hydrograph's step; null for the rational method. */
  unitDuration: number | null;
  /** NRCS: time to peak of the unit hydrograph (s); null for the rational method. */
  unitTimeToPeak: number | null;
  /** Rational: the storm duration (s) of the hydrograph; null for the NRCS method. */
  stormDuration: number | null;
}

export function summarize(h: Hydrograph): HydrographSummary {
  let peak = 0;
  let timeOfPeak = h.times[0];
  for (let i = 0; i < h.flows.length; i++) {
    if (h.flows[i] > peak) {
      peak = h.flows[i];
      timeOfPeak = h.times[i];
    }
  }
  return { peak, timeOfPeak, volume: hydrographVolume(h) };
}

/** Exact volume of a piecewise-linear hydrograph (m3). */
export function hydrographVolume(h: Hydrograph): number {
  let v = 0;
  for (let i = 1; i < h.times.length; i++) v += 0.5 * (h.flows[i] + h.flows[i - 1]) * (h.times[i] - h.times[i - 1]);
  return v;
}

/** The sum of hydrographs (each linear between its points, zero outside them), on the union of their times. */
export function sumHydrographs(list: readonly (Hydrograph | null)[]): Hydrograph {
  const given = list.filter((h): h is Hydrograph => h !== null && h.times.length > 0);
  if (given.length === 0) return { times: Float64Array.from([0, 60]), flows: new Float64Array(2) };
  if (given.length === 1) return given[0];
  const times = [...new Set(given.flatMap((h) => Array.from(h.times)))].sort((a, b) => a - b);
  const flows = times.map((t) => given.reduce((sum, h) => sum + valueAt(h, t), 0));
  return { times: Float64Array.from(times), flows: Float64Array.from(flows) };
}

/** A hydrograph's value at t: linear between points, zero before the first and after the last. */
export function valueAt(h: Hydrograph, t: number): number {
  const n = h.times.length;
  if (t < h.times[0] || t > h.times[n - 1]) return 0;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (h.times[mid] <= t) lo = mid;
    else hi = mid;
  }
  if (h.times[lo] === t || hi === lo) return h.flows[lo];
  return h.flows[lo] + ((h.flows[hi] - h.flows[lo]) * (t - h.times[lo])) / (h.times[hi] - h.times[lo]);
}
