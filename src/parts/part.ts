// The protocol every kind of outlet element implements: one file per kind in this folder, one line per
// kind in registry.ts. A kind owns everything that depends on what it is: its fragment of the case
// file's schema, its conversion to SI and back, its default coefficient and the source of its
// formula, its flow, its geometry on the wall that holds it, the range its formula was published for,
// its words in every output, its terms of the cost proxy and the options it offers the search. Nothing
// outside src/parts/ asks which kind an element is (tests/parts/partSwitches.test.ts).
import type { z } from "zod";
import type { Catalogue, Element } from "../model.js";
import type { Formatter } from "../format.js";
import type { Length } from "../fields.js";
import { toCaseUnits, type UnitSystem } from "../units.js";
import { trimNumber } from "../format.js";
import type { CostWeights } from "./cost.js";
import type { Outline } from "./outline.js";

/** What a part's conversion to SI needs from the loader (case/converter.ts's `Converter` is one). */
export interface Conversion {
  readonly units: UnitSystem;
  /** A length in SI (m); a problem and NaN when it does not parse. */
  length(value: Length, path: string): number;
  /** A flow in SI (m3/s). */
  flowOf(value: number | string, path: string): number;
  problem(path: string, found: string, expected: string): void;
  /** Checks a table column's SI values for order (rows may carry different units); returns them. */
  increasing(values: number[], strictly: boolean, name: string, at: (i: number) => { path: string; found: unknown }): number[];
}

/** The fields every element has in the case file. */
export interface ElementFileBase {
  type: string;
  shape?: string;
  keep?: boolean;
}

/** A method behind the numbers and its published source (a row of the review report's methods table). */
export interface Method {
  part: string;
  method: string;
  source: string;
}

/** What a part's range of validity is judged against: the highest stage routed and the pond's floor (m). */
export interface Routed {
  maxStage: number;
  floor: number;
}

/**
 * A size the case file gives for a part, in the file's own form (only the file knows a number was bare):
 * what case/sizePlausibility.ts judges when the number has no unit.
 */
export interface FileSize {
  /** Its field in the part's file form ("diameter", "height"). */
  field: string;
  value: Length;
  /** The part by what this size measures, after "a 6.00 ft ..." ("orifice", "high orifice", "riser"). */
  what: string;
  /** Whether the flow through it passes into the barrel, so it should not exceed the barrel's rise (an orifice's diameter or height). */
  intoBarrel: boolean;
}

/** One choice the search has for a control level: a catalogue size of one kind (or a part of the existing outlet). */
export interface PartOption {
  /** Its identity in layout keys, journals and the fit's seed: "orifice 2 x 6 in", "weir 2", "v-notch 45". */
  key: string;
  /** The kind. */
  part: ElementPart;
  /** The element in the case file's form, every coefficient written out; `placed` (registry.ts) puts it at an elevation. */
  file: ElementFileBase;
  /** The option in words, its size as the catalogue writes it ("2 x 6 in orifices", "45 deg v-notch"). */
  words: string;
  /** Openings side by side (1 for a weir). */
  count: number;
  /** The catalogue size stepped through (m): an orifice's diameter, a weir's length; 0 for a notch's angle. */
  sizeM: number;
  /** Height of a closed opening above its bottom (m); 0 for a notch open to the top of its wall. */
  height: number;
  /** Wall width the part takes (m); a notch's at one foot of head. */
  width: number;
  /** A part of the existing outlet that no catalogue option matches (value engineering): moved, never resized. */
  existing: boolean;
}

/** A size from the catalogue as written (written back as given) and in m. */
export interface SizeOption {
  size: Length;
  sizeM: number;
}

/** The catalogue as the case file gives it: sizes as written (the search writes them back as given). */
export interface CatalogueEntries {
  orifice?: { diameters: Length[]; maxCount?: number };
  weir?: { shapes?: string[]; lengths?: Length[]; angles?: number[] };
}

/** What a kind needs to turn the catalogue into options. */
export interface OptionContext {
  entries: CatalogueEntries;
  catalogue: Catalogue;
  units: UnitSystem;
  /** Sizes of the file, smallest first, with their values in m (those that do not parse left out). */
  sizes(values: readonly Length[] | undefined): SizeOption[];
  /** A length of the file in m. */
  length(value: Length): number;
}

/** The catalogue options a kind offers the search. */
export interface PartCatalogue<F extends ElementFileBase> {
  /** The name `catalogue.weir.shapes` lists it by (null: offered whenever its catalogue section gives sizes). */
  readonly listedAs: string | null;
  /** Listed when the catalogue gives weir sizes but no `shapes` (the case-format contract's default). */
  readonly listedByDefault: boolean;
  /** Its options, in the order the search tries them (smallest first). */
  options(context: OptionContext): PartOption[];
  /** The options one catalogue step from `option` among `same` (the options of this kind), smaller first. */
  neighbours(option: PartOption, same: readonly PartOption[]): PartOption[];
  /** An element of the existing outlet that no option matches, as an option of its own (moved, never resized). */
  existing(file: F, context: OptionContext): PartOption;
}

/** The rating sweep's faster forms of a kind's flow (within 1e-6 of `flow`; hydraulics/openingsSweep.ts). */
export interface SweepFlow<E> {
  /** Free flow (no downstream level). */
  free(e: E, ws: number): number;
  /** Flow under a downstream level above the part's bottom. */
  drowned(e: E, ws: number, ds: number): number;
}

/**
 * One kind of outlet element (an opening in the riser or headwall, or a device at an invert). `E` is its
 * SI form (model.ts's `Element` is the union of the kinds' forms, see `ElementKinds`), `F` its case-file
 * form. Members are methods (not function-valued properties) so that a kind's own `ElementPart<E, F>` is
 * an `ElementPart` of the registry.
 */
export interface ElementPart<E extends Element = Element, F extends ElementFileBase = ElementFileBase> {
  /** `type` and `shape` in the file and in SI (null shape: the type alone names the kind). */
  readonly type: string;
  readonly shape: string | null;
  /** The kind in words ("circular orifice", "v-notch weir"). */
  readonly name: string;
  /** Short name after an element's number in column heads and labels ("E2 v-notch"). */
  readonly column: string;
  /** The field of its bottom elevation: an opening's invert, a weir's crest. */
  readonly bottomField: "invert" | "crest";
  /** Its fragment of the case file's schema (a zod object with literal `type` and `shape`). */
  readonly schema: z.ZodObject;
  /** Its flow formula and source, for the review report's methods table (kinds may share one row). */
  readonly method: Method;
  /** Villemonte's exponent of its submergence (hydraulics' `villemonte`), null when it is not a weir. */
  readonly submergenceExponent: number | null;
  /** Counts as a control level of the cost proxy. */
  readonly level: boolean;
  /** Its catalogue options, if the catalogue offers the kind. */
  readonly catalogue: PartCatalogue<F> | null;
  /** The rating sweep's faster forms of its flow, if it has any. */
  readonly sweep: SweepFlow<E> | null;

  /** Default coefficient in the case's units (null: the kind has none, e.g. a rating), with its source in the part's file. */
  defaultCoefficient(units: UnitSystem): number | null;
  /** Its sizes in the file's form (none for a kind whose sizes are not judged: a weir's length, a rating). */
  fileSizes(file: F): FileSize[];
  /** The file form in SI, problems collected by the conversion. */
  toSI(file: F, cv: Conversion, path: string): E;
  /** The SI form written back in the file's form, in the case's units, every coefficient explicit. */
  toFile(e: E, units: UnitSystem): F;

  /** Flow in through the part (m3/s) for a pond stage and a downstream level (-Infinity: free). */
  flow(e: E, ws: number, ds: number): number;

  /** Its bottom elevation (m): invert or crest. */
  bottom(e: E): number;
  /** The highest point that must stay below the rim (m): a closed opening's top, a notch's crest (open above). */
  top(e: E): number;
  /** Width of the water surface across its opening(s) at a stage (m); 0 below its bottom. */
  widthAt(e: E, stage: number): number;
  /** Identical openings side by side at its bottom (an orifice's `count`; 1 for a notch or a device). */
  count(e: E): number;
  /**
   * One opening's outline on its wall, relative to its bottom: the one geometry of its openings on the
   * wall, which the placement (placement.ts), the buildability rules and the outlet drawing read.
   */
  outline(e: E): Outline;
  /** Elevations where its rating has a kink (bottom, an opening's top, a rating's points), pushed into `out`. */
  breaks(e: E, out: number[]): void;

  /** Where it is used outside the range its formula or coefficient was published for (reasons in words). */
  warnings(e: E, at: Routed, f: Formatter): string[];
  /** Largest head its formula covers (m; Infinity when unlimited) with the pond's floor at `floor`, for the search's soft residuals; null when it has none. */
  headLimit(e: E, floor: number): number | null;

  /** The part in words for a warning's subject ("1 x 6 in circular orifice"). */
  label(e: E, f: Formatter): string;
  /** The part with its elevation ("2 x 6 in orifices at 812.00 ft"). */
  describe(e: E, f: Formatter): string;
  /** Its size in words, for a change list ("2 x 6 in", "45 deg"). */
  size(e: E, f: Formatter): string;
  /** Its noun in a change list ("orifices", "v-notch"). */
  noun(e: E): string;
  /** Its row of the review report's parts table: kind, size, elevation, coefficient. */
  row(e: E, f: Formatter): [string, string, string, string];

  /** Its terms of the cost proxy (the level it adds is counted by the caller). */
  cost(e: E, w: CostWeights): number;
  /**
   * The size the minimum-opening rule compares with the smallest opening permitted, `minimum` (m): the
   * narrowest passage its kind offers where debris of that size meets it (an orifice's diameter or
   * smaller side, a weir's crest length, a notch's width one `minimum` above its vertex); null where
   * the rule does not bind the kind (a manufactured device, sized by its maker).
   */
  openingSize(e: E, minimum: number): number | null;
  /** The part with `open` of its open area left (clogging). */
  clogged(e: E, open: number): E;
  /** Its orifice discharge coefficient Cd, null when it is not an orifice. */
  dischargeCoefficient(e: E): number | null;
}

/** A catalogue size as written in a key or in words: a bare number as it is, a string with its unit. */
export function written(size: Length): string {
  return typeof size === "number" ? String(size) : size;
}

/** A catalogue size in words: a bare number with the case's length unit, a string as written. */
export function lengthWords(size: Length, units: UnitSystem): string {
  return typeof size === "number" ? `${size} ${units === "US" ? "ft" : "m"}` : size;
}

/** A small size written back to the file with its unit: inches (US) or millimetres (SI). */
export function smallSize(m: number, units: UnitSystem): string {
  return `${trimNumber(toCaseUnits(units).smallLength(m), 6)} ${units === "US" ? "in" : "mm"}`;
}
