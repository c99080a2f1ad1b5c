// Minimum opening: every orifice at least the size the rules permit (a circular orifice's diameter, a
// rectangular orifice's smaller side: each kind's `openingSize`), whatever the catalogue lists.
import type { Outlet } from "../../model.js";
import { partOf } from "../../parts/registry.js";
import { makeCheck, type Rule } from "./rule.js";

/** The smallest opening size of an outlet (m) among the kinds the rule binds; null without any. */
export function smallestOpening(outlet: Outlet): number | null {
  let smallest: number | null = null;
  for (const e of outlet.elements) {
    const size = partOf(e).openingSize(e);
    if (size === null) continue;
    if (smallest === null || size < smallest) smallest = size;
  }
  return smallest;
}

export const minimumOpening: Rule = {
  kind: "minimum-opening",
  quantity: "size",
  comparison: "at least",
  routings: ["design"],
  evaluate({ case: c, outlet }, out) {
    const rule = c.criteria.minimumOpening;
    if (!rule) return;
    const size = smallestOpening(outlet);
    if (size === null) return;
    out.push(makeCheck("minimum-opening", "outlet", "smallest orifice at least the minimum opening", size, rule.size, (size - rule.size) / rule.size, rule.label));
  },
  aim: () => 0,
  why: () => "an orifice is at the smallest size the rules permit",
  remedy: () => "no elevation step helps; a larger orifice (the minimum opening is a rule, not a catalogue choice)",
  subject: () => "smallest orifice",
  whyNothingComplies: () => "Every layout tried needs an orifice smaller than the minimum opening the rules permit; allow larger orifices in the catalogue.",
};
