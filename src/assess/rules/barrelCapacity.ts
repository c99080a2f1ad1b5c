// The barrel passes the riser's flow: with the pond at the rim, the barrel running with the chamber full
// to the rim carries at least what the openings let in there (discharging freely, or against a fixed
// tailwater). Otherwise the chamber fills to the rim before the pond reaches it: the openings below are
// drowned and the rim never works as a weir, so the outlet is the barrel's alone while the drawings
// show a designed riser. Above the rim the barrel may govern (pipe flow, as in a riser's usual
// sequence of weir, orifice and pipe flow).
import type { Case, Outlet } from "../../model.js";
import { openingsFlow } from "../../hydraulics/openings.js";
import { barrelFlow } from "../../hydraulics/barrelCurve.js";
import { tailwaterLevel } from "../../hydraulics/tailwater.js";
import { HAIR, makeCheck, type Rule } from "./rule.js";

/** The openings' flow with the pond at the rim and the barrel's with the chamber full to it (m3/s); null without a riser and a barrel, or with nothing let in. */
export function flowsAtRim(c: Case, outlet: Outlet): { openings: number; barrel: number } | null {
  const { riser: r, barrel: b } = outlet;
  if (!r || !b) return null;
  const openings = openingsFlow(outlet, r.crest, tailwaterLevel(c.tailwater, 0));
  if (!(openings > 0)) return null;
  return { openings, barrel: barrelFlow(b, r.crest, tailwaterLevel(c.tailwater, openings)) };
}

export const barrelCapacity: Rule = {
  kind: "barrel-capacity",
  quantity: "flow",
  comparison: "at least",
  routings: ["design"],
  asBuilt: true,
  evaluate({ case: c, outlet }, out) {
    const flows = flowsAtRim(c, outlet);
    if (flows === null) return;
    out.push(makeCheck("barrel-capacity", "outlet", "barrel, riser full, passes the openings at the rim", flows.barrel, flows.openings, (flows.barrel - flows.openings) / flows.openings));
  },
  aim: () => HAIR,
  why: () => "the barrel barely carries what the openings let in with the pond at the rim: the chamber nearly fills before the rim works",
  remedy: () => "a larger barrel, a lower rim or smaller openings below it",
  subject: () => "barrel flow at the rim",
  whyNothingComplies: () => "Every layout tried lets in more below the rim than its barrel carries with the riser full; allow larger barrels.",
};
