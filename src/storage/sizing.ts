// Pond dimensions from site limits: ponds of a given depth on the site's size step, their earthwork,
// and the smallest that holds a set of storage needs (each below its own limit level). Two families:
// - a prismoid with floor L = r W (r the length-to-width ratio), side slopes z, depth D; the size is W;
// - a given stage-area shape (area by depth) scaled in plan by a factor k (volumes scale with k); the
//   size is k.
// The depth and the floor are chosen elsewhere (sizing/pondChoice.ts); here they are given.
// Earthwork, when the site gives its existing grade G: the cut is the pond's volume below the grade;
// above it the pond is held by an embankment of crest width b and outside slope zo, whose fill is the
// solid under its outer faces (a frustum from the crest's outer edge down to the grade) less the
// water's room above the grade; the land taken is the outer toe's rectangle. Without a grade the
// pond is cut from its top down and no embankment is modelled (cut = volume below the top, land =
// the top's area). A shape's embankment is that of the square of equal top area.
import type { Pond, Site, Storage } from "../model.js";

export type { Site };
import { storageCurve } from "./curve.js";
import { stageAtVolume } from "./stageAtVolume.js";
import { prismoidVolume } from "./prismoid.js";
import { storageBelow } from "./limitLevel.js";

/** Where a pond of a given depth stands: its floor and its top of embankment (m). */
export interface PondLevels {
  floor: number;
  top: number;
}

export interface SizedPond {
  /** Floor width (m) or scale factor. */
  size: number;
  /** Steps of `site.step` (size = steps x step). */
  steps: number;
  pond: Pond;
  /** Top of embankment plan: length and width (m; null for a scaled shape) and area (m2). */
  topLength: number | null;
  topWidth: number | null;
  topArea: number;
  /** Volume below the top of embankment (m3). */
  volume: number;
  /** Earthwork (m3): excavation below the existing grade, embankment fill above it. */
  cut: number;
  fill: number;
  /** Embankment height above the existing grade (m; 0 without a grade or below it). */
  embankment: number;
  /** Land taken (m2): the embankment's outer toe, or the top's area. */
  land: number;
  /** The first site limit the pond exceeds, or null. */
  exceeds: string | null;
}

/** The pond of a given number of size steps with its floor and top at these levels. */
export function pondOfSize(site: Site, at: PondLevels, steps: number): SizedPond {
  const size = steps * site.step;
  const depth = at.top - at.floor;
  let storage: Storage;
  let topLength: number | null = null;
  let topWidth: number | null = null;
  if (site.shape) {
    storage = { kind: "stageArea", elevations: site.shape.depths.map((d) => at.floor + d), areas: site.shape.areas.map((a) => a * size) };
  } else {
    const width = size;
    const length = site.lengthToWidth * width;
    storage = { kind: "prismoid", length, width, sideSlope: site.sideSlope };
    topLength = length + 2 * site.sideSlope * depth;
    topWidth = width + 2 * site.sideSlope * depth;
  }
  const dry: Pond = { bottom: at.floor, top: at.top, pool: at.floor, storage };
  if (site.exfiltration) dry.exfiltration = site.exfiltration;
  const curve = storageCurve(dry);
  let pool = at.floor;
  if (site.pool && "depth" in site.pool) pool = at.floor + site.pool.depth;
  else if (site.pool) pool = stageAtVolume(dry, site.pool.volume);
  const pond: Pond = { ...dry, pool };
  const topArea = curve.area(at.top);
  const volume = curve.volume(at.top);
  let cut = volume;
  let fill = 0;
  let embankment = 0;
  let land = topArea;
  if (site.existingGrade !== null) {
    const grade = site.existingGrade;
    cut = curve.volume(Math.min(grade, at.top));
    embankment = Math.max(0, at.top - grade);
    if (embankment > 0) {
      const e = site.embankment;
      const [l, w] = topLength !== null ? [topLength, topWidth!] : [Math.sqrt(topArea), Math.sqrt(topArea)];
      const outer = prismoidVolume(l + 2 * e.topWidth, w + 2 * e.topWidth, e.outsideSlope, embankment);
      fill = Math.max(0, outer - (volume - curve.volume(grade)));
      land = (l + 2 * e.topWidth + 2 * e.outsideSlope * embankment) * (w + 2 * e.topWidth + 2 * e.outsideSlope * embankment);
    }
  }
  let exceeds: string | null = null;
  if (site.maxTopLength !== null && topLength !== null && topLength > site.maxTopLength * (1 + 1e-12)) exceeds = "maxTopLength";
  else if (site.maxTopWidth !== null && topWidth !== null && topWidth > site.maxTopWidth * (1 + 1e-12)) exceeds = "maxTopWidth";
  else if (site.maxTopArea !== null && topArea > site.maxTopArea * (1 + 1e-12)) exceeds = "maxTopArea";
  if (pool >= at.top) exceeds ??= "pool";
  return { size, steps, pond, topLength, topWidth, topArea, volume, cut, fill, embankment, land, exceeds };
}

/** Storage a storm needs (m3) below the limit level a pond gives it (a function of the pond: its top, its system). */
export interface StorageNeed {
  storm: string;
  volume: number;
  limit: (pond: Pond) => number;
}

/** How far a pond falls short of the needs (m3; 0 or less when it holds every one). */
export function shortfall(pond: Pond, needs: readonly StorageNeed[]): number {
  let short = -Infinity;
  for (const n of needs) short = Math.max(short, n.volume - storageBelow(pond, n.limit(pond)));
  return needs.length === 0 ? 0 : short;
}

export interface Sizing {
  /** The smallest pond holding every need, or null when none within the limits does. */
  pond: SizedPond | null;
  /** The largest pond within the site limits (null when even one step exceeds them). */
  largest: SizedPond | null;
}

/** Most steps tried: a pond a thousand steps wide is far past any site. */
const MAX_STEPS = 100000;

/** The smallest pond (in whole steps) at these levels that holds every need, within the site limits. */
export function sizePond(site: Site, at: PondLevels, needs: readonly StorageNeed[]): Sizing {
  const holds = (n: number) => shortfall(pondOfSize(site, at, n).pond, needs) <= 0;
  // Storage grows with the size: double until it holds, then bisect on whole steps.
  let low = 0;
  let high = 1;
  while (high < MAX_STEPS && !holds(high)) {
    low = high;
    high *= 2;
  }
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (holds(mid)) high = mid;
    else low = mid;
  }
  const smallest = pondOfSize(site, at, high);
  if (smallest.exceeds === null && holds(high)) return { pond: smallest, largest: smallest };
  return { pond: null, largest: largestWithin(site, at, high) };
}

/** The largest pond within the site limits, searching below `above` steps. */
export function largestWithin(site: Site, at: PondLevels, above: number): SizedPond | null {
  let low = 0;
  let high = above;
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (pondOfSize(site, at, mid).exceeds === null) low = mid;
    else high = mid;
  }
  return low > 0 ? pondOfSize(site, at, low) : null;
}
