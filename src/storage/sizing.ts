// Pond dimensions from site limits: the smallest pond, on the site's size step, that holds a required
// storage between its permanent pool and the freeboard level. Two families of ponds:
// - a prismoid with floor L = r W (r the length-to-width ratio), side slopes z, depth D; the size is W;
// - a given stage-area shape (area by depth) scaled in plan by a factor k (volumes scale with k); the
//   size is k.
// The depth is the site's largest depth (floor to top of embankment): for a given storage the deepest
// pond has the smallest footprint. A permanent pool is a depth, or a volume whose depth is solved at
// each size.
import type { Pond, Site, Storage } from "../model.js";

export type { Site };
import { storageCurve } from "./curve.js";
import { stageAtVolume } from "./stageAtVolume.js";

export interface SizedPond {
  /** Floor width (m) or scale factor. */
  size: number;
  /** Steps of `site.step` (size = steps x step). */
  steps: number;
  pond: Pond;
  /** Storage between the pool and the freeboard level (m3). */
  provided: number;
  /** Top of embankment plan: length and width (m; null for a scaled shape) and area (m2). */
  topLength: number | null;
  topWidth: number | null;
  topArea: number;
  /** Volume below the top of embankment (m3): the excavation, if the pond is cut to its top. */
  excavation: number;
  /** The first site limit the pond exceeds, or null. */
  exceeds: string | null;
}

/** The pond of a given number of size steps. */
export function pondOfSize(site: Site, freeboardDepth: number, steps: number): SizedPond {
  const size = steps * site.step;
  const depth = site.maxDepth;
  let storage: Storage;
  let topLength: number | null = null;
  let topWidth: number | null = null;
  if (site.shape) {
    storage = { kind: "stageArea", elevations: site.shape.depths.map((d) => site.floor + d), areas: site.shape.areas.map((a) => a * size) };
  } else {
    const width = size;
    const length = site.lengthToWidth * width;
    storage = { kind: "prismoid", length, width, sideSlope: site.sideSlope };
    topLength = length + 2 * site.sideSlope * depth;
    topWidth = width + 2 * site.sideSlope * depth;
  }
  const top = site.floor + depth;
  const dry: Pond = { bottom: site.floor, top, pool: site.floor, storage };
  const curve = storageCurve(dry);
  let pool = site.floor;
  if (site.pool && "depth" in site.pool) pool = site.floor + site.pool.depth;
  else if (site.pool) pool = stageAtVolume(dry, site.pool.volume);
  const pond: Pond = { ...dry, pool };
  const topArea = curve.area(top);
  const provided = Math.max(0, curve.volume(top - freeboardDepth) - curve.volume(pool));
  let exceeds: string | null = null;
  if (site.maxTopLength !== null && topLength !== null && topLength > site.maxTopLength * (1 + 1e-12)) exceeds = "maxTopLength";
  else if (site.maxTopWidth !== null && topWidth !== null && topWidth > site.maxTopWidth * (1 + 1e-12)) exceeds = "maxTopWidth";
  else if (site.maxTopArea !== null && topArea > site.maxTopArea * (1 + 1e-12)) exceeds = "maxTopArea";
  if (pool >= top - freeboardDepth) exceeds ??= "pool";
  return { size, steps, pond, provided, topLength, topWidth, topArea, excavation: curve.volume(top), exceeds };
}

export interface Sizing {
  /** m3 the pond must hold above its pool below the freeboard level. */
  required: number;
  /** The smallest pond holding it, or null when none within the limits does. */
  pond: SizedPond | null;
  /** The largest pond within the site limits (null when even one step exceeds them). */
  largest: SizedPond | null;
}

/** Most steps tried: a pond a thousand steps wide is far past any site. */
const MAX_STEPS = 100000;

/** The smallest pond (in whole steps) that holds `required`, within the site limits. */
export function sizePond(site: Site, freeboardDepth: number, required: number): Sizing {
  const holds = (n: number) => pondOfSize(site, freeboardDepth, n);
  let largest: SizedPond | null = null;
  // Storage grows with the size: double until it holds, then bisect on whole steps.
  let low = 0;
  let high = 1;
  while (high < MAX_STEPS && holds(high).provided < required) {
    low = high;
    high *= 2;
  }
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (holds(mid).provided >= required) high = mid;
    else low = mid;
  }
  const smallest = holds(high);
  if (smallest.exceeds === null && smallest.provided >= required) return { required, pond: smallest, largest: smallest };
  largest = largestWithin(site, freeboardDepth, high);
  return { required, pond: null, largest };
}

/** The largest pond within the site limits, searching below `above` steps. */
export function largestWithin(site: Site, freeboardDepth: number, above: number): SizedPond | null {
  let low = 0;
  let high = above;
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (pondOfSize(site, freeboardDepth, mid).exceeds === null) low = mid;
    else high = mid;
  }
  return low > 0 ? pondOfSize(site, freeboardDepth, low) : null;
}
