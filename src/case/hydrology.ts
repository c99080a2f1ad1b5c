// The case file's hydrology section and storm rainfalls in SI, and what each storm derives from them:
// the inflow (the post-development runoff hydrograph) and the target (the pre-development peak).
// Problems are reported through the case converter with their JSON paths.
import type { BypassAreaFile, CaseFile, CatchmentFile, HydrologyFile, RainfallFile } from "./schema.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { emptyRecord, own } from "../own.js";
import { FOOT, parseArea, parseDepth, parseIntensity } from "../units.js";
import { trimNumber } from "../format.js";
import { distributionMassCurve, type DistributionType, type MassCurve } from "../hydrology/distributions.js";
import { compositeCurveNumber, IMPERVIOUS_CURVE_NUMBER, imperviousCurveNumber, weightedMean, type AbstractionRatio, type CompositeRelation, type RunoffPart } from "../hydrology/runoff.js";
import { MAX_SHEET_LENGTH, tcFromLag, travelTime, watershedLag, type FlowSegment } from "../hydrology/timeOfConcentration.js";
import { idfRange, intensity, type IdfCurve } from "../hydrology/idf.js";
import { nrcsHydrograph, type AreaRunoff, type NrcsOptions } from "../hydrology/nrcsHydrograph.js";
import { criticalDuration, MIN_TC_RATIONAL, modifiedRationalHydrograph, rationalAreaHydrograph, rationalPeak, type CriticalDuration } from "../hydrology/rational.js";
import type { DurationRange } from "../model.js";
import { STANDARD_PEAK_RATE_FACTOR } from "../hydrology/unitHydrograph.js";
import type { AreaHydrograph } from "../hydrology/hydrograph.js";

/**
 * The drainage areas of the hydrology section: before development (draining to the point of analysis),
 * after development draining to the pond, and after development bypassing the pond to the point.
 */
export type AreaName = "pre" | "post" | "bypass";
export const AREA_NAMES: readonly AreaName[] = ["pre", "post", "bypass"];

/** How an area's NRCS runoff is computed: one composite curve number (TR-55 worksheet 2), or each part separately. */
export type RunoffMethod = "composite" | "separate";

/** One sub-area (or the whole area when it has no parts), as given, with its composite curve number. */
export interface SubArea {
  name: string | null;
  /** m2. */
  area: number;
  /** The sub-area's curve number: given, or composite from its pervious number and impervious share; null if none. */
  curveNumber: number | null;
  perviousCurveNumber: number | null;
  /** Impervious share of the sub-area (0 to 1); null when the curve number is given whole. */
  impervious: number | null;
  /** Share of the impervious area not directly connected (0 to 1); null when not given. */
  unconnected: number | null;
  /** The TR-55 ch. 2 relation that gave the composite curve number; null when it is given. */
  relation: CompositeRelation | null;
  runoffCoefficient: number | null;
}

/** One drainage area in SI. */
export interface Catchment {
  /** m2. */
  area: number;
  /** Composite (area-weighted) curve number as tabulated (initial abstraction ratio 0.2); null if not given. */
  curveNumber: number | null;
  /** Composite (area-weighted) rational runoff coefficient; null if not given. */
  runoffCoefficient: number | null;
  /** Tc (s) as given or computed, before a method's minimum. */
  tc: number;
  /** How Tc was found: "given", "flow path" or "watershed lag". */
  tcMethod: "given" | "flow path" | "watershed lag";
  /** Travel time (s) of each flow-path segment (empty unless tcMethod is "flow path"). */
  travelTimes: number[];
  /** The flow-path segments (SI), in order (empty unless tcMethod is "flow path"). */
  segments: FlowSegment[];
  /** The sub-areas as given (one entry for an area given whole). */
  subAreas: SubArea[];
  /**
   * The parts whose runoff is computed separately (runoffMethod "separate"): each sub-area's directly
   * connected impervious share at CN 98 and the rest at its own number; null without curve numbers.
   */
  runoffParts: RunoffPart[] | null;
  /** Seconds by which this area's runoff reaches the point of analysis later (bypass areas; 0 otherwise). */
  lag: number;
}

/** A further point of analysis of the hydrology section, with its areas in SI. */
export interface HydrologyPoint {
  name: string;
  pond: boolean;
  pre: Catchment | null;
  post: Catchment | null;
}

export type StormRainfall =
  | { kind: "distribution"; distribution: DistributionType; depth: number; curve: MassCurve }
  | { kind: "hyetograph"; depth: number; curve: MassCurve }
  | { kind: "idf"; name: string; curve: IdfCurve };

/** A further point's runoff in one storm. */
export interface PointHydrology {
  name: string;
  pond: boolean;
  pre: AreaHydrograph | null;
  /** The area draining to the point after development, lag applied. */
  post: AreaHydrograph | null;
}

export interface StormHydrology {
  method: "nrcs" | "rational";
  rainfall: StormRainfall;
  pre: AreaHydrograph | null;
  post: AreaHydrograph | null;
  /** The area bypassing the pond, lag applied; null without `hydrology.bypass`. */
  bypass: AreaHydrograph | null;
  points: PointHydrology[];
  /** A system of ponds: the runoff of each pond's own drainage area (`hydrology.ponds`), by pond name. */
  posts: { pond: string; area: AreaHydrograph }[];
  /** Rational method: the allowable release (m3/s) of the duration sweep (the explicit target, else the pre-development peak). */
  allowable: number | null;
  /** Rational method: the duration sweep of the post-development area (null without an allowable release). */
  sweep: CriticalDuration | null;
  /** Rational method: the range of storm durations routed for the post-development area (null without a sweep). */
  durations: DurationRange | null;
}

export interface CaseHydrology {
  nrcs: NrcsOptions;
  runoffMethod: RunoffMethod;
  /** The 2-year 24-hour rainfall (m) for sheet flow; null when not given. */
  twoYearRainfall: number | null;
  catchments: Record<AreaName, Catchment | null>;
  points: HydrologyPoint[];
  /** A system of ponds: each pond's drainage area (`hydrology.ponds`), by pond name, in the file's order. */
  pondAreas: { pond: string; catchment: Catchment }[];
  /** Per storm of the case, in order; null for a storm without a rainfall. */
  storms: (StormHydrology | null)[];
}

/** What an area's NRCS runoff is computed from under the case's method. */
export function areaRunoff(c: Catchment, method: RunoffMethod): AreaRunoff {
  return method === "separate" && c.runoffParts ? c.runoffParts : c.curveNumber!;
}

/** Every area of the hydrology (the three named ones, then each point's), with the key outputs use. */
export function hydrologyAreas(h: CaseHydrology): { key: string; catchment: Catchment; point: string | null; role: "pre" | "post" | "bypass" }[] {
  const areas: { key: string; catchment: Catchment; point: string | null; role: "pre" | "post" | "bypass" }[] = [];
  for (const name of AREA_NAMES) {
    const c = h.catchments[name];
    if (c) areas.push({ key: name, catchment: c, point: null, role: name });
  }
  for (const p of h.points) {
    if (p.pre) areas.push({ key: `${p.name}:pre`, catchment: p.pre, point: p.name, role: "pre" });
    if (p.post) areas.push({ key: `${p.name}:post`, catchment: p.post, point: p.name, role: "bypass" });
  }
  return areas;
}

/** A storm's hydrograph of an area key of `hydrologyAreas`. */
export function stormAreaHydrograph(s: StormHydrology, key: string): AreaHydrograph | null {
  if (key === "pre" || key === "post" || key === "bypass") return s[key];
  const at = key.lastIndexOf(":");
  const point = s.points.find((p) => p.name === key.slice(0, at));
  return point ? point[key.slice(at + 1) as "pre" | "post"] : null;
}

/** Converts the hydrology section and derives every storm's hydrographs; problems go to `cv`. */
export function caseHydrology(file: CaseFile, cv: Converter): CaseHydrology {
  const h: HydrologyFile = file.hydrology ?? {};
  const before = cv.problems.length;
  const choice = h.unitDuration ?? "standard";
  const nrcs: NrcsOptions = {
    ratio: (h.initialAbstractionRatio ?? 0.2) as AbstractionRatio,
    peakRateFactor: h.peakRateFactor ?? STANDARD_PEAK_RATE_FACTOR,
    unitDuration: typeof choice === "number" ? choice * 60 : choice,
  };
  const runoffMethod: RunoffMethod = h.runoffMethod ?? "composite";
  const twoYearRainfall = h.twoYearRainfall === undefined ? null : cv.quantity(parseDepth, h.twoYearRainfall, "hydrology.twoYearRainfall");
  const catchments: Record<AreaName, Catchment | null> = {
    pre: h.pre ? catchment(h.pre, `hydrology.pre`, cv, twoYearRainfall) : null,
    post: h.post ? catchment(h.post, `hydrology.post`, cv, twoYearRainfall) : null,
    bypass: h.bypass ? catchment(h.bypass, `hydrology.bypass`, cv, twoYearRainfall) : null,
  };
  const names = new Set<string>();
  const points: HydrologyPoint[] = (h.points ?? []).map((p, i) => {
    const path = `hydrology.points[${i}]`;
    if (names.has(p.name)) cv.problem(`${path}.name`, show(p.name), "a point name not used by another point");
    names.add(p.name);
    if (!p.pre && !p.post && p.pond !== true) cv.problem(path, "no area and no pond", "a pre-development area (pre), an area draining to the point (post), or pond: true");
    return {
      name: p.name,
      pond: p.pond ?? false,
      pre: p.pre ? catchment(p.pre, `${path}.pre`, cv, twoYearRainfall) : null,
      post: p.post ? catchment(p.post, `${path}.post`, cv, twoYearRainfall) : null,
    };
  });
  const pondAreas = Object.entries(h.ponds ?? {}).map(([pond, area]) => ({ pond, catchment: catchment(area, `hydrology.ponds.${pond}`, cv, twoYearRainfall) }));
  if (h.ponds !== undefined) checkPondAreas(file, cv);
  if (file.ponds && h.post && (file.ponds.length > 1 || h.ponds)) {
    cv.problem("hydrology.post", "one post-development area in a system of ponds", "each pond's drainage area under hydrology.ponds (by the pond's name)");
  }
  const curves: Record<string, IdfCurve> = emptyRecord();
  for (const [name, idf] of Object.entries(h.idf ?? {})) curves[name] = idfCurve(idf, `hydrology.idf.${name}`, cv);
  const result: CaseHydrology = { nrcs, runoffMethod, twoYearRainfall, catchments, points, pondAreas, storms: file.storms.map(() => null) };
  if (cv.problems.length > before) return result;
  const allAreas = hydrologyAreas(result);

  const missing = new Set<string>();
  const need = (path: string, expected: string) => {
    if (!missing.has(path)) cv.problem(path, "nothing (the field is missing)", expected);
    missing.add(path);
  };
  file.storms.forEach((storm, index) => {
    if (!storm.rainfall) return;
    const path = `storms[${index}]`;
    if (!file.hydrology) {
      cv.problem(`${path}.rainfall`, "a rainfall", "a hydrology section (at the top level) describing the drainage areas it falls on");
      return;
    }
    const start = cv.problems.length;
    const rainfall = stormRainfall(storm.rainfall, `${path}.rainfall`, cv, curves);
    if (file.ponds && !(file.ponds.length === 1 && catchments.post)) {
      if (pondAreas.length === 0 && !storm.inflows && !storm.inflow) need("hydrology.ponds", `each pond's drainage area: ${path} (${storm.name}) derives the ponds' inflows from them`);
      if (rainfall?.kind === "idf" && pondAreas.length > 0) {
        cv.problem(`${path}.rainfall.idf`, show(storm.rainfall.idf), "a 24-hour depth or a hyetograph (NRCS method): the rational method's critical duration is not derived for a system's ponds; give their inflows");
      }
    } else if (!storm.inflow && !catchments.post) need("hydrology.post", `the post-development area: ${path} (${storm.name}) derives its inflow from it`);
    if (rainfall === null || cv.problems.length > start) return;
    const method = rainfall.kind === "idf" ? "rational" : "nrcs";
    const pointPath = (key: string) => `hydrology.points[${points.findIndex((p) => p.name === key.slice(0, key.lastIndexOf(":")))}].${key.slice(key.lastIndexOf(":") + 1)}`;
    const areas = [...allAreas.map(({ key, catchment: c }) => ({ where: key.includes(":") ? pointPath(key) : `hydrology.${key}`, c })), ...pondAreas.map((a) => ({ where: `hydrology.ponds.${a.pond}`, c: a.catchment }))];
    for (const { where, c } of areas) {
      if (method === "nrcs" && c.curveNumber === null) {
        need(`${where}.curveNumber`, `a curve number: ${path} (${storm.name}) gives a 24-hour rainfall or a hyetograph (NRCS method)`);
      }
      if (method === "rational" && c.runoffCoefficient === null) {
        need(`${where}.runoffCoefficient`, `a runoff coefficient: ${path} (${storm.name}) gives an IDF curve (rational method)`);
      }
      if (rainfall.kind === "idf") checkIdfRange(rainfall, c, where, cv);
    }
    if (cv.problems.length > start) return;
    const explicitTarget = storm.target === undefined ? null : cv.flowOf(storm.target, `${path}.target`);
    result.storms[index] =
      rainfall.kind === "idf" ? rationalStorm(rainfall, catchments, points, explicitTarget) : nrcsStorm(rainfall, catchments, points, pondAreas, nrcs, runoffMethod);
  });
  return result;
}

/** A hydrograph later by `lag` seconds (zero before it); the same hydrograph when the lag is zero. */
export function lagged(h: AreaHydrograph, lag: number): AreaHydrograph {
  if (!(lag > 0)) return h;
  const times = Float64Array.from(h.hydrograph.times, (t) => t + lag);
  return { ...h, hydrograph: { times, flows: h.hydrograph.flows }, timeOfPeak: h.timeOfPeak + lag };
}

/** `hydrology.ponds` only in a system, naming its ponds; `hydrology.post` not beside it. */
function checkPondAreas(file: CaseFile, cv: Converter): void {
  if (!file.ponds) {
    cv.problem("hydrology.ponds", "drainage areas by pond", "no hydrology.ponds in a case with one pond (its post-development area is hydrology.post)");
    return;
  }
  const names = file.ponds.map((p) => p.name);
  for (const key of Object.keys(file.hydrology?.ponds ?? {})) {
    if (!names.includes(key)) cv.problem(`hydrology.ponds.${key}`, show(key), `the name of a pond (${names.join(", ")})`);
  }
}

function nrcsStorm(
  rainfall: Exclude<StormRainfall, { kind: "idf" }>,
  catchments: Record<AreaName, Catchment | null>,
  points: readonly HydrologyPoint[],
  pondAreas: CaseHydrology["pondAreas"],
  options: NrcsOptions,
  runoffMethod: RunoffMethod,
): StormHydrology {
  const area = (c: Catchment | null) => (c ? lagged(nrcsHydrograph(c.area, areaRunoff(c, runoffMethod), c.tc, rainfall.curve, options), c.lag) : null);
  return {
    method: "nrcs",
    rainfall,
    pre: area(catchments.pre),
    post: area(catchments.post),
    bypass: area(catchments.bypass),
    points: points.map((p) => ({ name: p.name, pond: p.pond, pre: area(p.pre), post: area(p.post) })),
    posts: pondAreas.map((a) => ({ pond: a.pond, area: area(a.catchment)! })),
    allowable: null,
    sweep: null,
    durations: null,
  };
}

function rationalStorm(
  rainfall: Extract<StormRainfall, { kind: "idf" }>,
  catchments: Record<AreaName, Catchment | null>,
  points: readonly HydrologyPoint[],
  explicitTarget: number | null,
): StormHydrology {
  const tcOf = (c: Catchment) => Math.max(c.tc, MIN_TC_RATIONAL);
  // An area before development: its peak storm (duration = Tc).
  const peakStorm = (c: Catchment | null) => (c ? rationalAreaHydrograph(c.area, c.runoffCoefficient!, tcOf(c), rainfall.curve, tcOf(c)) : null);
  const preHydrograph = peakStorm(catchments.pre);
  const allowable = explicitTarget ?? preHydrograph?.peak ?? null;
  const post = catchments.post;
  let postHydrograph: AreaHydrograph | null = null;
  let sweep: CriticalDuration | null = null;
  let durations: DurationRange | null = null;
  if (post) {
    const tc = tcOf(post);
    // Without an allowable release the storm of duration Tc (the largest peak) is the inflow.
    if (allowable !== null) {
      sweep = criticalDuration(post.runoffCoefficient!, post.area, tc, rainfall.curve, allowable);
      durations = durationRange(post, tc, rainfall.curve, sweep.critical.duration);
    }
    postHydrograph = rationalAreaHydrograph(post.area, post.runoffCoefficient!, tc, rainfall.curve, sweep ? sweep.critical.duration : tc);
  }
  // Areas that join the pond's outflow get the same rain as the pond's area: the storm of its duration
  // (the critical one), but not shorter than their own Tc.
  const duration = postHydrograph?.stormDuration ?? null;
  const joining = (c: Catchment | null) => {
    if (!c) return null;
    const tc = tcOf(c);
    return lagged(rationalAreaHydrograph(c.area, c.runoffCoefficient!, tc, rainfall.curve, Math.max(duration ?? tc, tc)), c.lag);
  };
  return {
    method: "rational",
    rainfall,
    pre: preHydrograph,
    post: postHydrograph,
    bypass: joining(catchments.bypass),
    points: points.map((p) => ({ name: p.name, pond: p.pond, pre: peakStorm(p.pre), post: joining(p.post) })),
    posts: [],
    allowable,
    sweep,
    durations,
  };
}

/**
 * The storm durations routed: from Tc to well past the critical duration of the storage formula
 * (three times it, at least an hour past it), within the IDF curve's range and 24 hours.
 */
function durationRange(post: Catchment, tc: number, curve: IdfCurve, critical: number): DurationRange {
  const longest = Math.min(idfRange(curve)[1], 24 * 3600, Math.max(3 * critical, critical + 3600));
  const c = post.runoffCoefficient!;
  return {
    shortest: tc,
    longest: Math.max(tc, longest),
    critical,
    inflow: (td) => modifiedRationalHydrograph(rationalPeak(c, intensity(curve, td), post.area), tc, td),
  };
}

function checkIdfRange(rainfall: Extract<StormRainfall, { kind: "idf" }>, c: Catchment, where: string, cv: Converter): void {
  const [shortest] = idfRange(rainfall.curve);
  const tc = Math.max(c.tc, MIN_TC_RATIONAL);
  if (tc < shortest - 1e-6) {
    cv.problem(
      `hydrology.idf.${rainfall.name}.table[0][0]`,
      `${show(shortest / 60)} min`,
      `a first duration no longer than the Tc used for ${where} (${(tc / 60).toFixed(1)} min)`,
    );
  }
}

function catchment(c: CatchmentFile | BypassAreaFile, path: string, cv: Converter, twoYearRainfall: number | null): Catchment {
  const given = c.parts
    ? c.parts.map((p, i) => ({ ...p, name: p.name ?? null, path: `${path}.parts[${i}]`, area: cv.quantity(parseArea, p.area, `${path}.parts[${i}].area`) }))
    : [{ ...c, name: null, path, area: cv.quantity(parseArea, c.area!, `${path}.area`) }];
  const subAreas: SubArea[] = given.map((p) => {
    const split = p.perviousCurveNumber !== undefined ? imperviousCurveNumber(p.perviousCurveNumber, p.impervious!, p.unconnected ?? 0) : null;
    return {
      name: p.name,
      area: p.area,
      curveNumber: split ? split.curveNumber : (p.curveNumber ?? null),
      perviousCurveNumber: p.perviousCurveNumber ?? null,
      impervious: p.impervious ?? null,
      unconnected: p.unconnected ?? null,
      relation: split ? split.relation : null,
      runoffCoefficient: p.runoffCoefficient ?? null,
    };
  });
  const area = subAreas.reduce((sum, p) => sum + p.area, 0);
  const consistent = (key: "curveNumber" | "runoffCoefficient", what: string): boolean => {
    const count = subAreas.filter((p) => p[key] !== null).length;
    if (count === 0 || count === subAreas.length) return count > 0;
    subAreas.forEach((p, i) => {
      if (p[key] === null) cv.problem(`${given[i].path}.${key}`, "nothing (the field is missing)", `${what}, as the other sub-areas have`);
    });
    return false;
  };
  const withNumbers = consistent("curveNumber", "a curve number (or perviousCurveNumber with impervious)");
  const curveNumber = withNumbers ? compositeCurveNumber(subAreas.map((p) => ({ area: p.area, curveNumber: p.curveNumber! }))) : null;
  const runoffCoefficient = consistent("runoffCoefficient", "a runoff coefficient") ? weightedMean(subAreas.map((p) => [p.area, p.runoffCoefficient!] as const)) : null;
  const runoffParts = withNumbers ? separateParts(subAreas, area) : null;
  let tc = NaN;
  let tcMethod: Catchment["tcMethod"] = "given";
  let travelTimes: number[] = [];
  let segments: FlowSegment[] = [];
  if (c.tc !== undefined) tc = c.tc * 60;
  else if (c.flowPath) {
    tcMethod = "flow path";
    segments = c.flowPath.map((s, i) => flowSegment(s, `${path}.flowPath[${i}]`, cv));
    if (segments.some((s) => s.type === "sheet") && twoYearRainfall === null) {
      cv.problem("hydrology.twoYearRainfall", "nothing (the field is missing)", `the 2-year 24-hour rainfall depth: sheet flow in ${path}.flowPath needs it (TR-55 eq 3-3)`);
    }
    travelTimes = segments.map((s) => travelTime(s, twoYearRainfall ?? NaN));
    tc = travelTimes.reduce((a, b) => a + b, 0);
  } else {
    tcMethod = "watershed lag";
    const longest = c.watershedLag!;
    if (curveNumber === null) {
      cv.problem(`${path}.curveNumber`, "nothing (the field is missing)", "a curve number: the watershed lag method uses it");
    } else {
      tc = tcFromLag(watershedLag(cv.length(longest.flowLength, `${path}.watershedLag.flowLength`), longest.slope, curveNumber));
    }
  }
  const lag = "lag" in c && c.lag !== undefined ? c.lag * 60 : 0;
  return { area, curveNumber, runoffCoefficient, tc, tcMethod, travelTimes, segments, subAreas, runoffParts, lag };
}

/**
 * The parts whose runoff "separate" computes on their own: each sub-area's directly connected
 * impervious share at CN 98; the rest (pervious ground with any unconnected impervious area draining
 * over it) at the sub-area's pervious number, raised for the unconnected area by TR-55 Figure 2-4 with
 * all of that area's impervious share unconnected (Figure 2-3 from 30 %); a sub-area given by one curve
 * number is one part.
 */
function separateParts(subAreas: readonly SubArea[], total: number): RunoffPart[] {
  const parts: RunoffPart[] = [];
  for (const p of subAreas) {
    const share = p.area / total;
    if (p.perviousCurveNumber === null) {
      parts.push({ share, curveNumber: p.curveNumber! });
      continue;
    }
    const connected = p.impervious! * (1 - (p.unconnected ?? 0));
    const rest = 1 - connected;
    if (connected > 0) parts.push({ share: share * connected, curveNumber: IMPERVIOUS_CURVE_NUMBER });
    if (rest > 0) {
      const unconnectedShare = (p.impervious! - connected) / rest;
      const curveNumber = unconnectedShare > 0 ? imperviousCurveNumber(p.perviousCurveNumber, unconnectedShare, 1).curveNumber : p.perviousCurveNumber;
      parts.push({ share: share * rest, curveNumber });
    }
  }
  return parts;
}

function flowSegment(s: NonNullable<CatchmentFile["flowPath"]>[number], path: string, cv: Converter): FlowSegment {
  const length = cv.length(s.length, `${path}.length`);
  if (s.type === "sheet") {
    if (length > MAX_SHEET_LENGTH * (1 + 1e-9)) {
      const shown = cv.units === "US" ? `${(length / FOOT).toFixed(0)} ft` : `${length.toFixed(1)} m`;
      cv.problem(`${path}.length`, `${show(s.length)} (${shown})`, "a sheet-flow length of at most 300 ft (91.4 m), TR-55's limit; continue as shallow flow");
    }
    return { type: "sheet", length, slope: s.slope, manningN: s.manningN };
  }
  if (s.type === "shallow") return { type: "shallow", length, slope: s.slope, surface: s.surface };
  return { type: "channel", length, slope: s.slope, manningN: s.manningN, hydraulicRadius: cv.length(s.hydraulicRadius, `${path}.hydraulicRadius`) };
}

function idfCurve(idf: NonNullable<HydrologyFile["idf"]>[string], path: string, cv: Converter): IdfCurve {
  if (idf.formula) {
    const { a, b, c } = idf.formula;
    return { kind: "formula", a: cv.quantity(parseIntensity, a, `${path}.formula.a`), b, c };
  }
  const rows = idf.table!;
  const durations = rows.map((r) => r[0] * 60);
  const intensities = rows.map((r, i) => cv.quantity(parseIntensity, r[1], `${path}.table[${i}][1]`));
  for (let i = 1; i < rows.length; i++) {
    if (!(durations[i] > durations[i - 1])) {
      cv.problem(`${path}.table[${i}][0]`, show(rows[i][0]), `a duration longer than the row before (${rows[i - 1][0]} min)`);
    }
    if (intensities[i] > intensities[i - 1]) {
      cv.problem(`${path}.table[${i}][1]`, show(rows[i][1]), `an intensity not above the row before (${show(rows[i - 1][1])}): intensity falls as duration grows`);
    }
  }
  return { kind: "table", durations, intensities };
}

function stormRainfall(r: RainfallFile, path: string, cv: Converter, curves: Record<string, IdfCurve>): StormRainfall | null {
  if (r.distribution) {
    const depth = cv.quantity(parseDepth, r.depth!, `${path}.depth`);
    return { kind: "distribution", distribution: r.distribution, depth, curve: distributionMassCurve(r.distribution, depth) };
  }
  if (r.hyetograph) {
    const points = r.hyetograph;
    const times = points.map((p) => p[0] * 60);
    const depths = points.map((p, i) => cv.quantity(parseDepth, p[1], `${path}.hyetograph[${i}][1]`));
    if (times[0] < 0) cv.problem(`${path}.hyetograph[0][0]`, show(points[0][0]), "a time of zero or more (minutes from the start of the storm)");
    if (depths[0] !== 0) cv.problem(`${path}.hyetograph[0][1]`, show(points[0][1]), "a cumulative depth of 0 at the first point");
    for (let i = 1; i < points.length; i++) {
      if (!(times[i] > times[i - 1])) cv.problem(`${path}.hyetograph[${i}][0]`, show(points[i][0]), `a time later than the point before (${points[i - 1][0]} min)`);
      if (depths[i] < depths[i - 1]) cv.problem(`${path}.hyetograph[${i}][1]`, show(points[i][1]), `a cumulative depth not below the point before (${show(points[i - 1][1])})`);
    }
    const total = depths[depths.length - 1];
    if (!(total > 0)) cv.problem(`${path}.hyetograph`, "no rainfall", "cumulative depths that reach above zero");
    return { kind: "hyetograph", depth: total, curve: { times, depths } };
  }
  const curve = own(curves, r.idf!);
  if (!curve) {
    const names = Object.keys(curves);
    cv.problem(`${path}.idf`, show(r.idf), names.length ? `the name of a curve in hydrology.idf (${names.join(", ")})` : "the name of a curve in hydrology.idf (there is none)");
    return null;
  }
  return { kind: "idf", name: r.idf!, curve };
}

/** The unit-duration choice in words, with its source. */
export function unitDurationWords(h: CaseHydrology): string {
  const d = h.nrcs.unitDuration ?? "standard";
  if (d === "standard") return "unit duration D <= 0.133 Tc on the rainfall's step (NEH 630 ch. 16)";
  if (d === "converged") return "unit duration halved from 0.133 Tc until the peak changes by at most 0.5 % (converged; above the method's own peak)";
  return `unit duration fixed at ${trimNumber(d / 60, 3)} min`;
}

/** The runoff method in words, with its source. */
export function runoffMethodWords(h: CaseHydrology): string {
  return h.runoffMethod === "separate"
    ? "runoff of each part computed separately (directly connected impervious at CN 98, the rest at its own curve number; TR-55 ch. 2) and added by area"
    : "runoff from one composite curve number per area (area-weighted, TR-55 ch. 2 worksheet 2; impervious shares by Figure 2-3, or 2-4 when unconnected)";
}

/** The methods that turn the case's rainfall into its storms' inflows, targets and bypasses, in words; null when none does. */
export function hydrologyMethodsWords(h: CaseHydrology): string | null {
  const methods = new Set(h.storms.filter((s): s is StormHydrology => s !== null).map((s) => s.method));
  if (methods.size === 0) return null;
  const words: string[] = [];
  if (methods.has("nrcs")) words.push(`NRCS: ${runoffMethodWords(h)}; unit hydrograph NEH 630 ch. 16, ${unitDurationWords(h)}`);
  if (methods.has("rational")) words.push("rational method, modified rational hydrograph (HEC-22 ch. 3 and 8)");
  return words.join("; ");
}
