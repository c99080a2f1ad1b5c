// The target band of a storm: [target*(1-under), target*(1+over)] (design notes' vocabulary). The
// only place the band is computed; checks, search aims and reports all call it.
import type { Storm } from "../../model.js";
import { lowerFlowSlack, PASS_TOLERANCE, upperFlowSlack } from "./rule.js";

export interface Tolerance {
  over: number;
  under: number;
}

/** Lower and upper edge of the band around a target (m3/s). */
export function targetBand(target: number, tolerance: Tolerance): [number, number] {
  return [target * (1 - tolerance.under), target * (1 + tolerance.over)];
}

/** The band narrowed by `margin` (a fraction of the target) inside each edge: what the search aims at. */
export function narrowed(tolerance: Tolerance, margin: number): Tolerance {
  return { over: tolerance.over - margin, under: tolerance.under - margin };
}

/**
 * Whether a peak passes both band checks, by the same slack and tolerance as the peak rules (so a
 * report's "within tolerance" and the checks never disagree at an edge). Edges count as inside.
 */
export function withinTargetBand(peak: number, target: number, tolerance: Tolerance): boolean {
  const [lower, upper] = targetBand(target, tolerance);
  return upperFlowSlack(peak, upper) >= -PASS_TOLERANCE && (lower <= 0 || lowerFlowSlack(peak, lower) >= -PASS_TOLERANCE);
}

/** Words naming the governing release limit of a storm for a check's name: none for a plain target. */
export function limitWords(storm: Storm): string {
  const g = storm.governingLimit;
  return g === null || g.form === "target" ? "" : ` (${g.statement})`;
}
