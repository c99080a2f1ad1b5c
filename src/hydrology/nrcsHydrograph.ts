// Runoff hydrograph of one area by the NRCS method: cumulative rainfall -> cumulative runoff by the
// curve number equation -> runoff increments per unit duration -> convolution with the unit hydrograph
// (NEH Part 630 ch. 10 and ch. 16; TR-55).
import { depthAt, resolution, type MassCurve } from "./distributions.js";
import { partsRunoffDepth, type AbstractionRatio, type RunoffPart } from "./runoff.js";
import { MIN_TC_NRCS } from "./timeOfConcentration.js";
import { convolve, STANDARD_PEAK_RATE_FACTOR, timeToPeak, unitHydrograph } from "./unitHydrograph.js";
import { regularHydrograph, summarize, type AreaHydrograph } from "./hydrograph.js";

/**
 * How the unit duration is chosen: "standard" (the method's convention: the largest step no longer
 * than 0.133 Tc, NEH 630 ch. 16, on the rainfall's own step), "converged" (from there halved until the
 * peak settles within 0.5 %), or a fixed number of seconds.
 */
export type UnitDurationChoice = "standard" | "converged" | number;

export interface NrcsOptions {
  ratio: AbstractionRatio;
  peakRateFactor: number;
  /** Default "standard". */
  unitDuration?: UnitDurationChoice;
}

export const DEFAULT_NRCS_OPTIONS: NrcsOptions = { ratio: 0.2, peakRateFactor: STANDARD_PEAK_RATE_FACTOR, unitDuration: "standard" };

/** NEH 630 ch. 16: the unit duration D is about 0.133 Tc (from Tc + D = 1.7 Tp and the lag L = 0.6 Tc); no longer. */
export const UNIT_DURATION_OF_TC = 0.133;

/**
 * The rainfall's own step (s): the longest step that divides every interval of its table, so that
 * each tabulated depth falls on a step end (0.25 h for the NRCS distributions), to the millisecond;
 * null when the intervals share no step of a second or more.
 */
export function rainfallStep(curve: MassCurve): number | null {
  const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
  let g = 0;
  for (let i = 1; i < curve.times.length; i++) g = gcd(Math.round(1000 * (curve.times[i] - curve.times[i - 1])), g);
  return g >= 1000 ? g / 1000 : null;
}

/**
 * The unit duration (s) at the method's convention: the longest whole fraction of the rainfall's
 * step (`rainfallStep`) no longer than 0.133 Tc (NEH 630 ch. 16), so that D is as near 0.133 Tc as
 * the table allows and every tabulated depth lands on a step end; without a common step, the shorter
 * of 0.133 Tc and the rainfall's shortest interval. `rainfall` is the mass curve, or its step (s).
 */
export function unitDuration(tc: number, rainfall: MassCurve | number): number {
  const limit = UNIT_DURATION_OF_TC * tc;
  const step = typeof rainfall === "number" ? rainfall : rainfallStep(rainfall);
  if (step === null) return Math.min(limit, resolution(rainfall as MassCurve));
  return step / Math.ceil(step / limit - 1e-9);
}

/**
 * Relative change of the peak between two successive unit durations at or below which the converged
 * computation stops: 0.5 %, the routing contract's tolerance on peaks. The peak's error is about
 * linear in the step, so after a halving what remains is about the last change.
 */
export const PEAK_CONVERGENCE = 0.005;

/** Shortest unit duration the converged computation goes to (s). */
const FINEST_STEP = 5;

/** The runoff parameters of an area: one (composite) curve number, or parts computed separately. */
export type AreaRunoff = number | readonly RunoffPart[];

/**
 * The NRCS runoff hydrograph of an area (m2) with a curve number (or parts with their own, computed
 * separately) and Tc (s) for a rainfall mass curve. The unit duration follows `options.unitDuration`:
 * by default the method's convention (`unitDuration`, at most 0.133 Tc); "converged" halves it from
 * there (down to 5 s) until the peak changes by at most PEAK_CONVERGENCE, which tends to the
 * instantaneous unit hydrograph (time to peak 0.6 Tc) and a higher peak than the method's own;
 * `fixedStep` (s) computes at that step only.
 */
export function nrcsHydrograph(
  area: number,
  runoff: AreaRunoff,
  tc: number,
  rainfall: MassCurve,
  options: NrcsOptions = DEFAULT_NRCS_OPTIONS,
  fixedStep?: number,
): AreaHydrograph {
  const tcUsed = Math.max(tc, MIN_TC_NRCS);
  const parts: readonly RunoffPart[] = typeof runoff === "number" ? [{ share: 1, curveNumber: runoff }] : runoff;
  const choice = fixedStep ?? options.unitDuration ?? "standard";
  if (typeof choice === "number") return atStep(area, parts, tcUsed, rainfall, options, choice);
  const first = unitDuration(tcUsed, rainfall);
  let result = atStep(area, parts, tcUsed, rainfall, options, first);
  if (choice === "standard") return result;
  // Halving: with an error about linear in the step, the change of a halving is about the error left.
  for (let step = first / 2; step >= FINEST_STEP - 1e-9; step /= 2) {
    const finer = atStep(area, parts, tcUsed, rainfall, options, step);
    const change = Math.abs(finer.peak - result.peak) / Math.max(finer.peak, Number.MIN_VALUE);
    result = finer;
    if (change <= PEAK_CONVERGENCE) break;
  }
  return result;
}

function atStep(area: number, parts: readonly RunoffPart[], tcUsed: number, rainfall: MassCurve, options: NrcsOptions, step: number): AreaHydrograph {
  const start = rainfall.times[0];
  const count = Math.ceil((rainfall.times[rainfall.times.length - 1] - start) / step - 1e-9);
  const excess = new Float64Array(count);
  let before = partsRunoffDepth(depthAt(rainfall, start), parts, options.ratio);
  for (let k = 0; k < count; k++) {
    const after = partsRunoffDepth(depthAt(rainfall, start + (k + 1) * step), parts, options.ratio);
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
    runoff: partsRunoffDepth(total, parts, options.ratio),
    tc: tcUsed,
    unitDuration: step,
    unitTimeToPeak: tp,
    stormDuration: null,
  };
}
