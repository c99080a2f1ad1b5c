// The outlet's total outflow at every stage of a rating grid, swept from the bottom up. By default
// the sweep reuses what one stage tells the next: each opening's free flow once per stage
// (OpeningsSweep), the chamber root and the root under a tailwater rating started from the previous
// stage's (the outflow does not fall as the stage rises), and circular orifices' free flow from the
// dimensionless table (circleTable.ts), and the stages below the lowest part in which the outlet
// differs from a kept rating on the same grid from that rating (sweepReuse.ts, exact). With `direct`
// every stage is `outletDischarge` on its own, the reference the tests and the bench compare the
// sweep with.
import type { Outlet, Tailwater } from "../model.js";
import { dischargeAtTailwater, outletDischarge } from "./outlet.js";
import { lowestOpening } from "./openings.js";
import { freeColumn, OpeningsSweep } from "./openingsSweep.js";
import { ChamberSweep, extrapolate, sweepTolerance } from "./chamberSweep.js";
import { keepSweep, sharedSweep, sortedParts, sweepColumns, type SweepColumns } from "./sweepReuse.js";
import { valueKey } from "./barrelCurve.js";
import { spillwayFlow } from "../parts/spillway.js";
import { tailwaterLevel } from "./tailwater.js";
import { warmRoot, type WarmStart } from "./roots.js";

/** Fills `out` with the outlet's outflow at each of `stages` (non-decreasing), in m3/s. `keep`: the
 * stages are a grid worth keeping parts' free-flow columns for (see `freeColumn`); false for a grid
 * used once. */
export function rateOutlet(outlet: Outlet, tail: Tailwater, stages: Float64Array, out: Float64Array, direct = false, keep = true): void {
  new RatingSweep(outlet, tail, stages, out, direct, keep).rateTo(stages.length);
}

/**
 * The sweep of `rateOutlet`, taken up stage by stage: `rateTo(count)` fills `out` for the stages
 * below `count` that are not rated yet, so a router that asks only for the stages a storm reaches
 * (a lazy rating table, ratingTable.ts) gets the values a whole sweep gives, bit for bit: each stage
 * depends only on the stages below it. The parts' free-flow columns and a fixed tailwater's
 * columns are whole-grid columns (kept per grid, cheap); the roots (chamber, tailwater rating) are
 * what is put off.
 */
export class RatingSweep {
  /** Stages rated so far, from the bottom (`out` holds their values). */
  rated = 0;
  private readonly step: (i: number) => number;
  private readonly shared: SweepColumns | null = null;

  constructor(outlet: Outlet, tail: Tailwater, private readonly stages: Float64Array, private readonly out: Float64Array, direct = false, keep = true) {
    const n = stages.length;
    if (direct) {
      this.step = (i) => outletDischarge(outlet, tail, stages[i]);
      return;
    }
    if (tail.kind === "rating") {
      const sweep = tailwaterRatingSweep(outlet, tail, stages, keep);
      this.step = sweep.step;
      this.shared = sweep.shared;
      if (sweep.shared && sweep.start > 0) out.set(sweep.shared.flows.subarray(0, sweep.start));
      this.startFromShared(sweep.start);
      return;
    }
    const tw = tailwaterLevel(tail, 0);
    const spillway = outlet.spillway;
    const openings = new OpeningsSweep(outlet, true);
    openings.useGrid(stages, keep);
    const spill = spillway ? freeColumn(stages, `spillway ${tw} ${JSON.stringify(spillway)}`, (ws) => spillwayFlow(spillway, ws, tw), keep) : null;
    if (outlet.barrel) {
      const chamber = new ChamberSweep(openings, tw);
      if (keep) {
        const { columns, count } = sharedColumns(stages, openings, sweepContext(outlet, tail));
        const { flows, slopes } = columns;
        chamber.resume(stages, flows, slopes, count);
        this.shared = columns;
        this.step = (i) => {
          flows[i] = chamber.flow(stages[i], i);
          slopes[i] = chamber.slope;
          return flows[i] + (spill ? spill[i] : 0);
        };
        for (let i = 0; i < count; i++) out[i] = flows[i] + (spill ? spill[i] : 0);
        this.startFromShared(count);
      } else this.step = (i) => chamber.flow(stages[i], i) + (spill ? spill[i] : 0);
      return;
    }
    // Without a barrel or a tailwater rating a stage is a sum of kept columns: the whole grid at
    // once (cheaper than taking it up stage by stage).
    if (tw === -Infinity) for (let i = 0; i < n; i++) out[i] = openings.setGridStage(i) + (spill ? spill[i] : 0);
    else {
      // A fixed tailwater: kept columns per level.
      openings.flowsAtLevel(tw, out, keep);
      if (spill) for (let i = 0; i < n; i++) out[i] += spill[i];
    }
    this.rated = n;
    // Rated whole: `rateTo` never takes a stage up.
    this.step = (i) => out[i];
  }

  /** The stages a kept sweep shared are rated; the columns are kept for the next outlet from here on,
   * their valid length (`rated`) following this sweep's. */
  private startFromShared(count: number): void {
    this.rated = count;
    if (this.shared) {
      this.shared.rated = count;
      keepSweep(this.stages, this.shared);
    }
  }

  /** Rates the stages below `count` (at most the grid's); returns the number rated. */
  rateTo(count: number): number {
    const end = Math.min(count, this.stages.length);
    if (end <= this.rated) return this.rated;
    const shared = this.shared;
    if (shared && shared.retired) throw new Error("internal: a rating sweep was taken up after its kept columns went to another outlet");
    const out = this.out;
    for (let i = this.rated; i < end; i++) out[i] = this.step(i);
    this.rated = end;
    if (shared) shared.rated = end;
    return end;
  }
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
 * each evaluation is the direct chamber solve for that tailwater (as outlet.ts does). Returns the
 * step for stage i (stages in order from `start`, the stages a kept sweep shares, which `out`
 * must be given by the caller from `shared`).
 */
function tailwaterRatingSweep(outlet: Outlet, tail: Tailwater & { kind: "rating" }, stages: Float64Array, keep: boolean): { step: (i: number) => number; shared: SweepColumns | null; start: number } {
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
  // The roots of the last three stages (the extrapolation's), raw (before any held level).
  let q1 = NaN;
  let q2 = NaN;
  let q3 = NaN;
  // The stages a kept sweep shares (sweepReuse.ts), and the state it had reached there.
  const shared = keep ? sharedColumns(stages, openings, sweepContext(outlet, tail)) : null;
  const start = shared ? shared.count : 0;
  if (shared && start > 0) {
    const { flows, slopes, flags } = shared.columns;
    state.root = flows[start - 1];
    state.slope = slopes[start - 1];
    felt = flags[start - 1] === 1;
    q1 = flows[start - 1];
    q2 = start >= 2 ? flows[start - 2] : NaN;
    q3 = start >= 3 ? flows[start - 3] : NaN;
  }
  const step = (i: number): number => {
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
      const guess = i >= 3 ? extrapolate(ws, stages[i - 1], previous, stages[i - 2], q2, stages[i - 3], q3) : previous;
      o = warmRoot(excess, low, high, felt ? NaN : excess(high), guess, state, sweepTolerance(guess, high));
      felt = o < high;
    }
    state.root = o;
    q3 = q2;
    q2 = q1;
    q1 = o;
    if (shared) {
      shared.columns.flows[i] = o;
      shared.columns.slopes[i] = state.slope;
      shared.columns.flags[i] = felt ? 1 : 0;
    }
    return o;
  };
  return { step, shared: shared ? shared.columns : null, start };
}
