// The pond's part of the cost proxy: excavation and footprint, overridable in the case's `costs` like
// the outlet's weights (per ft3 and ft2 in US cases, per m3 and m2 in SI). Invented relative efforts
// for ranking alternatives, not prices.
import type { Case } from "../src/model.js";
import { FOOT } from "../src/units.js";
import type { SizedPond } from "../src/storage/sizing.js";

export const DEFAULT_POND_COSTS_US = {
  /** Per ft3 excavated below the top of embankment. */
  excavation: 0.001,
  /** Per ft2 of footprint at the top of embankment (land taken). */
  footprint: 0.002,
};

/** Weights in SI (per m3, per m2). */
export function pondCostWeights(c: Case): typeof DEFAULT_POND_COSTS_US {
  const unit = c.units === "US" ? FOOT : 1;
  const given = (key: keyof typeof DEFAULT_POND_COSTS_US, power: number) =>
    c.costs[key] !== undefined ? c.costs[key] / unit ** power : DEFAULT_POND_COSTS_US[key] / FOOT ** power;
  return { excavation: given("excavation", 3), footprint: given("footprint", 2) };
}

export function pondCost(p: SizedPond, w: typeof DEFAULT_POND_COSTS_US): number {
  return w.excavation * p.excavation + w.footprint * p.topArea;
}
