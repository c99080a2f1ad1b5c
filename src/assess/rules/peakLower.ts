// A storm's routed peak at least the lower edge of its target band (no over-detention beyond it).
import { limitWords, targetBand, narrowed } from "./band.js";
import { aimMargin } from "./peakUpper.js";
import { atPointWords, lowerFlowSlack, makeCheck, POINT_OF_ANALYSIS, type Rule } from "./rule.js";

export const peakLower: Rule = {
  kind: "peak-lower",
  quantity: "flow",
  comparison: "at least",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    for (const { storm, result } of routings.design) {
      if (storm.target === null) continue;
      const lower = targetBand(storm.target, c.criteria)[0];
      if (!(lower > 0)) continue;
      const peak = result.peakAtPoint;
      const check = makeCheck("peak-lower", storm.name, `${storm.name} peak${atPointWords(storm)} within lower band${limitWords(storm)}`, peak, lower, lowerFlowSlack(peak, lower), storm.governingLimit?.label ?? null);
      if (storm.bypass) check.point = POINT_OF_ANALYSIS;
      out.push(check);
    }
  },
  aim(c, check, margin) {
    const target = c.storms.find((s) => s.name === check.storm)!.target!;
    const low = targetBand(target, narrowed(c.criteria, aimMargin(c.criteria, margin)))[0];
    return (low - check.limit) / check.limit;
  },
  why: (check) =>
    check.point === null
      ? `the ${check.storm} storm is held back more than its band allows (over-detention)`
      : `the ${check.storm} flow at the ${check.point} (the pond's outflow plus the runoff bypassing the pond) is held back more than its band allows (over-detention)`,
  remedy: () => "no single elevation step helps; a larger opening at the level that holds this storm, or accept over-detention (tolerance.under)",
  subject: (check) => (check.point === null ? `${check.storm} peak` : `${check.storm} peak at the ${check.point}`),
  whyNothingComplies: () => "Some storms stay below their lower band: the pond over-detains them with the openings that meet the other storms; accept over-detention (tolerance.under) or allow other sizes.",
};
