// Time for a pond with no further inflow to fall from one stage to a lower one through its outlet:
// t = integral of A(h) dh / O(h), taken as sum of dS / O(mid-stage) over equal stage steps (level-pool
// drain, the integral of the continuity equation dS/dt = -O(h)). The outflows at the mid-stages come
// from the rating sweep (outletRating.ts: within 1e-5 of the direct evaluation, tested), or with
// `direct` from `outletDischarge` at each stage on its own (the reference). One integral allocates
// its two columns of STEPS values; nothing per step.
import type { Outlet, Pond, Tailwater } from "../case/model.js";
import { rateOutlet } from "../hydraulics/outletRating.js";
import type { StorageCurve } from "../storage/curve.js";

/** Stage steps of the integral (midpoint rule; the tests compare it with Torricelli's closed form). */
const STEPS = 400;

/** Seconds to drain from stage `from` down to `to` (Infinity when the outlet passes nothing on the way). */
export function drainTime(storage: StorageCurve, outlet: Outlet, tail: Tailwater, from: number, to: number, direct = false): number {
  if (!(from > to)) return 0;
  const dh = (from - to) / STEPS;
  const stages = new Float64Array(STEPS);
  for (let i = 0; i < STEPS; i++) stages[i] = to + (i + 0.5) * dh;
  const flows = new Float64Array(STEPS);
  // A grid of its own, used once: the parts' free-flow columns are not kept for it.
  rateOutlet(outlet, tail, stages, flows, direct, false);
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
