// Turns a schema-valid case file into the SI model, checking what spans several fields.
import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import type { CaseFile, ElementFile, Length, OutletFile } from "./schema.js";
import type { Case, Catalogue, Criteria, Element, Hydrograph, Outlet, Pond, Storage, Storm, Tailwater } from "./model.js";
import { CaseError, describeIoError, show } from "./errors.js";
import { Converter } from "./converter.js";
import { parseInflowCsv } from "./csv.js";
import { baseArea, baseLength, baseVolume, baseWeirCoefficient, FOOT, parseArea, parseDepth } from "../units.js";
import { defaultCoefficients } from "../hydraulics/defaults.js";
import { caseHydrology, type StormHydrology } from "./hydrology.js";
import { stormLimits } from "./releaseLimits.js";
import { ENTRANCE_TABLE, entrancesFor } from "../hydraulics/entrances.js";

export { Converter } from "./converter.js";

export interface NormalizeContext {
  file: string;
  label: string;
  directory: string;
}

export function normalizeCase(file: CaseFile, context: NormalizeContext): Case {
  const cv = new Converter(file.units, context.label);
  const pond = normalizePond(file, cv);
  const hydrology = caseHydrology(file, cv);
  const storms = file.storms.map((storm, i) => normalizeStorm(storm, i, cv, context, hydrology.storms[i]));
  const names = new Set<string>();
  file.storms.forEach((storm, i) => {
    if (names.has(storm.name)) cv.problem(`storms[${i}].name`, show(storm.name), "a storm name not used by another storm");
    names.add(storm.name);
  });
  const result: Case = {
    name: file.name,
    units: file.units,
    file: context.file,
    pond,
    tailwater: normalizeTailwater(file, cv),
    storms,
    criteria: normalizeCriteria(file, cv),
    outlet: file.outlet ? normalizeOutlet(file.outlet, cv, "outlet") : undefined,
    catalogue: file.catalogue ? normalizeCatalogue(file, cv) : undefined,
    costs: file.costs ?? {},
  };
  if (cv.problems.length > 0) throw new CaseError(cv.problems);
  return result;
}

function normalizePond(file: CaseFile, cv: Converter): Pond {
  const p = file.pond;
  const bottom = cv.length(p.bottom, "pond.bottom");
  const top = cv.length(p.top, "pond.top");
  const pool = cv.optionalLength(p.permanentPool, "pond.permanentPool", bottom);
  if (!(top > bottom)) cv.problem("pond.top", show(p.top), `an elevation above pond.bottom (${show(p.bottom)})`);
  if (p.permanentPool !== undefined && !(pool >= bottom && pool < top)) {
    cv.problem("pond.permanentPool", show(p.permanentPool), "an elevation from pond.bottom up to (not including) pond.top");
  }
  const s = p.storage;
  const L = baseLength(file.units);
  let storage: Storage;
  if (s.prismoid) {
    storage = {
      kind: "prismoid",
      length: cv.length(s.prismoid.length, "pond.storage.prismoid.length"),
      width: cv.length(s.prismoid.width, "pond.storage.prismoid.width"),
      sideSlope: s.prismoid.sideSlope,
    };
  } else {
    const rows = (s.stageArea ?? s.stageStorage)!;
    const kind = s.stageArea ? "stageArea" : "stageStorage";
    const elevations = rows.map((r) => r[0] * L);
    const values = rows.map((r) => r[1] * (s.stageArea ? baseArea(file.units) : baseVolume(file.units)));
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
  return { bottom, top, pool, storage };
}

function normalizeTailwater(file: CaseFile, cv: Converter): Tailwater {
  const t = file.tailwater;
  if (!t || t.free) return { kind: "free" };
  if (t.elevation !== undefined) return { kind: "elevation", elevation: cv.length(t.elevation, "tailwater.elevation") };
  const rows = t.rating!;
  return {
    kind: "rating",
    flows: rows.map((r) => r[0] * cv.flow),
    elevations: rows.map((r) => r[1] * baseLength(file.units)),
  };
}

/** A storm's inflow and target: given explicitly, or derived from its rainfall (explicit values win). */
function normalizeStorm(storm: CaseFile["storms"][number], index: number, cv: Converter, context: NormalizeContext, derived: StormHydrology | null): Storm {
  const path = `storms[${index}]`;
  const inflow: Hydrograph = storm.inflow || !derived?.post ? readHydrograph(storm.inflow, `${path}.inflow`, cv, context) : derived.post.hydrograph;
  return {
    name: storm.name,
    returnPeriod: storm.returnPeriod,
    ...stormLimits(storm, index, cv, derived?.pre?.peak ?? null),
    inflow,
    ceiling: stormCeiling(storm, path, cv, context, derived),
  };
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
function readHydrograph(source: { file?: string; series?: [number, number][] } | undefined, path: string, cv: Converter, context: NormalizeContext): Hydrograph {
  let minutes: number[] = [];
  let flows: number[] = [];
  if (source?.series) {
    const series = source.series;
    series.forEach(([t, q], i) => {
      if (q < 0) cv.problem(`${path}.series[${i}][1]`, show(q), "a flow of zero or more");
      if (i > 0 && !(t > series[i - 1][0])) {
        cv.problem(`${path}.series[${i}][0]`, show(t), `a time later than the point before (${series[i - 1][0]} min)`);
      }
    });
    if (series.length < 2) cv.problem(`${path}.series`, `${series.length} points`, "at least two [minutes, flow] points");
    minutes = series.map((p) => p[0]);
    flows = series.map((p) => p[1]);
  } else if (source?.file) {
    const name = source.file;
    const full = resolve(context.directory, name);
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
        flows = parsed.flows;
      }
    }
  }
  return { times: Float64Array.from(minutes, (m) => m * 60), flows: Float64Array.from(flows, (q) => q * cv.flow) };
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
    labels: {
      freeboard: c.freeboard?.source ?? null,
      drawdown: c.drawdown?.source ?? null,
      spillway: c.spillway?.source ?? null,
      overtopping: c.overtopping?.source ?? null,
    },
  };
}

/** A water-quality volume given as a runoff depth over an area (m3). */
function waterQualityVolume(depth: number | string, area: number | string, cv: Converter, path: string): number {
  const d = parseDepth(depth, cv.units);
  const a = parseArea(area, cv.units);
  if (typeof d !== "number") cv.problem(`${path}.depth`, show(depth), d.error);
  if (typeof a !== "number") cv.problem(`${path}.area`, show(area), a.error);
  return typeof d === "number" && typeof a === "number" ? d * a : NaN;
}

/** Converts an `outlet` section (also used for outlets written by the search). */
export function normalizeOutlet(o: OutletFile, cv: Converter, path: string): Outlet {
  const d = defaultCoefficients(cv.units);
  const k = baseWeirCoefficient(cv.units);
  const elements = (o.elements ?? []).map((e, i) => normalizeElement(e, cv, `${path}.elements[${i}]`));
  const outlet: Outlet = { elements };
  if (o.riser) {
    const r = o.riser;
    const common = {
      crest: cv.length(r.crest, `${path}.riser.crest`),
      coefficient: (r.coefficient ?? d.riserWeir) * k,
      orificeCoefficient: r.orificeCoefficient ?? d.riserOrifice,
      keep: r.keep ?? false,
    };
    outlet.riser =
      r.shape === "circular"
        ? { shape: "circular", diameter: cv.length(r.diameter, `${path}.riser.diameter`), ...common }
        : { shape: "box", length: cv.length(r.length, `${path}.riser.length`), width: cv.length(r.width, `${path}.riser.width`), ...common };
  }
  if (o.barrel) {
    const b = o.barrel;
    const common = {
      length: cv.length(b.length, `${path}.barrel.length`),
      inletInvert: cv.length(b.inletInvert, `${path}.barrel.inletInvert`),
      outletInvert: cv.length(b.outletInvert, `${path}.barrel.outletInvert`),
      manningN: b.manningN,
      entrance: b.entrance,
      keep: b.keep ?? false,
    };
    const row = ENTRANCE_TABLE[b.entrance];
    if (row.shape !== b.shape) {
      cv.problem(`${path}.barrel.entrance`, show(b.entrance), `an entrance for a ${b.shape} barrel (${entrancesFor(b.shape).join(", ")})`);
    }
    outlet.barrel =
      b.shape === "circular"
        ? { shape: "circular", diameter: cv.length(b.diameter, `${path}.barrel.diameter`), ...common }
        : { shape: "box", span: cv.length(b.span, `${path}.barrel.span`), rise: cv.length(b.rise, `${path}.barrel.rise`), ...common };
  }
  if (o.spillway) {
    const s = o.spillway;
    outlet.spillway = {
      crest: cv.length(s.crest, `${path}.spillway.crest`),
      length: cv.length(s.length, `${path}.spillway.length`),
      sideSlope: s.sideSlope,
      coefficient: (s.coefficient ?? d.spillway) * k,
      keep: s.keep ?? false,
    };
  }
  return outlet;
}

function normalizeElement(e: ElementFile, cv: Converter, path: string): Element {
  const d = defaultCoefficients(cv.units);
  const k = baseWeirCoefficient(cv.units);
  const keep = e.keep ?? false;
  if (e.type === "orifice") {
    const common = { count: e.count ?? 1, invert: cv.length(e.invert, `${path}.invert`), coefficient: e.coefficient ?? d.orifice, keep };
    return e.shape === "circular"
      ? { type: "orifice", shape: "circular", diameter: cv.length(e.diameter, `${path}.diameter`), ...common }
      : {
          type: "orifice",
          shape: "rectangular",
          width: cv.length(e.width, `${path}.width`),
          height: cv.length(e.height, `${path}.height`),
          ...common,
        };
  }
  if (e.type === "weir") {
    if (e.shape === "rectangular") {
      return {
        type: "weir",
        shape: "rectangular",
        length: cv.length(e.length, `${path}.length`),
        crest: cv.length(e.crest, `${path}.crest`),
        endContractions: e.endContractions ?? 0,
        coefficient: (e.coefficient ?? d.rectangularWeir) * k,
        keep,
      };
    }
    return {
      type: "weir",
      shape: "v-notch",
      angle: e.angle,
      crest: cv.length(e.crest, `${path}.crest`),
      coefficient: (e.coefficient ?? d.vNotchWeir) * k,
      keep,
    };
  }
  const L = baseLength(cv.units);
  if (e.rating[0][0] < 0) cv.problem(`${path}.rating[0][0]`, show(e.rating[0][0]), "a head of zero or more");
  return {
    type: "regulator",
    invert: cv.length(e.invert, `${path}.invert`),
    heads: e.rating.map((r) => r[0] * L),
    flows: e.rating.map((r) => r[1] * cv.flow),
    keep,
  };
}

function normalizeCatalogue(file: CaseFile, cv: Converter): Catalogue {
  const c = file.catalogue!;
  const lengths = (values: Length[] | undefined, path: string) =>
    (values ?? []).map((v, i) => cv.length(v, `${path}[${i}]`)).sort((a, b) => a - b);
  return {
    orificeDiameters: lengths(c.orifice?.diameters, "catalogue.orifice.diameters"),
    maxCount: c.orifice?.maxCount ?? 1,
    weirShapes: c.weir?.shapes ?? (c.weir ? ["rectangular", "v-notch"] : []),
    weirLengths: lengths(c.weir?.lengths, "catalogue.weir.lengths"),
    weirAngles: [...(c.weir?.angles ?? [])].sort((a, b) => a - b),
    riserDiameters: lengths(c.riser?.diameters, "catalogue.riser.diameters"),
    barrelDiameters: lengths(c.barrel?.diameters, "catalogue.barrel.diameters"),
    maxStages: c.maxStages ?? 3,
    elevationStep: cv.optionalLength(c.elevationStep, "catalogue.elevationStep", file.units === "US" ? 0.05 * FOOT : 0.01),
  };
}
