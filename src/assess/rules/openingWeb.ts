// Openings on one wall do not overlap and keep a clear web between them, across and up, and to a box
// riser's corners, a headwall's ends and the barrel's hole: the smallest clear web of the placement
// outfit gives the openings (parts/placement.ts) at least `criteria.buildability.web` (default 6 in /
// 150 mm, the minimum structural leg between openings in a precast wall: NPCA, "Manhole sizing
// recommendations", 2010; common practice). Not checked on a headwall of unstated width, where the
// openings can always be set apart.
import { formatter } from "../../format.js";
import { wallLength } from "../../parts/wall.js";
import { HAIR, makeCheck, type Rule } from "./rule.js";
import { holeWords, wallPlan } from "./walls.js";

export const openingWeb: Rule = {
  kind: "opening-web",
  quantity: "size",
  comparison: "at least",
  routings: ["design"],
  asBuilt: true,
  evaluate(input, out) {
    const plan = wallPlan(input);
    if (plan.web === null || plan.openings.length === 0 || wallLength(plan.wall) === null) return;
    const { web, labels } = input.case.criteria.buildability;
    const f = formatter(input.case.units);
    const between = plan.closest ? ` (${holeWords(input.outlet, plan.closest[0])} and ${holeWords(input.outlet, plan.closest[1])})` : "";
    out.push(makeCheck("opening-web", "outlet", `clear web in the wall at least ${f.size(web)}${between}`, plan.web, web, (plan.web - web) / web, labels.web));
  },
  aim: () => HAIR,
  why: () => "two holes in the wall (openings, the barrel, a corner) come close to the least clear web of wall the structure needs between them",
  remedy: () => "a larger riser, fewer openings at one level, smaller openings, or levels further apart",
  subject: () => "clear web",
  whyNothingComplies: ({ case: c }) =>
    `Every layout tried puts holes in the wall closer together than the clear web of ${formatter(c.units).size(c.criteria.buildability.web)}; allow larger risers, fewer openings per level or smaller openings.`,
};
