// The outlet's total outflow at every stage of a rating grid, swept from the bottom up. By default
// the sweep reuses what one stage tells the next: each opening's free flow once per stage
// (OpeningsSweep), the chamber root and the root under a tailwater rating started from the previous
// stage's (the outflow does not fall as the stage rises), and circular orifices' free flow from the
// dimensionless table (circleTable.ts), and the stages below the lowest part in which the outlet
// differs from a kept rating on the same grid from that rating (sweepReuse.ts, exact). With `direct`
// every stage is `outletDischarge` on its own, the reference the tests and the bench compare the
// sweep with.
import type { Outlet, Tailwater } from "../case/model.js";
import { dischargeAtTailwater, outletDischarge } from "./outlet.js";
import { lowestOpening } from "./openings.js";
import { freeColumn, OpeningsSweep } from "./openingsSweep.js";
import { ChamberSweep, extrapolate, sweepTolerance } from "./chamberSweep.js";
import { keepSweep, sharedSweep, sortedParts, sweepColumns, type SweepColumns } from "./sweepReuse.js";
import { valueKey } from "./barrelCurve.js";
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
  const spill = spillway ? freeColumn(stages, `spillway ${tw} ${JSON.stringify(spillway)}`, (ws) => spillwayFlow(spillway, ws, tw), keep) : null;
  if (outlet.barrel) {
    const chamber = new ChamberSweep(openings, tw);
    const chamberFlows = keep ? chamberSweepShared(stages, openings, chamber, sweepContext(outlet, tail)) : null;
    for (let i = 0; i < n; i++) out[i] = (chamberFlows ? chamberFlows[i] : chamber.flow(stages[i], i)) + (spill ? spill[i] : 0);
    return;
  }
  if (tw === -Infinity) {
    for (let i = 0; i < n; i++) out[i] = openings.setGridStage(i) + (spill ? spill[i] : 0);
    return;
  }
  openings.flowsAtLevel(tw, out, keep);
  if (spill) for (let i = 0; i < n; i++) out[i] += spill[i];
}

/** The chamber flow at every stage: the stages below the lowest part in which the outlet differs
 * from a kept rating of the same barrel, tailwater and grid from that rating, the rest swept from
 * there (sweepReuse.ts); the result is kept in turn. */
function chamberSweepShared(stages: Float64Array, openings: OpeningsSweep, chamber: ChamberSweep, context: string): Float64Array {
  const { columns, count } = sharedColumns(stages, openings, context);
  const { flows, slopes } = columns;
  chamber.resume(stages, flows, slopes, count);
  for (let i = count; i < stages.length; i++) {
    flows[i] = chamber.flow(stages[i], i);
    slopes[i] = chamber.slope;
  }
  keepSweep(stages, columns);
  return flows;
}

/** What a sweep's roots depend on besides the openings and the grid (sweepReuse.ts): for the chamber
 * sweep the barrel and the constant tailwater (not the spillway, added after), under a tailwater
 * rating the rating, the spillway and the barrel. */
export function sweepContext(outlet: Outlet, tail: Tailwater): string {
  if (tail.kind === "rating") return `rating ${JSON.stringify(tail)} ${JSON.stringify(outlet.spillway ?? null)} ${JSON.stringify(outlet.barrel ?? null)}`;
  return `chamber ${outlet.barrel ? valueKey(outlet.barrel, tailwaterLevel(tail, 0)) : "none"}`;
}

/** Columns for a new sweep, holding the stages a kept sweep with this context shares with these
 * openings (the first `count`). */
function sharedColumns(stages: Float64Array, openings: OpeningsSweep, context: string): { columns: SweepColumns; count: number } {
  const parts = sortedParts(openings.partBottoms, openings.partKeys);
  const { rating, count } = sharedSweep(stages, context, parts.bottoms, parts.keys);
  const columns = sweepColumns(stages, context, parts.bottoms, parts.keys);
  if (rating && count > 0 && rating.flows !== columns.flows) {
    columns.flows.set(rating.flows.subarray(0, count));
    columns.slopes.set(rating.slopes.subarray(0, count));
    columns.flags.set(rating.flags.subarray(0, count));
  }
  return { columns, count };
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
  // The stages a kept sweep shares (sweepReuse.ts), and the state it had reached there.
  const shared = keep ? sharedColumns(stages, openings, sweepContext(outlet, tail)) : null;
  const start = shared ? shared.count : 0;
  if (shared && start > 0) {
    const { flows, slopes, flags } = shared.columns;
    out.set(flows.subarray(0, start));
    state.root = flows[start - 1];
    state.slope = slopes[start - 1];
    felt = flags[start - 1] === 1;
  }
  for (let i = start; i < stages.length; i++) {
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
    if (shared) {
      shared.columns.flows[i] = o;
      shared.columns.slopes[i] = state.slope;
      shared.columns.flags[i] = felt ? 1 : 0;
    }
  }
  if (shared) keepSweep(stages, shared.columns);
}
