// The cost proxy: a relative measure of what an outlet takes to build (not money). Each weight may be
// overridden in the case's `costs`, in the case's length unit (per ft for US, per m for SI).
import { own } from "../src/own.js";
import type { Case, Outlet } from "../src/model.js";
import { FOOT } from "../src/units.js";
import { riserPerimeter } from "../src/hydraulics/riser.js";

/** Default weights per foot: invented relative efforts for ranking alternatives, not prices. */
export const DEFAULT_COSTS_PER_FOOT = {
  /** Each orifice opening cut and fitted with a trash rack. */
  opening: 1.0,
  /** Per foot of orifice diameter, per opening. */
  orificeDiameter: 4.0,
  /** Each weir notch. */
  weir: 1.5,
  /** Per foot of rectangular weir length. */
  weirLength: 0.5,
  /** Each distinct control elevation (forming, survey). */
  level: 0.5,
  /** A riser structure. */
  riser: 4.0,
  /** Per foot of riser perimeter. */
  riserPerimeter: 0.5,
  /** Per foot of barrel diameter (or rise) per foot of barrel length. */
  barrel: 0.04,
};

export type CostWeights = typeof DEFAULT_COSTS_PER_FOOT;
export const COST_KEYS = Object.keys(DEFAULT_COSTS_PER_FOOT) as (keyof CostWeights)[];
// The case file's schema lists the same names (COST_WEIGHT_NAMES); a test holds them equal.

/** Weights in SI (per m, per m2), from the defaults and the case's overrides. */
export function costWeights(c: Case): CostWeights {
  const perUnit = c.units === "US" ? FOOT : 1;
  const weights = { ...DEFAULT_COSTS_PER_FOOT };
  const lengthPower: Record<keyof CostWeights, number> = {
    opening: 0, orificeDiameter: 1, weir: 0, weirLength: 1, level: 0, riser: 0, riserPerimeter: 1, barrel: 2,
  };
  for (const key of COST_KEYS) {
    const given = own(c.costs, key);
    // Defaults are per foot; a case's own weights are per its length unit.
    weights[key] = given !== undefined ? given / Math.pow(perUnit, lengthPower[key]) : weights[key] / Math.pow(FOOT, lengthPower[key]);
  }
  return weights;
}

/** Cost proxy of an outlet; kept parts cost nothing (they exist already). */
export function outletCost(outlet: Outlet, w: CostWeights): number {
  let cost = 0;
  const levels = new Set<number>();
  for (const e of outlet.elements) {
    if (e.keep) continue;
    if (e.type === "orifice") {
      levels.add(Math.round(e.invert * 1e6));
      const size = e.shape === "circular" ? e.diameter : Math.max(e.width, e.height);
      cost += e.count * (w.opening + w.orificeDiameter * size);
    } else if (e.type === "weir") {
      levels.add(Math.round(e.crest * 1e6));
      cost += w.weir + (e.shape === "rectangular" ? w.weirLength * e.length : 0);
    }
  }
  cost += w.level * levels.size;
  if (outlet.riser && !outlet.riser.keep) cost += w.riser + w.riserPerimeter * riserPerimeter(outlet.riser);
  if (outlet.barrel && !outlet.barrel.keep) {
    const size = outlet.barrel.shape === "circular" ? outlet.barrel.diameter : outlet.barrel.rise;
    cost += w.barrel * size * outlet.barrel.length;
  }
  return cost;
}
