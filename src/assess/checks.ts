// The case's criteria as checks with value, limit and slack (case-format contract): slack is how far
// a check is from failing as a fraction of its limit, on flows for flow checks and on depths above
// pond.bottom for elevation checks; negative when the check fails. Each kind of check is one rule
// in ./rules/; this file runs the registry.
import type { Case, Outlet } from "../case/model.js";
import type { StormRouting } from "../routing/routeCase.js";
import { RULES, ruleOf } from "./rules/registry.js";
import type { Check } from "./rules/rule.js";

export type { Check, CheckKind } from "./rules/rule.js";

export function evaluateChecks(c: Case, outlet: Outlet, storms: readonly StormRouting[]): Check[] {
  const checks: Check[] = [];
  const input = { case: c, outlet, routings: { design: storms } };
  for (const rule of RULES) rule.evaluate(input, checks);
  // Flow checks are listed storm by storm (upper then lower), the others rule by rule.
  const stormIndex = new Map(storms.map((s, i) => [s.storm.name, i]));
  const group = (check: Check) => (ruleOf(check).quantity === "flow" ? stormIndex.get(check.storm)! : storms.length + RULES.indexOf(ruleOf(check)));
  return checks.sort((a, b) => group(a) - group(b));
}

/** The check with the least slack. */
export function bindingCheck(checks: readonly Check[]): Check | undefined {
  let best: Check | undefined;
  for (const check of checks) if (!best || check.slack < best.slack) best = check;
  return best;
}
