// How much storage a case lacks, in volumes, each storm counted below its own limit level (the lower
// of the freeboard level and, for a storm that keeps the spillway dry, the spillway crest; an
// underground system's top):
// - a lower bound from the storms alone: any outlet that keeps a storm's peak outflow at or below its
//   target releases at most the target at every instant, so it holds at least the inflow's volume above
//   the target (the constant-release hydrograph difference);
// - the routed estimate: the storm routed through notional outlets of the usual kinds, sized to meet
//   the target, needs what the largest of them stores, and a pond sized for it holds that and the
//   catalogue allowance more (as `outfit pond` sizes);
// - what the closest routed design stored above the limit level.
// The advice adds the largest of these.
import type { Case, Storm } from "../model.js";
import type { StormRouting } from "../routing/routeCase.js";
import { targetBand } from "./rules/band.js";
import { storageCurve } from "../storage/curve.js";
import { hydrographDifference } from "../storage/estimate.js";
import { storageBelow, type LimitLevel } from "../storage/limitLevel.js";
import { caseLimitLevel } from "../sizing/stormEstimates.js";
import { routedEstimates, type NotionalKind } from "../sizing/routedEstimate.js";
import { CATALOGUE_ALLOWANCE } from "../sizing/pondChoice.js";

export interface StormShortfall {
  storm: string;
  limit: LimitLevel;
  /** m3 between the pool and the storm's limit level. */
  available: number;
}

export interface StorageShortfall {
  /** The storm with the least room below its limit level, its level and what it holds (m3). */
  tightest: StormShortfall;
  /** The largest lower bound of any storm beyond its available storage (m3, 0 when none), the bound and its storm. */
  leastShortfall: number;
  leastNeeded: number;
  leastStorm: string | null;
  /** The routed estimate (with the catalogue allowance) beyond the available storage (m3, 0 when none), and its storm and notional outlet. */
  routedShortfall: number;
  routedNeeded: number;
  routedStorm: string | null;
  routedKind: NotionalKind | null;
  /** m3 the closest routed design stored above a storm's limit level (the most of any storm; null without a design). */
  designShortfall: number | null;
  designStorm: string | null;
  /** Plan area at the tightest limit level (m2), to turn a volume into depth. */
  areaAtLimit: number;
  /** Depth between the pool and the tightest limit level (m), to turn a volume into footprint. */
  usableDepth: number;
}

export function storageShortfall(c: Case, closest: readonly StormRouting[] | null): StorageShortfall {
  const targeted = c.storms.filter((s) => s.target !== null);
  const room = (s: Storm): StormShortfall => {
    const limit = caseLimitLevel(c, s);
    return { storm: s.name, limit, available: storageBelow(c.pond, limit.level) };
  };
  const rooms = new Map(targeted.map((s) => [s.name, room(s)]));
  let tightest: StormShortfall = targeted.length ? rooms.get(targeted[0].name)! : { storm: "", limit: caseLimitLevel(c, c.storms[0]), available: storageBelow(c.pond, caseLimitLevel(c, c.storms[0]).level) };
  for (const r of rooms.values()) if (r.available < tightest.available) tightest = r;
  let least = { short: 0, needed: 0, storm: null as string | null };
  for (const s of targeted) {
    const v = hydrographDifference(s.inflow, targetBand(s.target!, c.criteria)[1], "constant");
    const short = v - rooms.get(s.name)!.available;
    if (short > least.short || least.storm === null) least = { short: Math.max(0, short), needed: v, storm: s.name };
  }
  let routed = { short: 0, needed: 0, storm: null as string | null, kind: null as NotionalKind | null };
  for (const e of routedEstimates({ pond: c.pond, tailwater: c.tailwater, storms: c.storms, drawdownDepth: c.criteria.drawdownDepth, over: c.criteria.over, under: c.criteria.under })) {
    const needed = e.largest.storage * (1 + CATALOGUE_ALLOWANCE);
    const short = needed - rooms.get(e.storm.name)!.available;
    if (short > routed.short || routed.storm === null) routed = { short: Math.max(0, short), needed, storm: e.storm.name, kind: e.largest.kind };
  }
  const curve = storageCurve(c.pond);
  let design: { short: number; storm: string } | null = null;
  for (const sr of closest ?? []) {
    const r = rooms.get(sr.storm.name);
    if (!r) continue;
    const short = Math.max(0, curve.volume(sr.result.maxStage) - curve.volume(r.limit.level));
    if (design === null || short > design.short) design = { short, storm: sr.storm.name };
  }
  return {
    tightest,
    leastShortfall: least.short,
    leastNeeded: least.needed,
    leastStorm: least.storm,
    routedShortfall: routed.short,
    routedNeeded: routed.needed,
    routedStorm: routed.storm,
    routedKind: routed.kind,
    designShortfall: design?.short ?? null,
    designStorm: design?.storm ?? null,
    areaAtLimit: curve.area(tightest.limit.level),
    usableDepth: tightest.limit.level - c.pond.pool,
  };
}
