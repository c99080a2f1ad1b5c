// A routed outlet judged against the case: checks, warnings, compliance and the binding check.
import type { Case } from "../model.js";
import type { CaseRouting } from "../routing/routeCase.js";
import { bindingCheck, evaluateChecks, type Check } from "./checks.js";
import { outletWarnings, type Warning } from "./warnings.js";
import { implausibleInputWarnings } from "./plausibility.js";
import type { WallPlan } from "../parts/placement.js";
import { casePlan } from "./rules/walls.js";

export interface Assessment {
  checks: Check[];
  warnings: Warning[];
  compliant: boolean;
  binding: Check | undefined;
  /** Where each opening sits on its wall (the placement the buildability rules judge). */
  wall: WallPlan;
}

/** `direct`: rules that evaluate the outlet themselves do it stage by stage (the search's reference path). */
export function assess(c: Case, routing: CaseRouting, direct = false): Assessment {
  const checks = evaluateChecks(c, routing.outlet, routing.storms, undefined, direct);
  return {
    checks,
    warnings: [...outletWarnings(c, routing.outlet, routing), ...implausibleInputWarnings(c, routing.outlet, routing)],
    compliant: checks.every((check) => check.passed),
    binding: bindingCheck(checks),
    wall: casePlan(c, routing.outlet, routing.storms),
  };
}
