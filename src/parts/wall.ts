// The wall that holds an outlet's openings (a round riser's curved wall, a box riser's four sides, or a
// headwall where there is no riser) and the one way outfit says where an opening sits on it: as a
// drafter reads the wall developed (unrolled) and seen from outside, from the pond, left to right.
// - Round riser: the angle of the opening's centre from the barrel's centreline (0 degrees where the
//   barrel leaves; 180 the upstream face, facing the pond), counterclockwise seen from above, which is
//   left to right seen from outside; without a barrel from the middle of the downstream face.
// - Box riser: the side, named as one looks downstream (`downstream`, the side the barrel leaves
//   through, then `left`, `upstream` and `right`: their order left to right seen from outside), and the
//   offset of the opening's centre from that side's left end seen from outside. A box's `length` runs
//   along the barrel: its downstream and upstream sides are `width` long, its left and right `length`.
// - Headwall: the offset of the centre from its left end seen from the pond.
// A station is the distance along the developed wall from its left edge (m): around a round riser from
// the barrel's centreline (the barrel's hole straddles both edges), around a box from the downstream
// side's left end, along a headwall from its left end. The placement (placement.ts) gives each opening
// its station and place; the rules, the text and JSON output and the outlet drawing read them there.
import type { Outlet } from "../model.js";

export type Wall =
  | { kind: "round riser"; diameter: number }
  | { kind: "box riser"; length: number; width: number }
  /** No riser: the openings are in a headwall, of a stated usable width or (null) as wide as they need. */
  | { kind: "headwall"; width: number | null };

/** A box riser's sides in the order of its developed wall, left to right seen from outside. */
export const BOX_SIDES = ["downstream", "left", "upstream", "right"] as const;
export type BoxSide = (typeof BOX_SIDES)[number];

/** Where one opening sits on its wall (see the file's head): an angle (degrees), or a side and an offset (m), or an offset (m). */
export type WallPlace = { angle: number } | { side: BoxSide; offset: number } | { offset: number };

/** The wall of an outlet: its riser's, or a headwall of the stated width. */
export function wallOf(outlet: Outlet, headwallWidth: number | null): Wall {
  const r = outlet.riser;
  if (!r) return { kind: "headwall", width: headwallWidth };
  return r.shape === "circular" ? { kind: "round riser", diameter: r.diameter } : { kind: "box riser", length: r.length, width: r.width };
}

/** Length of the developed wall (m): a riser's perimeter, a headwall's stated width (null: not limited). */
export function wallLength(w: Wall): number | null {
  return w.kind === "round riser" ? Math.PI * w.diameter : w.kind === "box riser" ? 2 * (w.length + w.width) : w.width;
}

/** The wall is closed on itself (a riser): stations wrap around. */
export function wallCloses(w: Wall): boolean {
  return w.kind !== "headwall";
}

/** A box riser's sides' lengths, in the order of BOX_SIDES (m). */
export function boxSides(length: number, width: number): [number, number, number, number] {
  return [width, length, width, length];
}

/** Stations where the wall's faces meet or end: a box's corners (each side's left end), a stated headwall's two ends; none around a round riser. */
export function wallEdges(w: Wall): number[] {
  if (w.kind === "box riser") return [0, w.width, w.width + w.length, 2 * w.width + w.length];
  return w.kind === "headwall" && w.width !== null ? [0, w.width] : [];
}

/** Station of the barrel's centreline on a riser's wall (a box's downstream side's middle); null on a headwall (the barrel leaves below and behind it). */
export function barrelStation(w: Wall): number | null {
  return w.kind === "round riser" ? 0 : w.kind === "box riser" ? w.width / 2 : null;
}

/** Station of the middle of the upstream face, facing the pond (a headwall's middle; 0 on one of unstated width). */
export function upstreamStation(w: Wall): number {
  if (w.kind === "round riser") return (Math.PI * w.diameter) / 2;
  if (w.kind === "box riser") return 1.5 * w.width + w.length;
  return w.width === null ? 0 : w.width / 2;
}

/** Stations of the middles of a wall's faces (a box's sides, a headwall), with half each face's length; none on a round riser. */
export function faceMiddles(w: Wall): { middle: number; half: number }[] {
  if (w.kind === "round riser") return [];
  if (w.kind === "headwall") return w.width === null ? [] : [{ middle: w.width / 2, half: w.width / 2 }];
  let start = 0;
  return boxSides(w.length, w.width).map((side) => {
    const face = { middle: start + side / 2, half: side / 2 };
    start += side;
    return face;
  });
}

/** The place at a station of the wall (see the file's head); a round riser's angle to a millionth of a degree, so round stations read as whole degrees. */
export function placeAt(w: Wall, station: number): WallPlace {
  const length = wallLength(w);
  const s = length !== null && wallCloses(w) && Number.isFinite(length) ? ((station % length) + length) % length : station;
  if (w.kind === "round riser") return { angle: Number.isFinite(length) ? Math.round((360e6 * s) / length!) / 1e6 : 0 };
  if (w.kind === "headwall") return { offset: s };
  const sides = boxSides(w.length, w.width);
  let start = 0;
  for (let i = 0; i < 3; i++) {
    if (s < start + sides[i]) return { side: BOX_SIDES[i], offset: s - start };
    start += sides[i];
  }
  return { side: BOX_SIDES[3], offset: s - start };
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
