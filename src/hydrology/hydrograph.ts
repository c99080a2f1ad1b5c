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
