// Underground storage as a pond storage form: pipes or chambers, optionally bedded in stone. Volume is
// measured from the lowest point of the system. The system ends at its top (the bed's top, or the
// highest crown or chamber top without stone): above it the water has only what the case declares,
// - structures that rise above the top (manholes, inlets, risers), each with the plan area of water
//   inside it, from the top to its rim; above its rim the water is at the surface there, and (when no
//   surface ponding is declared) the structure is carried up as a notional shaft, so the stage says how
//   high the water would rise in it;
// - surface ponding with its own stage-area rows (conic between rows, vertical walls above the last),
//   reached through the structures.
// With nothing declared the storage stops growing at the top: the system is sealed, and a stage above
// it is the head the outlet needs to pass the inflow. A stage above the top is a surcharge (the
// `surcharge` rule).
import type { RisingStructure, UndergroundSystem, UndergroundUnits } from "../model.js";
import { galleryArea, galleryBreaks, galleryTop, galleryVolume } from "./pipeGallery.js";
import { chambersArea, chambersBreaks, chambersTop, chambersVolume } from "./chambers.js";
import { stoneArea, stoneVolume } from "./stoneEnvelope.js";
import { stageAreaArea, stageAreaVolume } from "./stageArea.js";

export type { UndergroundSystem, UndergroundUnits };

function unitsVolume(u: UndergroundUnits, stage: number): number {
  return u.kind === "pipeGallery" ? galleryVolume(u.gallery, stage) : chambersVolume(u.chambers, stage);
}
function unitsArea(u: UndergroundUnits, stage: number): number {
  return u.kind === "pipeGallery" ? galleryArea(u.gallery, stage) : chambersArea(u.chambers, stage);
}
function unitsTop(u: UndergroundUnits): number {
  return u.kind === "pipeGallery" ? galleryTop(u.gallery) : chambersTop(u.chambers);
}
/** Plan area the units cover (m2): pipes side by side, or the chambers' largest area. */
export function unitsFootprint(u: UndergroundUnits): number {
  if (u.kind === "pipeGallery") return u.gallery.count * u.gallery.diameter * u.gallery.length;
  return u.chambers.count * Math.max(...u.chambers.areas);
}

/** Top of the system (m): the stone's top, or the units' top without stone. */
export function systemTop(s: Pick<UndergroundSystem, "units" | "stone">): number {
  return s.stone ? Math.max(s.stone.top, unitsTop(s.units)) : unitsTop(s.units);
}

/** Plan area the system covers (m2): the stone bed, or the units without stone. */
export function systemFootprint(s: Pick<UndergroundSystem, "units" | "stone">): number {
  return s.stone ? s.stone.length * s.stone.width : unitsFootprint(s.units);
}

/** Whether anything is declared above the system's top. */
export function declaresAbove(s: UndergroundSystem): boolean {
  return s.structures.length > 0 || s.ponding !== null;
}

/** The highest stage the system may reach without a surcharge: the permitted ponding level, else its top. */
export function surchargeLimit(s: UndergroundSystem): number {
  return s.ponding?.limit ?? systemTop(s);
}

/** Elevation up to which a structure holds water: its rim when surface ponding takes over there, else no limit. */
function structureCap(s: UndergroundSystem, structure: RisingStructure): number {
  return s.ponding ? structure.rim : Infinity;
}

/** Water (m3) above the system's top at a stage: in the structures and on the surface. */
function aboveVolume(s: UndergroundSystem, top: number, stage: number): number {
  let v = 0;
  for (const structure of s.structures) v += structure.area * Math.max(0, Math.min(stage, structureCap(s, structure)) - top);
  if (s.ponding) v += stageAreaVolume(s.ponding.elevations, s.ponding.areas, stage);
  return v;
}

/** Plan area of water (m2) above the system's top at a stage. */
function aboveArea(s: UndergroundSystem, stage: number): number {
  let a = 0;
  for (const structure of s.structures) if (stage < structureCap(s, structure)) a += structure.area;
  if (s.ponding && stage > s.ponding.elevations[0]) a += stageAreaArea(s.ponding.elevations, s.ponding.areas, stage);
  return a;
}

/** Water held (m3) at a stage: in the units, in the stone's voids, and above the top what the case declares. */
export function undergroundVolume(s: UndergroundSystem, stage: number): number {
  const top = systemTop(s);
  const z = Math.min(stage, top);
  let v = unitsVolume(s.units, z);
  if (s.stone) v += stoneVolume(s.stone, z, (level) => unitsVolume(s.units, level));
  return stage > top ? v + aboveVolume(s, top, stage) : v;
}

/** Water-surface area (m2) at a stage. */
export function undergroundArea(s: UndergroundSystem, stage: number): number {
  if (stage > systemTop(s)) return aboveArea(s, stage);
  const inner = unitsArea(s.units, stage);
  return inner + (s.stone ? stoneArea(s.stone, stage, inner) : 0);
}

/** Elevations where the storage changes form: the units', the bed's, the top, the rims and the ponding rows. */
export function undergroundBreaks(s: UndergroundSystem): number[] {
  const own = s.units.kind === "pipeGallery" ? galleryBreaks(s.units.gallery) : chambersBreaks(s.units.chambers);
  const breaks = s.stone ? [...own, s.stone.bottom, s.stone.top] : own;
  breaks.push(systemTop(s), ...s.structures.map((x) => x.rim));
  if (s.ponding) breaks.push(...s.ponding.elevations);
  return breaks;
}

/** Where the water stands at a stage above the system's top. */
export interface Surcharge {
  /** Stage above the system's top (m; 0 when not above). */
  height: number;
  /** Structures whose rim the stage reaches (the water is at the surface there), lowest rim first. */
  atSurface: RisingStructure[];
  /** Structures that hold the water below their rims. */
  inStructures: RisingStructure[];
  /** Depth of water on the surface above the ponding's first row (m; 0 without ponding or below it). */
  pondingDepth: number;
  /** Nothing is declared above the top: the system is sealed and the stage is the head the outlet needs. */
  sealed: boolean;
}

export function surchargeAt(s: UndergroundSystem, stage: number): Surcharge {
  const top = systemTop(s);
  const height = Math.max(0, stage - top);
  const sorted = [...s.structures].sort((a, b) => a.rim - b.rim);
  return {
    height,
    atSurface: height > 0 ? sorted.filter((x) => stage >= x.rim) : [],
    inStructures: height > 0 ? sorted.filter((x) => stage < x.rim) : [],
    pondingDepth: s.ponding ? Math.max(0, stage - s.ponding.elevations[0]) : 0,
    sealed: !declaresAbove(s),
  };
}
