// The outlet's total outflow at every stage of a rating grid, swept from the bottom up. By default
// the sweep reuses what one stage tells the next: each opening's free flow once per stage
// (OpeningsSweep), the chamber root and the root under a tailwater rating started from the previous
// stage's (the outflow does not fall as the stage rises), and circular orifices' free flow from the
// dimensionless table (circleTable.ts). With `direct` every stage is `outletDischarge` on its own,
// the reference the tests and the bench compare the sweep with.
import type { Outlet, Tailwater } from "../case/model.js";
import { dischargeAtTailwater, outletDischarge } from "./outlet.js";
import { lowestOpening } from "./openings.js";
import { freeColumn, OpeningsSweep } from "./openingsSweep.js";
import { ChamberSweep, extrapolate, sweepTolerance } from "./chamberSweep.js";
import { spillwayFlow } from "./spillway.js";
import { tailwaterLevel } from "./tailwater.js";
import { warmRoot, type WarmStart } from "./roots.js";

/** Fills `out` with the outlet's outflow at each of `stages` (non-decreasing), in m3/s. `keep`: the
 * stages are a grid worth keeping parts' free-flow columns for (see `freeColumn`); false for a grid
 * used once. */
export function rateOutlet(outlet: Outlet, tail: Tailwater, stages: Float64Array, out: Float64Array, direct = false, keep = true): void {
  const n = stages.length;
  if (direct) {
    for (let i = 0; i < n; i++) out[i] = outletDischarge(outlet, tail, stages[i]);
    return;
  }
  if (tail.kind === "rating") {
    rateUnderTailwaterRating(outlet, tail, stages, out, keep);
    return;
  }
  const tw = tailwaterLevel(tail, 0);
  const spillway = outlet.spillway;
  const openings = new OpeningsSweep(outlet, true);
  openings.useGrid(stages, keep);
  const chamber = outlet.barrel ? new ChamberSweep(openings, tw) : null;
  const spill = spillway ? freeColumn(stages, `spillway ${tw} ${JSON.stringify(spillway)}`, (ws) => spillwayFlow(spillway, ws, tw), keep) : null;
  for (let i = 0; i < n; i++) {
    out[i] = (chamber ? chamber.flow(stages[i], i) : openingsWithTailwater(openings, i, tw)) + (spill ? spill[i] : 0);
  }
}

function openingsWithTailwater(openings: OpeningsSweep, index: number, tw: number): number {
  const free = openings.setGridStage(index);
  return tw === -Infinity || !(free > 0) ? free : openings.flow(tw);
}

/**
 * Under a downstream channel rating: O = discharge(ws, TW(O)) at each stage (outlet.ts), its root
 * started from the previous stage's. Without a barrel the openings come from the sweep; with one,
 * each evaluation is the direct chamber solve for that tailwater (as outlet.ts does).
 */
function rateUnderTailwaterRating(outlet: Outlet, tail: Tailwater, stages: Float64Array, out: Float64Array, keep: boolean): void {
  const spillway = outlet.spillway;
  const openings = new OpeningsSweep(outlet, true);
  openings.useGrid(stages, keep);
  let lowestEffect = lowestOpening(outlet);
  if (spillway) lowestEffect = Math.min(lowestEffect, spillway.crest);
  if (outlet.barrel) lowestEffect = Math.min(lowestEffect, outlet.barrel.outletInvert);
  let ws = NaN;
  const discharge = outlet.barrel
    ? (tw: number) => dischargeAtTailwater(outlet, ws, tw, true)
    : (tw: number) => openings.flow(tw) + (spillway ? spillwayFlow(spillway, ws, tw) : 0);
  const excess = (o: number) => discharge(tailwaterLevel(tail, o)) - o;
  const state: WarmStart = { root: NaN, slope: NaN };
  let felt = false;
  for (let i = 0; i < stages.length; i++) {
    ws = stages[i];
    // The free flow (no tailwater, no chamber) bounds the outflow from above: f(free) <= 0.
    const high = openings.setGridStage(i) + (spillway ? spillwayFlow(spillway, ws, -Infinity) : 0);
    let o: number;
    if (!(high > 0)) o = 0;
    else if (tailwaterLevel(tail, high) <= lowestEffect && !outlet.barrel) o = high;
    else {
      // Once the tailwater is felt, f(high) is evaluated only if the root search needs it.
      const previous = state.root;
      const low = previous > 0 && previous < high ? previous : 0;
      const guess = i >= 3 ? extrapolate(ws, stages[i - 1], previous, stages[i - 2], out[i - 2], stages[i - 3], out[i - 3]) : previous;
      o = warmRoot(excess, low, high, felt ? NaN : excess(high), guess, state, sweepTolerance(guess, high));
      felt = o < high;
    }
    state.root = o;
    out[i] = o;
  }
}
