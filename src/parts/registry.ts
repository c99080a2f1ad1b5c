// The outlet element kinds: one line each (a kind's file holds the rest, see part.ts). The order is
// the order of the catalogue's options, of neighbouring kinds in the search and of the methods table.
// Everything below asks an element's kind here instead of switching on it.
import { z } from "zod";
import type { Element } from "../model.js";
import type { Length } from "../fields.js";
import type { UnitSystem } from "../units.js";
import type { Conversion, ElementFileBase, ElementPart, Method, OptionContext, PartOption } from "./part.js";
import { circularOrifice } from "./circularOrifice.js";
import { rectangularOrifice } from "./rectangularOrifice.js";
import { rectangularWeir } from "./rectangularWeir.js";
import { vNotchWeir } from "./vNotchWeir.js";
import { cipollettiWeir } from "./cipollettiWeir.js";
import { regulator } from "./regulator.js";

export const ELEMENT_PARTS = [circularOrifice, rectangularOrifice, rectangularWeir, vNotchWeir, cipollettiWeir, regulator] as const;

type FileOf<P> = P extends ElementPart<Element, infer F> ? F : never;
/** An element in the case file's form: the union of the kinds' forms. */
export type ElementFile = FileOf<(typeof ELEMENT_PARTS)[number]>;
/** Any kind, as the registry hands it out. */
export type AnyElementPart = ElementPart<Element, ElementFile>;

const PARTS: readonly AnyElementPart[] = ELEMENT_PARTS;

/** Kinds by type, then by shape ("" for a type that names its kind alone). */
const BY_TYPE = new Map<string, Map<string, AnyElementPart>>();
for (const part of PARTS) {
  const shapes = BY_TYPE.get(part.type) ?? new Map<string, AnyElementPart>();
  shapes.set(part.shape ?? "", part);
  BY_TYPE.set(part.type, shapes);
}

/** The kind of an element, in SI or in the file's form (by its `type` and `shape`). */
export function partOf(e: Element | ElementFileBase): AnyElementPart {
  const part = BY_TYPE.get(e.type)?.get((e as ElementFileBase).shape ?? "");
  if (!part) throw new Error(`no outlet part kind of type ${e.type} and shape ${(e as ElementFileBase).shape}`);
  return part;
}

/** "a", or "an" before a vowel. */
function article(word: string): string {
  return /^[aeiou]/.test(word) ? "an" : "a";
}

/** "a", "b" or "c" (quoted). */
function quotedChoice(names: readonly string[]): string {
  const quoted = names.map((n) => `"${n}"`);
  return quoted.length === 1 ? quoted[0] : `${quoted.slice(0, -1).join(", ")} or ${quoted[quoted.length - 1]}`;
}

/** The case file's `outlet.elements[]` schema, built from the kinds' fragments: by type, then by shape. */
export const elementSchema = z.discriminatedUnion(
  "type",
  [...BY_TYPE].map(([type, shapes]) => {
    const schemas = [...shapes.values()].map((p) => p.schema);
    if (shapes.has("")) return schemas[0];
    return z.discriminatedUnion("shape", schemas as [z.ZodObject, ...z.ZodObject[]], { error: `${article(type)} ${type} shape: ${quotedChoice([...shapes.keys()])}` });
  }) as unknown as [z.ZodObject, ...z.ZodObject[]],
  { error: `an element type: ${quotedChoice([...BY_TYPE.keys()])}` },
) as unknown as z.ZodType<ElementFile>;

/** The names `catalogue.weir.shapes` may list, and those listed when it lists none (the contract's default). */
export const LISTED_SHAPES = PARTS.flatMap((p) => (p.catalogue?.listedAs ? [p.catalogue.listedAs] : []));
export const DEFAULT_LISTED_SHAPES = PARTS.flatMap((p) => (p.catalogue?.listedAs && p.catalogue.listedByDefault ? [p.catalogue.listedAs] : []));
/** One name of `catalogue.weir.shapes`. */
export const listedShapeSchema = z.enum(LISTED_SHAPES as [string, ...string[]], { error: quotedChoice(LISTED_SHAPES) });

/** An element of the file in SI. */
export function elementToSI(file: ElementFile, cv: Conversion, path: string): Element {
  return partOf(file).toSI(file, cv, path);
}

/** An element written back in the file's form, in the case's units. */
export function elementToFile(e: Element, units: UnitSystem): ElementFile {
  return partOf(e).toFile(e, units);
}

/** An element's bottom elevation (m): an opening's invert, a weir's crest. */
export function bottomOf(e: Element): number {
  return partOf(e).bottom(e);
}

/** An element of the file's bottom elevation as written (invert or crest). */
export function fileBottom(file: ElementFile): Length {
  return (file as unknown as Record<string, Length>)[partOf(file).bottomField];
}

/** An element of the file at another bottom elevation (its fields in their order). */
export function placed<F extends ElementFileBase>(file: F, at: Length): F {
  return { ...file, [partOf(file).bottomField]: at };
}

/** An element of the file with its coefficient written out (the kind's default where it gives none). */
export function explicit<F extends ElementFileBase>(file: F, units: UnitSystem): F {
  const coefficient = partOf(file).defaultCoefficient(units);
  const withCoefficient = coefficient === null ? { ...file } : { ...file, coefficient: (file as { coefficient?: number }).coefficient ?? coefficient };
  return Object.fromEntries(Object.entries(withCoefficient).filter(([, v]) => v !== undefined)) as F;
}

/** Whether two SI elements are the same part but for their elevation (and `keep`): same kind, sizes within 1e-9 m. */
export function sameElement(a: Element, b: Element): boolean {
  if (partOf(a) !== partOf(b)) return false;
  const bottom = partOf(a).bottomField;
  const x = a as unknown as Record<string, unknown>;
  const y = b as unknown as Record<string, unknown>;
  return Object.keys(x).every((k) => {
    if (k === bottom || k === "keep") return true;
    const u = x[k];
    const v = y[k];
    return typeof u === "number" && typeof v === "number" ? Math.abs(u - v) < 1e-9 : JSON.stringify(u) === JSON.stringify(v);
  });
}

/** Every catalogue option of every kind the catalogue offers, kind by kind in the registry's order. */
export function catalogueOptions(context: OptionContext): PartOption[] {
  return PARTS.flatMap((p) => {
    const c = p.catalogue;
    if (!c || (c.listedAs !== null && !context.catalogue.weirShapes.includes(c.listedAs))) return [];
    return c.options(context);
  });
}

/** Whether the catalogue's form can express an element of this kind (else an existing one is kept as it is). */
export function inCatalogueForm(file: ElementFile): boolean {
  return partOf(file).catalogue !== null;
}

/** The kinds' methods and sources, once each (kinds may share one), in the registry's order. */
export function elementMethods(elements: readonly Element[]): Method[] {
  const used = new Set(elements.map((e) => partOf(e).method));
  return [...new Set(PARTS.map((p) => p.method))].filter((m) => used.has(m));
}

/** Villemonte's exponent of each weir kind, in words ("1.5 rectangular weir, 2.5 v-notch weir"). */
export const SUBMERGENCE_EXPONENTS = PARTS.flatMap((p) => (p.submergenceExponent === null ? [] : [`${p.submergenceExponent} ${p.name}`])).join(", ");

/** The kinds other than `part`'s that the catalogue offers options of, in the registry's order. */
export function otherKinds(part: AnyElementPart | ElementPart): readonly AnyElementPart[] {
  return PARTS.filter((p) => p !== part && p.catalogue !== null);
}
