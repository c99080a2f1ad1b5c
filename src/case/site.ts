// The case file's `site` section in SI, and the pond chosen from it when the file gives no pond.
import type { CaseFile } from "./schema.js";
import type { Criteria, Pond, Site, SiteSizingSummary, Spillway, Storm, Tailwater } from "../model.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { baseLength, baseVolume, FOOT, parseArea } from "../units.js";
import { choosePond, lowestFloor, type PondChoice } from "../sizing/pondChoice.js";
import { pondCostWeights } from "../sizing/pondCost.js";
import { normalizeExfiltration } from "./exfiltration.js";

/** Side slopes 3 H : 1 V and a floor twice as long as wide when not given (common practice). */
const DEFAULT_SIDE_SLOPE = 3;
const DEFAULT_LENGTH_TO_WIDTH = 2;
/** An embankment's crest 10 ft / 3 m wide with outside slopes 3 H : 1 V; the floor 2 ft / 0.6 m above the
 * seasonal high groundwater (common practice; local codes ask 2 to 4 ft under infiltration basins). */
const DEFAULT_EMBANKMENT_TOP = { US: 10 * FOOT, SI: 3 };
const DEFAULT_OUTSIDE_SLOPE = 3;
const DEFAULT_SEPARATION = { US: 2 * FOOT, SI: 0.6 };
/** Depths compared 1 ft / 0.25 m apart. */
const DEFAULT_DEPTH_STEP = { US: FOOT, SI: 0.25 };

export function normalizeSite(file: CaseFile, cv: Converter): Site {
  const s = file.site!;
  const L = baseLength(file.units);
  const us = file.units === "US" ? "US" : "SI";
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
  const existingGrade = s.existingGrade === undefined ? null : cv.length(s.existingGrade, "site.existingGrade");
  if (s.floor === undefined && existingGrade === null) cv.problem("site.floor", "nothing (the field is missing)", "the pond floor's elevation, or site.existingGrade to choose the floor from");
  const nonNegative = (value: number, path: string, found: unknown) => {
    if (value < 0) cv.problem(path, show(found as number), "a length of zero or more");
    return value;
  };
  const e = s.embankment ?? {};
  const embankment = {
    maxHeight: e.maxHeight === undefined ? null : nonNegative(cv.length(e.maxHeight, "site.embankment.maxHeight"), "site.embankment.maxHeight", e.maxHeight),
    topWidth: e.topWidth === undefined ? DEFAULT_EMBANKMENT_TOP[us] : nonNegative(cv.length(e.topWidth, "site.embankment.topWidth"), "site.embankment.topWidth", e.topWidth),
    outsideSlope: e.outsideSlope ?? DEFAULT_OUTSIDE_SLOPE,
  };
  const groundwater = s.groundwater
    ? {
        seasonalHigh: cv.length(s.groundwater.seasonalHigh, "site.groundwater.seasonalHigh"),
        separation: s.groundwater.separation === undefined ? DEFAULT_SEPARATION[us] : nonNegative(cv.length(s.groundwater.separation, "site.groundwater.separation"), "site.groundwater.separation", s.groundwater.separation),
      }
    : null;
  const site: Site = {
    floor: s.floor === undefined ? null : cv.length(s.floor, "site.floor"),
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
    existingGrade,
    embankment,
    groundwater,
    outfallInvert: s.outfallInvert === undefined ? null : cv.length(s.outfallInvert, "site.outfallInvert"),
    outfallFall: s.outfallFall === undefined ? 0 : nonNegative(cv.length(s.outfallFall, "site.outfallFall"), "site.outfallFall", s.outfallFall),
    depthStep: s.depthStep === undefined ? DEFAULT_DEPTH_STEP[us] : cv.length(s.depthStep, "site.depthStep"),
  };
  // Without an existing grade the floor is fixed: the groundwater and outfall limits can only be met or not.
  if (existingGrade === null && site.floor !== null && cv.problems.length === 0) {
    const lowest = lowestFloor(site);
    if (lowest && lowest.by !== "floor" && lowest.level > site.floor + 1e-9) {
      const why = lowest.by === "groundwater" ? "the seasonal high groundwater plus its separation" : "the outfall invert plus its fall (the floor drains through the barrel)";
      cv.problem("site.floor", show(s.floor!), `a floor at or above ${why}, ${show(Number((lowest.level / L).toFixed(4)))}; or give site.existingGrade so that the floor is chosen`);
    }
  }
  if (s.exfiltration && cv.problems.length === 0) {
    const probe: Pond = { bottom: 0, top: 1, pool: 0, storage: { kind: "prismoid", length: 1, width: 1, sideSlope: site.sideSlope } };
    site.exfiltration = normalizeExfiltration(s.exfiltration, probe, cv, "site.exfiltration", pool !== null);
  }
  return site;
}

/** The pond chosen from the site for the routed estimates (a first size, before any outlet), or null without a storm with a target. */
export function siteSizing(file: CaseFile, site: Site, storms: readonly Storm[], criteria: Criteria, tailwater: Tailwater, spillway: Spillway | undefined): PondChoice | null {
  if (!storms.some((s) => s.target !== null)) return null;
  return choosePond({ site, criteria, spillway, tailwater, storms, costs: pondCostWeights(file.units, file.costs ?? {}) });
}

/** The pond a site-sized case routes: the chosen one, else the largest the site allows at the deepest depth possible. */
export function sitePond(choice: PondChoice): Pond | null {
  if (choice.chosen) return choice.chosen.sized!.pond;
  for (const o of choice.options) if (o.blocked?.kind === "site limits" && o.blocked.largest) return o.blocked.largest.pond;
  return null;
}

/** What the case keeps of a choice. */
export function sizingSummary(choice: PondChoice): SiteSizingSummary {
  const o = choice.chosen ?? choice.options.find((x) => x.blocked?.kind === "site limits" && x.blocked.largest) ?? null;
  const pond = o?.sized ?? (o?.blocked?.kind === "site limits" ? o.blocked.largest : null);
  const g = o?.governing ?? null;
  return { required: g?.volume ?? 0, storm: g?.storm ?? "", method: g ? `routed-${g.kind}` : "", steps: pond?.steps ?? 0, depth: o?.depth ?? 0, withinLimits: choice.chosen !== null };
}
