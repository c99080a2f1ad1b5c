// A storm's routed peak at most the upper edge of its target band.
import { limitWords, targetBand, narrowed } from "./band.js";
import { atPointWords, makeCheck, POINT_OF_ANALYSIS, upperFlowSlack, type Rule } from "./rule.js";

export const peakUpper: Rule = {
  kind: "peak-upper",
  quantity: "flow",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    for (const { storm, result } of routings.design) {
      if (storm.target === null) continue;
      const upper = targetBand(storm.target, c.criteria)[1];
      const peak = result.peakAtPoint;
      const check = makeCheck("peak-upper", storm.name, `${storm.name} peak${atPointWords(storm)} within upper band${limitWords(storm)}`, peak, upper, upperFlowSlack(peak, upper), storm.governingLimit?.label ?? null);
      if (storm.bypass) check.point = POINT_OF_ANALYSIS;
      out.push(check);
    }
  },
  aim(c, check, margin) {
    const target = c.storms.find((s) => s.name === check.storm)!.target!;
    const high = targetBand(target, narrowed(c.criteria, aimMargin(c.criteria, margin)))[1];
    return (check.limit - high) / check.limit;
  },
  why: (check) =>
    check.point === null
      ? `the ${check.storm} storm releases close to its allowable peak`
      : `the ${check.storm} flow at the ${check.point} (the pond's outflow plus the runoff bypassing the pond) comes close to its allowable peak`,
  remedy: () => "no single elevation step helps; a smaller opening at the level that holds this storm, or more storage",
  subject: (check) => (check.point === null ? `${check.storm} peak` : `${check.storm} peak at the ${check.point}`),
  whyNothingComplies: ({ firstLevelBound }) =>
    firstLevelBound ? null : "Some storms exceed their allowable peak with every layout tried; allow smaller openings or more control levels, or add storage.",
};

/** The search's margin inside each band edge: at most a quarter of the band's width. */
export function aimMargin(tolerance: { over: number; under: number }, margin: number): number {
  return Math.min(margin, (tolerance.over + tolerance.under) / 4);
}
