// Exfiltration: water leaving a pond or an underground system into the ground, at a design
// infiltration rate over the wetted area (the rate is the design value the case gives, any safety
// factor already applied). The wetted bottom always counts once the water stands above it; the
// wetted sides count when the case says so:
// - prismoid: floor L x W; sides exactly, four trapezoids in the side slopes,
//   2 (L + W + 2 z d) d sqrt(1 + z^2) at depth d;
// - stage-area and stage-storage tables: the bottom is the area at pond.bottom (a stage-storage table's
//   first interval's area); the sides are those of the square of equal plan area at every level (the
//   square frustum of each row interval: 4 (s0 + s1)/2 dh sqrt(1 + ((s1 - s0)/(2 dh))^2), s = sqrt(A)),
//   an approximation for a shape the table does not describe (common practice);
// - underground: the stone bed's base L x W and its vertical sides 2 (L + W) h up to the bed's top;
//   without stone, the chambers' open bottoms (their area at height 0) and no sides (their walls are
//   solid). Nothing exfiltrates above the system's top.
// Darcy flow under a unit gradient (the design-rate convention): the rate does not grow with depth.
// The wetted bottom takes up its full rate over the first millimetre of water (WETTING_DEPTH), so that
// the rate is continuous in the stage (a pond does not go from dry to full exfiltration in no depth,
// and neither the router's table nor an ODE solver meets a jump at the floor).
import type { Pond } from "../model.js";
import { stageAreaArea } from "./stageArea.js";
import { stageStorageArea } from "./stageStorage.js";
import { systemTop } from "./underground.js";

/** Plan area (m2) of the wetted bottom. */
export function wettedBottom(pond: Pond): number {
  const s = pond.storage;
  switch (s.kind) {
    case "prismoid":
      return s.length * s.width;
    case "stageArea":
      return stageAreaArea(s.elevations, s.areas, pond.bottom);
    case "stageStorage":
      return stageStorageArea(s.elevations, s.volumes, pond.bottom);
    case "underground":
      if (s.stone) return s.stone.length * s.stone.width;
      return s.units.kind === "chambers" ? s.units.chambers.count * s.units.chambers.areas[0] : 0;
  }
}

/** Wetted side area (m2) below a stage. */
export function wettedSides(pond: Pond, stage: number): number {
  const s = pond.storage;
  const d = stage - pond.bottom;
  if (d <= 0) return 0;
  switch (s.kind) {
    case "prismoid": {
      const z = s.sideSlope;
      return 2 * (s.length + s.width + 2 * z * d) * d * Math.sqrt(1 + z * z);
    }
    case "stageArea":
      return squareFrustumSides(pond.bottom, stage, (z0, z1) => [stageAreaArea(s.elevations, s.areas, z0), stageAreaArea(s.elevations, s.areas, z1)], s.elevations);
    case "stageStorage": {
      // The table's area is constant on each interval: vertical walls there.
      const mid = (z0: number, z1: number): [number, number] => {
        const a = stageStorageArea(s.elevations, s.volumes, 0.5 * (z0 + z1));
        return [a, a];
      };
      return squareFrustumSides(pond.bottom, stage, mid, s.elevations);
    }
    case "underground": {
      if (!s.stone) return 0;
      const h = Math.min(stage, systemTop(s), s.stone.top) - s.stone.bottom;
      return h > 0 ? 2 * (s.stone.length + s.stone.width) * h : 0;
    }
  }
}

/**
 * Side area of the squares of equal plan area from `bottom` to `stage`, row interval by row interval;
 * `ends` gives the plan areas at an interval's two ends.
 */
function squareFrustumSides(bottom: number, stage: number, ends: (z0: number, z1: number) => [number, number], rows: readonly number[]): number {
  const levels = [bottom, ...rows.filter((z) => z > bottom && z < stage), stage];
  let sides = 0;
  for (let i = 1; i < levels.length; i++) {
    const dh = levels[i] - levels[i - 1];
    if (dh <= 0) continue;
    const [a0, a1] = ends(levels[i - 1], levels[i]);
    const s0 = Math.sqrt(Math.max(0, a0));
    const s1 = Math.sqrt(Math.max(0, a1));
    const offset = (s1 - s0) / (2 * dh);
    sides += 2 * (s0 + s1) * dh * Math.sqrt(1 + offset * offset);
  }
  return sides;
}

/** Depth of water (m) over which the wetted bottom takes up its full rate. */
export const WETTING_DEPTH = 0.001;

/** Wetted area (m2) through which the water exfiltrates at a stage. */
export function exfiltrationArea(pond: Pond, stage: number): number {
  const x = pond.exfiltration;
  const d = stage - pond.bottom;
  if (!x || d <= 0) return 0;
  return wettedBottom(pond) * Math.min(1, d / WETTING_DEPTH) + (x.sides ? wettedSides(pond, stage) : 0);
}

/** Exfiltration (m3/s) at a stage; 0 for a pond without it. */
export function exfiltrationRate(pond: Pond, stage: number): number {
  const x = pond.exfiltration;
  return x ? x.rate * exfiltrationArea(pond, stage) : 0;
}
