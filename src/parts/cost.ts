// The weights of the cost proxy: a relative measure of what an outlet takes to build (not money). The
// parts' `cost` terms use them; search/engine/cost.ts applies a case's overrides and sums an outlet.

/** Default weights per foot: invented relative efforts for ranking alternatives, not prices. */
export const DEFAULT_COSTS_PER_FOOT = {
  /** Each orifice opening cut and fitted with a trash rack. */
  opening: 1.0,
  /** Per foot of orifice diameter, per opening. */
  orificeDiameter: 4.0,
  /** Each weir notch. */
  weir: 1.5,
  /** Per foot of weir length (rectangular and Cipolletti weirs). */
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
/** The weights' names (the case file's `costs` takes each; the schema lists them from here). */
export const COST_KEYS = Object.keys(DEFAULT_COSTS_PER_FOOT) as (keyof CostWeights)[];
/** The power of length in each weight's unit (per ft, per ft2), for converting it to SI. */
export const COST_LENGTH_POWER: Record<keyof CostWeights, number> = {
  opening: 0, orificeDiameter: 1, weir: 0, weirLength: 1, level: 0, riser: 0, riserPerimeter: 1, barrel: 2,
};
