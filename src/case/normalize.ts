// Turns a schema-valid case file into the SI model, checking what spans several fields.
import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import type { BypassFile, CaseFile, Length, OutletFile, PondFile } from "./schema.js";
import type { AnalysisPoint, Case, Catalogue, Criteria, Hydrograph, Outlet, Pond, Storage, Storm, Tailwater } from "../model.js";
import { normalizeExfiltration } from "./exfiltration.js";
import { CaseError, describeIoError, show } from "./errors.js";
import { Converter } from "./converter.js";
import { MAX_ROWS, parseInflowCsv } from "./csv.js";
import { baseLength, baseVolume, FOOT, parseArea, parseDepth, parsePondArea } from "../units.js";
import { caseHydrology, hydrologyMethodsWords, type StormHydrology } from "./hydrology.js";
import { stormLimits } from "./releaseLimits.js";
import { DEFAULT_LISTED_SHAPES, elementToSI } from "../parts/registry.js";
import { riserToSI } from "../parts/riser.js";
import { barrelToSI } from "../parts/barrel.js";
import { spillwayToSI } from "../parts/spillway.js";
import { normalizeUnderground } from "./underground.js";
import { normalizeSite, siteSizing, sitePond, sizingSummary } from "./site.js";
import type { PondChoice } from "../sizing/pondChoice.js";
import { bareSizeWarnings } from "./sizePlausibility.js";
import { normalizeSystem, outfallPond, pondNames, stormInflows } from "./system.js";

export { Converter } from "./converter.js";

export interface NormalizeContext {
  file: string;
  label: string;
  directory: string;
  /** Notes on how inputs were read (a CSV's separator and units), for the user. */
  notes?: string[];
  /** Inflow files read, by absolute path (SI): taken from here when present, added when read. */
  hydrographs?: Map<string, Hydrograph>;
}

export function normalizeCase(file: CaseFile, context: NormalizeContext): Case {
  const cv = new Converter(file.units, context.label);
  const hydrology = caseHydrology(file, cv);
  const names = file.ponds ? pondNames(file) : null;
  const storms = file.storms.map((storm, i) => normalizeStorm(storm, i, cv, context, hydrology.storms[i], names));
  const stormNames = new Set<string>();
  file.storms.forEach((storm, i) => {
    if (stormNames.has(storm.name)) cv.problem(`storms[${i}].name`, show(storm.name), "a storm name not used by another storm");
    stormNames.add(storm.name);
  });
  const criteria = normalizeCriteria(file, cv);
  const system = file.ponds ? normalizeSystem(file, cv, (p, c) => normalizePond(p, file.units, c), (o, c, path) => normalizeOutlet(o, c, path)) : undefined;
  const site = file.site && !file.ponds ? normalizeSite(file, cv) : undefined;
  const tailwater = normalizeTailwater(file, cv);
  // The system's pond at the outfall stands for the case where one pond is read (see Case.pond).
  const atOutfall = system ? outfallPond(system) : -1;
  const outlet = system ? system.ponds[atOutfall]?.outlet : file.outlet ? normalizeOutlet(file.outlet, cv, "outlet") : undefined;
  let pond: Pond | null = system ? (system.ponds[atOutfall]?.pond ?? null) : file.pond ? normalizePond(file.pond, file.units, cv) : null;
  let sizing: PondChoice | null = null;
  if (file.ponds) {
    // A system: its ponds are checked in system.ts.
  } else if (!file.pond && !site) cv.problem("pond", "nothing (the field is missing)", "a pond (bottom, top, storage), or a site section to size one from");
  else if (!pond && site && cv.problems.length === 0) {
    // No pond given: the pond chosen from the site limits for the routed estimates.
    sizing = siteSizing(file, site, storms, criteria, tailwater, outlet?.spillway);
    pond = sizing ? sitePond(sizing) : null;
    if (!pond) cv.problem("site", sizing ? "limits that admit no pond at any depth" : "no storm with a target", sizing ? "site limits (depth, floor, grade, embankment, maxTopLength, maxTopWidth, maxTopArea) that admit at least one pond (outfit pond shows why each depth fails)" : "at least one storm with a target, to size the pond from");
  }
  if (cv.problems.length > 0) throw new CaseError(cv.problems);
  const result: Case = {
    name: file.name,
    units: file.units,
    file: context.file,
    pond: pond!,
    ...(system ? { system } : {}),
    site,
    sizing: sizing ? sizingSummary(sizing) : undefined,
    tailwater,
    storms,
    criteria,
    outlet,
    catalogue: file.catalogue ? normalizeCatalogue(file, cv) : undefined,
    costs: file.costs ?? {},
    sizeWarnings: bareSizeWarnings(file),
    hydrologyMethods: hydrologyMethodsWords(hydrology) ?? undefined,
  };
  if (cv.problems.length > 0) throw new CaseError(cv.problems);
  return result;
}

/** A pond section in SI; problems name `pond.` paths (a system's ponds re-root them, system.ts). */
function normalizePond(p: PondFile, units: CaseFile["units"], cv: Converter): Pond {
  const bottom = cv.length(p.bottom, "pond.bottom");
  const top = cv.length(p.top, "pond.top");
  const pool = cv.optionalLength(p.permanentPool, "pond.permanentPool", bottom);
  if (!(top > bottom)) cv.problem("pond.top", show(p.top), `an elevation above pond.bottom (${show(p.bottom)})`);
  if (p.permanentPool !== undefined && !(pool >= bottom && pool < top)) {
    cv.problem("pond.permanentPool", show(p.permanentPool), "an elevation from pond.bottom up to (not including) pond.top");
  }
  const s = p.storage;
  const L = baseLength(units);
  let storage: Storage;
  if (s.prismoid) {
    storage = {
      kind: "prismoid",
      length: cv.length(s.prismoid.length, "pond.storage.prismoid.length"),
      width: cv.length(s.prismoid.width, "pond.storage.prismoid.width"),
      sideSlope: s.prismoid.sideSlope,
    };
  } else if (s.pipeGallery || s.chambers) {
    storage = normalizeUnderground(s, cv, bottom, top);
  } else {
    const rows = (s.stageArea ?? s.stageStorage)!;
    const kind = s.stageArea ? "stageArea" : "stageStorage";
    const elevations = rows.map((r) => r[0] * L);
    const values = s.stageArea
      ? s.stageArea.map((r, i) => cv.quantity(parsePondArea, r[1], `pond.storage.stageArea[${i}][1]`))
      : s.stageStorage!.map((r) => r[1] * baseVolume(units));
    if (s.stageArea) cv.increasing(values, false, "area", (i) => ({ path: `pond.storage.stageArea[${i}][1]`, found: s.stageArea![i][1] }));
    if (elevations[0] > bottom + 1e-9) {
      cv.problem(`pond.storage.${kind}[0][0]`, show(rows[0][0]), `a first elevation at or below pond.bottom (${show(p.bottom)})`);
    }
    if (elevations[elevations.length - 1] < top - 1e-9) {
      cv.problem(`pond.storage.${kind}[${rows.length - 1}][0]`, show(rows[rows.length - 1][0]), `a last elevation at or above pond.top (${show(p.top)})`);
    }
    if (s.stageArea && values[values.length - 1] <= 0) {
      cv.problem(`pond.storage.stageArea`, "no surface area anywhere", "a surface area greater than zero");
    }
    storage = s.stageArea
      ? { kind: "stageArea", elevations, areas: values }
      : { kind: "stageStorage", elevations, volumes: values };
  }
  const pond: Pond = { bottom, top, pool, storage };
  if (p.exfiltration) pond.exfiltration = normalizeExfiltration(p.exfiltration, pond, cv, "pond.exfiltration", pond.pool > bottom);
  return pond;
}

function normalizeTailwater(file: CaseFile, cv: Converter): Tailwater {
  const t = file.tailwater;
  if (!t || t.free) return { kind: "free" };
  if (t.elevation !== undefined) return { kind: "elevation", elevation: cv.length(t.elevation, "tailwater.elevation") };
  const rows = t.rating!;
  return {
    kind: "rating",
    flows: cv.increasing(rows.map((r, i) => cv.flowOf(r[0], `tailwater.rating[${i}][0]`)), true, "flow", (i) => ({ path: `tailwater.rating[${i}][0]`, found: rows[i][0] })),
    elevations: rows.map((r) => r[1] * baseLength(file.units)),
  };
}

/** A storm's inflow and target: given explicitly, or derived from its rainfall (explicit values win). */
function normalizeStorm(storm: CaseFile["storms"][number], index: number, cv: Converter, context: NormalizeContext, derived: StormHydrology | null, ponds: string[] | null): Storm {
  const path = `storms[${index}]`;
  const limits = stormLimits(storm, index, cv, derived?.pre?.peak ?? null);
  const ceiling = stormCeiling(storm, path, cv, context, derived);
  // Runoff joining the flow at the point of analysis (a system's: the flow reaching its outfall) and at further points.
  const joining = {
    bypass: storm.bypass ? readBypass(storm.bypass, `${path}.bypass`, cv, context) : (derived?.bypass?.hydrograph ?? null),
    points: stormPoints(storm, path, cv, context, derived),
  };
  if (ponds) {
    const read = (source: { file?: string; series?: [number, number | string][] }, where: string) => readHydrograph(source, where, cv, context);
    return { name: storm.name, returnPeriod: storm.returnPeriod, ...limits, ...stormInflows(storm, index, ponds, cv, read, derived), ceiling, ...joining };
  }
  for (const field of ["inflows", "pondTargets"] as const) {
    if (storm[field] !== undefined) cv.problem(`${path}.${field}`, "a value per pond", `no ${field} in a case with one pond (${field} name the ponds of a system: ponds[])`);
  }
  const inflow: Hydrograph = storm.inflow || !derived?.post ? readHydrograph(storm.inflow, `${path}.inflow`, cv, context) : derived.post.hydrograph;
  return {
    name: storm.name,
    returnPeriod: storm.returnPeriod,
    ...limits,
    inflow,
    // A rational storm whose inflow is derived is routed over its range of durations.
    ...(!storm.inflow && derived?.durations ? { durations: derived.durations } : {}),
    ceiling,
    ...joining,
  };
}

/** A bypass hydrograph (file or series), later by its lag. */
function readBypass(source: BypassFile, path: string, cv: Converter, context: NormalizeContext): Hydrograph {
  const h = readHydrograph(source, path, cv, context);
  const lag = (source.lag ?? 0) * 60;
  return lag > 0 ? { times: Float64Array.from(h.times, (t) => t + lag), flows: h.flows } : h;
}

/**
 * The storm's further points of analysis: those the storm lists and those the hydrology section
 * defines, by name; the storm's own values (target, bypass, pond) win over derived ones.
 */
function stormPoints(storm: CaseFile["storms"][number], path: string, cv: Converter, context: NormalizeContext, derived: StormHydrology | null): AnalysisPoint[] {
  const given = storm.points ?? [];
  const names = new Set<string>();
  given.forEach((p, i) => {
    if (names.has(p.name)) cv.problem(`${path}.points[${i}].name`, show(p.name), "a point name not used by another point of this storm");
    names.add(p.name);
  });
  const derivedPoints = derived?.points ?? [];
  const all = [...given.map((p) => p.name), ...derivedPoints.map((p) => p.name).filter((n) => !names.has(n))];
  return all.map((name) => {
    const i = given.findIndex((p) => p.name === name);
    const own = i >= 0 ? given[i] : undefined;
    const from = derivedPoints.find((p) => p.name === name);
    const where = `${path}.points[${i}]`;
    const bypass = own?.bypass ? readBypass(own.bypass, `${where}.bypass`, cv, context) : (from?.post?.hydrograph ?? null);
    const pond = own?.pond ?? from?.pond ?? false;
    if (own && !bypass && !pond) cv.problem(where, "no runoff reaching the point", "a bypass (file or series), pond: true, or a point of the same name in hydrology.points with an area draining to it");
    const target = own?.target !== undefined ? cv.flowOf(own.target, `${where}.target`) : (from?.pre?.peak ?? null);
    return { name, pond, bypass, target, label: own?.targetSource ?? null };
  });
}

/** The pre-development hydrograph the outflow must stay under (a `belowPreHydrograph` release limit), given or derived. */
function stormCeiling(storm: CaseFile["storms"][number], path: string, cv: Converter, context: NormalizeContext, derived: StormHydrology | null): Storm["ceiling"] {
  const i = (storm.releaseLimits ?? []).findIndex((r) => r.belowPreHydrograph === true);
  if (i < 0) return null;
  const r = storm.releaseLimits![i];
  const where = `${path}.releaseLimits[${i}]`;
  if (r.preHydrograph) return { hydrograph: readHydrograph(r.preHydrograph, `${where}.preHydrograph`, cv, context), statement: "under the given pre-development hydrograph", label: r.source ?? null };
  if (derived?.pre) return { hydrograph: derived.pre.hydrograph, statement: "under the pre-development hydrograph (hydrology)", label: r.source ?? null };
  cv.problem(`${where}.preHydrograph`, "none given", "a pre-development hydrograph (file or series), or a hydrology section with a pre-development area to derive it");
  return null;
}

/** A hydrograph given as a CSV file or a series of [minutes, flow] pairs, in SI. */
export function readHydrograph(source: { file?: string; series?: [number, number | string][] } | undefined, path: string, cv: Converter, context: NormalizeContext): Hydrograph {
  let minutes: number[] = [];
  let flows: number[] = [];
  if (source?.series) {
    const series = source.series;
    const seriesFlows = series.map(([, q], i) => cv.flowOf(q, `${path}.series[${i}][1]`));
    series.forEach(([t], i) => {
      if (seriesFlows[i] < 0) cv.problem(`${path}.series[${i}][1]`, show(series[i][1]), "a flow of zero or more");
      if (i > 0 && !(t > series[i - 1][0])) {
        cv.problem(`${path}.series[${i}][0]`, show(t), `a time later than the point before (${series[i - 1][0]} min)`);
      }
    });
    if (series.length < 2) cv.problem(`${path}.series`, `${series.length} points`, "at least two [minutes, flow] points");
    minutes = series.map((p) => p[0]);
    flows = seriesFlows.map((q) => q / cv.flow);
  } else if (source?.file) {
    const name = source.file;
    const full = resolve(context.directory, name);
    const known = context.hydrographs?.get(full);
    if (known) return known;
    let text: string | undefined;
    try {
      text = readFileSync(full, "utf8");
    } catch (error) {
      cv.problem(`${path}.file`, `${show(name)}: ${describeIoError(error)} (looked for ${full})`, "a readable CSV inflow file, named relative to the case file");
    }
    if (text !== undefined) {
      const parsed = parseInflowCsv(text, name);
      if ("where" in parsed) cv.problems.push(parsed);
      else {
        minutes = parsed.times;
        flows = parsed.flowFactor === null ? parsed.flows : parsed.flows.map((q) => (q * parsed.flowFactor!) / cv.flow);
        context.notes?.push(`${name}: read with ${parsed.reading}`);
      }
    }
  }
  checkInflowSpan(minutes, path, cv);
  const hydrograph = { times: Float64Array.from(minutes, (m) => m * 60), flows: Float64Array.from(flows, (q) => q * cv.flow) };
  if (source?.file && cv.problems.length === 0) context.hydrographs?.set(resolve(context.directory, source.file), hydrograph);
  return hydrograph;
}

function normalizeCriteria(file: CaseFile, cv: Converter): Criteria {
  const c = file.criteria ?? {};
  const largest = file.storms.reduce((a, b) => (b.returnPeriod > a.returnPeriod ? b : a), file.storms[0]);
  const freeboardStorm = c.freeboard?.storm ?? largest.name;
  if (c.freeboard?.storm !== undefined && !file.storms.some((s) => s.name === c.freeboard!.storm)) {
    cv.problem("criteria.freeboard.storm", show(c.freeboard.storm), `the name of a storm (${file.storms.map((s) => s.name).join(", ")})`);
  }
  const us = file.units === "US";
  const freeboardDepth = cv.optionalLength(c.freeboard?.depth, "criteria.freeboard.depth", us ? FOOT : 0.3);
  const stormNames = file.storms.map((s) => s.name);
  if (c.blockedOutlet && !stormNames.includes(c.blockedOutlet.storm)) {
    cv.problem("criteria.blockedOutlet.storm", show(c.blockedOutlet.storm), `the name of a storm (${stormNames.join(", ")})`);
  }
  return {
    over: c.tolerance?.over ?? 0,
    under: c.tolerance?.under ?? 0.1,
    // Defaults 1 ft / 0.3 m and 0.1 ft / 0.03 m: the case-format contract (1 ft above the 100-yr
    // water surface is common practice).
    freeboardDepth,
    freeboardStorm,
    drawdownHours: c.drawdown?.hours ?? null,
    drawdownDepth: cv.optionalLength(c.drawdown?.depth, "criteria.drawdown.depth", us ? 0.1 * FOOT : 0.03),
    spillwayDryThrough: c.spillway?.dryThrough ?? largest.returnPeriod,
    blockedOutlet: c.blockedOutlet
      ? { storm: c.blockedOutlet.storm, freeboard: cv.optionalLength(c.blockedOutlet.freeboard, "criteria.blockedOutlet.freeboard", freeboardDepth), label: c.blockedOutlet.source ?? null }
      : null,
    clogging: c.clogging ? { fraction: c.clogging.fraction, checks: c.clogging.checks ?? null, label: c.clogging.source ?? null } : null,
    extendedDetention: (c.extendedDetention ?? []).map((r, i) => {
      if (r.storm !== undefined && !stormNames.includes(r.storm)) cv.problem(`criteria.extendedDetention[${i}].storm`, show(r.storm), `the name of a storm (${stormNames.join(", ")})`);
      const volume = r.volume !== undefined ? r.volume * baseVolume(file.units) : r.depth !== undefined && r.area !== undefined ? waterQualityVolume(r.depth, r.area, cv, `criteria.extendedDetention[${i}]`) : null;
      return { storm: r.storm ?? null, volume, hours: r.hours, share: r.share ?? 1, label: r.source ?? null };
    }),
    minimumOpening: c.minimumOpening ? { size: cv.length(c.minimumOpening.size, "criteria.minimumOpening.size"), label: c.minimumOpening.source ?? null } : null,
    buildability: buildability(c.buildability, cv),
    labels: {
      freeboard: c.freeboard?.source ?? null,
      drawdown: c.drawdown?.source ?? null,
      spillway: c.spillway?.source ?? null,
      overtopping: c.overtopping?.source ?? null,
    },
  };
}

/**
 * Buildable geometry, each limit the case's or the default of common practice: a clear web of 6 in /
 * 150 mm between openings (the minimum structural leg between openings in a precast wall, NPCA
 * "Manhole sizing recommendations", 2010), control levels at least 0.25 ft / 75 mm apart, and crests and
 * opening tops at least that far below the rim (the rim is one more control level).
 */
function buildability(b: NonNullable<CaseFile["criteria"]>["buildability"], cv: Converter): Criteria["buildability"] {
  const us = cv.units === "US";
  const label = (stated: unknown) => (stated === undefined ? COMMON_PRACTICE : (b?.source ?? null));
  return {
    web: cv.optionalLength(b?.web, "criteria.buildability.web", us ? 0.5 * FOOT : 0.15),
    levelSpacing: cv.optionalLength(b?.levelSpacing, "criteria.buildability.levelSpacing", us ? 0.25 * FOOT : 0.075),
    rimClearance: cv.optionalLength(b?.rimClearance, "criteria.buildability.rimClearance", us ? 0.25 * FOOT : 0.075),
    headwallWidth: b?.headwallWidth === undefined ? null : cv.length(b.headwallWidth, "criteria.buildability.headwallWidth"),
    labels: { web: label(b?.web), levelSpacing: label(b?.levelSpacing), rimClearance: label(b?.rimClearance) },
  };
}

/** The label of a limit outfit takes from common practice (the case states none). */
export const COMMON_PRACTICE = "common practice";

/** A water-quality volume given as a runoff depth over an area (m3). */
function waterQualityVolume(depth: number | string, area: number | string, cv: Converter, path: string): number {
  const d = parseDepth(depth, cv.units);
  const a = parseArea(area, cv.units);
  if (typeof d !== "number") cv.problem(`${path}.depth`, show(depth), d.error);
  if (typeof a !== "number") cv.problem(`${path}.area`, show(area), a.error);
  return typeof d === "number" && typeof a === "number" ? d * a : NaN;
}

/** Converts an `outlet` section (also used for outlets written by the search): each part by its kind. */
export function normalizeOutlet(o: OutletFile, cv: Converter, path: string): Outlet {
  const outlet: Outlet = { elements: (o.elements ?? []).map((e, i) => elementToSI(e, cv, `${path}.elements[${i}]`)) };
  if (o.riser) outlet.riser = riserToSI(o.riser, cv, `${path}.riser`);
  if (o.barrel) outlet.barrel = barrelToSI(o.barrel, cv, `${path}.barrel`);
  if (o.spillway) outlet.spillway = spillwayToSI(o.spillway, cv, `${path}.spillway`);
  return outlet;
}

function normalizeCatalogue(file: CaseFile, cv: Converter): Catalogue {
  const c = file.catalogue!;
  const lengths = (values: Length[] | undefined, path: string) =>
    (values ?? []).map((v, i) => cv.length(v, `${path}[${i}]`)).sort((a, b) => a - b);
  return {
    orificeDiameters: lengths(c.orifice?.diameters, "catalogue.orifice.diameters"),
    maxCount: c.orifice?.maxCount ?? 1,
    weirShapes: c.weir?.shapes ?? (c.weir ? [...DEFAULT_LISTED_SHAPES] : []),
    weirLengths: lengths(c.weir?.lengths, "catalogue.weir.lengths"),
    weirAngles: [...(c.weir?.angles ?? [])].sort((a, b) => a - b),
    riserDiameters: lengths(c.riser?.diameters, "catalogue.riser.diameters"),
    barrelDiameters: lengths(c.barrel?.diameters, "catalogue.barrel.diameters"),
    maxStages: c.maxStages ?? 3,
    elevationStep: cv.optionalLength(c.elevationStep, "catalogue.elevationStep", file.units === "US" ? 0.05 * FOOT : 0.01),
  };
}

/** Longest inflow a storm may span: routing goes on until 10 days after the last point, and a
 * span beyond this is a typo in the times (or the unit of the time column), not a design storm. */
export const MAX_INFLOW_DAYS = 30;

function checkInflowSpan(minutes: number[], path: string, cv: Converter): void {
  if (minutes.length > MAX_ROWS) cv.problem(path, `${minutes.length} points`, `at most ${MAX_ROWS} points`);
  if (minutes.length < 2) return;
  const span = minutes[minutes.length - 1] - minutes[0];
  if (span > MAX_INFLOW_DAYS * 1440) {
    cv.problem(path, `times from ${show(minutes[0])} to ${show(minutes[minutes.length - 1])} minutes (${show(Number((span / 1440).toPrecision(3)))} days)`, `an inflow spanning at most ${MAX_INFLOW_DAYS} days (${MAX_INFLOW_DAYS * 1440} minutes); times are minutes unless a CSV header names hours or seconds`);
  }
}
