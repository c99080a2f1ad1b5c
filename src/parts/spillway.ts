// The emergency spillway: a broad-crested trapezoidal overflow that discharges straight downstream.
// Flow: Q = C (L H^1.5 + 0.8 z H^2.5) (case-format contract; the first term is HEC-22 eq 8-22 / 8-26,
// the second the side slopes' share). Default C 2.8 US / 1.55 SI, within HEC-22 Table 8-1 (Brater &
// King). Villemonte n = 1.5 when the tailwater stands above the crest.
import { z } from "zod";
import type { Spillway } from "../model.js";
import { keep, lengthSchema, nonNegative, positive, positiveLength } from "../fields.js";
import { baseWeirCoefficient, toCaseUnits, type UnitSystem } from "../units.js";
import { trimNumber, type Formatter } from "../format.js";
import { villemonte } from "./submergence.js";
import { weirCoefficientText } from "./weir.js";
import type { Conversion, Method } from "./part.js";

export const spillwaySchema = z.object({
  crest: lengthSchema,
  length: positiveLength,
  sideSlope: nonNegative,
  coefficient: positive.optional(),
  keep,
});
export type SpillwayFile = z.infer<typeof spillwaySchema>;

/** Broad-crested trapezoidal spillway: 2.8 US, 1.55 SI (HEC-22 Table 8-1 range, Brater & King). */
const COEFFICIENT = { US: 2.8, SI: 1.55 };

export const SPILLWAY_METHOD: Method = {
  part: "spillway",
  method: "broad-crested trapezoid Q = C (L H^1.5 + 0.8 z H^2.5); default C 2.8 US / 1.55 SI",
  source: "FHWA HEC-22 (3rd ed., 2009) eq 8-22, Table 8-1",
};

export function spillwayToSI(s: SpillwayFile, cv: Conversion, path: string): Spillway {
  return {
    crest: cv.length(s.crest, `${path}.crest`),
    length: cv.length(s.length, `${path}.length`),
    sideSlope: s.sideSlope,
    coefficient: (s.coefficient ?? COEFFICIENT[cv.units]) * baseWeirCoefficient(cv.units),
    keep: s.keep ?? false,
  };
}

export function spillwayToFile(s: Spillway, units: UnitSystem): SpillwayFile {
  const u = toCaseUnits(units);
  return { crest: u.length(s.crest), length: u.length(s.length), sideSlope: s.sideSlope, coefficient: u.weirCoefficient(s.coefficient), ...(s.keep ? { keep: true } : {}) };
}

/** The spillway of the file with its coefficient written out (the search keeps it as given). */
export function explicitSpillway(s: SpillwayFile, units: UnitSystem): SpillwayFile {
  return { ...s, coefficient: s.coefficient ?? COEFFICIENT[units] };
}

/** "12.0 ft spillway at 816.50 ft". */
export function spillwayWords(s: Spillway, f: Formatter): string {
  return `${f.length(s.length, 1)} spillway at ${f.elevation(s.crest)}`;
}

/** Its row of the review report's parts table: kind, size, elevation, coefficient. */
export function spillwayRow(s: Spillway, f: Formatter): [string, string, string, string] {
  return ["trapezoidal spillway", `${f.length(s.length, 1)} bottom, side slopes ${trimNumber(s.sideSlope, 3)} H : 1 V`, `crest ${f.elevation(s.crest)}`, `C ${weirCoefficientText(f, s.coefficient)}`];
}

export function spillwayFlow(s: Spillway, ws: number, tw: number): number {
  const head = ws - s.crest;
  if (head <= 0 || tw >= ws) return 0;
  const h15 = head * Math.sqrt(head);
  const free = s.coefficient * h15 * (s.length + 0.8 * s.sideSlope * head);
  return villemonte(free, head, tw - s.crest, 1.5);
}
