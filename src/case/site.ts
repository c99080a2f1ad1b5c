// The case file's `site` section in SI, and the pond sized from it when the file gives no pond.
import type { CaseFile } from "./schema.js";
import type { Criteria, Pond, Site, SiteSizingSummary, Storm } from "../model.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { baseLength, baseVolume, FOOT, parseArea } from "../units.js";
import type { Sizing } from "../storage/sizing.js";
import { sizePond } from "../storage/sizing.js";
import { governingVolume, stormVolumes, type EstimateMethod } from "../storage/stormEstimates.js";
import { tr55Group } from "../storage/estimate.js";
import type { StormHydrology } from "./hydrology.js";

/** Side slopes 3 H : 1 V and a floor twice as long as wide when not given (common practice). */
const DEFAULT_SIDE_SLOPE = 3;
const DEFAULT_LENGTH_TO_WIDTH = 2;

export function normalizeSite(file: CaseFile, cv: Converter): Site {
  const s = file.site!;
  const L = baseLength(file.units);
  let maxTopArea: number | null = null;
  if (s.maxTopArea !== undefined) {
    const a = parseArea(s.maxTopArea, file.units);
    if (typeof a === "number") maxTopArea = a;
    else cv.problem("site.maxTopArea", show(s.maxTopArea), a.error);
  }
  const maxDepth = cv.length(s.maxDepth, "site.maxDepth");
  const shape = s.shape ? { depths: s.shape.stageArea.map((r) => r[0] * L), areas: s.shape.stageArea.map((r) => r[1] * L * L) } : null;
  if (shape && shape.depths[0] !== 0) cv.problem("site.shape.stageArea[0][0]", show(s.shape!.stageArea[0][0]), "a first depth of 0 (depths are above the floor)");
  if (shape && shape.depths[shape.depths.length - 1] < maxDepth - 1e-9) {
    cv.problem(`site.shape.stageArea[${shape.depths.length - 1}][0]`, show(s.shape!.stageArea[shape.depths.length - 1][0]), `a last depth at or beyond site.maxDepth (${show(s.maxDepth)})`);
  }
  const pool = s.permanentPool
    ? s.permanentPool.depth !== undefined
      ? { depth: cv.length(s.permanentPool.depth, "site.permanentPool.depth") }
      : { volume: s.permanentPool.volume! * baseVolume(file.units) }
    : null;
  return {
    floor: cv.length(s.floor, "site.floor"),
    maxDepth,
    sideSlope: s.sideSlope ?? DEFAULT_SIDE_SLOPE,
    lengthToWidth: s.lengthToWidth ?? DEFAULT_LENGTH_TO_WIDTH,
    maxTopLength: s.maxTopLength === undefined ? null : cv.length(s.maxTopLength, "site.maxTopLength"),
    maxTopWidth: s.maxTopWidth === undefined ? null : cv.length(s.maxTopWidth, "site.maxTopWidth"),
    maxTopArea,
    pool,
    shape,
    // 1 ft (0.5 m) of floor width, or 5 % of the shape's area (common practice steps for a first layout).
    step: s.step === undefined ? (shape ? 0.05 : file.units === "US" ? FOOT : 0.5) : shape ? s.step : s.step * L,
  };
}

export interface SiteSizing extends Sizing {
  /** Storm and method whose estimate governs the required volume. */
  storm: string;
  method: EstimateMethod;
}

/** The pond sized from the site for the largest storage estimate of any storm (a first size, before routing). */
export function siteSizing(site: Site, storms: readonly Storm[], hydrology: readonly (StormHydrology | null)[], criteria: Criteria): SiteSizing | null {
  const estimates = storms.map((storm, i) => {
    const h = hydrology[i];
    return stormVolumes(storm, {
      group: h?.rainfall.kind === "distribution" ? tr55Group(h.rainfall.distribution) : null,
      rational: h?.method === "rational" ? h.sweep : null,
    });
  });
  const governing = governingVolume(estimates);
  if (!governing) return null;
  return { ...sizePond(site, criteria.freeboardDepth, governing.volume), storm: governing.storm, method: governing.method };
}

/** The pond a site-sized case routes: the smallest that holds the estimate, else the largest the site allows. */
export function sitePond(sizing: SiteSizing): Pond | null {
  return (sizing.pond ?? sizing.largest)?.pond ?? null;
}

/** What the case keeps of a sizing. */
export function sizingSummary(sizing: SiteSizing): SiteSizingSummary {
  return { required: sizing.required, storm: sizing.storm, method: sizing.method, steps: (sizing.pond ?? sizing.largest)?.steps ?? 0, withinLimits: sizing.pond !== null };
}
