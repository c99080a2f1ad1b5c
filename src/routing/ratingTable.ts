// The outlet's rating on a stage grid, with the pond's storage at the same stages: the table that
// storage-indication routing interpolates in.
import type { Outlet, Pond, Tailwater } from "../case/model.js";
import { storageCurve } from "../storage/curve.js";
import { outletDischarge } from "../hydraulics/outlet.js";
import { openingHeight } from "../hydraulics/orifice.js";

export interface RatingTable {
  /** Stage (m), strictly increasing. */
  stage: Float64Array;
  /** Storage above pond.bottom (m3) at each stage. */
  storage: Float64Array;
  /** Total outflow (m3/s) at each stage, non-decreasing. */
  outflow: Float64Array;
  /** Nodes where the computed outflow fell below the one beneath it and was held level. */
  heldNodes: number;
}

/** A stage grid with the pond's storage on it, reusable for every outlet on the same pond. */
export interface StageGrid {
  stage: Float64Array;
  storage: Float64Array;
}

/** Default number of grid intervals between pond.bottom and pond.top. */
export const GRID_INTERVALS = 800;
/** The grid extends this fraction of the pond's depth above pond.top (routing extrapolates beyond). */
export const GRID_EXTENSION = 0.5;

/**
 * Stage grid from pond.bottom to top + 50 % of the depth at `step` (default depth / 800), with the
 * given break points (inverts, crests, rim, pool) inserted so that every kink of the rating is a node.
 */
export function stageGrid(pond: Pond, breaks: readonly number[] = [], step?: number): StageGrid {
  const depth = pond.top - pond.bottom;
  const h = step ?? depth / GRID_INTERVALS;
  const end = pond.top + GRID_EXTENSION * depth;
  const n = Math.ceil((end - pond.bottom) / h);
  const points: number[] = [];
  for (let i = 0; i <= n; i++) points.push(pond.bottom + i * h);
  const tolerance = h * 1e-6;
  for (const b of breaks) if (b > pond.bottom + tolerance && b < points[n] - tolerance) points.push(b);
  points.sort((a, b) => a - b);
  const unique: number[] = [];
  for (const p of points) if (unique.length === 0 || p - unique[unique.length - 1] > tolerance) unique.push(p);
  const curve = storageCurve(pond);
  const stage = Float64Array.from(unique);
  const storage = stage.map((z) => curve.volume(z));
  return { stage, storage };
}

/** Elevations where an outlet's rating has a kink: inverts, opening tops, crests, rim, pool, top. */
export function ratingBreaks(pond: Pond, outlet: Outlet): number[] {
  const breaks = [pond.pool, pond.top];
  for (const e of outlet.elements) {
    if (e.type === "orifice") breaks.push(e.invert, e.invert + openingHeight(e));
    else if (e.type === "weir") breaks.push(e.crest);
    else breaks.push(e.invert, ...e.heads.map((h) => e.invert + h));
  }
  if (outlet.riser) breaks.push(outlet.riser.crest);
  if (outlet.spillway) breaks.push(outlet.spillway.crest);
  return breaks;
}

export interface RatingOptions {
  /** Grid step (m); default pond depth / 800. */
  step?: number;
  /** A precomputed grid (the search reuses one grid for every candidate). */
  grid?: StageGrid;
}

/** Rates an outlet on the pond's stage grid. */
export function buildRatingTable(pond: Pond, outlet: Outlet, tail: Tailwater, options: RatingOptions = {}): RatingTable {
  const grid = options.grid ?? stageGrid(pond, ratingBreaks(pond, outlet), options.step);
  const n = grid.stage.length;
  const outflow = new Float64Array(n);
  let held = 0;
  for (let i = 0; i < n; i++) {
    const q = outletDischarge(outlet, tail, grid.stage[i]);
    if (i > 0 && q < outflow[i - 1]) {
      if (outflow[i - 1] - q > 1e-9 * (1 + outflow[i - 1])) held++;
      outflow[i] = outflow[i - 1];
    } else outflow[i] = q;
  }
  return { stage: grid.stage, storage: grid.storage, outflow, heldNodes: held };
}

/** A table given directly as columns (e.g. a textbook's storage-indication table). */
export function tableFromColumns(stage: readonly number[], storage: readonly number[], outflow: readonly number[]): RatingTable {
  return {
    stage: Float64Array.from(stage),
    storage: Float64Array.from(storage),
    outflow: Float64Array.from(outflow),
    heldNodes: 0,
  };
}

/** Linear interpolation of a column of the table at a stage (extrapolating past the ends). */
export function interpolateAtStage(table: RatingTable, column: Float64Array, stage: number): number {
  const z = table.stage;
  const n = z.length;
  let lo = 0;
  let hi = n - 1;
  if (stage <= z[0]) hi = 1;
  else if (stage >= z[n - 1]) lo = n - 2;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (z[mid] <= stage) lo = mid;
    else hi = mid;
  }
  hi = lo + 1;
  return column[lo] + ((column[hi] - column[lo]) * (stage - z[lo])) / (z[hi] - z[lo]);
}
