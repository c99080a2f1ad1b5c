// A notch or weir fits the wall that holds it: a v-notch's top width (at the top of its plate: a
// riser's rim, or without a riser the highest stage routed), a rectangular weir's length and a
// Cipolletti weir's top width within the usable width of the wall: the plate, with the clear web at
// each end, spans at most a round riser's diameter (the longest chord across it), a box riser's
// longest side or a headwall's stated width (parts/wall.ts), each notch as wide as the placement puts it
// on its wall (parts/placement.ts). Not checked on a headwall of unstated width.
import { formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { outlineHeight } from "../../parts/outline.js";
import { usableWidth } from "../../parts/wall.js";
import { failingSubjects, HAIR, makeCheck, type Rule } from "./rule.js";
import { wallPlan } from "./walls.js";

export const notchWidth: Rule = {
  kind: "notch-width",
  quantity: "length",
  comparison: "at most",
  routings: ["design"],
  asBuilt: true,
  evaluate(input, out) {
    const { case: c, outlet } = input;
    const b = c.criteria.buildability;
    // The notches as placed: each as wide as it is at the top of its plate.
    const plan = wallPlan(input);
    const usable = usableWidth(plan.wall, b.web);
    if (usable === null) return;
    let widest: { index: number; width: number } | null = null;
    for (const o of plan.openings) {
      const e = outlet.elements[o.element];
      if (outlineHeight(partOf(e).outline(e)) !== null) continue;
      if (widest === null || o.width > widest.width) widest = { index: o.element, width: o.width };
    }
    if (widest === null) return;
    const { index, width } = widest;
    const f = formatter(c.units);
    const limit = Math.max(usable, 0);
    const slack = limit > 0 ? (limit - width) / limit : -1;
    out.push(makeCheck("notch-width", "outlet", `E${index + 1} ${partOf(outlet.elements[index]).noun(outlet.elements[index])} within its wall, ${f.size(b.web)} web each end`, width, limit, slack, b.labels.web));
  },
  aim: () => HAIR,
  why: () => "a notch or weir is nearly as wide as its wall can take (a v-notch widens to the top of its plate)",
  remedy: () => "a lower rim (a shorter notch), a narrower notch angle or a shorter weir, or a wider riser",
  subject: () => "width of the widest notch or weir",
  whyNothingComplies: ({ failing }) =>
    `Every layout tried with notches or weirs needs one wider than its wall can take (${failingSubjects(failing)}); allow narrower notch angles, shorter weirs or wider risers.`,
};
