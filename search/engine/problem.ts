// What the search works on: the case, the catalogue's part options, the fixed parts, the elevation
// limits, the stage grid shared by every candidate and the target aims.
import type { Case, Outlet, Storm } from "../../src/model.js";
import type { BarrelFile, CaseFile, ElementFile, Length, OutletFile, RiserFile, SpillwayFile } from "../../src/case/schema.js";
import { normalizeOutlet } from "../../src/case/normalize.js";
import { CaseError } from "../../src/case/errors.js";
import { Converter } from "../../src/case/normalize.js";
import { parseLength } from "../../src/units.js";
import { stageGrid, type StageGrid } from "../../src/routing/ratingTable.js";
import { searchInflows } from "./durations.js";
import type { SearchInflow } from "../../src/routing/durations.js";
import { costWeights } from "./cost.js";
import type { CostWeights } from "../../src/parts/cost.js";
import { narrowed, targetBand } from "../../src/assess/rules/band.js";
import { aimMargin } from "../../src/assess/rules/peakUpper.js";
import type { OptionContext, PartOption, SizeOption } from "../../src/parts/part.js";
import { catalogueOptions, elementToSI, explicit, fileBottom, inCatalogueForm, partOf, sameElement } from "../../src/parts/registry.js";
import { riserSize } from "../../src/parts/riser.js";
import { levelCount } from "../../src/assess/rules/levelSpacing.js";
import { barrelSize } from "../../src/parts/barrel.js";
import { pondDesignView } from "./pondViews.js";

/** The discrete part of a design (which parts, counts, sizes); its elevations are the fit's variables (layout.ts). */
export interface Layout {
  /** Designed control levels, bottom up. The first sits at the floor unless a kept element does. */
  levels: PartOption[];
  /** Designed riser size (null: a kept riser or none). */
  riser: SizeOption | null;
  /** Size of the site barrel (null: a kept barrel or none). */
  barrel: SizeOption | null;
  /**
   * A system of ponds: each pond's layout, in the system's order (`SearchProblem.system`); the fields
   * above are then empty. Its variables are the ponds' variables one pond after the other.
   */
  ponds?: Layout[];
}

/**
 * What the search designs in one pond of a system: "designed", the single pond's search on the
 * pond's view of the case (parts from the catalogue, its kept parts, its barrel and spillway as site
 * data); "pipe", an outlet that is a barrel alone (an equaliser pipe), whose size is drawn from the
 * catalogue's barrels; "fixed", nothing (a kept pipe, or the limits leave it as it is).
 */
export interface SystemPondDesign {
  name: string;
  kind: "designed" | "pipe" | "fixed";
  /** The pond's own problem, built from its view (pondViews.ts). */
  problem: SearchProblem;
}

/** A system of ponds designed together: its ponds, in the system's order. */
export interface SystemDesign {
  ponds: SystemPondDesign[];
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
  rankBy: "cost" | "change" | "robust";
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
   * Least spacing of designed control levels (m): the case's `buildability.levelSpacing` rounded up to
   * whole elevation steps (at least one), so that levels on the lattice keep it.
   */
  levelGapM: number;
  /** Least distance of a crest or an opening's top below the rim (m): the case's `buildability.rimClearance`. */
  rimClearanceM: number;
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
  /**
   * A system of ponds: the ponds' problems; the search's layouts then hold every pond's layout
   * (`Layout.ponds`) and every design is routed and judged as the system, together. The fields of
   * the problem describing one pond are the pond at the outfall's (as `Case.pond` stands for it).
   */
  system?: SystemDesign;
  /** A pond written as a `ponds` list of one: its name (designed as the single pond it is, written back as a list of one). */
  listedPond?: string;
  grid: StageGrid;
  /**
   * The inflow each storm is routed on in the search (a long fine record thinned, volume kept: see
   * `src/routing/thinInflow.ts`), or a few durations of a modified rational storm (`durations.ts`);
   * reported candidates are routed on the full inflow and every duration.
   */
  inflows: ReadonlyMap<Storm, SearchInflow>;
  costs: CostWeights;
  options: SearchOptions;
}

export function buildProblem(c: Case, file: CaseFile, options: Partial<SearchOptions> = {}, limits: DesignLimits = DEFAULT_LIMITS): SearchProblem {
  if (c.system && c.system.ponds.length > 1) return buildSystemProblem(c, file, options, limits);
  if (c.system) {
    // A `ponds` list of one is the single pond: designed exactly as it, on the pond and outlet it names.
    const { system, ...single } = c;
    const { ponds, ...rest } = file;
    return { ...buildProblem(single, { ...rest, pond: ponds![0].pond, outlet: ponds![0].outlet }, options, limits), listedPond: system.ponds[0].name };
  }
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
  const keptElements = (outlet.elements ?? []).filter((e) => e.keep || !inCatalogueForm(e));
  const keptElevations = keptElements.map((e) => converter.length(fileBottom(e), "outlet.elements"));
  const poolHeldByTailwater = c.pond.pool > c.pond.bottom && c.tailwater.kind === "elevation" && c.tailwater.elevation >= c.pond.pool - 1e-9;
  const floor = poolHeldByTailwater ? c.pond.bottom : c.pond.pool;
  const ceiling = c.pond.top - c.criteria.freeboardDepth;
  const stepM = cat.elevationStep;
  const targeted = c.storms.filter((s) => s.target !== null).sort((a, b) => a.returnPeriod - b.returnPeriod);
  if (targeted.length === 0) {
    throw new CaseError([{ where: `${label}: storms`, found: "no storm with a target", expected: "at least one storm with a target for the search to aim at" }]);
  }

  const parts = permitted(c, catalogueOptions(optionContext(c, catFile, converter)), converter);
  if (parts.length === 0 && keptElements.length === 0) {
    throw new CaseError([{ where: `${label}: catalogue`, found: "no orifice diameters or weir sizes", expected: "at least one orifice diameter or weir size" }]);
  }

  const riserHeld = limits.keepRiser || limits.vary === "openings";
  const riserLength = (value: Length) => converter.length(value, "outlet.riser.diameter");
  const ownRiser = outlet.riser ? riserSize(outlet.riser, riserLength) : null;
  // A box riser is not a catalogue size: with only elevations to vary, it stays as it is.
  const riserKept = outlet.riser?.keep === true || (riserHeld && outlet.riser !== undefined) || (limits.vary === "elevations" && outlet.riser !== undefined && ownRiser === null);
  const existingRiser = ownRiser ? [ownRiser] : [];
  let riserOptions = riserKept || riserHeld ? [] : limits.vary === "elevations" ? existingRiser : sizes(catFile.riser?.diameters, c);
  if (!riserKept && !riserHeld && riserOptions.length === 0) riserOptions = existingRiser;
  const barrel = outlet.barrel;
  const ownBarrel = barrel ? barrelSize(barrel, (value) => converter.length(value, "outlet.barrel.diameter")) : null;
  // A box barrel is not a catalogue size: it stays as it is.
  const barrelKept = barrel?.keep === true || (barrel !== undefined && ownBarrel === null) || limits.keepBarrel || limits.vary !== "all";
  let barrelOptions: SizeOption[] = [];
  if (barrel && !barrelKept) {
    barrelOptions = sizes(catFile.barrel?.diameters, c);
    if (barrelOptions.length === 0 && ownBarrel) barrelOptions = [ownBarrel];
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
    levelGapM: Math.max(1, Math.ceil(c.criteria.buildability.levelSpacing / stepM - 1e-9)) * stepM,
    rimClearanceM: c.criteria.buildability.rimClearance,
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
    // Kept elements closer than the level spacing are one control level (the rule's count).
    maxLevels: Math.max(0, cat.maxStages - levelCount(keptElevations, c.criteria.buildability.levelSpacing)),
    grid: stageGrid(c.pond, [], gridStepOnLattice),
    inflows: searchInflows(c),
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

/** Whether a pond's outlet file is a barrel alone (an equaliser pipe between two ponds). */
export function isPipe(outlet: OutletFile): boolean {
  return outlet.barrel !== undefined && (outlet.elements?.length ?? 0) === 0 && outlet.riser === undefined;
}

/**
 * A system of ponds: each pond's problem on its view of the case (pondViews.ts), what the search
 * designs in it, and the problem of the whole (the pond at the outfall's fields standing for one pond).
 */
function buildSystemProblem(c: Case, file: CaseFile, options: Partial<SearchOptions>, limits: DesignLimits): SearchProblem {
  const system = c.system!;
  const label = c.file ? c.file.split(/[\\/]/).pop()! : "case";
  if (!c.catalogue || !file.catalogue) {
    throw new CaseError([{ where: `${label}: catalogue`, found: "nothing (the field is missing)", expected: "a catalogue of parts the search may use for the ponds' outlets (orifice, weir, riser, barrel sizes)" }]);
  }
  const ponds = system.ponds.map((p, i): SystemPondDesign => {
    const view = pondDesignView(c, file, i);
    const outlet = view.file.outlet!;
    const pipe = isPipe(outlet);
    const kind = pipe ? (outlet.barrel!.keep || limits.vary !== "all" || limits.keepBarrel || !file.catalogue!.barrel?.diameters.length ? "fixed" : "pipe") : "designed";
    let problem: SearchProblem;
    try {
      problem = buildProblem(view.case, view.file, options, kind === "designed" ? limits : DEFAULT_LIMITS);
    } catch (error) {
      // The pond's own problems, under its path in the case file.
      if (error instanceof CaseError) throw new CaseError(error.problems.map((q) => ({ ...q, where: q.where.replace(/: (outlet|pond|storms)/, `: ponds[${i}].$1`) })));
      throw error;
    }
    if (kind === "pipe") {
      // The pipe as given is one of its sizes, whether or not the catalogue lists it.
      const own = barrelSize(outlet.barrel!, (value) => problem.converter.length(value, "outlet.barrel.diameter"));
      if (own && !problem.barrelOptions.some((o) => Math.abs(o.sizeM - own.sizeM) < 1e-9)) problem.barrelOptions = [...problem.barrelOptions, own].sort((a, b) => a.sizeM - b.sizeM);
    }
    return { name: p.name, kind, problem };
  });
  const main = system.ponds.findIndex((p) => p.to < 0);
  const carrier = ponds[main].problem;
  const problem: SearchProblem = {
    ...carrier,
    case: c,
    file,
    targeted: c.storms.filter((s) => s.target !== null).sort((a, b) => a.returnPeriod - b.returnPeriod),
    existing: null,
    fixedLayout: null,
    limits,
    system: { ponds },
  };
  if (problem.targeted.length === 0) {
    throw new CaseError([{ where: `${label}: storms`, found: "no storm with a target", expected: "at least one storm with a target at the outfall for the search to aim at" }]);
  }
  if (ponds.every((d) => d.kind === "fixed" || (d.problem.fixedLayout === null && d.problem.parts.length === 0 && d.problem.riserOptions.length === 0 && d.problem.barrelOptions.length === 0))) {
    throw new CaseError([{ where: `${label}: ponds`, found: "nothing the search may change in any pond's outlet", expected: "at least one pond's outlet the catalogue can design (openings, a riser, a barrel or a pipe size not kept)" }]);
  }
  problem.existing = systemExisting(problem);
  if (limits.vary === "elevations" && problem.existing) problem.fixedLayout = problem.existing.layout;
  return problem;
}

/** A pond's layout as the case gives it: its existing layout, or (a pipe) its size, or nothing designed. */
export function pondLayoutAsGiven(d: SystemPondDesign): { layout: Layout; vars: number[] } {
  const p = d.problem;
  if (d.kind === "designed" && p.existing) return { layout: p.existing.layout, vars: p.existing.vars };
  const own = p.file.outlet?.barrel ? barrelSize(p.file.outlet.barrel, (value) => p.converter.length(value, "outlet.barrel.diameter")) : null;
  const barrel = d.kind === "pipe" && own ? (p.barrelOptions.find((o) => Math.abs(o.sizeM - own.sizeM) < 1e-9) ?? null) : null;
  return { layout: { levels: [], riser: null, barrel }, vars: [] };
}

/**
 * The existing system (value engineering), when a pond's outlet is a design of its own (openings or
 * a riser) or a pipe: every pond's layout as given; the outlet standing for it is the pond at the
 * outfall's.
 */
function systemExisting(p: SearchProblem): ExistingOutlet | null {
  const ponds = p.system!.ponds;
  if (!ponds.some((d) => (d.kind === "designed" && d.problem.existing) || d.kind === "pipe")) return null;
  const given = ponds.map(pondLayoutAsGiven);
  const main = p.case.system!.ponds.findIndex((q) => q.to < 0);
  const at = ponds[main].problem;
  return {
    file: at.existing?.file ?? at.file.outlet ?? {},
    outlet: p.case.system!.ponds[main].outlet,
    layout: { levels: [], riser: null, barrel: null, ponds: given.map((g) => g.layout) },
    vars: given.flatMap((g) => g.vars),
  };
}

/**
 * The case's outlet as the search sees it: its designed parts (catalogue options where a part is
 * one, else the part itself as a template) bottom up, its riser and barrel sizes, their elevations.
 */
function existingOutlet(p: SearchProblem, file: OutletFile, label: string): ExistingOutlet {
  const converter = new Converter(p.case.units, label);
  const outlet = normalizeOutlet(file, converter, "outlet");
  const context = optionContext(p.case, p.file.catalogue!, converter);
  const designed = (file.elements ?? []).filter((e) => !p.keptElements.includes(e));
  const at = (e: ElementFile) => converter.length(fileBottom(e), "outlet.elements");
  designed.sort((a, b) => at(a) - at(b));
  const levels = designed.map((e): PartOption => {
    // A catalogue option when it is one (same kind and sizes, the default coefficient), else the part itself.
    const own = elementToSI(e, converter, "outlet.elements");
    const inCatalogue = p.parts.find((o) => o.part === partOf(e) && sameElement(elementToSI(o.file as ElementFile, converter, "outlet.elements"), own));
    if (inCatalogue) return inCatalogue;
    const template = explicit(Object.fromEntries(Object.entries(e).filter(([k]) => k !== "keep")) as ElementFile, p.case.units);
    return partOf(e).catalogue!.existing(template, context);
  });
  const length = (value: Length) => converter.length(value, "outlet");
  const riser = !p.keptRiser && file.riser ? riserSize(file.riser, length) : null;
  const barrel = !p.barrelKept && file.barrel ? barrelSize(file.barrel, length) : null;
  const layout: Layout = { levels, riser, barrel };
  // The existing elevations of the variables (m): the levels that float, then the rim.
  const vars = designed.map(at).filter((_, i) => i > 0 || p.lowestFloats);
  if (riser && file.riser) vars.push(converter.length(file.riser.crest, "outlet.riser.crest"));
  return { file, outlet, layout, vars };
}

/**
 * The options that keep to the minimum opening (each kind's `openingSize`): a layout with any other
 * fails the rule whatever its elevations. All of them when none does (the search then shows why).
 */
function permitted(c: Case, options: PartOption[], converter: Converter): PartOption[] {
  const minimum = c.criteria.minimumOpening?.size;
  if (minimum === undefined) return options;
  const kept = options.filter((o) => {
    const size = o.part.openingSize(elementToSI(o.file as ElementFile, converter, "catalogue"), minimum);
    return size === null || size >= minimum * (1 - 1e-12);
  });
  return kept.length > 0 ? kept : options;
}

/** What the parts need to turn the catalogue into options. */
function optionContext(c: Case, entries: NonNullable<CaseFile["catalogue"]>, converter: Converter): OptionContext {
  return { entries, catalogue: c.catalogue!, units: c.units, sizes: (values) => sizes(values, c), length: (value) => converter.length(value, "outlet.elements") };
}

function sizes(values: readonly Length[] | undefined, c: Case): SizeOption[] {
  const out = (values ?? []).map((size) => {
    const m = parseLength(size, c.units);
    return { size, sizeM: typeof m === "number" ? m : NaN };
  });
  return out.filter((o) => Number.isFinite(o.sizeM)).sort((a, b) => a.sizeM - b.sizeM);
}

/** Lower and upper aim of a storm's peak: the band with a margin of the target inside each edge. */
export function aimBand(p: SearchProblem, target: number): [number, number] {
  return targetBand(target, narrowed(p.case.criteria, aimMargin(p.case.criteria, p.options.margin)));
}
