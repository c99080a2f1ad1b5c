// The wall that holds an outlet's openings: a round riser's curved wall, a box riser's four sides, or a
// headwall where there is no riser. Positions along a wall are stations (m), measured clockwise in
// plan from the datum: on a riser, the barrel's centreline where the barrel leaves it (the downstream
// face when there is no barrel; on a box, the middle of its downstream side); on a headwall, its middle
// line, positive to the right looking downstream. A box riser's `length` runs along the barrel, so
// its downstream and upstream sides are `width` long and its right and left sides `length` long.
import type { Outlet } from "../model.js";

export type Wall =
  | { kind: "round riser"; diameter: number }
  | { kind: "box riser"; length: number; width: number }
  /** No riser: the openings are in a headwall, of a stated usable width or (null) as wide as they need. */
  | { kind: "headwall"; width: number | null };

/** A box riser's sides, clockwise in plan from the barrel's. */
export const BOX_SIDES = ["downstream", "right", "upstream", "left"] as const;
export type BoxSide = (typeof BOX_SIDES)[number];

/** The wall of an outlet: its riser's, or a headwall of the stated width. */
export function wallOf(outlet: Outlet, headwallWidth: number | null): Wall {
  const r = outlet.riser;
  if (!r) return { kind: "headwall", width: headwallWidth };
  return r.shape === "circular" ? { kind: "round riser", diameter: r.diameter } : { kind: "box riser", length: r.length, width: r.width };
}

/** Length of the wall along its stations (m): a riser's perimeter, a headwall's width (null: not limited). */
export function wallLength(w: Wall): number | null {
  return w.kind === "round riser" ? Math.PI * w.diameter : w.kind === "box riser" ? 2 * (w.length + w.width) : w.width;
}

/** The wall is closed on itself (a riser): stations wrap around. */
export function wallCloses(w: Wall): boolean {
  return w.kind !== "headwall";
}

/**
 * The usable width of the wall for one plate or hole (m): the plate, with a clear web at each end,
 * spans at most a round riser's diameter (the longest chord across it), a box's longest side, or a
 * headwall's stated width; null when a headwall's width is not stated.
 */
export function usableWidth(w: Wall, web: number): number | null {
  const span = w.kind === "round riser" ? w.diameter : w.kind === "box riser" ? Math.max(w.length, w.width) : w.width;
  return span === null ? null : span - 2 * web;
}

/**
 * The length along a round wall of diameter `diameter` that a flat plate or hole of chord `chord`
 * takes: the arc the chord subtends, D asin(c / D) (half the perimeter when the chord is the diameter
 * or more). Flat walls take the chord itself.
 */
export function chordArc(diameter: number, chord: number): number {
  return chord >= diameter ? (Math.PI * diameter) / 2 : diameter * Math.asin(chord / diameter);
}

/** A box's side at a station (stations from the middle of the downstream side), and the offset from its middle (m, clockwise positive). */
export function boxSideAt(length: number, width: number, station: number): { side: BoxSide; offset: number } {
  const perimeter = 2 * (length + width);
  let s = ((station % perimeter) + perimeter) % perimeter;
  // Shift so that the downstream side runs from 0 to `width`.
  s = (s + width / 2) % perimeter;
  const ends = [width, width + length, 2 * width + length, perimeter];
  const middles = [width / 2, width + length / 2, 1.5 * width + length, 2 * width + 1.5 * length];
  const i = ends.findIndex((end) => s < end);
  const side = i < 0 ? 3 : i;
  return { side: BOX_SIDES[side], offset: s - middles[side] };
}

/** The stations of a box's corners (from the middle of the downstream side, clockwise). */
export function boxCorners(length: number, width: number): number[] {
  return [width / 2, width / 2 + length, 1.5 * width + length, 1.5 * width + 2 * length];
}

// The same wall unrolled for the outlet drawing, and an opening's place on it as the drawing's input gives it.

/**
 * Where one opening sits on its wall, its centre across:
 * - `angle`: around a round riser, in degrees counterclockwise seen from above from the barrel's axis;
 * - `side` and `offset`: on a box riser's side (1 to 4 counterclockwise seen from above, side 1 the one
 *   the barrel leaves through) or a headwall's one face (side 1), the offset (m) of its centre from the
 *   side's left end seen from outside.
 */
export type WallPlace = { angle: number } | { side: number; offset: number };

/** A wall unrolled: its faces left to right seen from outside (m). */
export interface DevelopedWall {
  /** Its length unrolled (m): a round riser's perimeter, a box's four sides, a headwall's width. */
  width: number;
  /** Its flat faces in the order unrolled (m each), numbered from 1; null for a round wall (places by angle). */
  sides: readonly number[] | null;
  /** Where the barrel's axis meets the wall, along it (m); null where the barrel does not leave through it. */
  barrelAt: number | null;
}

/** A round wall of perimeter `width`, unrolled from the point opposite the barrel (so the barrel sits in its middle). */
export function roundWall(width: number): DevelopedWall {
  return { width, sides: null, barrelAt: width / 2 };
}

/** A headwall `width` wide: one face; the barrel leaves below and behind it. */
export function headwallWall(width: number): DevelopedWall {
  return { width, sides: [width], barrelAt: null };
}

/** A place's distance along the unrolled wall from its left edge (m). */
export function alongWall(wall: DevelopedWall, place: WallPlace): number {
  if ("angle" in place) {
    if (wall.sides !== null) throw new Error(`an angle (${place.angle} deg) places an opening on a round riser only; this wall has ${wall.sides.length} flat side(s)`);
    const turn = (((place.angle + 180) % 360) + 360) % 360;
    return (turn / 360) * wall.width;
  }
  const sides = wall.sides;
  if (sides === null) throw new Error(`a side (${place.side}) places an opening on a flat wall only; this wall is round (give an angle)`);
  if (!Number.isInteger(place.side) || place.side < 1 || place.side > sides.length) throw new Error(`side ${place.side} of a wall with sides 1 to ${sides.length}`);
  const length = sides[place.side - 1];
  if (!(place.offset >= 0 && place.offset <= length)) throw new Error(`offset ${place.offset} m on side ${place.side}, which is ${length} m long`);
  return sides.slice(0, place.side - 1).reduce((a, b) => a + b, 0) + place.offset;
}
