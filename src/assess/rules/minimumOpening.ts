// Minimum opening: every opening at least the size the rules permit, whatever the catalogue lists. Each
// kind says what it compares (`openingSize`): a circular orifice's diameter, a rectangular orifice's
// smaller side, a rectangular or Cipolletti weir's crest length, a v-notch's width one minimum size above
// its vertex (so a notch passes only with an angle of at least 2 atan(1/2), about 53.1 degrees); a
// manufactured regulator is not bound (its maker states its throat).
import type { Outlet } from "../../model.js";
import { formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { makeCheck, type Rule } from "./rule.js";

/** The smallest opening of an outlet against `minimum` (m) and its element, among the kinds the rule binds; null without any. */
export function smallestOpening(outlet: Outlet, minimum: number): { size: number; index: number } | null {
  let smallest: { size: number; index: number } | null = null;
  for (let index = 0; index < outlet.elements.length; index++) {
    const e = outlet.elements[index];
    const size = partOf(e).openingSize(e, minimum);
    if (size !== null && (smallest === null || size < smallest.size)) smallest = { size, index };
  }
  return smallest;
}

export const minimumOpening: Rule = {
  kind: "minimum-opening",
  quantity: "size",
  comparison: "at least",
  routings: ["design"],
  asBuilt: true,
  evaluate({ case: c, outlet }, out) {
    const rule = c.criteria.minimumOpening;
    if (!rule) return;
    const smallest = smallestOpening(outlet, rule.size);
    if (smallest === null) return;
    const e = outlet.elements[smallest.index];
    const f = formatter(c.units);
    out.push(makeCheck("minimum-opening", "outlet", `smallest opening at least ${f.size(rule.size)} (E${smallest.index + 1}, ${partOf(e).label(e, f)})`, smallest.size, rule.size, (smallest.size - rule.size) / rule.size, rule.label));
  },
  aim: () => 0,
  why: () => "an opening is at the smallest size the rules permit (an orifice's diameter or smaller side, a weir's length, a v-notch's width one minimum size above its vertex)",
  remedy: () => "no elevation step helps; a larger opening or a wider notch (the minimum opening is a rule, not a catalogue choice)",
  subject: () => "smallest opening",
  whyNothingComplies: () => "Every layout tried needs an opening smaller than the minimum opening the rules permit; allow larger orifices, longer weirs or wider notch angles in the catalogue.",
};
