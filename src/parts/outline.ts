// An opening's outline on the wall that holds it, relative to its bottom (an orifice's invert, a weir's
// crest), as each part kind gives it (`outline` of part.ts): what the outlet drawing draws, and the
// widths and heights it needs, without asking which kind the part is.

/** An opening's outline on its wall (m), relative to its bottom and centred across. */
export type Outline =
  /** A round opening. */
  | { kind: "circle"; diameter: number }
  /** A rectangular opening. */
  | { kind: "rectangle"; width: number; height: number }
  /** Open to the top of the wall: its bottom width, and the widening of each side per unit of height (a rectangular notch 0, a Cipolletti 1/4, a V tan(angle/2)). */
  | { kind: "notch"; bottomWidth: number; spreadPerHeight: number }
  /** A manufactured device at its invert (a flow regulator), drawn as a box of this size. */
  | { kind: "device"; width: number; height: number };

/** Width (m) an outline takes across its wall at a height `up` above its bottom (a notch widens). */
export function outlineWidth(o: Outline, up: number): number {
  if (o.kind === "notch") return o.bottomWidth + 2 * o.spreadPerHeight * Math.max(up, 0);
  return o.kind === "circle" ? o.diameter : o.width;
}

/** Height (m) of a closed outline above its bottom; null for a notch, open to the top of its wall. */
export function outlineHeight(o: Outline): number | null {
  if (o.kind === "notch") return null;
  return o.kind === "circle" ? o.diameter : o.height;
}

/** A hole cut in the wall (a device is mounted on it instead: it takes no part in the wall's webs). */
export function isHole(o: Outline): boolean {
  return o.kind !== "device";
}
