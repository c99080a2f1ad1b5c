// The case file's hydrology section and storm rainfalls in SI, and what each storm derives from them:
// the inflow (the post-development runoff hydrograph) and the target (the pre-development peak).
// Problems are reported through the case converter with their JSON paths.
import type { CaseFile, CatchmentFile, HydrologyFile, RainfallFile } from "./schema.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { emptyRecord, own } from "../own.js";
import { FOOT, parseArea, parseDepth, parseIntensity } from "../units.js";
import { distributionMassCurve, type DistributionType, type MassCurve } from "../hydrology/distributions.js";
import { compositeCurveNumber, weightedMean, type AbstractionRatio } from "../hydrology/runoff.js";
import { MAX_SHEET_LENGTH, tcFromLag, travelTime, watershedLag, type FlowSegment } from "../hydrology/timeOfConcentration.js";
import { idfRange, intensity, type IdfCurve } from "../hydrology/idf.js";
import { nrcsHydrograph, type NrcsOptions } from "../hydrology/nrcsHydrograph.js";
import { criticalDuration, MIN_TC_RATIONAL, modifiedRationalHydrograph, rationalAreaHydrograph, rationalPeak, type CriticalDuration } from "../hydrology/rational.js";
import type { DurationRange } from "../model.js";
import { STANDARD_PEAK_RATE_FACTOR } from "../hydrology/unitHydrograph.js";
import type { AreaHydrograph } from "../hydrology/hydrograph.js";

export type AreaName = "pre" | "post";
export const AREA_NAMES: readonly AreaName[] = ["pre", "post"];

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
}

export type StormRainfall =
  | { kind: "distribution"; distribution: DistributionType; depth: number; curve: MassCurve }
  | { kind: "hyetograph"; depth: number; curve: MassCurve }
  | { kind: "idf"; name: string; curve: IdfCurve };

export interface StormHydrology {
  method: "nrcs" | "rational";
  rainfall: StormRainfall;
  pre: AreaHydrograph | null;
  post: AreaHydrograph | null;
  /** Rational method: the allowable release (m3/s) of the duration sweep (the explicit target, else the pre-development peak). */
  allowable: number | null;
  /** Rational method: the duration sweep of the post-development area (null without an allowable release). */
  sweep: CriticalDuration | null;
  /** Rational method: the range of storm durations routed for the post-development area (null without a sweep). */
  durations: DurationRange | null;
}

export interface CaseHydrology {
  nrcs: NrcsOptions;
  catchments: Record<AreaName, Catchment | null>;
  /** Per storm of the case, in order; null for a storm without a rainfall. */
  storms: (StormHydrology | null)[];
}

/** Converts the hydrology section and derives every storm's hydrographs; problems go to `cv`. */
export function caseHydrology(file: CaseFile, cv: Converter): CaseHydrology {
  const h: HydrologyFile = file.hydrology ?? {};
  const before = cv.problems.length;
  const nrcs: NrcsOptions = {
    ratio: (h.initialAbstractionRatio ?? 0.2) as AbstractionRatio,
    peakRateFactor: h.peakRateFactor ?? STANDARD_PEAK_RATE_FACTOR,
  };
  const twoYearRainfall = h.twoYearRainfall === undefined ? null : cv.quantity(parseDepth, h.twoYearRainfall, "hydrology.twoYearRainfall");
  const catchments: Record<AreaName, Catchment | null> = {
    pre: h.pre ? catchment(h.pre, `hydrology.pre`, cv, twoYearRainfall) : null,
    post: h.post ? catchment(h.post, `hydrology.post`, cv, twoYearRainfall) : null,
  };
  const curves: Record<string, IdfCurve> = emptyRecord();
  for (const [name, idf] of Object.entries(h.idf ?? {})) curves[name] = idfCurve(idf, `hydrology.idf.${name}`, cv);
  const result: CaseHydrology = { nrcs, catchments, storms: file.storms.map(() => null) };
  if (cv.problems.length > before) return result;

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
    if (!storm.inflow && !catchments.post) need("hydrology.post", `the post-development area: ${path} (${storm.name}) derives its inflow from it`);
    if (rainfall === null || cv.problems.length > start) return;
    const method = rainfall.kind === "idf" ? "rational" : "nrcs";
    for (const name of AREA_NAMES) {
      const c = catchments[name];
      if (!c) continue;
      if (method === "nrcs" && c.curveNumber === null) {
        need(`hydrology.${name}.curveNumber`, `a curve number: ${path} (${storm.name}) gives a 24-hour rainfall or a hyetograph (NRCS method)`);
      }
      if (method === "rational" && c.runoffCoefficient === null) {
        need(`hydrology.${name}.runoffCoefficient`, `a runoff coefficient: ${path} (${storm.name}) gives an IDF curve (rational method)`);
      }
      if (rainfall.kind === "idf") checkIdfRange(rainfall, c, name, cv);
    }
    if (cv.problems.length > start) return;
    const explicitTarget = storm.target === undefined ? null : cv.flowOf(storm.target, `${path}.target`);
    result.storms[index] =
      rainfall.kind === "idf" ? rationalStorm(rainfall, catchments, explicitTarget) : nrcsStorm(rainfall, catchments, nrcs);
  });
  return result;
}

function nrcsStorm(rainfall: Exclude<StormRainfall, { kind: "idf" }>, catchments: Record<AreaName, Catchment | null>, options: NrcsOptions): StormHydrology {
  const area = (c: Catchment | null) => (c ? nrcsHydrograph(c.area, c.curveNumber!, c.tc, rainfall.curve, options) : null);
  return { method: "nrcs", rainfall, pre: area(catchments.pre), post: area(catchments.post), allowable: null, sweep: null, durations: null };
}

function rationalStorm(rainfall: Extract<StormRainfall, { kind: "idf" }>, catchments: Record<AreaName, Catchment | null>, explicitTarget: number | null): StormHydrology {
  const tcOf = (c: Catchment) => Math.max(c.tc, MIN_TC_RATIONAL);
  const pre = catchments.pre;
  const preHydrograph = pre ? rationalAreaHydrograph(pre.area, pre.runoffCoefficient!, tcOf(pre), rainfall.curve, tcOf(pre)) : null;
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
  return { method: "rational", rainfall, pre: preHydrograph, post: postHydrograph, allowable, sweep, durations };
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

function checkIdfRange(rainfall: Extract<StormRainfall, { kind: "idf" }>, c: Catchment, name: AreaName, cv: Converter): void {
  const [shortest] = idfRange(rainfall.curve);
  const tc = Math.max(c.tc, MIN_TC_RATIONAL);
  if (tc < shortest - 1e-6) {
    cv.problem(
      `hydrology.idf.${rainfall.name}.table[0][0]`,
      `${show(shortest / 60)} min`,
      `a first duration no longer than the Tc used for hydrology.${name} (${(tc / 60).toFixed(1)} min)`,
    );
  }
}

function catchment(c: CatchmentFile, path: string, cv: Converter, twoYearRainfall: number | null): Catchment {
  let area: number;
  let curveNumber: number | null;
  let runoffCoefficient: number | null;
  if (c.parts) {
    const parts = c.parts.map((p, i) => ({ ...p, area: cv.quantity(parseArea, p.area, `${path}.parts[${i}].area`) }));
    area = parts.reduce((sum, p) => sum + p.area, 0);
    const consistent = (key: "curveNumber" | "runoffCoefficient", what: string): boolean => {
      const given = parts.filter((p) => p[key] !== undefined).length;
      if (given === 0 || given === parts.length) return given > 0;
      parts.forEach((p, i) => {
        if (p[key] === undefined) cv.problem(`${path}.parts[${i}].${key}`, "nothing (the field is missing)", `${what}, as the other sub-areas have`);
      });
      return false;
    };
    curveNumber = consistent("curveNumber", "a curve number")
      ? compositeCurveNumber(parts.map((p) => ({ area: p.area, curveNumber: p.curveNumber! })))
      : null;
    runoffCoefficient = consistent("runoffCoefficient", "a runoff coefficient")
      ? weightedMean(parts.map((p) => [p.area, p.runoffCoefficient!] as const))
      : null;
  } else {
    area = cv.quantity(parseArea, c.area!, `${path}.area`);
    curveNumber = c.curveNumber ?? null;
    runoffCoefficient = c.runoffCoefficient ?? null;
  }
  let tc = NaN;
  let tcMethod: Catchment["tcMethod"] = "given";
  let travelTimes: number[] = [];
  if (c.tc !== undefined) tc = c.tc * 60;
  else if (c.flowPath) {
    tcMethod = "flow path";
    const segments = c.flowPath.map((s, i) => flowSegment(s, `${path}.flowPath[${i}]`, cv));
    if (segments.some((s) => s.type === "sheet") && twoYearRainfall === null) {
      cv.problem("hydrology.twoYearRainfall", "nothing (the field is missing)", `the 2-year 24-hour rainfall depth: sheet flow in ${path}.flowPath needs it (TR-55 eq 3-3)`);
    }
    travelTimes = segments.map((s) => travelTime(s, twoYearRainfall ?? NaN));
    tc = travelTimes.reduce((a, b) => a + b, 0);
  } else {
    tcMethod = "watershed lag";
    const lag = c.watershedLag!;
    if (curveNumber === null) {
      cv.problem(`${path}.curveNumber`, "nothing (the field is missing)", "a curve number: the watershed lag method uses it");
    } else {
      tc = tcFromLag(watershedLag(cv.length(lag.flowLength, `${path}.watershedLag.flowLength`), lag.slope, curveNumber));
    }
  }
  return { area, curveNumber, runoffCoefficient, tc, tcMethod, travelTimes };
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

/** Parses a value with one of the units' parsers, reporting a problem at `path` when it fails. */
