// What the search works on: the case, the catalogue's part options, the fixed parts, the elevation
// limits, the stage grid shared by every candidate and the target aims.
import type { Case, Hydrograph, Outlet, Storm } from "../src/model.js";
import type { BarrelFile, CaseFile, ElementFile, Length, OutletFile, RiserFile, SpillwayFile } from "../src/case/schema.js";
import { normalizeOutlet } from "../src/case/normalize.js";
import { defaultCoefficients } from "../src/hydraulics/defaults.js";
import { CaseError } from "../src/case/errors.js";
import { Converter } from "../src/case/normalize.js";
import { parseLength } from "../src/units.js";
import { stageGrid, type StageGrid } from "../src/routing/ratingTable.js";
import { searchInflow } from "../src/routing/thinInflow.js";
import { costWeights, type CostWeights } from "./cost.js";
import { narrowed, targetBand } from "../src/assess/rules/band.js";
import { aimMargin } from "../src/assess/rules/peakUpper.js";

/** One choice for a control level: an orifice group or a weir, in catalogue sizes. */
export interface PartOption {
  key: string;
  kind: "orifice" | "rectangular" | "v-notch";
  count: number;
  /** The catalogue's own value (diameter or weir length), written back as given. */
  size: Length | null;
  /** Diameter or weir length (m); 0 for a v-notch. */
  sizeM: number;
  angle: number;
  /** Height of the opening (m): the diameter for orifices, 0 for weirs. */
  height: number;
  /** Wall width the part takes (m); a v-notch's at one foot of head. */
  width: number;
  /** A part of the existing outlet outside the catalogue's form: written as this element, moved. */
  template?: ElementFile;
}

export interface SizeOption {
  size: Length;
  sizeM: number;
}

/** The discrete part of a design (which parts, counts, sizes); its elevations are the fit's variables (layout.ts). */
export interface Layout {
  /** Designed control levels, bottom up. The first sits at the floor unless a kept element does. */
  levels: PartOption[];
  /** Designed riser size (null: a kept riser or none). */
  riser: SizeOption | null;
  /** Size of the site barrel (null: a kept barrel or none). */
  barrel: SizeOption | null;
}

export interface SearchOptions {
  /** Aim this fraction of the target inside each edge of the band (default 0.02). */
  margin: number;
  /** The reference path, the bench's "before": every candidate rated by the direct evaluation at
   * each stage instead of the rating sweep's tables and warm starts (results agree within the
   * tables' stated errors), and the staged start's routings not shared between layouts. */
  referencePath: boolean;
}

/** What value engineering may change in the existing outlet, and how its alternatives are ranked. */
export interface DesignLimits {
  /**
   * "all": everything the catalogue allows; "openings": only the orifices and weirs (the riser and
   * barrel stay as they are); "elevations": every part keeps its size, only inverts, crests and the
   * rim move.
   */
  vary: "all" | "openings" | "elevations";
  keepRiser: boolean;
  keepBarrel: boolean;
  /** "cost": cheapest compliant first; "change": smallest change to the existing outlet first. */
  rankBy: "cost" | "change";
}

export const DEFAULT_LIMITS: DesignLimits = { vary: "all", keepRiser: false, keepBarrel: false, rankBy: "cost" };

/** The case's own outlet, the baseline of value engineering. */
export interface ExistingOutlet {
  file: OutletFile;
  outlet: Outlet;
  /** The existing outlet as a layout whose elevations the search may refit, with those elevations. */
  layout: Layout;
  vars: number[];
}

export interface SearchProblem {
  case: Case;
  file: CaseFile;
  converter: Converter;
  /**
   * The catalogue's elevationStep (m). Every elevation of the search is in m; a level on the step's
   * lattice (k * stepM) is written back to the case file as exactly k steps in case units.
   */
  stepM: number;
  /**
   * Lowest opening elevation (m): the permanent pool, or the pond floor when a constant tailwater at
   * or above the pool holds it (openings below the pool are then drowned, not a drain).
   */
  floor: number;
  /** A constant tailwater at or above the permanent pool holds the pool of this wet pond. */
  poolHeldByTailwater: boolean;
  /** The lowest designed opening may float (a kept element holds the floor, or the tailwater holds the pool). */
  lowestFloats: boolean;
  /** Highest elevation of any designed invert or crest: top less freeboard (m). */
  ceiling: number;
  /** Storms with a target, by return period. */
  targeted: Storm[];
  keptElements: ElementFile[];
  /** Elevations of kept elements (m). */
  keptElevations: number[];
  /** A kept element sits at the floor, so designed levels may all float. */
  floorTaken: boolean;
  keptRiser?: RiserFile;
  riserOptions: SizeOption[];
  /** Site barrel (length, inverts, n, entrance) whose size the search picks, or a kept barrel. */
  barrel?: BarrelFile;
  barrelKept: boolean;
  barrelOptions: SizeOption[];
  spillway?: SpillwayFile;
  parts: PartOption[];
  maxLevels: number;
  /** The case's outlet (value engineering), or null. */
  existing: ExistingOutlet | null;
  /** With `limits.vary` "elevations": the one layout the search fits. */
  fixedLayout: Layout | null;
  limits: DesignLimits;
  grid: StageGrid;
  /**
   * The inflow each storm is routed on in the search (a long fine record thinned, volume kept: see
   * `src/routing/thinInflow.ts`); reported candidates are routed on the full inflow.
   */
  inflows: ReadonlyMap<Storm, Hydrograph>;
  costs: CostWeights;
  options: SearchOptions;
}

export function buildProblem(c: Case, file: CaseFile, options: Partial<SearchOptions> = {}, limits: DesignLimits = DEFAULT_LIMITS): SearchProblem {
  const label = c.file ? c.file.split(/[\\/]/).pop()! : "case";
  if (!c.catalogue || !file.catalogue) {
    throw new CaseError([{ where: `${label}: catalogue`, found: "nothing (the field is missing)", expected: "a catalogue of parts the search may use (orifice, weir, riser, barrel sizes)" }]);
  }
  const cat = c.catalogue;
  const catFile = file.catalogue;
  const converter = new Converter(c.units, label);
  const outlet = file.outlet ?? {};
  // An outlet with openings or a riser is an existing design (the baseline of value engineering);
  // one with only a barrel or spillway is site data.
  const hasExisting = (outlet.elements?.length ?? 0) > 0 || outlet.riser !== undefined;
  if (limits.vary !== "all" && !hasExisting) {
    throw new CaseError([{ where: `${label}: outlet`, found: file.outlet ? "no elements and no riser" : "nothing (the field is missing)", expected: `an existing outlet whose ${limits.vary === "openings" ? "openings" : "elevations"} the search may change (--vary ${limits.vary})` }]);
  }
  // Parts of the existing outlet the catalogue's form cannot express (rectangular orifices,
  // regulators) stay as they are, like kept parts.
  const keptElements = (outlet.elements ?? []).filter((e) => e.keep || e.type === "regulator" || (e.type === "orifice" && e.shape === "rectangular"));
  const keptElevations = keptElements.map((e) => converter.length(e.type === "weir" ? e.crest : e.invert, "outlet.elements"));
  const poolHeldByTailwater = c.pond.pool > c.pond.bottom && c.tailwater.kind === "elevation" && c.tailwater.elevation >= c.pond.pool - 1e-9;
  const floor = poolHeldByTailwater ? c.pond.bottom : c.pond.pool;
  const ceiling = c.pond.top - c.criteria.freeboardDepth;
  const stepM = cat.elevationStep;
  const targeted = c.storms.filter((s) => s.target !== null).sort((a, b) => a.returnPeriod - b.returnPeriod);
  if (targeted.length === 0) {
    throw new CaseError([{ where: `${label}: storms`, found: "no storm with a target", expected: "at least one storm with a target for the search to aim at" }]);
  }

  const parts: PartOption[] = [];
  const diameters = sizes(catFile.orifice?.diameters, c);
  for (const d of diameters) {
    for (let count = 1; count <= cat.maxCount; count++) {
      parts.push({ key: `orifice ${count} x ${show(d.size)}`, kind: "orifice", count, size: d.size, sizeM: d.sizeM, angle: 0, height: d.sizeM, width: count * d.sizeM });
    }
  }
  if (cat.weirShapes.includes("rectangular")) {
    for (const w of sizes(catFile.weir?.lengths, c)) {
      parts.push({ key: `weir ${show(w.size)}`, kind: "rectangular", count: 1, size: w.size, sizeM: w.sizeM, angle: 0, height: 0, width: w.sizeM });
    }
  }
  if (cat.weirShapes.includes("v-notch")) {
    for (const angle of cat.weirAngles) {
      parts.push({ key: `v-notch ${angle}`, kind: "v-notch", count: 1, size: null, sizeM: 0, angle, height: 0, width: notchWidth(angle) });
    }
  }
  if (parts.length === 0 && keptElements.length === 0) {
    throw new CaseError([{ where: `${label}: catalogue`, found: "no orifice diameters or weir sizes", expected: "at least one orifice diameter or weir size" }]);
  }

  const riserHeld = limits.keepRiser || limits.vary === "openings";
  const riserKept = outlet.riser?.keep === true || (riserHeld && outlet.riser !== undefined) || (limits.vary === "elevations" && outlet.riser?.shape === "box");
  const existingRiser = outlet.riser?.shape === "circular" ? [{ size: outlet.riser.diameter, sizeM: converter.length(outlet.riser.diameter, "outlet.riser.diameter") }] : [];
  let riserOptions = riserKept || riserHeld ? [] : limits.vary === "elevations" ? existingRiser : sizes(catFile.riser?.diameters, c);
  if (!riserKept && !riserHeld && riserOptions.length === 0) riserOptions = existingRiser;
  const barrel = outlet.barrel;
  const barrelKept = barrel?.keep === true || (barrel !== undefined && barrel.shape === "box") || limits.keepBarrel || limits.vary !== "all";
  let barrelOptions: SizeOption[] = [];
  if (barrel && !barrelKept) {
    barrelOptions = sizes(catFile.barrel?.diameters, c);
    if (barrelOptions.length === 0 && barrel.shape === "circular") {
      barrelOptions = [{ size: barrel.diameter, sizeM: converter.length(barrel.diameter, "outlet.barrel.diameter") }];
    }
  }
  const depth = c.pond.top - c.pond.bottom;
  // A grid on the elevation lattice: inverts and crests snapped to the step fall on its nodes.
  const gridStep = Math.min(stepM / 2, depth / 200);
  const gridStepOnLattice = stepM / Math.ceil(stepM / gridStep);
  const problem: SearchProblem = {
    case: c,
    file,
    converter,
    stepM,
    floor,
    poolHeldByTailwater,
    lowestFloats: false,
    ceiling,
    targeted,
    keptElements,
    keptElevations,
    floorTaken: keptElevations.some((z) => Math.abs(z - floor) < 1e-9),
    keptRiser: riserKept ? outlet.riser : undefined,
    riserOptions,
    barrel,
    barrelKept,
    barrelOptions,
    spillway: outlet.spillway,
    parts,
    maxLevels: Math.max(0, cat.maxStages - new Set(keptElevations.map((z) => Math.round(z * 1e6))).size),
    grid: stageGrid(c.pond, [], gridStepOnLattice),
    inflows: new Map(c.storms.map((s) => [s, searchInflow(s.inflow)])),
    costs: costWeights(c),
    options: { margin: options.margin ?? 0.02, referencePath: options.referencePath ?? false },
    existing: null,
    fixedLayout: null,
    limits,
  };
  problem.lowestFloats = problem.floorTaken || poolHeldByTailwater;
  if (file.outlet && hasExisting) {
    problem.existing = existingOutlet(problem, file.outlet, label);
    if (limits.vary === "elevations") {
      problem.fixedLayout = problem.existing.layout;
      problem.parts = problem.existing.layout.levels;
    }
  }
  return problem;
}

/**
 * The case's outlet as the search sees it: its designed parts (catalogue options where a part is
 * one, else the part itself as a template) bottom up, its riser and barrel sizes, their elevations.
 */
function existingOutlet(p: SearchProblem, file: OutletFile, label: string): ExistingOutlet {
  const converter = new Converter(p.case.units, label);
  const outlet = normalizeOutlet(file, converter, "outlet");
  const d = defaultCoefficients(p.case.units);
  const designed = (file.elements ?? []).filter((e) => !p.keptElements.includes(e));
  const at = (e: ElementFile) => converter.length(e.type === "weir" ? e.crest : e.invert, "outlet.elements");
  designed.sort((a, b) => at(a) - at(b));
  const levels = designed.map((e): PartOption => {
    const sizeM = e.type === "orifice" && e.shape === "circular" ? converter.length(e.diameter, "outlet.elements") : e.type === "weir" && e.shape === "rectangular" ? converter.length(e.length, "outlet.elements") : 0;
    const inCatalogue = p.parts.find((o) => {
      if (e.type === "orifice" && e.shape === "circular") return o.kind === "orifice" && Math.abs(o.sizeM - sizeM) < 1e-9 && o.count === (e.count ?? 1) && (e.coefficient ?? d.orifice) === d.orifice;
      if (e.type === "weir" && e.shape === "rectangular") return o.kind === "rectangular" && Math.abs(o.sizeM - sizeM) < 1e-9 && (e.endContractions ?? 0) === 2 && (e.coefficient ?? d.rectangularWeir) === d.rectangularWeir;
      if (e.type === "weir" && e.shape === "v-notch") return o.kind === "v-notch" && o.angle === e.angle && (e.coefficient ?? d.vNotchWeir) === d.vNotchWeir;
      return false;
    });
    if (inCatalogue) return inCatalogue;
    const template = Object.fromEntries(Object.entries(e).filter(([k]) => k !== "keep")) as ElementFile;
    if (e.type === "orifice" && e.shape === "circular") {
      const count = e.count ?? 1;
      return { key: `existing orifice ${count} x ${show(e.diameter)} Cd ${e.coefficient ?? d.orifice}`, kind: "orifice", count, size: e.diameter, sizeM, angle: 0, height: sizeM, width: count * sizeM, template };
    }
    if (e.type === "weir" && e.shape === "rectangular") {
      return { key: `existing weir ${show(e.length)} n ${e.endContractions ?? 0} C ${e.coefficient ?? d.rectangularWeir}`, kind: "rectangular", count: 1, size: e.length, sizeM, angle: 0, height: 0, width: sizeM, template };
    }
    // What is left is a v-notch (rectangular orifices and regulators are among the kept elements).
    const notch = e as Extract<ElementFile, { shape: "v-notch" }>;
    return { key: `existing v-notch ${notch.angle} C ${notch.coefficient ?? d.vNotchWeir}`, kind: "v-notch", count: 1, size: null, sizeM: 0, angle: notch.angle, height: 0, width: notchWidth(notch.angle), template };
  });
  const riser = !p.keptRiser && file.riser?.shape === "circular" ? { size: file.riser.diameter, sizeM: converter.length(file.riser.diameter, "outlet.riser.diameter") } : null;
  const barrel = !p.barrelKept && file.barrel?.shape === "circular" ? { size: file.barrel.diameter, sizeM: converter.length(file.barrel.diameter, "outlet.barrel.diameter") } : null;
  const layout: Layout = { levels, riser, barrel };
  // The existing elevations of the variables (m): the levels that float, then the rim.
  const vars = designed.map(at).filter((_, i) => i > 0 || p.lowestFloats);
  if (riser && file.riser) vars.push(converter.length(file.riser.crest, "outlet.riser.crest"));
  return { file, outlet, layout, vars };
}

/** Wall width a v-notch takes at one foot of head (m). */
function notchWidth(angle: number): number {
  return 2 * 0.3048 * Math.tan((angle * Math.PI) / 360);
}

function sizes(values: Length[] | undefined, c: Case): SizeOption[] {
  const out = (values ?? []).map((size) => {
    const m = parseLength(size, c.units);
    return { size, sizeM: typeof m === "number" ? m : NaN };
  });
  return out.filter((o) => Number.isFinite(o.sizeM)).sort((a, b) => a.sizeM - b.sizeM);
}

function show(size: Length): string {
  return typeof size === "number" ? String(size) : size;
}

/** Lower and upper aim of a storm's peak: the band with a margin of the target inside each edge. */
export function aimBand(p: SearchProblem, target: number): [number, number] {
  return targetBand(target, narrowed(p.case.criteria, aimMargin(p.case.criteria, p.options.margin)));
}
