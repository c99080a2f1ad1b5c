// What the search works on: the case, the catalogue's part options, the fixed parts, the elevation
// limits, the stage grid shared by every candidate and the target aims.
import type { Case, Storm } from "../src/case/model.js";
import type { BarrelFile, CaseFile, ElementFile, Length, RiserFile, SpillwayFile } from "../src/case/schema.js";
import { CaseError } from "../src/case/errors.js";
import { Converter } from "../src/case/normalize.js";
import { baseLength, parseLength } from "../src/units.js";
import { stageGrid, type StageGrid } from "../src/routing/ratingTable.js";
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
}

export interface SizeOption {
  size: Length;
  sizeM: number;
}

export interface SearchOptions {
  /** Aim this fraction of the target inside each edge of the band (default 0.02). */
  margin: number;
  /** The reference path, the bench's "before": every candidate rated by the direct evaluation at
   * each stage instead of the rating sweep's tables and warm starts (results agree within the
   * tables' stated errors), and the staged start's routings not shared between layouts. */
  referencePath: boolean;
}

export interface SearchProblem {
  case: Case;
  file: CaseFile;
  converter: Converter;
  /** elevationStep in case units and in m. */
  step: number;
  stepM: number;
  /** Lowest opening elevation: the permanent pool or the floor (m). */
  floor: number;
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
  grid: StageGrid;
  costs: CostWeights;
  options: SearchOptions;
}

export function buildProblem(c: Case, file: CaseFile, options: Partial<SearchOptions> = {}): SearchProblem {
  const label = c.file ? c.file.split(/[\\/]/).pop()! : "case";
  if (!c.catalogue || !file.catalogue) {
    throw new CaseError([{ where: `${label}: catalogue`, found: "nothing (the field is missing)", expected: "a catalogue of parts the search may use (orifice, weir, riser, barrel sizes)" }]);
  }
  const cat = c.catalogue;
  const catFile = file.catalogue;
  const converter = new Converter(c.units, label);
  const L = baseLength(c.units);
  const outlet = file.outlet ?? {};
  const keptElements = (outlet.elements ?? []).filter((e) => e.keep);
  const keptElevations = keptElements.map((e) => converter.length(e.type === "weir" ? e.crest : e.invert, "outlet.elements"));
  const floor = c.pond.pool;
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
      parts.push({ key: `v-notch ${angle}`, kind: "v-notch", count: 1, size: null, sizeM: 0, angle, height: 0, width: 2 * 0.3048 * Math.tan((angle * Math.PI) / 360) });
    }
  }
  if (parts.length === 0 && keptElements.length === 0) {
    throw new CaseError([{ where: `${label}: catalogue`, found: "no orifice diameters or weir sizes", expected: "at least one orifice diameter or weir size" }]);
  }

  const riserOptions = outlet.riser?.keep ? [] : sizes(catFile.riser?.diameters, c);
  if (!outlet.riser?.keep && riserOptions.length === 0 && outlet.riser?.shape === "circular") {
    riserOptions.push({ size: outlet.riser.diameter, sizeM: converter.length(outlet.riser.diameter, "outlet.riser.diameter") });
  }
  const barrel = outlet.barrel;
  const barrelKept = barrel?.keep === true || (barrel !== undefined && barrel.shape === "box");
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
  return {
    case: c,
    file,
    converter,
    step: stepM / L,
    stepM,
    floor,
    ceiling,
    targeted,
    keptElements,
    keptElevations,
    floorTaken: keptElevations.some((z) => Math.abs(z - floor) < 1e-9),
    keptRiser: outlet.riser?.keep ? outlet.riser : undefined,
    riserOptions,
    barrel,
    barrelKept,
    barrelOptions,
    spillway: outlet.spillway,
    parts,
    maxLevels: Math.max(0, cat.maxStages - new Set(keptElevations.map((z) => Math.round(z * 1e6))).size),
    grid: stageGrid(c.pond, [], gridStepOnLattice),
    costs: costWeights(c),
    options: { margin: options.margin ?? 0.02, referencePath: options.referencePath ?? false },
  };
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
