// The case as outfit computes with it: every quantity in SI (m, m2, m3, m3/s, s).
import type { UnitSystem } from "./units.js";

/** Identical parallel pipes (SI): inside diameter, length, count, fall per length, low end's invert. */
export interface PipeGallery {
  diameter: number;
  length: number;
  count: number;
  /** m/m, 0 for level pipes. */
  slope: number;
  /** Invert at the low end (m). */
  invert: number;
}

/** Identical chambers from one unit's stage-area rows (heights above the base from 0, plan areas of water). */
export interface Chambers {
  count: number;
  /** Elevation of the chambers' base (m). */
  base: number;
  heights: number[];
  areas: number[];
}

/** A rectangular stone bed around the units: void ratio (porosity), base and top elevations, plan size. */
export interface StoneBed {
  voidRatio: number;
  bottom: number;
  top: number;
  length: number;
  width: number;
}

export type UndergroundUnits = { kind: "pipeGallery"; gallery: PipeGallery } | { kind: "chambers"; chambers: Chambers };

/** A structure that reaches above an underground system's top (a manhole, inlet or riser): the plan area of
 * water inside it (m2) and its rim (m), where the water reaches the surface. */
export interface RisingStructure {
  name: string;
  area: number;
  rim: number;
}

/** Surface ponding declared above an underground system: its own stage-area rows (m, m2; conic between
 * rows, vertical walls above the last), and the highest ponding level permitted (m; null: none). */
export interface SurfacePonding {
  elevations: number[];
  areas: number[];
  limit: number | null;
}

export interface UndergroundSystem {
  units: UndergroundUnits;
  stone: StoneBed | null;
  /** Structures above the system's top (none: nothing is counted there). */
  structures: RisingStructure[];
  /** Surface ponding above the system's top, reached through the structures; null when none is declared. */
  ponding: SurfacePonding | null;
}

/**
 * Exfiltration: water leaving the storage into the ground at a design infiltration rate (m/s) over the
 * wetted bottom, and the wetted sides when `sides` is true. `drainHours` limits the time to drain after a
 * storm's peak stage (the drain-time check).
 */
export interface Exfiltration {
  rate: number;
  sides: boolean;
  drainHours: number;
  label: string | null;
}

/** Site limits from which a pond is sized (SI). */
export interface Site {
  /**
   * Pond floor elevation (m). With `existingGrade` the floor is chosen with the depth, and this (if
   * given) is the lowest floor allowed; null then when not given.
   */
  floor: number | null;
  /** Largest depth, floor to top of embankment (m): a limit, not the answer. */
  maxDepth: number;
  /** Prismoid: side slopes (H:V) and floor length-to-width ratio. */
  sideSlope: number;
  lengthToWidth: number;
  /** Largest plan dimensions and area at the top of embankment (m, m2); null when not limited. */
  maxTopLength: number | null;
  maxTopWidth: number | null;
  maxTopArea: number | null;
  pool: { depth: number } | { volume: number } | null;
  /** A stage-area shape (depth above the floor, m; area, m2) to scale instead of a prismoid. */
  shape: { depths: number[]; areas: number[] } | null;
  /** Size step: floor width (m) for a prismoid, scale factor for a shape. */
  step: number;
  /** Existing ground elevation (m); null when not given. */
  existingGrade: number | null;
  /** Embankment above the existing grade: its highest allowed height (m; null: not limited), crest width and outside slope (H:V). */
  embankment: { maxHeight: number | null; topWidth: number; outsideSlope: number };
  /** Seasonal high groundwater (m) and the separation the floor keeps above it (m); null when not given. */
  groundwater: { seasonalHigh: number; separation: number } | null;
  /** Invert at the outfall (m): the floor drains by gravity through the barrel, so it stands at least `outfallFall` above it; null when not given. */
  outfallInvert: number | null;
  outfallFall: number;
  /** Step of the depths compared (m). */
  depthStep: number;
  /** Exfiltration of the sized pond (an infiltration basin); absent when none. */
  exfiltration?: Exfiltration;
}

/** How a pond was sized from the site when the file gives none. */
export interface SiteSizingSummary {
  /** m3 above the pool below the limit level, for the governing storm. */
  required: number;
  /** Storm and estimate that govern (the routed estimate's notional outlet). */
  storm: string;
  method: string;
  /** Size steps of the pond used. */
  steps: number;
  /** Depth chosen (m). */
  depth: number;
  /** False when no pond within the limits holds the estimate (the largest that fits is used). */
  withinLimits: boolean;
}

export type Storage =
  | { kind: "prismoid"; length: number; width: number; sideSlope: number }
  | { kind: "stageArea"; elevations: number[]; areas: number[] }
  | { kind: "stageStorage"; elevations: number[]; volumes: number[] }
  /** Pipes or chambers, optionally in a stone bed (underground storage). */
  | ({ kind: "underground" } & UndergroundSystem);

export interface Pond {
  bottom: number;
  top: number;
  /** Normal water level; equals `bottom` for a dry pond. */
  pool: number;
  storage: Storage;
  /** Exfiltration into the ground (an infiltration basin or underground system); absent when none. */
  exfiltration?: Exfiltration;
}

export type Tailwater =
  | { kind: "free" }
  | { kind: "elevation"; elevation: number }
  /** Downstream channel rating: elevation by the pond's total outflow. */
  | { kind: "rating"; flows: number[]; elevations: number[] };

export interface Hydrograph {
  /** Seconds from the start of the storm, strictly increasing. */
  times: Float64Array;
  /** m3/s, linear between points, zero after the last. */
  flows: Float64Array;
}

/**
 * The storm durations routed for one design storm of the modified rational method: every storm from
 * `shortest` (Tc) to `longest` is a candidate, and the one that raises the pond highest governs.
 */
export interface DurationRange {
  /** Shortest and longest storm durations (s). */
  shortest: number;
  longest: number;
  /** The critical duration of the modified rational storage formula (s), whose hydrograph is `Storm.inflow`. */
  critical: number;
  /** The inflow hydrograph of a storm of this duration (s). */
  inflow(duration: number): Hydrograph;
}

export interface Storm {
  name: string;
  returnPeriod: number;
  /** Allowable peak outflow, m3/s (the smallest of its release limits); null when the storm has no target. */
  target: number | null;
  /** Every release limit of the storm (the plain `target` among them); empty when it has no target. */
  releaseLimits: ReleaseLimit[];
  /** The release limit that governs (the smallest); null when the storm has no target. */
  governingLimit: ReleaseLimit | null;
  inflow: Hydrograph;
  /** A modified rational storm: the range of durations routed (the one that governs gives the storm's result). */
  durations?: DurationRange;
  /** The outflow must stay under this hydrograph at every instant of its span (a release-limit form); null when not asked. */
  ceiling: { hydrograph: Hydrograph; statement: string; label: string | null } | null;
  /**
   * Runoff of the area that bypasses the pond and joins its outflow at the point of analysis, lag
   * applied (null when none): the target and every release rule on peaks then apply to the sum.
   */
  bypass: Hydrograph | null;
  /** Further points of analysis of this storm (a site that drains two ways); empty when none. */
  points: AnalysisPoint[];
  /**
   * A system of ponds (`Case.system`): each pond's own inflow, by pond index (null: no direct
   * inflow); `inflow` is then their sum, the system's inflow. Absent for a single pond.
   */
  inflows?: (Hydrograph | null)[];
  /** A system of ponds: each pond's own allowable peak outflow (m3/s), by pond index; null where none is given. */
  pondTargets?: (number | null)[];
}

/** A further point of analysis of a storm: the runoff reaching it and its allowable peak. */
export interface AnalysisPoint {
  name: string;
  /** Whether the pond's outflow (spillway included) reaches this point too (a system's: the flow reaching its outfall). */
  pond: boolean;
  /** Runoff joining at this point, lag applied; null when only the pond's outflow reaches it. */
  bypass: Hydrograph | null;
  /** Allowable peak at the point (m3/s); null when the point is only reported. */
  target: number | null;
  /** Free-text source of the target; null when none. */
  label: string | null;
}

/** One allowable-release form of a storm, resolved to a flow. */
export interface ReleaseLimit {
  /** "target" (the plain field), "flow", "share-of-pre", "per-area". */
  form: "target" | "flow" | "share-of-pre" | "per-area";
  /** m3/s. */
  flow: number;
  /** How the limit was stated, in the case's words (e.g. "50 % of the pre-development peak"). */
  statement: string;
  /** Free-text source (e.g. an ordinance clause); null when the case gives none. */
  label: string | null;
}

export interface Criteria {
  over: number;
  under: number;
  freeboardDepth: number;
  freeboardStorm: string;
  /** Hours allowed to drain after the peak stage; null when there is no drawdown rule. */
  drawdownHours: number | null;
  drawdownDepth: number;
  /** Storms with a return period up to this many years must not reach the spillway crest. */
  spillwayDryThrough: number;
  /** The principal outlet blocked: the spillway alone passes `storm` with `freeboard` (m) below the top; null when not asked. */
  blockedOutlet: { storm: string; freeboard: number; label: string | null } | null;
  /** Assumed blocked share of the openings' open area; `checks` lists the rule kinds it applies to (null: every "at most" rule). */
  clogging: { fraction: number; checks: string[] | null; label: string | null } | null;
  /**
   * Extended-detention rules: `storm` (a storm's volume at its peak stage) or `volume` (m3 above the
   * pool: a water-quality volume) takes at least `hours` to release `share` of itself (1: to drain).
   */
  extendedDetention: { storm: string | null; volume: number | null; hours: number; share: number; label: string | null }[];
  /** Smallest opening the rules permit (m: an orifice's diameter, or a rectangular orifice's smaller side); null when none. */
  minimumOpening: { size: number; label: string | null } | null;
  /**
   * Buildable geometry (m): the clear web between openings on one wall (and to a box's corners), the
   * least spacing of distinct control levels, the least distance of weir crests and the tops of holes
   * below the rim, and the usable width of a headwall (null: not limited). `labels` says where each
   * limit comes from: the case's source (or null when it states the limit without one), or "common
   * practice" for a default.
   */
  buildability: {
    web: number;
    levelSpacing: number;
    rimClearance: number;
    headwallWidth: number | null;
    labels: { web: string | null; levelSpacing: string | null; rimClearance: string | null };
  };
  /** Source labels of the criteria rules (null when the case gives none). */
  labels: { freeboard: string | null; drawdown: string | null; spillway: string | null; overtopping: string | null };
}

/**
 * The SI form of each kind of outlet element, by the kind's name. Each kind's file in src/parts/ adds
 * its own form here (TypeScript's declaration merging: `declare module "../model.js" { interface
 * ElementKinds { ... } }`), so a new kind needs no edit of this file; `Element` is the union of them
 * all. Every form has `type` (and `shape` where a type has several), `keep`, and its sizes in m.
 */
export interface ElementKinds {}
export type Element = ElementKinds[keyof ElementKinds];

export type Riser = (
  | { shape: "circular"; diameter: number }
  | { shape: "box"; length: number; width: number }
) & {
  crest: number;
  /** Rim weir coefficient, SI. */
  coefficient: number;
  /** Discharge coefficient of the top opening. */
  orificeCoefficient: number;
  keep: boolean;
};

export type Barrel = ({ shape: "circular"; diameter: number } | { shape: "box"; span: number; rise: number }) & {
  length: number;
  inletInvert: number;
  outletInvert: number;
  manningN: number;
  entrance: string;
  /** The outlet end's entrance, met by water flowing back into the barrel from a downstream pond; absent: `entrance`. */
  outletEntrance?: string;
  keep: boolean;
};

export interface Spillway {
  crest: number;
  length: number;
  sideSlope: number;
  /** SI (m^0.5/s). */
  coefficient: number;
  keep: boolean;
}

export interface Outlet {
  elements: Element[];
  riser?: Riser;
  barrel?: Barrel;
  spillway?: Spillway;
}

export interface Catalogue {
  orificeDiameters: number[];
  maxCount: number;
  /** The weir kinds the catalogue lists (`catalogue.weir.shapes`). */
  weirShapes: string[];
  weirLengths: number[];
  weirAngles: number[];
  riserDiameters: number[];
  barrelDiameters: number[];
  maxStages: number;
  elevationStep: number;
}

/** One pond of a system of ponds: its geometry, its outlet and where that outlet drains. */
export interface SystemPond {
  name: string;
  pond: Pond;
  outlet: Outlet;
  /** Index of the pond its outlet drains into (its stage is the outlet's downstream level); -1: the outfall. */
  to: number;
}

/** Ponds joined by their outlets (the case file's `ponds`). */
export interface PondSystem {
  ponds: SystemPond[];
  /** Pond indices, every pond before the pond it drains into (upstream first). */
  order: number[];
}

export interface Case {
  name: string;
  units: UnitSystem;
  /** Absolute path of the case file ("" when built in memory). */
  file: string;
  /**
   * The pond given, or (no pond in the file) the pond sized from `site`. For a system of ponds: the
   * first pond that drains to the outfall (with `outlet` its outlet); commands read `system` then.
   */
  pond: Pond;
  /** A system of ponds (the file's `ponds`, even a list of one); absent for a single `pond`. */
  system?: PondSystem;
  /** Site limits, when the file gives them. */
  site?: Site;
  /** How the pond was sized from the site, when the file gives no pond. */
  sizing?: SiteSizingSummary;
  tailwater: Tailwater;
  storms: Storm[];
  criteria: Criteria;
  outlet?: Outlet;
  catalogue?: Catalogue;
  /** Cost weights given in the case (the search documents the defaults). */
  costs: Partial<Record<string, number>>;
  /**
   * Sizes of the case's outlet and catalogue given as bare numbers that are implausible for their part
   * (read in the case's unit: an orifice larger than its barrel, a diameter over 10 ft or 3 m), each
   * with the JSON path and why; absent or empty when none.
   */
  sizeWarnings?: { part: string; reason: string }[];
  /** When storms come from rainfall: the methods that derive them, in words (runoff, unit hydrograph and its unit duration). */
  hydrologyMethods?: string;
}
