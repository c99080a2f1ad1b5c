// Time for a pond with no further inflow to fall from one stage to a lower one through its outlet:
// t = integral of A(h) dh / O(h), taken as sum of dS / O(mid-stage) over equal stage steps (level-pool
// drain, the integral of the continuity equation dS/dt = -O(h)). The outflows at the mid-stages come
// from the rating sweep (`rateOutlet`, as every rating table's do: within 1e-5 of the direct
// evaluation, tests/routing/drainTime.test.ts and drainTimeKept.test.ts); `direct` evaluates each stage on its own instead.
// No allocation per stage: the mid-stage grids and the flows are kept between calls.
import type { Outlet, Pond, Tailwater } from "../model.js";
import { rateOutlet } from "../hydraulics/outletRating.js";
import type { StorageCurve } from "../storage/curve.js";

/** Stage steps of the integral (midpoint rule; the tests compare it with Torricelli's closed form). */
const STEPS = 400;

/**
 * Mid-stage grids by their ends, least recently used dropped: the sweep keeps each part's free flow
 * per grid object (openingsSweep.ts), so a drain between the same two stages (a water-quality
 * volume, evaluated for every candidate of a search) reuses the columns of the parts it shares.
 * A grid's stages never change once made.
 */
const GRIDS_KEPT = 16;
const grids = new Map<string, Float64Array>();
const flows = new Float64Array(STEPS);

function midStages(from: number, to: number): Float64Array {
  const key = `${from} ${to}`;
  let stages = grids.get(key);
  if (stages) grids.delete(key);
  else {
    stages = new Float64Array(STEPS);
    const dh = (from - to) / STEPS;
    for (let i = 0; i < STEPS; i++) stages[i] = to + (i + 0.5) * dh;
  }
  grids.set(key, stages);
  if (grids.size > GRIDS_KEPT) grids.delete(grids.keys().next().value as string);
  return stages;
}

/** Seconds to drain from stage `from` down to `to` (Infinity when the outlet passes nothing on the way). */
export function drainTime(storage: StorageCurve, outlet: Outlet, tail: Tailwater, from: number, to: number, direct = false): number {
  if (!(from > to)) return 0;
  const dh = (from - to) / STEPS;
  rateOutlet(outlet, tail, midStages(from, to), flows, direct);
  let t = 0;
  let below = storage.volume(to);
  for (let i = 0; i < STEPS; i++) {
    const above = storage.volume(to + (i + 1) * dh);
    const q = flows[i];
    if (!(q > 0)) return Infinity;
    t += (above - below) / q;
    below = above;
  }
  return t;
}

/** The stage at which the storage above pond.bottom is `volume` (bisection on the storage curve). */
export function stageOfVolume(storage: StorageCurve, pond: Pond, volume: number): number {
  let low = pond.bottom;
  let high = pond.top + (pond.top - pond.bottom);
  for (let i = 0; i < 80 && high - low > 1e-9; i++) {
    const mid = 0.5 * (low + high);
    if (storage.volume(mid) < volume) low = mid;
    else high = mid;
  }
  return 0.5 * (low + high);
}
