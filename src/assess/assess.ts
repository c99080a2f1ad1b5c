// A routed outlet judged against the case: checks, warnings, compliance and the binding check.
import type { Case, Outlet } from "../model.js";
import type { CaseRouting } from "../routing/routeCase.js";
import { bindingCheck, evaluateChecks, type Check } from "./checks.js";
import { outletWarnings, type Warning } from "./warnings.js";
import { implausibleInputWarnings } from "./plausibility.js";
import type { WallPlan } from "../parts/placement.js";
import { casePlan } from "./rules/walls.js";

/** One outlet's wall as judged: the pond it belongs to (null: the case's one pond), the outlet, and where each of its openings sits. */
export interface OutletWall {
  pond: string | null;
  outlet: Outlet;
  plan: WallPlan;
}

export interface Assessment {
  checks: Check[];
  warnings: Warning[];
  compliant: boolean;
  binding: Check | undefined;
  /** Each outlet's wall with its openings placed (the placement the buildability rules judge): the one pond's, or each pond's of a system. */
  walls: OutletWall[];
}

/** The wall of a single pond's outlet: its assessment's one. */
export function outletWall(a: Assessment): WallPlan {
  return a.walls[0].plan;
}

/** `direct`: rules that evaluate the outlet themselves do it stage by stage (the search's reference path). */
export function assess(c: Case, routing: CaseRouting, direct = false): Assessment {
  const checks = evaluateChecks(c, routing.outlet, routing.storms, undefined, direct);
  return {
    checks,
    warnings: [...outletWarnings(c, routing.outlet, routing), ...implausibleInputWarnings(c, routing.outlet, routing)],
    compliant: checks.every((check) => check.passed),
    binding: bindingCheck(checks),
    walls: [{ pond: null, outlet: routing.outlet, plan: casePlan(c, routing.outlet, routing.storms) }],
  };
}
