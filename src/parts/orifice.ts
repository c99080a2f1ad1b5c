// What the orifice kinds share: the default discharge coefficient and its published range, their
// method and source, their warnings and cost terms, and their catalogue words.
import { trimNumber, type Formatter } from "../format.js";
import type { Length } from "../fields.js";
import type { CostWeights } from "./cost.js";
import type { Conversion, Method } from "./part.js";

/** Orifice discharge coefficient, sharp-edged opening: 0.61 (USBR Water Measurement Manual; HEC-22 sec. 8.4.4.1 gives 0.6). */
export const ORIFICE_COEFFICIENT = 0.61;
/** Orifice discharge coefficients 0.40 (ragged) to 0.60 (square-edged) (HEC-22 sec. 8.4.4.1) and 0.61-0.62
 * for sharp-edged plates (USBR WMM; from memory). */
export const ORIFICE_COEFFICIENTS = [0.4, 0.62] as const;

/** One row for both orifice kinds in the methods table. */
export const ORIFICE_METHOD: Method = {
  part: "orifice",
  method: "orifice equation integrated over the wetted opening, head to the downstream level where submerged; default Cd 0.61",
  source: "FHWA HEC-22 (3rd ed., 2009) eq 8-17; USBR Water Measurement Manual (3rd ed.)",
};

/** The fields both orifice kinds share, in SI (count 1 and Cd 0.61 unless given). */
export function orificeFields(file: { count?: number; invert: Length; coefficient?: number; keep?: boolean }, cv: Conversion, path: string) {
  return { count: file.count ?? 1, invert: cv.length(file.invert, `${path}.invert`), coefficient: file.coefficient ?? ORIFICE_COEFFICIENT, keep: file.keep ?? false };
}

/** A discharge coefficient outside the published range, in words (none when inside). */
export function orificeWarnings(coefficient: number): string[] {
  return coefficient < ORIFICE_COEFFICIENTS[0] || coefficient > ORIFICE_COEFFICIENTS[1] ? [`discharge coefficient ${coefficient} is outside the published 0.40 to 0.62`] : [];
}

/** Each opening cut and fitted with a trash rack, plus its size (its diameter or larger side, m). */
export function orificeCost(count: number, size: number, w: CostWeights): number {
  return count * (w.opening + w.orificeDiameter * size);
}

/** "orifice" or "orifices" after a count. */
export function orifices(count: number): string {
  return `orifice${count > 1 ? "s" : ""}`;
}

/** Its invert in a row of the parts table, and its coefficient. */
export function orificeRowEnd(invert: number, coefficient: number, f: Formatter): [string, string] {
  return [`invert ${f.elevation(invert)}`, `Cd ${trimNumber(coefficient, 3)} (dimensionless)`];
}
