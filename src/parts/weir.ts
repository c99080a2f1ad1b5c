// What the sharp-crested weir kinds share: the smallest head their coefficients were measured at, their
// coefficient's words, and the catalogue step between weirs of one kind.
import { FOOT } from "../units.js";
import { trimNumber, type Formatter } from "../format.js";
import type { PartOption } from "./part.js";

/** Smallest head at which sharp-crested weir coefficients were measured: 0.2 ft (USBR Water
 * Measurement Manual ch. 7, lower limit of h1 for standard weirs; from memory). */
export const WEIR_MIN_HEAD = 0.2 * FOOT;

/** The largest head routed over a crest, below the smallest measured head, in words (none otherwise). */
export function lowHeadWarnings(head: number, f: Formatter): string[] {
  return head > 0 && head < WEIR_MIN_HEAD ? [`largest head ${f.length(head)} is below ${f.length(WEIR_MIN_HEAD)}, the smallest head weir coefficients were measured at`] : [];
}

/** A weir-type coefficient with its unit, length^0.5 / time. */
export function weirCoefficientText(f: Formatter, si: number): string {
  return `${trimNumber(f.raw.weirCoefficient(si), 3)} ${f.labels.length}^0.5/s`;
}

/** Its crest and coefficient in a row of the parts table. */
export function weirRowEnd(crest: number, coefficient: number, f: Formatter): [string, string] {
  return [`crest ${f.elevation(crest)}`, `C ${weirCoefficientText(f, coefficient)}`];
}

/** The options next to `option` among `same` in the order of `by` (a length, an angle): one smaller, one larger. */
export function catalogueSteps(option: PartOption, same: readonly PartOption[], by: (o: PartOption) => number): PartOption[] {
  const sorted = [...same].sort((a, b) => by(a) - by(b));
  const at = sorted.findIndex((o) => o.key === option.key);
  return [sorted[at - 1], sorted[at + 1]].filter((o): o is PartOption => o !== undefined);
}
