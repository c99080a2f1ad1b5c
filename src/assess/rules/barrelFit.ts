// The barrel fits the riser it leaves: its hole, with the clear web at each side, within the wall it
// is cut in: a round riser's diameter (the longest chord across it), a box riser's downstream side.
// (Its crown below the rim is the rim-clearance rule's; its web to the openings the opening-web rule's.)
import type { Outlet } from "../../model.js";
import { formatter } from "../../format.js";
import { barrelSpan } from "../../parts/barrel.js";
import { barrelWallWidth } from "../../parts/riser.js";
import { HAIR, makeCheck, type Rule } from "./rule.js";

/** The barrel's width across the riser's wall, and the most that wall takes with a web each side (m); null without both. */
export function barrelInWall(outlet: Outlet, web: number): { width: number; usable: number } | null {
  const { riser: r, barrel: b } = outlet;
  if (!r || !b) return null;
  return { width: barrelSpan(b), usable: barrelWallWidth(r) - 2 * web };
}

export const barrelFit: Rule = {
  kind: "barrel-fit",
  quantity: "length",
  comparison: "at most",
  routings: ["design"],
  asBuilt: true,
  evaluate({ case: c, outlet }, out) {
    const { web, labels } = c.criteria.buildability;
    const fit = barrelInWall(outlet, web);
    if (fit === null) return;
    const f = formatter(c.units);
    const limit = Math.max(fit.usable, 0);
    const slack = limit > 0 ? (limit - fit.width) / limit : -1;
    out.push(makeCheck("barrel-fit", "outlet", `barrel within the riser's wall, ${f.size(web)} web each side`, fit.width, limit, slack, labels.web));
  },
  aim: () => HAIR,
  why: () => "the barrel is nearly as wide as the riser's wall can take",
  remedy: () => "a wider riser or a smaller barrel",
  subject: () => "barrel width",
  whyNothingComplies: () => "Every layout tried has a barrel wider than its riser's wall can take; allow wider risers or smaller barrels.",
};
