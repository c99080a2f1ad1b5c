// A notch or weir fits the wall that holds it: a v-notch's top width (at the top of its plate: a
// riser's rim, or without a riser the highest stage routed), a rectangular weir's length and a
// Cipolletti weir's top width within the usable width of the wall: the plate, with the clear web at
// each end, spans at most a round riser's diameter (the longest chord across it), a box riser's
// longest side or a headwall's stated width (parts/wall.ts). Not checked on a headwall of unstated width.
import { formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { plateTop } from "../../parts/placement.js";
import { usableWidth, wallOf } from "../../parts/wall.js";
import { failingSubjects, HAIR, makeCheck, type Rule } from "./rule.js";
import { highestStage } from "./walls.js";

export const notchWidth: Rule = {
  kind: "notch-width",
  quantity: "length",
  comparison: "at most",
  routings: ["design"],
  asBuilt: true,
  evaluate(input, out) {
    const { case: c, outlet } = input;
    const b = c.criteria.buildability;
    const usable = usableWidth(wallOf(outlet, b.headwallWidth), b.web);
    if (usable === null) return;
    const top = highestStage(input);
    let widest: { index: number; width: number } | null = null;
    for (let index = 0; index < outlet.elements.length; index++) {
      const e = outlet.elements[index];
      const kind = partOf(e);
      if (kind.opening(e) !== null) continue;
      const room = kind.room(e, plateTop(outlet, top, kind.bottom(e)));
      if (room === null) continue;
      if (widest === null || room.width > widest.width) widest = { index, width: room.width };
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
