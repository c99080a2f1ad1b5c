// What the buildability rules share: the outlet's openings placed on their wall (parts/placement.ts)
// with the case's limits, and the words for a hole of the plan ("E2", "the barrel").
import type { Case, Outlet } from "../../model.js";
import type { StormRouting } from "../../routing/routeCase.js";
import { placeOpenings, type HoleRef, type WallPlan } from "../../parts/placement.js";
import type { RuleInput } from "./rule.js";

/** The highest stage any storm reaches (m), null when none is routed. */
export function highestOf(storms: readonly StormRouting[]): number | null {
  let top: number | null = null;
  for (const s of storms) if (top === null || s.result.maxStage > top) top = s.result.maxStage;
  return top;
}

/** The highest stage any storm of the design routing reaches (m), null when none is routed. */
export function highestStage(input: RuleInput): number | null {
  return highestOf(input.routings.design);
}

/** An outlet's openings placed on their wall with the case's web and headwall width (a notch's plate without a riser up to the highest stage routed). */
export function casePlan(c: Case, outlet: Outlet, storms: readonly StormRouting[]): WallPlan {
  const b = c.criteria.buildability;
  return placeOpenings(outlet, { web: b.web, headwallWidth: b.headwallWidth, highestStage: highestOf(storms) });
}

/** The outlet's openings placed on their wall. */
export function wallPlan(input: RuleInput): WallPlan {
  return casePlan(input.case, input.outlet, input.routings.design);
}

/** A hole of the plan in words. */
export function holeWords(outlet: Outlet, ref: HoleRef): string {
  if (ref.kind === "barrel") return "the barrel";
  if (ref.kind === "edge") return outlet.riser ? "a corner" : "an end of the headwall";
  return `E${ref.element + 1}`;
}
