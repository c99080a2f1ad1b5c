// The barrel: a circular pipe (diameter) or a box culvert (span and rise) that drains the chamber. Its
// file form, SI form, section sizes, words, cost terms and catalogue size; its hydraulics (FHWA HDS-5
// inlet and outlet control, the part-full section, the backwater profile) are hydraulics/barrel*.ts.
import { z } from "zod";
import type { Barrel } from "../model.js";
import { keep, lengthSchema, positive, positiveLength, show, type Length } from "../fields.js";
import { toCaseUnits, type UnitSystem } from "../units.js";
import { trimNumber, type Formatter } from "../format.js";
import { ENTRANCE_TABLE, ENTRANCES, entrancesFor } from "./entrances.js";
import { smallSize, type Conversion, type FileSize, type Method, type SizeOption } from "./part.js";
import type { CostWeights } from "./cost.js";
import type { Outline } from "./outline.js";

const barrelCommon = {
  length: positiveLength,
  inletInvert: lengthSchema,
  outletInvert: lengthSchema,
  manningN: positive,
  entrance: z.enum(ENTRANCES, { error: `an entrance among ${ENTRANCES.join(", ")}` }),
  /** The outlet end's entrance, for water entering there (reverse flow between ponds); default `entrance`. */
  outletEntrance: z.enum(ENTRANCES, { error: `an entrance among ${ENTRANCES.join(", ")}` }).optional(),
  keep,
};
export const barrelSchema = z.discriminatedUnion(
  "shape",
  [
    z.object({ shape: z.literal("circular"), diameter: positiveLength, ...barrelCommon }),
    z.object({ shape: z.literal("box"), span: positiveLength, rise: positiveLength, ...barrelCommon }),
  ],
  { error: 'a barrel shape: "circular" or "box"' },
);
export type BarrelFile = z.infer<typeof barrelSchema>;

export const BARREL_METHOD: Method = {
  part: "barrel",
  method: "inlet control (unsubmerged and submerged forms, blended between) and full-flow outlet control; the larger headwater governs; chamber level solved against the barrel",
  source: "FHWA HDS-5, Hydraulic Design of Highway Culverts (2nd ed. 2001, 3rd ed. 2012), App. A and ch. III",
};

export function barrelToSI(b: BarrelFile, cv: Conversion, path: string): Barrel {
  const common = {
    length: cv.length(b.length, `${path}.length`),
    inletInvert: cv.length(b.inletInvert, `${path}.inletInvert`),
    outletInvert: cv.length(b.outletInvert, `${path}.outletInvert`),
    manningN: b.manningN,
    entrance: b.entrance,
    ...(b.outletEntrance !== undefined ? { outletEntrance: b.outletEntrance } : {}),
    keep: b.keep ?? false,
  };
  for (const field of ["entrance", "outletEntrance"] as const) {
    const name = b[field];
    if (name !== undefined && ENTRANCE_TABLE[name].shape !== b.shape) {
      cv.problem(`${path}.${field}`, show(name), `an entrance for a ${b.shape} barrel (${entrancesFor(b.shape).join(", ")})`);
    }
  }
  return b.shape === "circular"
    ? { shape: "circular", diameter: cv.length(b.diameter, `${path}.diameter`), ...common }
    : { shape: "box", span: cv.length(b.span, `${path}.span`), rise: cv.length(b.rise, `${path}.rise`), ...common };
}

export function barrelToFile(b: Barrel, units: UnitSystem): BarrelFile {
  const u = toCaseUnits(units);
  const common = {
    length: u.length(b.length),
    inletInvert: u.length(b.inletInvert),
    outletInvert: u.length(b.outletInvert),
    manningN: b.manningN,
    entrance: b.entrance as never,
    ...(b.outletEntrance !== undefined ? { outletEntrance: b.outletEntrance as never } : {}),
    ...(b.keep ? { keep: true } : {}),
  };
  return b.shape === "circular" ? { shape: "circular", diameter: smallSize(b.diameter, units), ...common } : { shape: "box", span: u.length(b.span), rise: u.length(b.rise), ...common };
}

/** The barrel as a catalogue size (its diameter), null for a box (the catalogue lists pipes). */
export function barrelSize(b: BarrelFile, length: (value: Length) => number): SizeOption | null {
  return b.shape === "circular" ? { size: b.diameter, sizeM: length(b.diameter) } : null;
}

/** The site barrel with a catalogue diameter (a box is kept as it is). */
export function resizedBarrel(b: BarrelFile, size: Length): BarrelFile {
  return b.shape === "circular" ? { ...b, diameter: size } : { ...b };
}

/** Its rise in the file's form (a pipe's diameter, a box's rise): the size openings that drain into it are judged against. */
export function barrelFileRise(b: BarrelFile): FileSize {
  return b.shape === "circular" ? { field: "diameter", value: b.diameter, what: "barrel", intoBarrel: false } : { field: "rise", value: b.rise, what: "barrel", intoBarrel: false };
}

/** Barrel rise D (m). */
export function barrelRise(b: Barrel): number {
  return b.shape === "circular" ? b.diameter : b.rise;
}

/** Its opening where it leaves the riser, relative to its invert (the outlet drawing): a pipe's circle, a box's span and rise. */
export function barrelOutline(b: Barrel): Outline {
  return b.shape === "circular" ? { kind: "circle", diameter: b.diameter } : { kind: "rectangle", width: b.span, height: b.rise };
}

/** Barrel width across (m): a pipe's diameter, a box's span (its hole in the riser's wall). */
export function barrelSpan(b: Barrel): number {
  return b.shape === "circular" ? b.diameter : b.span;
}

/** Full cross-section area A (m2). */
export function barrelArea(b: Barrel): number {
  return b.shape === "circular" ? (Math.PI * b.diameter * b.diameter) / 4 : b.span * b.rise;
}

/** Hydraulic radius of the full barrel (m). */
export function fullHydraulicRadius(b: Barrel): number {
  return b.shape === "circular" ? b.diameter / 4 : (b.span * b.rise) / (2 * (b.span + b.rise));
}

/** Its size in words: "18 in", "4.00 ft x 3.00 ft". */
export function barrelSizeWords(b: Barrel, f: Formatter): string {
  return b.shape === "circular" ? f.size(b.diameter) : `${f.length(b.span)} x ${f.length(b.rise)}`;
}

/** Its row of the review report's parts table: kind, size, elevation, coefficient. */
export function barrelRow(b: Barrel, f: Formatter): [string, string, string, string] {
  const size = b.shape === "circular" ? `${f.size(b.diameter)} diameter` : `${f.length(b.span)} span x ${f.length(b.rise)} rise`;
  return [`barrel (${b.entrance})`, `${size}, ${f.length(b.length, 1)} long`, `inlet ${f.elevation(b.inletInvert)}, outlet ${f.elevation(b.outletInvert)}`, `Manning n ${trimNumber(b.manningN, 4)} (s/m^(1/3))`];
}

/** Its terms of the cost proxy: rise times length. */
export function barrelCost(b: Barrel, w: CostWeights): number {
  return w.barrel * barrelRise(b) * b.length;
}
