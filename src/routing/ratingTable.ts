// The outlet's rating on a stage grid, with the pond's storage at the same stages: the table that
// storage-indication routing interpolates in.
import type { Outlet, Pond, Tailwater } from "../model.js";
import { storageBreaks, storageCurve } from "../storage/curve.js";
import { exfiltrationRate, WETTING_DEPTH } from "../storage/exfiltration.js";
import { RatingSweep } from "../hydraulics/outletRating.js";
import { bottomOf, partOf } from "../parts/registry.js";

export interface RatingTable {
  /** Stage (m), strictly increasing. */
  stage: Float64Array;
  /** Storage above pond.bottom (m3) at each stage. */
  storage: Float64Array;
  /** Total outflow through the outlet (m3/s) at each stage, non-decreasing. */
  outflow: Float64Array;
  /** Exfiltration into the ground (m3/s) at each stage, when the pond has it (a property of the storage, rated whole). */
  exfiltration?: Float64Array;
  /** Nodes where the computed outflow fell below the one beneath it and was held level. */
  heldNodes: number;
  /**
   * A lazy table (`lazyRatingTable`, the search's): `outflow` (and `heldNodes`) hold the stages below
   * `rated` only, and `extend(count)` rates on to at least `count` stages (the grid's at most) and
   * returns the new `rated`. Without them the whole table is rated.
   */
  rated?: number;
  extend?: (count: number) => number;
}

/** A stage grid with the pond's storage on it, reusable for every outlet on the same pond. */
export interface StageGrid {
  stage: Float64Array;
  storage: Float64Array;
  /** Exfiltration (m3/s) at each stage, when the pond has it. */
  exfiltration?: Float64Array;
}

/** Default number of grid intervals between pond.bottom and pond.top. */
export const GRID_INTERVALS = 800;
/** The grid extends this fraction of the pond's depth above pond.top (routing extrapolates beyond). */
export const GRID_EXTENSION = 0.5;

/**
 * Ratio of neighbouring grid intervals in the graded part of the grid above an onset (see `stageGrid`).
 * A flow that starts as a power p of the head (p = 1.5 over a crest, 2 at the bottom of a circular
 * opening, 2.5 for a v-notch; 0.5 above a tailwater level) is interpolated linearly between nodes:
 * the error of H^p on an interval [H, r H] is about p (p - 1) (r - 1)^2 / 8 of the flow, 0.3 % for
 * p = 2.5 and r = 1.08, where a uniform grid of step h gives about 9 % on [h, 2h] for p = 1.5.
 */
export const GRADING_RATIO = 1.08;
/** The graded nodes above an onset start at this fraction of the uniform grid step. */
export const GRADING_SMALLEST = 1 / 256;

/**
 * Stage grid from pond.bottom to top + 50 % of the depth at `step` (default depth / 800), with the
 * given break points (inverts, crests, rim, pool) and the rows of a storage table inserted so that
 * every kink of the rating and of the storage is a node. Above each onset (an elevation where a flow
 * starts as a power of the head) the grid is graded geometrically, from step / 256 until the uniform
 * step is within the grading ratio of the head.
 */
export function stageGrid(pond: Pond, breaks: readonly number[] = [], step?: number, onsets: readonly number[] = []): StageGrid {
  const depth = pond.top - pond.bottom;
  const h = step ?? depth / GRID_INTERVALS;
  const end = pond.top + GRID_EXTENSION * depth;
  const n = Math.ceil((end - pond.bottom) / h);
  const points: number[] = [];
  for (let i = 0; i <= n; i++) points.push(pond.bottom + i * h);
  const tolerance = h * 1e-6;
  const inside = (z: number) => z > pond.bottom + tolerance && z < points[n] - tolerance;
  for (const b of breaks) if (inside(b)) points.push(b);
  for (const z of storageBreaks(pond)) if (inside(z)) points.push(z);
  // The wetted bottom takes up its rate over the first millimetre: a node where it is complete.
  if (pond.exfiltration && inside(pond.bottom + WETTING_DEPTH)) points.push(pond.bottom + WETTING_DEPTH);
  const gradedSpan = (h * GRADING_RATIO) / (GRADING_RATIO - 1);
  for (const b of onsets) {
    if (!(b > pond.bottom - tolerance && b < points[n])) continue;
    for (let g = h * GRADING_SMALLEST; g < gradedSpan; g *= GRADING_RATIO) if (inside(b + g)) points.push(b + g);
  }
  points.sort((a, b) => a - b);
  const unique: number[] = [];
  for (const p of points) if (unique.length === 0 || p - unique[unique.length - 1] > tolerance) unique.push(p);
  const curve = storageCurve(pond);
  const stage = Float64Array.from(unique);
  const storage = stage.map((z) => curve.volume(z));
  if (!pond.exfiltration) return { stage, storage };
  return { stage, storage, exfiltration: stage.map((z) => exfiltrationRate(pond, z)) };
}

/** Elevations where an outlet's rating has a kink: inverts, opening tops, crests, rim, pool, top. */
export function ratingBreaks(pond: Pond, outlet: Outlet): number[] {
  const breaks = [pond.pool, pond.top];
  for (const e of outlet.elements) partOf(e).breaks(e, breaks);
  if (outlet.riser) breaks.push(outlet.riser.crest);
  if (outlet.spillway) breaks.push(outlet.spillway.crest);
  return breaks;
}

/**
 * Elevations where a flow starts as a power of the head: inverts, crests, the rim, the spillway crest
 * and a fixed tailwater level (above it a submerged opening's flow grows as the square root of the head).
 */
export function ratingOnsets(outlet: Outlet, tail: Tailwater): number[] {
  const onsets: number[] = [];
  for (const e of outlet.elements) onsets.push(bottomOf(e));
  if (outlet.riser) onsets.push(outlet.riser.crest);
  if (outlet.spillway) onsets.push(outlet.spillway.crest);
  if (tail.kind === "elevation") onsets.push(tail.elevation);
  return onsets;
}

export interface RatingOptions {
  /** Grid step (m); default pond depth / 800. */
  step?: number;
  /** A precomputed grid (the search reuses one grid for every candidate). */
  grid?: StageGrid;
  /** Every stage by the direct evaluation (`outletDischarge`) instead of the sweep with its tables
   * and warm starts (outletRating.ts): the reference for tests and the bench's "before". */
  direct?: boolean;
}

/** Rates an outlet on the pond's stage grid. */
export function buildRatingTable(pond: Pond, outlet: Outlet, tail: Tailwater, options: RatingOptions = {}): RatingTable {
  const lazy = lazyRatingTable(pond, outlet, tail, options);
  lazy.extend!(lazy.stage.length);
  return { stage: lazy.stage, storage: lazy.storage, outflow: lazy.outflow, exfiltration: lazy.exfiltration, heldNodes: lazy.heldNodes };
}

/** Stages a lazy table rates beyond the count asked for (one call per few intervals the router climbs). */
const LAZY_CHUNK = 8;

/**
 * A rating table that rates its stages as the router climbs into them (`RatingTable.extend`): a
 * storm that peaks at half the grid needs only the stages below it, and the stages above are where a
 * barrel throttles and each stage costs a chamber solve. The values are those of the whole table bit
 * for bit (each stage of the sweep depends only on the stages below, and the held level only on the
 * stage below). The search routes on these (search/engine/evaluate.ts); a table kept after its routings
 * (the `route` path's, the assessment's) is `buildRatingTable`'s, rated whole.
 */
export function lazyRatingTable(pond: Pond, outlet: Outlet, tail: Tailwater, options: RatingOptions = {}): RatingTable {
  const grid = options.grid ?? stageGrid(pond, ratingBreaks(pond, outlet), options.step, ratingOnsets(outlet, tail));
  const n = grid.stage.length;
  const outflow = new Float64Array(n);
  const sweep = new RatingSweep(outlet, tail, grid.stage, outflow, options.direct === true);
  const table: RatingTable = { stage: grid.stage, storage: grid.storage, outflow, exfiltration: grid.exfiltration, heldNodes: 0, rated: 0 };
  table.extend = (count: number) => {
    const done = table.rated as number;
    if (count <= done) return done;
    const end = sweep.rateTo(Math.max(count, done + LAZY_CHUNK));
    // The outflow does not fall as the stage rises: a node below the one beneath is held level.
    let held = table.heldNodes;
    for (let i = done; i < end; i++) {
      const q = outflow[i];
      if (i > 0 && q < outflow[i - 1]) {
        if (outflow[i - 1] - q > 1e-9 * (1 + outflow[i - 1])) held++;
        outflow[i] = outflow[i - 1];
      }
    }
    table.heldNodes = held;
    table.rated = end;
    return end;
  };
  return table;
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
