// How much storage a case lacks, in volumes: a lower bound from the storms alone and what the closest
// routed design needed. Any outlet that keeps a storm's peak outflow at or below the target releases at
// most the target at every instant, so it must hold at least the inflow's volume above the target
// (the constant-release hydrograph difference): that less what the pond holds between its pool and
// the freeboard level is storage no outlet can do without.
import type { Case } from "../model.js";
import { targetBand } from "./rules/band.js";
import { storageCurve } from "../storage/curve.js";
import { hydrographDifference } from "../storage/estimate.js";
import { availableStorage, freeboardLevel } from "../storage/stormEstimates.js";

export interface StorageShortfall {
  /** m3 between the pool and the freeboard level. */
  available: number;
  /** The largest least-storage of any storm (m3) and that storm. */
  leastNeeded: number;
  leastStorm: string | null;
  /** m3 the storms need beyond what is available (0 when none). */
  leastShortfall: number;
  /** m3 the closest routed design stored above the freeboard level in the freeboard storm (null without one). */
  routedShortfall: number | null;
  /** Plan area at the freeboard level (m2), to turn a volume into depth. */
  areaAtFreeboard: number;
  /** Depth between the pool and the freeboard level (m), to turn a volume into footprint. */
  usableDepth: number;
}

export function storageShortfall(c: Case, closestMaxStage: number | null): StorageShortfall {
  const available = availableStorage(c);
  let leastNeeded = 0;
  let leastStorm: string | null = null;
  for (const s of c.storms) {
    if (s.target === null) continue;
    const v = hydrographDifference(s.inflow, targetBand(s.target, c.criteria)[1], "constant");
    if (v > leastNeeded) [leastNeeded, leastStorm] = [v, s.name];
  }
  const curve = storageCurve(c.pond);
  const level = freeboardLevel(c);
  return {
    available,
    leastNeeded,
    leastStorm,
    leastShortfall: Math.max(0, leastNeeded - available),
    routedShortfall: closestMaxStage === null ? null : Math.max(0, curve.volume(closestMaxStage) - curve.volume(level)),
    areaAtFreeboard: curve.area(level),
    usableDepth: level - c.pond.pool,
  };
}
