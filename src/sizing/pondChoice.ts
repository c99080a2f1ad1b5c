// The pond's depth and footprint chosen together from the site. For each depth from the site's
// largest (`maxDepth`, a limit) down, on the site's depth step and at the depths where a limit
// starts to bind, the floor and top are placed:
// - without an existing grade, the floor is the site's floor and the top the floor plus the depth;
// - with one, the floor goes as low as the site allows (the lowest floor given, the seasonal high
//   groundwater plus its separation, the outfall invert plus its fall: the floor drains through the
//   barrel by gravity), the top no lower than the grade, and the embankment above the grade no higher
//   than allowed;
// - a spillway given in the case keeps the top at least the freeboard depth above its crest.
// At each depth the smallest footprint on the size step whose storage below every storm's limit level
// holds that storm's routed estimate (the most any of the notional outlets needs) is found by a fixed
// point: the estimate is routed in the pond it sized until the size no longer changes (the storage a
// notional outlet needs hardly depends on the pond's shape). The depth whose pond costs least by the
// cost proxy (excavation, fill, land) is chosen; every depth tried is kept for the trade-off table.
import type { Criteria, Pond, Site, Spillway, Storm, Tailwater } from "../model.js";
import { hydrographDifference } from "../storage/estimate.js";
import { limitLevel, storageBelow } from "../storage/limitLevel.js";
import { pondOfSize, sizePond, type PondLevels, type SizedPond, type StorageNeed } from "../storage/sizing.js";
import { routedEstimates, type NotionalKind, type RoutedEstimate } from "./routedEstimate.js";
import { pondCostParts, type PondCostParts, type PondCostWeights } from "./pondCost.js";

export interface SizingContext {
  site: Site;
  criteria: Criteria;
  /** The spillway given in the case (site data), if any. */
  spillway?: Spillway;
  tailwater: Tailwater;
  storms: readonly Storm[];
  costs: PondCostWeights;
}

/** What sets the lowest floor. */
export type FloorLimit = { by: "floor" | "groundwater" | "outfall"; level: number };

/** Why a depth cannot be built on the site. */
export type Blocked =
  | { kind: "floor above grade"; floor: FloorLimit; grade: number }
  | { kind: "embankment"; height: number; max: number; floor: FloorLimit | null }
  | { kind: "spillway"; top: number; lowest: number; crest: number }
  | { kind: "no storage"; top: number }
  | { kind: "site limits"; limit: string; shortfall: number; largest: SizedPond | null };

export interface DepthOption {
  depth: number;
  levels: PondLevels | null;
  /** What holds the floor up at this depth (with an existing grade), or null. */
  floorAt: FloorLimit | null;
  blocked: Blocked | null;
  /** The smallest pond at this depth holding the routed estimates (null when blocked). */
  sized: SizedPond | null;
  /** The routed estimates in that pond. */
  estimates: RoutedEstimate[];
  /** The storm and notional outlet whose need binds the size, with its volume (m3) and limit level (m). */
  governing: { storm: string; kind: NotionalKind; volume: number; level: number } | null;
  cost: PondCostParts | null;
}

export interface PondChoice {
  options: DepthOption[];
  /** The cheapest depth that holds every estimate within the site limits, or null. */
  chosen: DepthOption | null;
}

/**
 * The pond holds each storm's routed estimate and this share more: a notional outlet is sized
 * continuously, a real one from catalogue sizes (an orifice a size too small, a weir's crest set
 * above the stage the storm below reaches), and so it stores more. The share is measured: on the
 * bundled cases and an invented 24-hour NRCS case the smallest compliant designs used up to about
 * 1.12 times the routed estimate (tests/sizing/bracket.test.ts).
 */
export const CATALOGUE_ALLOWANCE = 0.15;

/** Depths compared at most (the step is widened to keep the table short). */
const MAX_DEPTHS = 12;
/** Fixed-point rounds of the routed estimate at one depth. */
const MAX_ROUNDS = 6;
const SLACK = 1e-9;

/** The lowest floor the site allows and what sets it; null when nothing does. */
export function lowestFloor(site: Site): FloorLimit | null {
  const limits: FloorLimit[] = [];
  if (site.floor !== null) limits.push({ by: "floor", level: site.floor });
  if (site.groundwater) limits.push({ by: "groundwater", level: site.groundwater.seasonalHigh + site.groundwater.separation });
  if (site.outfallInvert !== null) limits.push({ by: "outfall", level: site.outfallInvert + site.outfallFall });
  return limits.reduce<FloorLimit | null>((a, b) => (a === null || b.level > a.level ? b : a), null);
}

/** Floor and top of a pond of this depth, or why it cannot be built. */
export function levelsAt(ctx: Pick<SizingContext, "site" | "criteria" | "spillway">, depth: number): { levels: PondLevels | null; floorAt: FloorLimit | null; blocked: Blocked | null } {
  const { site } = ctx;
  const lowest = lowestFloor(site);
  let levels: PondLevels;
  let floorAt: FloorLimit | null = null;
  if (site.existingGrade === null) levels = { floor: site.floor!, top: site.floor! + depth };
  else {
    const grade = site.existingGrade;
    if (lowest && lowest.level > grade + SLACK) return { levels: null, floorAt: null, blocked: { kind: "floor above grade", floor: lowest, grade } };
    const top = Math.max(grade, (lowest?.level ?? -Infinity) + depth);
    levels = { floor: top - depth, top };
    if (lowest && top > grade + SLACK) floorAt = lowest;
    const height = top - grade;
    const max = site.embankment.maxHeight;
    if (max !== null && height > max + SLACK) return { levels: null, floorAt, blocked: { kind: "embankment", height, max, floor: lowest } };
  }
  const fb = ctx.criteria.freeboardDepth;
  if (ctx.spillway && levels.top < ctx.spillway.crest + fb - SLACK) return { levels: null, floorAt, blocked: { kind: "spillway", top: levels.top, lowest: ctx.spillway.crest + fb, crest: ctx.spillway.crest } };
  const poolDepth = site.pool && "depth" in site.pool ? site.pool.depth : 0;
  if (depth - poolDepth <= fb + SLACK) return { levels: null, floorAt, blocked: { kind: "no storage", top: levels.top } };
  return { levels, floorAt, blocked: null };
}

/** The depths compared: from the largest down on the depth step, and where a limit starts to bind. */
export function depthsToCompare(ctx: Pick<SizingContext, "site" | "criteria" | "spillway">): number[] {
  const { site } = ctx;
  const poolDepth = site.pool && "depth" in site.pool ? site.pool.depth : 0;
  const shallowest = Math.min(site.maxDepth, poolDepth + ctx.criteria.freeboardDepth + site.depthStep);
  let step = site.depthStep;
  const span = site.maxDepth - shallowest;
  if (span / step > MAX_DEPTHS - 1) step = Math.ceil(span / (MAX_DEPTHS - 1) / site.depthStep - 1e-9) * site.depthStep;
  const depths: number[] = [];
  for (let d = site.maxDepth; d >= shallowest - SLACK; d -= step) depths.push(d);
  // Where the limits bind: the deepest pond the floor and embankment limits allow, the shallowest the spillway allows.
  const lowest = lowestFloor(site);
  if (site.existingGrade !== null && site.embankment.maxHeight !== null && lowest) depths.push(site.existingGrade + site.embankment.maxHeight - lowest.level);
  if (site.existingGrade !== null && lowest) depths.push(site.existingGrade - lowest.level);
  if (ctx.spillway && site.existingGrade === null && site.floor !== null) depths.push(ctx.spillway.crest + ctx.criteria.freeboardDepth - site.floor);
  const inRange = depths.filter((d) => d <= site.maxDepth + SLACK && d >= shallowest - SLACK);
  const unique: number[] = [];
  for (const d of inRange.sort((a, b) => b - a)) if (unique.length === 0 || unique[unique.length - 1] - d > 1e-6) unique.push(d);
  return unique;
}

/** What each storm needs below its limit level, from estimates (volumes, m3). */
function needsOf(ctx: SizingContext, volumes: ReadonlyMap<Storm, number>): StorageNeed[] {
  return [...volumes].map(([storm, volume]) => ({ storm: storm.name, volume: volume * (1 + CATALOGUE_ALLOWANCE), limit: (pond: Pond) => limitLevel(pond, ctx.criteria, ctx.spillway, storm.returnPeriod).level }));
}

/** Each storm's need from routed estimates: the largest of its notional outlets. */
function estimateVolumes(estimates: readonly RoutedEstimate[]): Map<Storm, number> {
  return new Map(estimates.map((e) => [e.storm, e.largest.storage]));
}

/** The routed estimates of the case's storms in a pond. */
export function estimatesIn(ctx: Pick<SizingContext, "tailwater" | "storms" | "criteria">, pond: Pond): RoutedEstimate[] {
  return routedEstimates({ pond, tailwater: ctx.tailwater, storms: ctx.storms, drawdownDepth: ctx.criteria.drawdownDepth, over: ctx.criteria.over, under: ctx.criteria.under });
}

/** The pond at one depth: the smallest holding its own routed estimates (fixed point), starting from `start` volumes. */
function sizeAtDepth(ctx: SizingContext, levels: PondLevels, start: ReadonlyMap<Storm, number>): { sized: SizedPond | null; largest: SizedPond | null; estimates: RoutedEstimate[]; shortfall: number } {
  let volumes = start;
  let sizing = sizePond(ctx.site, levels, needsOf(ctx, volumes));
  let estimates: RoutedEstimate[] = [];
  const seen = new Set<number>();
  for (let round = 0; round < MAX_ROUNDS; round++) {
    const pond = (sizing.pond ?? sizing.largest)?.pond;
    if (!pond) break;
    estimates = estimatesIn(ctx, pond);
    volumes = estimateVolumes(estimates);
    const next = sizePond(ctx.site, levels, needsOf(ctx, volumes));
    const before = (sizing.pond ?? sizing.largest)!.steps;
    const after = next.pond?.steps ?? null;
    if (after === null || after === before || seen.has(after)) {
      // Settled, or cycling between neighbours (keep the larger), or beyond the site limits.
      if (after === null) sizing = next;
      else if (after > before) {
        sizing = next;
        estimates = estimatesIn(ctx, next.pond!.pond);
      }
      break;
    }
    seen.add(before);
    sizing = next;
  }
  const largest = sizing.largest;
  const short = largest ? Math.max(0, ...needsOf(ctx, volumes).map((n) => n.volume - storageBelow(largest.pond, n.limit(largest.pond)))) : Infinity;
  return { sized: sizing.pond, largest, estimates, shortfall: short };
}

/** Compares the depths and chooses the cheapest pond that holds the routed estimates. */
export function choosePond(ctx: SizingContext): PondChoice {
  const options: DepthOption[] = [];
  let start: Map<Storm, number> = new Map(ctx.storms.filter((s) => s.target !== null).map((s) => [s, hydrographDifference(s.inflow, s.target!, "rising")]));
  for (const depth of depthsToCompare(ctx)) {
    const { levels, floorAt, blocked } = levelsAt(ctx, depth);
    const option: DepthOption = { depth, levels, floorAt, blocked, sized: null, estimates: [], governing: null, cost: null };
    options.push(option);
    if (!levels) continue;
    const at = sizeAtDepth(ctx, levels, start);
    option.estimates = at.estimates;
    if (at.estimates.length > 0) start = estimateVolumes(at.estimates);
    if (!at.sized) {
      const limit = pondOfSize(ctx.site, levels, (at.largest?.steps ?? 0) + 1).exceeds ?? "site limits";
      option.blocked = { kind: "site limits", limit, shortfall: at.shortfall, largest: at.largest };
      continue;
    }
    option.sized = at.sized;
    option.governing = bindingNeed(ctx, at.sized.pond, at.estimates);
    option.cost = pondCostParts(at.sized, ctx.costs);
  }
  let chosen: DepthOption | null = null;
  for (const o of options) if (o.cost && (chosen === null || o.cost.total < chosen.cost!.total - 1e-12)) chosen = o;
  return { options, chosen };
}

/** The need with the least room left below its limit level: the one that sets the size. */
export function bindingNeed(ctx: Pick<SizingContext, "criteria" | "spillway">, pond: Pond, estimates: readonly RoutedEstimate[]): DepthOption["governing"] {
  let best: DepthOption["governing"] = null;
  let room = Infinity;
  for (const e of estimates) {
    const level = limitLevel(pond, ctx.criteria, ctx.spillway, e.storm.returnPeriod).level;
    const left = storageBelow(pond, level) - e.largest.storage;
    if (left < room) {
      room = left;
      best = { storm: e.storm.name, kind: e.largest.kind, volume: e.largest.storage, level };
    }
  }
  return best;
}
