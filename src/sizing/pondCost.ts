// The pond's part of the cost proxy: excavation (cut below the existing grade, or below the top when
// no grade is given), embankment fill above the grade, and the land taken. Overridable in the case's
// `costs` (per ft3 and ft2 in US cases, per m3 and m2 in SI). Invented relative efforts for ranking
// alternatives, not prices: fill counts twice the cut per unit (it is placed and compacted as well as
// dug), and a square foot of land as much as two cubic feet of fill.
import type { UnitSystem } from "../units.js";
import { FOOT } from "../units.js";
import type { SizedPond } from "../storage/sizing.js";

export const DEFAULT_POND_COSTS_US = {
  /** Per ft3 excavated. */
  excavation: 0.001,
  /** Per ft3 of embankment fill. */
  fill: 0.002,
  /** Per ft2 of land taken. */
  land: 0.002,
};

export type PondCostWeights = typeof DEFAULT_POND_COSTS_US;

/** The names a case's `costs` may give for the pond. */
export const POND_COST_NAMES = ["excavation", "fill", "land"] as const;

/** Weights in SI (per m3, per m2). */
export function pondCostWeights(units: UnitSystem, costs: Partial<Record<string, number>>): PondCostWeights {
  const unit = units === "US" ? FOOT : 1;
  const given = (key: keyof PondCostWeights, power: number) => (costs[key] !== undefined ? costs[key] / unit ** power : DEFAULT_POND_COSTS_US[key] / FOOT ** power);
  return { excavation: given("excavation", 3), fill: given("fill", 3), land: given("land", 2) };
}

export interface PondCostParts {
  excavation: number;
  fill: number;
  land: number;
  total: number;
}

export function pondCostParts(p: SizedPond, w: PondCostWeights): PondCostParts {
  const excavation = w.excavation * p.cut;
  const fill = w.fill * p.fill;
  const land = w.land * p.land;
  return { excavation, fill, land, total: excavation + fill + land };
}

export function pondCost(p: SizedPond, w: PondCostWeights): number {
  return pondCostParts(p, w).total;
}
