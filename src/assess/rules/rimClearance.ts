// Weir crests, the tops of orifices and the barrel's crown at least `criteria.buildability.rimClearance`
// below the riser's rim (default 0.25 ft / 75 mm, common practice: the rim is one more control level,
// and a crest just under it passes nearly nothing before the rim takes over; a hole needs wall above it).
import type { Outlet } from "../../model.js";
import { formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { isHole, outlineHeight } from "../../parts/outline.js";
import { barrelRise } from "../../parts/barrel.js";
import { HAIR, makeCheck, type Rule } from "./rule.js";

/** The hole whose top is nearest the rim: its top (m: a closed opening's top, a notch's crest, the barrel's crown) and which (-1: the barrel); null without a riser or holes. */
export function highestTop(outlet: Outlet): { top: number; index: number } | null {
  if (!outlet.riser) return null;
  let highest: { top: number; index: number } | null = null;
  for (let index = 0; index < outlet.elements.length; index++) {
    const e = outlet.elements[index];
    const kind = partOf(e);
    if (!isHole(kind.outline(e))) continue;
    const top = kind.top(e);
    if (highest === null || top > highest.top) highest = { top, index };
  }
  const b = outlet.barrel;
  if (b && (highest === null || b.inletInvert + barrelRise(b) > highest.top)) highest = { top: b.inletInvert + barrelRise(b), index: -1 };
  return highest;
}

export const rimClearance: Rule = {
  kind: "rim-clearance",
  quantity: "length",
  comparison: "at least",
  routings: ["design"],
  asBuilt: true,
  evaluate({ case: c, outlet }, out) {
    const highest = highestTop(outlet);
    if (highest === null) return;
    const { rimClearance: limit, labels } = c.criteria.buildability;
    const f = formatter(c.units);
    const clearance = outlet.riser!.crest - highest.top;
    const which = highest.index < 0 ? "barrel crown" : `E${highest.index + 1} ${outlineHeight(partOf(outlet.elements[highest.index]).outline(outlet.elements[highest.index])) === null ? "crest" : "top"}`;
    out.push(makeCheck("rim-clearance", "outlet", `${which} at least ${f.length(limit, c.units === "US" ? 2 : 3)} below the rim`, clearance, limit, (clearance - limit) / limit, labels.rimClearance));
  },
  aim: () => HAIR,
  why: () => "a crest or an opening's top is close to the least distance below the rim",
  remedy: () => "raise the rim or lower the part",
  subject: () => "distance below the rim",
  whyNothingComplies: ({ case: c }) =>
    `Every layout tried has a crest or an opening's top closer than ${formatter(c.units).length(c.criteria.buildability.rimClearance, c.units === "US" ? 2 : 3)} below the rim; allow a higher rim (a deeper pond above the openings) or smaller openings.`,
};
