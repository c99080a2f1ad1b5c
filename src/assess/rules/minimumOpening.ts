// Minimum opening: every orifice at least the size the rules permit (a circular orifice's diameter, a
// rectangular orifice's smaller side), whatever the catalogue lists.
import type { Outlet } from "../../model.js";
import { makeCheck, type Rule } from "./rule.js";

/** The smallest orifice dimension of an outlet (m); null without orifices. */
export function smallestOpening(outlet: Outlet): number | null {
  let smallest: number | null = null;
  for (const e of outlet.elements) {
    if (e.type !== "orifice") continue;
    const size = e.shape === "circular" ? e.diameter : Math.min(e.width, e.height);
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
    const size = smallestOpening(outlet);
    if (!rule || size === null) return;
    out.push(makeCheck("minimum-opening", "outlet", "smallest orifice at least the minimum opening", size, rule.size, (size - rule.size) / rule.size, rule.label));
  },
  aim: () => 0,
  why: () => "an orifice is at the smallest size the rules permit",
  remedy: () => "no elevation step helps; a larger orifice (the minimum opening is a rule, not a catalogue choice)",
  subject: () => "smallest orifice",
  whyNothingComplies: () => "Every layout tried needs an orifice smaller than the minimum opening the rules permit; allow larger orifices in the catalogue.",
};
