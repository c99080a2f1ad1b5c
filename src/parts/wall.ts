// The wall that holds the openings, unrolled (developed) for the outlet drawing, and an opening's place
// on it as a drafter gives it: around a round riser by its angle, on a box riser's side or a headwall
// by its offset along that face. The riser's file gives its wall (riser.ts, `riserWall`); a headwall
// is one face (`headwallWall`). An opening's invert is its bottom (the element's), not part of its place.

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
