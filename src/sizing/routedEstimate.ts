// The routed estimate: storage found by routing each storm through notional outlets of the usual
// kinds, before any real outlet exists. Each notional outlet is sized so that the storm's routed peak
// outflow meets its target; the storage it then uses is what an outlet of that kind needs:
// - orifice: one orifice at the pool (or floor), Q = Cd A sqrt(2 g h) with all its area at the invert
//   (the orifice equation for a small opening, HEC-22 eq 8-17), sized by Cd A;
// - weir: one sharp-crested rectangular weir with its crest at the pool, Q = C L h^1.5 (Francis without
//   end contractions, HEC-22 eq 8-19), sized by C L;
// - two-stage: the orifice that meets the smallest storm's target, and above the stage that storm
//   reaches a weir sized for each larger storm (the shape of most multi-stage outlets: the low orifice
//   holds back the early part of the large storms);
// - multi-stage (three storms or more): a level per storm, each a weir with its crest at the stage the
//   storm below reaches through the levels below, sized for its storm.
// With a bypass (a point of analysis) the routed peak is that of the pond's outflow and the bypass
// summed at each instant, which the target applies to (case format, "Bypass and the point of
// analysis"): the pond releases less, so it needs more storage than for its outflow alone.
// Each is sized for the middle of the storm's target band (at most 10 % below the target: the band's
// edges are where a design may land, and `design` aims inside them), `aimFactor`.
// Under a fixed tailwater the orifice takes the head to the tailwater and the weirs are drowned by
// Villemonte's formula (1947); a tailwater rating is taken as a free outfall. Exfiltration, when the
// pond has it, is routed too. Unlike the hydrograph differences (lower bounds on the storage of any
// outlet), these are what outlets of these shapes use; real outlets with more levels or a barrel that
// throttles use somewhat more or less.
import type { Hydrograph, Pond, Storm, Tailwater } from "../model.js";
import { GRAVITY } from "../units.js";
import { stageGrid, type RatingTable } from "../routing/ratingTable.js";
import type { RouteOptions, RouteResult } from "../routing/router.js";
import { routeStorm } from "../routing/durations.js";
import { villemonte } from "../parts/submergence.js";
import { storageCurve } from "../storage/curve.js";
import { systemFootprint, systemTop } from "../storage/underground.js";
import { sumHydrographs } from "../hydrology/hydrograph.js";

export type NotionalKind = "orifice" | "weir" | "two-stage" | "multi-stage";
export const NOTIONAL_KINDS: readonly NotionalKind[] = ["orifice", "weir", "two-stage", "multi-stage"];

export const NOTIONAL_WORDS: Readonly<Record<NotionalKind, string>> = {
  orifice: "one orifice",
  weir: "one weir",
  "two-stage": "orifice and weir",
  "multi-stage": "a level per storm",
};

export interface NotionalResult {
  kind: NotionalKind;
  /** Storage above the pool at the storm's highest stage (m3). */
  storage: number;
  /** The highest stage (m). */
  stage: number;
  /** Routed peak outflow (m3/s); with a bypass, the peak at the point of analysis (outflow and bypass summed). */
  peak: number;
  /** The peak aimed at (m3/s). */
  aim: number;
  /** Cd A of the orifice (m2); 0 for the weir alone. */
  orificeSize: number;
  /** C L of each weir (Q = C L h^1.5, m^1.5/s) and its crest (m), lowest first. */
  weirs: { size: number; crest: number }[];
  /** A storm of several durations: the one that governs (s). */
  governingDuration: number | null;
  /** Why the size does not meet the aim (the levels below alone release more), or null. */
  note: string | null;
}

export interface RoutedEstimate {
  storm: Storm;
  results: NotionalResult[];
  /** The result needing the most storage. */
  largest: NotionalResult;
}

export interface RoutedEstimateInput {
  pond: Pond;
  tailwater: Tailwater;
  /** Every storm; those without a target get no estimate. */
  storms: readonly Storm[];
  /** Drawdown depth (m): the drained stage is the pool plus this. */
  drawdownDepth: number;
  /** The target band's tolerances (criteria.tolerance). */
  over: number;
  under: number;
}

/** The routed peak meets its aim within this fraction. */
const PEAK_TOLERANCE = 5e-4;
const MAX_ITERATIONS = 60;
/** The aim is never further below the target than this (with `under: 1` the band reaches down to 0). */
const MOST_UNDER = 0.1;

/** The fraction of its target a notional outlet is sized for: the middle of the band, capped. */
export function aimFactor(over: number, under: number): number {
  return 1 + (over - Math.min(under, MOST_UNDER)) / 2;
}

type Part = { size: number; column: Float64Array };

/** Routed estimates of every storm with a target, in the case's storm order. */
export function routedEstimates(input: RoutedEstimateInput): RoutedEstimate[] {
  const { pond, tailwater } = input;
  const tail = tailwater.kind === "elevation" ? tailwater.elevation : -Infinity;
  const invert = Math.max(pond.pool, tail);
  const grid = stageGrid(pond, [pond.pool, pond.top], undefined, [invert]);
  const n = grid.stage.length;
  // What a storm needs, not what the system holds: above an underground system's top the storage
  // goes on over its footprint, so that an estimate beyond the system's capacity is a volume.
  if (pond.storage.kind === "underground") {
    const top = systemTop(pond.storage);
    const full = storageCurve(pond).volume(top);
    const plan = systemFootprint(pond.storage);
    for (let i = 0; i < n; i++) if (grid.stage[i] > top) grid.storage[i] = full + plan * (grid.stage[i] - top);
  }
  const orificeColumn = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = grid.stage[i] - invert;
    orificeColumn[i] = h > 0 ? Math.sqrt(2 * GRAVITY * h) : 0;
  }
  const weirColumns = new Map<number, Float64Array>();
  const weirColumn = (crest: number) => {
    let column = weirColumns.get(crest);
    if (column) return column;
    column = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const h = grid.stage[i] - crest;
      column[i] = h > 0 ? villemonte(h * Math.sqrt(h), h, tail - crest, 1.5) : 0;
    }
    weirColumns.set(crest, column);
    return column;
  };
  const outflow = new Float64Array(n);
  const table: RatingTable = { stage: grid.stage, storage: grid.storage, outflow, exfiltration: grid.exfiltration, heldNodes: 0 };
  const options: RouteOptions = { drainedStage: pond.pool + input.drawdownDepth, startStage: pond.pool, maxAfterInflow: 0 };
  const poolStorage = storageCurve(pond).volume(pond.pool);
  const depth = Math.max(pond.top - pond.pool, 1e-3);
  const factor = aimFactor(input.over, input.under);

  /** Routes a storm through the sum of the parts (with its bypass, the flow at the point of analysis is tracked). */
  const routeThrough = (storm: Storm, parts: readonly Part[]): RouteResult => {
    outflow.fill(0);
    for (const { size, column } of parts) for (let i = 0; i < n; i++) outflow[i] += size * column[i];
    return routeStorm(table, storm, storm.bypass ? { ...options, bypass: storm.bypass } : options);
  };
  const result = (kind: NotionalKind, storm: Storm, r: RouteResult, parts: readonly Part[], note: string | null): NotionalResult => ({
    kind,
    storage: Math.max(0, r.maxStorage - poolStorage),
    stage: r.maxStage,
    peak: r.peakAtPoint,
    aim: storm.target! * factor,
    orificeSize: parts[0].column === orificeColumn ? parts[0].size : 0,
    weirs: parts.filter((p) => p.column !== orificeColumn && p.size > 0).map((p) => ({ size: p.size, crest: crestOf.get(p.column)! })),
    governingDuration: r.governingDuration ?? null,
    note,
  });
  const crestOf = new Map<Float64Array, number>();
  const weirAt = (crest: number) => {
    const column = weirColumn(crest);
    crestOf.set(column, crest);
    return column;
  };

  const targeted = input.storms.filter((s) => s.target !== null);
  if (targeted.length === 0) return [];
  const ordered = [...targeted].sort((a, b) => a.returnPeriod - b.returnPeriod || a.target! - b.target!);
  const smallest = ordered[0];
  // Without a pond the flow at the point of analysis is the inflow (and the bypass, with one).
  const unheld = (storm: Storm) => peakOf(storm.bypass ? sumHydrographs([storm.inflow, storm.bypass]) : storm.inflow);
  const needsNone = (storm: Storm) => storm.target! * factor >= unheld(storm) && !storm.durations;

  /** A level added above `below`, sized so the storm's peak meets its aim (none when the levels below already release more). */
  const stage = (storm: Storm, below: Part[], column: Float64Array, guess: number): { parts: Part[]; r: RouteResult; note: string | null } => {
    const aim = storm.target! * factor;
    if (below.length > 0) {
      const alone = routeThrough(storm, below);
      if (alone.peakAtPoint >= aim) return { parts: [...below, { size: 0, column }], r: alone, note: "the levels below alone release more than this storm's target" };
    }
    const found = sizeFor(aim, guess, (size) => routeThrough(storm, [...below, { size, column }]));
    return { parts: [...below, { size: found.size, column }], r: found.r, note: null };
  };
  const orificeGuess = (storm: Storm) => storm.target! / Math.sqrt(GRAVITY * depth);
  const weirGuess = (storm: Storm, crest: number) => storm.target! / Math.pow(Math.max(depth - (crest - pond.pool), depth / 10) / 2, 1.5);

  const orifices = new Map<Storm, ReturnType<typeof stage>>();
  const orificeOf = (storm: Storm) => {
    let known = orifices.get(storm);
    if (!known) orifices.set(storm, (known = stage(storm, [], orificeColumn, orificeGuess(storm))));
    return known;
  };
  // The staged outlets: the smallest storm's orifice, then a level per larger storm.
  const base = needsNone(smallest) ? null : orificeOf(smallest);
  const staged = new Map<Storm, ReturnType<typeof stage>>();
  if (base) {
    staged.set(smallest, base);
    let below = base;
    for (const storm of ordered.slice(1)) {
      if (needsNone(storm)) continue;
      const crest = below.r.maxStage;
      below = stage(storm, below.parts.filter((p) => p.size > 0), weirAt(crest), weirGuess(storm, crest));
      staged.set(storm, below);
    }
  }

  return targeted.map((storm) => {
    const results: NotionalResult[] = [];
    const kinds = NOTIONAL_KINDS.filter((k) => k !== "multi-stage" || ordered.length >= 3);
    if (needsNone(storm)) {
      for (const kind of kinds) {
        results.push({ kind, storage: 0, stage: pond.pool, peak: unheld(storm), aim: storm.target! * factor, orificeSize: 0, weirs: [], governingDuration: null, note: "target at or above the peak inflow: no storage needed" });
      }
    } else {
      const o = orificeOf(storm);
      results.push(result("orifice", storm, o.r, o.parts, o.note));
      const w = stage(storm, [], weirAt(pond.pool), weirGuess(storm, pond.pool));
      results.push(result("weir", storm, w.r, w.parts, w.note));
      const two = storm === smallest || !base ? o : stage(storm, base.parts, weirAt(base.r.maxStage), weirGuess(storm, base.r.maxStage));
      results.push(result("two-stage", storm, two.r, two.parts, two.note));
      if (kinds.includes("multi-stage")) {
        const m = staged.get(storm) ?? o;
        results.push(result("multi-stage", storm, m.r, m.parts, m.note));
      }
    }
    const largest = results.reduce((a, b) => (b.storage > a.storage ? b : a));
    return { storm, results, largest };
  });
}

function peakOf(h: Hydrograph): number {
  let peak = 0;
  for (const q of h.flows) if (q > peak) peak = q;
  return peak;
}

/**
 * The size whose routed peak meets the target: the peak grows with the size, so bracket it by
 * factors of 4 and close in by the Illinois variant of regula falsi on log size against log peak.
 */
function sizeFor(target: number, guess: number, routeWith: (size: number) => RouteResult): { size: number; r: RouteResult } {
  const miss = (r: RouteResult) => (r.peakAtPoint > 0 ? Math.log(r.peakAtPoint / target) : -50);
  let x = Math.log(Math.max(guess, 1e-12));
  let r = routeWith(Math.exp(x));
  let f = miss(r);
  let best = { size: Math.exp(x), r, f };
  const keep = (size: number, rr: RouteResult, ff: number) => {
    if (Math.abs(ff) < Math.abs(best.f)) best = { size, r: rr, f: ff };
  };
  let lo = x;
  let flo = f;
  let hi = x;
  let fhi = f;
  for (let i = 0; i < MAX_ITERATIONS && (f < 0 ? fhi < 0 : flo > 0); i++) {
    if (f < 0) {
      hi += Math.log(4);
      r = routeWith(Math.exp(hi));
      fhi = miss(r);
      keep(Math.exp(hi), r, fhi);
      if (fhi < 0) [lo, flo] = [hi, fhi];
    } else {
      lo -= Math.log(4);
      r = routeWith(Math.exp(lo));
      flo = miss(r);
      keep(Math.exp(lo), r, flo);
      if (flo > 0) [hi, fhi] = [lo, flo];
    }
  }
  if (!(flo <= 0 && fhi >= 0)) return { size: best.size, r: best.r };
  let side = 0;
  for (let i = 0; i < MAX_ITERATIONS && Math.abs(best.f) > PEAK_TOLERANCE; i++) {
    x = flo === fhi ? 0.5 * (lo + hi) : lo - (flo * (hi - lo)) / (fhi - flo);
    if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
    r = routeWith(Math.exp(x));
    f = miss(r);
    keep(Math.exp(x), r, f);
    if (f < 0) {
      [lo, flo] = [x, f];
      if (side === -1) fhi /= 2;
      side = -1;
    } else {
      [hi, fhi] = [x, f];
      if (side === 1) flo /= 2;
      side = 1;
    }
    if (hi - lo < 1e-9) break;
  }
  return { size: best.size, r: best.r };
}
