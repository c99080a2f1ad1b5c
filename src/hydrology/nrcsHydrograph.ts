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

/**
 * Relative change of the peak between two successive unit durations at or below which the peak
 * counts as converged: 0.5 %, the routing contract's tolerance on peaks. The peak's error is about
 * linear in the step, so after a halving what remains is about the last change (tests: the
 * converged peak against a 5-second computation).
 */
export const PEAK_CONVERGENCE = 0.005;

/** Shortest unit duration the refinement goes to (s). */
const FINEST_STEP = 5;

/**
 * The NRCS runoff hydrograph of an area (m2) with a curve number and Tc (s) for a rainfall mass curve.
 * The unit duration starts at `unitDuration` and is halved (down to 5 s) until the peak changes by at
 * most PEAK_CONVERGENCE (a 12-minute step understated a Tc 1.53 h area's peak by
 * 7.5 %, which is unconservative for storage). `fixedStep` (s) computes at that step only.
 */
export function nrcsHydrograph(
  area: number,
  curveNumber: number,
  tc: number,
  rainfall: MassCurve,
  options: NrcsOptions = DEFAULT_NRCS_OPTIONS,
  fixedStep?: number,
): AreaHydrograph {
  const tcUsed = Math.max(tc, MIN_TC_NRCS);
  if (fixedStep !== undefined) return atStep(area, curveNumber, tcUsed, rainfall, options, fixedStep);
  const first = unitDuration(tcUsed, resolution(rainfall));
  let result = atStep(area, curveNumber, tcUsed, rainfall, options, first);
  // Halving: with an error about linear in the step, the change of a halving is about the error left.
  for (let step = first / 2; step >= FINEST_STEP - 1e-9; step /= 2) {
    const finer = atStep(area, curveNumber, tcUsed, rainfall, options, step);
    const change = Math.abs(finer.peak - result.peak) / Math.max(finer.peak, Number.MIN_VALUE);
    result = finer;
    if (change <= PEAK_CONVERGENCE) break;
  }
  return result;
}

function atStep(area: number, curveNumber: number, tcUsed: number, rainfall: MassCurve, options: NrcsOptions, step: number): AreaHydrograph {
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
