// A storm's routed peak at least the lower edge of its target band (no over-detention beyond it).
import { limitWords, targetBand, narrowed } from "./band.js";
import { aimMargin } from "./peakUpper.js";
import { lowerFlowSlack, makeCheck, type Rule } from "./rule.js";

export const peakLower: Rule = {
  kind: "peak-lower",
  quantity: "flow",
  comparison: "at least",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    for (const { storm, result } of routings.design) {
      if (storm.target === null) continue;
      const lower = targetBand(storm.target, c.criteria)[0];
      if (lower > 0) out.push(makeCheck("peak-lower", storm.name, `${storm.name} peak within lower band${limitWords(storm)}`, result.peakOutflow, lower, lowerFlowSlack(result.peakOutflow, lower), storm.governingLimit?.label ?? null));
    }
  },
  aim(c, check, margin) {
    const target = c.storms.find((s) => s.name === check.storm)!.target!;
    const low = targetBand(target, narrowed(c.criteria, aimMargin(c.criteria, margin)))[0];
    return (low - check.limit) / check.limit;
  },
  why: (check) => `the ${check.storm} storm is held back more than its band allows (over-detention)`,
  remedy: () => "no single elevation step helps; a larger opening at the level that holds this storm, or accept over-detention (tolerance.under)",
  subject: (check) => `${check.storm} peak`,
  whyNothingComplies: () => "Some storms stay below their lower band: the pond over-detains them with the openings that meet the other storms; accept over-detention (tolerance.under) or allow other sizes.",
};
