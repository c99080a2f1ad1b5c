// Distinct control levels at least `criteria.buildability.levelSpacing` apart (default 0.25 ft / 75 mm,
// common practice): the inverts and crests of the openings, taken bottom up, either share an elevation
// (one control level) or are at least that far apart. Openings closer than that are one level in
// intent (the search and the catalogue's maxStages count them as one) and should be set at one
// elevation; two levels 0.05 ft apart are a drafting error, not a design.
import type { Outlet } from "../../model.js";
import { formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { HAIR, makeCheck, type Rule } from "./rule.js";

/** Elevations closer than this are one elevation (m): round-off of conversions, not a spacing. */
const SAME_ELEVATION = 1e-6;

/** The distinct bottoms (inverts and crests) of an outlet's control levels, lowest first (m). */
export function controlElevations(outlet: Outlet): number[] {
  const bottoms = outlet.elements.filter((e) => partOf(e).level).map((e) => partOf(e).bottom(e)).sort((a, b) => a - b);
  return bottoms.filter((z, i) => i === 0 || z - bottoms[i - 1] > SAME_ELEVATION);
}

/** How many control levels elevations make when those closer than `spacing` count as one (each group from its lowest). */
export function levelCount(elevations: readonly number[], spacing: number): number {
  const sorted = [...elevations].sort((a, b) => a - b);
  let count = 0;
  let start = -Infinity;
  for (const z of sorted) {
    if (z - start >= spacing - SAME_ELEVATION) {
      count++;
      start = z;
    }
  }
  return count;
}

export const levelSpacing: Rule = {
  kind: "level-spacing",
  quantity: "length",
  comparison: "at least",
  routings: ["design"],
  asBuilt: true,
  evaluate({ case: c, outlet }, out) {
    const levels = controlElevations(outlet);
    if (levels.length < 2) return;
    let gap = Infinity;
    for (let i = 1; i < levels.length; i++) gap = Math.min(gap, levels[i] - levels[i - 1]);
    const { levelSpacing: spacing, labels } = c.criteria.buildability;
    const f = formatter(c.units);
    out.push(makeCheck("level-spacing", "outlet", `control levels at least ${f.length(spacing, c.units === "US" ? 2 : 3)} apart`, gap, spacing, (gap - spacing) / spacing, labels.levelSpacing));
  },
  aim: () => HAIR,
  why: () => "two control levels are close to the least spacing of distinct levels",
  remedy: () => "set the two openings at one elevation (one level), or move one level away from the other",
  subject: () => "spacing of control levels",
  whyNothingComplies: ({ case: c }) =>
    `Every layout tried needs control levels closer than ${formatter(c.units).length(c.criteria.buildability.levelSpacing, c.units === "US" ? 2 : 3)} apart; allow more sizes per level (counts, larger openings) or a deeper pond.`,
};
