// Underground storage as a pond storage form: pipes or chambers, optionally bedded in stone. Volume is
// measured from the lowest point of the system; above the system's top (the bed's top, or the highest
// crown or chamber top without stone) storage grows with the system's footprint (vertical walls, as the
// case format has it above a table), so a stage above pond.top still has a volume to route with.
import type { UndergroundSystem, UndergroundUnits } from "../model.js";
import { galleryArea, galleryBreaks, galleryTop, galleryVolume } from "./pipeGallery.js";
import { chambersArea, chambersBreaks, chambersTop, chambersVolume } from "./chambers.js";
import { stoneArea, stoneVolume } from "./stoneEnvelope.js";

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
export function systemTop(s: UndergroundSystem): number {
  return s.stone ? Math.max(s.stone.top, unitsTop(s.units)) : unitsTop(s.units);
}
function footprint(s: UndergroundSystem): number {
  return s.stone ? s.stone.length * s.stone.width : unitsFootprint(s.units);
}

/** Water held (m3) at a stage: in the units, and in the stone's voids. */
export function undergroundVolume(s: UndergroundSystem, stage: number): number {
  const top = systemTop(s);
  const z = Math.min(stage, top);
  let v = unitsVolume(s.units, z);
  if (s.stone) v += stoneVolume(s.stone, z, (level) => unitsVolume(s.units, level));
  return stage > top ? v + footprint(s) * (stage - top) : v;
}

/** Water-surface area (m2) at a stage. */
export function undergroundArea(s: UndergroundSystem, stage: number): number {
  if (stage > systemTop(s)) return footprint(s);
  const inner = unitsArea(s.units, stage);
  return inner + (s.stone ? stoneArea(s.stone, stage, inner) : 0);
}

/** Elevations where the storage changes form. */
export function undergroundBreaks(s: UndergroundSystem): number[] {
  const own = s.units.kind === "pipeGallery" ? galleryBreaks(s.units.gallery) : chambersBreaks(s.units.chambers);
  return s.stone ? [...own, s.stone.bottom, s.stone.top] : own;
}
