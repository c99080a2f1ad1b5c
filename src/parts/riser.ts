// The riser: a round or box structure whose walls hold the openings and whose rim is one more inlet to
// the chamber. Its file form, SI form, geometry, words, cost terms and catalogue size. The rim's flow:
// the smaller of weir flow over the perimeter, Cw P H^1.5, and orifice flow through the top opening,
// Cd A sqrt(2 g H) (HEC-22 sec. 8.4.4.2 and Example 8-6). Defaults Cw 3.0 US / 1.66 SI, Cd 0.60
// (case-format contract). A chamber level above the rim reduces the weir flow by Villemonte's formula
// (n = 1.5) and the orifice head to WS - DS.
import { z } from "zod";
import type { Riser } from "../model.js";
import { keep, lengthSchema, positive, positiveLength, type Length } from "../fields.js";
import { baseWeirCoefficient, GRAVITY, toCaseUnits, type UnitSystem } from "../units.js";
import { trimNumber, type Formatter } from "../format.js";
import { villemonte } from "./submergence.js";
import { weirCoefficientText } from "./weir.js";
import type { Conversion, FileSize, Method, SizeOption } from "./part.js";
import type { CostWeights } from "./cost.js";

export const riserSchema = z.discriminatedUnion(
  "shape",
  [
    z.object({
      shape: z.literal("circular"),
      diameter: positiveLength,
      crest: lengthSchema,
      coefficient: positive.optional(),
      orificeCoefficient: positive.optional(),
      keep,
    }),
    z.object({
      shape: z.literal("box"),
      length: positiveLength,
      width: positiveLength,
      crest: lengthSchema,
      coefficient: positive.optional(),
      orificeCoefficient: positive.optional(),
      keep,
    }),
  ],
  { error: 'a riser shape: "circular" or "box"' },
);
export type RiserFile = z.infer<typeof riserSchema>;

/** Rim weir coefficient: 3.0 US, 1.66 SI (the case-format contract's default). */
const RIM_WEIR = { US: 3.0, SI: 1.66 };
/** Top opening as an orifice: Cd 0.60 (HEC-22 Example 8-6). */
const RIM_ORIFICE = 0.6;

export const RISER_METHOD: Method = {
  part: "riser rim",
  method: "smaller of weir flow over the perimeter and orifice flow through the top; default Cw 3.0 US / 1.66 SI, Cd 0.60",
  source: "FHWA HEC-22 (3rd ed., 2009) sec. 8.4.4.2, Example 8-6",
};

export function riserToSI(r: RiserFile, cv: Conversion, path: string): Riser {
  const common = {
    crest: cv.length(r.crest, `${path}.crest`),
    coefficient: (r.coefficient ?? RIM_WEIR[cv.units]) * baseWeirCoefficient(cv.units),
    orificeCoefficient: r.orificeCoefficient ?? RIM_ORIFICE,
    keep: r.keep ?? false,
  };
  return r.shape === "circular"
    ? { shape: "circular", diameter: cv.length(r.diameter, `${path}.diameter`), ...common }
    : { shape: "box", length: cv.length(r.length, `${path}.length`), width: cv.length(r.width, `${path}.width`), ...common };
}

export function riserToFile(r: Riser, units: UnitSystem): RiserFile {
  const u = toCaseUnits(units);
  const common = { crest: u.length(r.crest), coefficient: u.weirCoefficient(r.coefficient), orificeCoefficient: r.orificeCoefficient, ...(r.keep ? { keep: true } : {}) };
  return r.shape === "circular" ? { shape: "circular", diameter: u.length(r.diameter), ...common } : { shape: "box", length: u.length(r.length), width: u.length(r.width), ...common };
}

/** A riser of the file with its coefficients written out (the search's kept riser). */
export function explicitRiser(r: RiserFile, units: UnitSystem): RiserFile {
  return { ...r, coefficient: r.coefficient ?? RIM_WEIR[units], orificeCoefficient: r.orificeCoefficient ?? RIM_ORIFICE };
}

/** A round riser of a catalogue size with its rim at `crest`, coefficients written out (the search's designed riser). */
export function designedRiser(size: Length, crest: Length, units: UnitSystem): RiserFile {
  return { shape: "circular", diameter: size, crest, coefficient: RIM_WEIR[units], orificeCoefficient: RIM_ORIFICE };
}

/** The riser as a catalogue size (its diameter), null for a box (the catalogue lists round risers). */
export function riserSize(r: RiserFile, length: (value: Length) => number): SizeOption | null {
  return r.shape === "circular" ? { size: r.diameter, sizeM: length(r.diameter) } : null;
}

/** Its sizes in the file's form whose plausibility is judged: a round riser's diameter. */
export function riserFileSizes(r: RiserFile): FileSize[] {
  return r.shape === "circular" ? [{ field: "diameter", value: r.diameter, what: "riser", intoBarrel: false }] : [];
}

export function riserPerimeter(r: Riser): number {
  return r.shape === "circular" ? Math.PI * r.diameter : 2 * (r.length + r.width);
}

export function riserArea(r: Riser): number {
  return r.shape === "circular" ? (Math.PI * r.diameter * r.diameter) / 4 : r.length * r.width;
}

/** The riser's widest and narrowest extent across (m): a round riser's diameter; a box's longer and shorter side. */
export function riserAcross(r: Riser): { widest: number; narrowest: number } {
  return r.shape === "circular" ? { widest: r.diameter, narrowest: r.diameter } : { widest: Math.max(r.length, r.width), narrowest: Math.min(r.length, r.width) };
}

/** Its width in a section along the barrel's axis (m): a round riser's diameter, a box's `length`. */
export function riserSection(r: Riser): number {
  return r.shape === "circular" ? r.diameter : r.length;
}

/** Width of the riser's wall the barrel leaves through (m): a round riser's diameter (its longest chord), a box's downstream side (its `width`). */
export function barrelWallWidth(r: Riser): number {
  return r.shape === "circular" ? r.diameter : r.width;
}

/** "4.00 ft riser", "4.00 ft x 3.00 ft box riser". */
export function riserWords(r: Riser, f: Formatter): string {
  return r.shape === "circular" ? `${f.length(r.diameter)} riser` : `${f.length(r.length)} x ${f.length(r.width)} box riser`;
}

/** Its row of the review report's parts table: kind, size, elevation, coefficient. */
export function riserRow(r: Riser, f: Formatter): [string, string, string, string] {
  const size = r.shape === "circular" ? `${f.length(r.diameter)} diameter` : `${f.length(r.length)} x ${f.length(r.width)} box`;
  return ["riser rim", size, `rim ${f.elevation(r.crest)}`, `weir C ${weirCoefficientText(f, r.coefficient)}; top opening Cd ${trimNumber(r.orificeCoefficient, 3)} (dimensionless)`];
}

/** Its terms of the cost proxy: the structure and its perimeter. */
export function riserCost(r: Riser, w: CostWeights): number {
  return w.riser + w.riserPerimeter * riserPerimeter(r);
}

export interface RimFlow {
  flow: number;
  /** True when the top opening (orifice flow) limits the rim. */
  orificeControls: boolean;
}

export function rimFlow(r: Riser, ws: number, ds: number): RimFlow {
  const weir = rimWeirFlow(r, ws, ds);
  const orifice = rimOrificeFlow(r, ws, ds);
  return orifice < weir ? { flow: orifice, orificeControls: true } : { flow: weir, orificeControls: false };
}

/** The rim's flow alone (the smaller of the two forms), without allocating: the rating's hot path. */
export function rimDischarge(r: Riser, ws: number, ds: number): number {
  return Math.min(rimWeirFlow(r, ws, ds), rimOrificeFlow(r, ws, ds));
}

function rimWeirFlow(r: Riser, ws: number, ds: number): number {
  const head = ws - r.crest;
  if (head <= 0 || ds >= ws) return 0;
  return villemonte(r.coefficient * riserPerimeter(r) * head * Math.sqrt(head), head, ds - r.crest, 1.5);
}

function rimOrificeFlow(r: Riser, ws: number, ds: number): number {
  const head = ws - Math.max(r.crest, ds);
  if (ws <= r.crest || head <= 0) return 0;
  return r.orificeCoefficient * riserArea(r) * Math.sqrt(2 * GRAVITY * head);
}
