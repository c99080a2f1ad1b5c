// Every rule, in the order its checks are listed. Adding a rule: one file in this folder, one line here.
import type { Check, CheckKind, InfeasibleInput, Rule } from "./rule.js";
import { peakUpper } from "./peakUpper.js";
import { peakLower } from "./peakLower.js";
import { freeboard } from "./freeboard.js";
import { spillwayDry } from "./spillwayDry.js";
import { drawdown } from "./drawdown.js";
import { overtopping } from "./overtopping.js";
import { blockedOutlet } from "./blockedOutlet.js";
import { belowPreHydrograph } from "./belowPreHydrograph.js";
import { extendedDetention } from "./extendedDetention.js";
import { minimumOpening } from "./minimumOpening.js";
import { minimumOpeningRelease } from "./minimumOpeningRelease.js";
import { surcharge } from "./surcharge.js";
import { exfiltrationDrain } from "./exfiltrationDrain.js";
import { furtherPointPeakRule } from "./furtherPointPeak.js";
import { levelSpacing } from "./levelSpacing.js";
import { rimClearance } from "./rimClearance.js";
import { notchWidth } from "./notchWidth.js";
import { openingWeb } from "./openingWeb.js";
import { barrelFit } from "./barrelFit.js";
import { barrelCapacity } from "./barrelCapacity.js";

export const RULES: readonly Rule[] = [
  peakUpper,
  peakLower,
  belowPreHydrograph,
  freeboard,
  spillwayDry,
  drawdown,
  exfiltrationDrain,
  surcharge,
  overtopping,
  blockedOutlet,
  extendedDetention,
  minimumOpening,
  minimumOpeningRelease,
  furtherPointPeakRule,
  levelSpacing,
  rimClearance,
  notchWidth,
  openingWeb,
  barrelFit,
  barrelCapacity,
];

const BY_KIND = new Map<CheckKind, Rule>(RULES.map((r) => [r.kind, r]));

/** The rule that produced a check of this kind. */
export function ruleOf(check: { kind: CheckKind }): Rule {
  return BY_KIND.get(check.kind)!;
}

/** The kinds of every rule (what `criteria.clogging.checks` may name). */
export const RULE_KINDS: readonly CheckKind[] = RULES.map((r) => r.kind);

/**
 * Why nothing complies, rule by rule in the registry's order: each rule failing in the closest
 * candidates words its own cause (a sentence two rules share is given once).
 */
export function whyNothingComplies(input: Omit<InfeasibleInput, "failing">, closestChecks: readonly (readonly Check[])[]): string[] {
  const failing = new Map<Rule, Check[]>();
  for (const checks of closestChecks) {
    for (const check of checks) {
      if (check.passed) continue;
      const rule = ruleOf(check);
      const list = failing.get(rule);
      if (list) list.push(check);
      else failing.set(rule, [check]);
    }
  }
  const lines = new Set<string>();
  for (const rule of RULES) {
    const checks = failing.get(rule);
    const line = checks ? rule.whyNothingComplies({ ...input, failing: checks }) : null;
    if (line !== null) lines.add(line);
  }
  return [...lines];
}
