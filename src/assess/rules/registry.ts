// Every rule, in the order its checks are listed. Adding a rule: one file in this folder, one line here.
import type { CheckKind, Rule } from "./rule.js";
import { peakUpper } from "./peakUpper.js";
import { peakLower } from "./peakLower.js";
import { freeboard } from "./freeboard.js";
import { spillwayDry } from "./spillwayDry.js";
import { drawdown } from "./drawdown.js";
import { overtopping } from "./overtopping.js";

export const RULES: readonly Rule[] = [peakUpper, peakLower, freeboard, spillwayDry, drawdown, overtopping];

const BY_KIND = new Map<CheckKind, Rule>(RULES.map((r) => [r.kind, r]));

/** The rule that produced a check of this kind. */
export function ruleOf(check: { kind: CheckKind }): Rule {
  return BY_KIND.get(check.kind)!;
}
