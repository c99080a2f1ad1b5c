// The cost proxy: a relative measure of what an outlet takes to build (not money), the sum of its
// parts' terms (each kind's `cost`, src/parts/) and a term per control level. Each weight may be
// overridden in the case's `costs`, in the case's length unit (per ft for US, per m for SI).
import { own } from "../../src/own.js";
import type { Case, Outlet } from "../../src/model.js";
import { FOOT } from "../../src/units.js";
import { COST_KEYS, COST_LENGTH_POWER, DEFAULT_COSTS_PER_FOOT, type CostWeights } from "../../src/parts/cost.js";
import { partOf } from "../../src/parts/registry.js";
import { riserCost } from "../../src/parts/riser.js";
import { barrelCost } from "../../src/parts/barrel.js";
import { levelCount } from "../../src/assess/rules/levelSpacing.js";

/** Weights in SI (per m, per m2), from the defaults and the case's overrides. */
export function costWeights(c: Case): CostWeights {
  const perUnit = c.units === "US" ? FOOT : 1;
  const weights = { ...DEFAULT_COSTS_PER_FOOT };
  for (const key of COST_KEYS) {
    const given = own(c.costs, key);
    // Defaults are per foot; a case's own weights are per its length unit.
    weights[key] = given !== undefined ? given / Math.pow(perUnit, COST_LENGTH_POWER[key]) : weights[key] / Math.pow(FOOT, COST_LENGTH_POWER[key]);
  }
  return weights;
}

/**
 * Cost proxy of an outlet; kept parts cost nothing (they exist already). Control levels closer than
 * `levelSpacing` (m) count as one (`buildability.levelSpacing`).
 */
export function outletCost(outlet: Outlet, w: CostWeights, levelSpacing: number): number {
  let cost = 0;
  const levels: number[] = [];
  for (const e of outlet.elements) {
    if (e.keep) continue;
    const kind = partOf(e);
    if (kind.level) levels.push(kind.bottom(e));
    cost += kind.cost(e, w);
  }
  cost += w.level * levelCount(levels, levelSpacing);
  if (outlet.riser && !outlet.riser.keep) cost += riserCost(outlet.riser, w);
  if (outlet.barrel && !outlet.barrel.keep) cost += barrelCost(outlet.barrel, w);
  return cost;
}
