// The case's criteria as checks with value, limit and slack (case-format contract): slack is how far
// a check is from failing as a fraction of its limit, on flows for flow checks and on depths above
// pond.bottom for elevation checks; negative when the check fails. Each kind of check is one rule
// in ./rules/; this file runs the registry, routing each variant some rule names once (and the
// clogged outlet when the case assumes clogging).
import type { Case, Outlet } from "../model.js";
import { routeCase, type StormRouting } from "../routing/routeCase.js";
import { RULES, ruleOf } from "./rules/registry.js";
import type { Check, Rule, RoutingVariant, RuleInput, VariantOutlet } from "./rules/rule.js";
import { cloggedOutlet, cloggingApplies } from "./rules/clogging.js";

export type { Check, CheckKind } from "./rules/rule.js";

/** Routes every storm of the case through an outlet (the search passes its own grid's router). */
export type OutletRouter = (outlet: Outlet) => readonly StormRouting[];

/** Every variant some rule names, with the outlet it routes. */
function variantsOf(rules: readonly Rule[]): ReadonlyMap<RoutingVariant, VariantOutlet> {
  return new Map(rules.flatMap((r) => Object.entries(r.variants ?? {})));
}
const VARIANTS = variantsOf(RULES);

/**
 * `direct`: rules that rate the outlet themselves use the direct evaluation (see `RuleInput.direct`).
 * `rules`: the rules to evaluate (default every rule; a system of ponds judges some at the outfall).
 */
export function evaluateChecks(c: Case, outlet: Outlet, storms: readonly StormRouting[], router: OutletRouter = (o) => routeCase(c, o).storms, direct = false, rules: readonly Rule[] = RULES): Check[] {
  const checks: Check[] = [];
  const routings: Record<RoutingVariant, readonly StormRouting[]> & { design: readonly StormRouting[] } = { design: storms };
  for (const [name, variant] of rules === RULES ? VARIANTS : variantsOf(rules)) {
    const changed = variant(c, outlet);
    if (changed) routings[name] = router(changed);
  }
  const input: RuleInput = { case: c, outlet, routings, direct };
  for (const rule of rules) rule.evaluate(input, checks);
  const clog = c.criteria.clogging;
  if (clog) {
    const clogged = cloggedOutlet(outlet, clog.fraction);
    const cloggedInput: RuleInput = { case: c, outlet: clogged, routings: { ...routings, design: router(clogged) }, direct, condition: "clogged" };
    const words = `${+(100 * clog.fraction).toPrecision(6)} % clogged${clog.label === null ? "" : `, ${clog.label}`}`;
    for (const rule of rules) {
      if (rule.asBuilt || !cloggingApplies(c, rule.kind, rule.comparison) || rule.routings.some((v) => v !== "design")) continue;
      const from = checks.length;
      rule.evaluate(cloggedInput, checks);
      for (let i = from; i < checks.length; i++) {
        const check = checks[i];
        check.key += ":clogged";
        check.name += ` (${words})`;
        check.condition = "clogged";
      }
    }
  }
  // Flow checks are listed storm by storm (upper then lower), the others rule by rule; clogged after
  // their unclogged twins.
  const stormIndex = new Map(storms.map((s, i) => [s.storm.name, i]));
  const group = (check: Check) => (ruleOf(check).quantity === "flow" && stormIndex.has(check.storm) ? stormIndex.get(check.storm)! : storms.length + RULES.indexOf(ruleOf(check))) * 2 + (check.condition === "clogged" ? 1 : 0);
  return checks.sort((a, b) => group(a) - group(b));
}

/** The check with the least slack. */
export function bindingCheck(checks: readonly Check[]): Check | undefined {
  let best: Check | undefined;
  for (const check of checks) if (!best || check.slack < best.slack) best = check;
  return best;
}
