// The limit level of a storage question: the highest stage a storm may use. It is the lower of the
// freeboard level (top of embankment less the freeboard depth) and, for a storm that must keep the
// spillway dry (return period up to criteria.spillway.dryThrough), the spillway crest; an underground
// system also ends at its top (or the surface ponding the case permits). Every estimate, pond size and
// shortfall is counted below this level.
import type { Criteria, Pond, Spillway } from "../model.js";
import { storageCurve } from "./curve.js";
import { surchargeLimit } from "./underground.js";

export type LimitReason = "freeboard level" | "spillway crest" | "system top" | "permitted ponding";

export interface LimitLevel {
  /** m. */
  level: number;
  /** What sets it. */
  by: LimitReason;
}

/** The limit level of one storm (by its return period) in a pond with these criteria and spillway. */
export function limitLevel(pond: Pond, criteria: Pick<Criteria, "freeboardDepth" | "spillwayDryThrough">, spillway: Pick<Spillway, "crest"> | undefined, returnPeriod: number): LimitLevel {
  let limit: LimitLevel = { level: pond.top - criteria.freeboardDepth, by: "freeboard level" };
  if (spillway && returnPeriod <= criteria.spillwayDryThrough && spillway.crest <= limit.level + 1e-9) limit = { level: spillway.crest, by: "spillway crest" };
  const s = pond.storage;
  if (s.kind === "underground") {
    const top = surchargeLimit(s);
    if (top < limit.level) limit = { level: top, by: s.ponding?.limit != null ? "permitted ponding" : "system top" };
  }
  return limit;
}

/** Storage (m3) between the pond's permanent pool (or floor) and a level (0 when the level is below the pool). */
export function storageBelow(pond: Pond, level: number): number {
  const curve = storageCurve(pond);
  return Math.max(0, curve.volume(level) - curve.volume(pond.pool));
}
