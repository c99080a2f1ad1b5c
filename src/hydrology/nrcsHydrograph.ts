// Runoff hydrograph of one area by the NRCS method: cumulative rainfall -> cumulative runoff by the
// curve number equation -> runoff increments per unit duration -> convolution with the unit hydrograph
// (NEH Part 630 ch. 10 and ch. 16; TR-55).
import { depthAt, resolution, type MassCurve } from "./distributions.js";
import { runoffDepth, type AbstractionRatio } from "./runoff.js";
import { MIN_TC_NRCS } from "./timeOfConcentration.js";
import { convolve, STANDARD_PEAK_RATE_FACTOR, timeToPeak, unitHydrograph } from "./unitHydrograph.js";
import { regularHydrograph, summarize, type AreaHydrograph } from "./hydrograph.js";

export interface NrcsOptions {
  ratio: AbstractionRatio;
  peakRateFactor: number;
}

export const DEFAULT_NRCS_OPTIONS: NrcsOptions = { ratio: 0.2, peakRateFactor: STANDARD_PEAK_RATE_FACTOR };

/** Unit durations outfit picks from (minutes): each divides an hour and a day. */
const NICE_STEPS_MINUTES = [60, 30, 20, 15, 12, 10, 6, 5, 3, 2, 1, 0.5];

/**
 * The unit duration (s): the largest of the steps above not longer than 0.133 Tc (NEH 630 ch. 16,
 * D = 0.133 Tc) nor the rainfall's own resolution; below half a minute, that limit itself.
 */
export function unitDuration(tc: number, rainfallResolution: number): number {
  const limit = Math.min(0.133 * tc, rainfallResolution);
  for (const minutes of NICE_STEPS_MINUTES) if (minutes * 60 <= limit + 1e-9) return minutes * 60;
  return limit;
}

/** The NRCS runoff hydrograph of an area (m2) with a curve number and Tc (s) for a rainfall mass curve. */
export function nrcsHydrograph(area: number, curveNumber: number, tc: number, rainfall: MassCurve, options: NrcsOptions = DEFAULT_NRCS_OPTIONS): AreaHydrograph {
  const tcUsed = Math.max(tc, MIN_TC_NRCS);
  const step = unitDuration(tcUsed, resolution(rainfall));
  const start = rainfall.times[0];
  const count = Math.ceil((rainfall.times[rainfall.times.length - 1] - start) / step - 1e-9);
  const excess = new Float64Array(count);
  let before = runoffDepth(depthAt(rainfall, start), curveNumber, options.ratio);
  for (let k = 0; k < count; k++) {
    const after = runoffDepth(depthAt(rainfall, start + (k + 1) * step), curveNumber, options.ratio);
    excess[k] = after - before;
    before = after;
  }
  const tp = timeToPeak(step, tcUsed);
  const flows = convolve(excess, unitHydrograph(area, step, tp, options.peakRateFactor));
  const hydrograph = regularHydrograph(step, flows);
  if (start !== 0) for (let i = 0; i < hydrograph.times.length; i++) hydrograph.times[i] += start;
  const total = rainfall.depths[rainfall.depths.length - 1] - rainfall.depths[0];
  return {
    hydrograph,
    ...summarize(hydrograph),
    rainfall: total,
    runoff: runoffDepth(total, curveNumber, options.ratio),
    tc: tcUsed,
    unitDuration: step,
    unitTimeToPeak: tp,
    stormDuration: null,
  };
}
