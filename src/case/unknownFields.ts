// Lists the fields of a JSON value that its schema does not know, driven by the schema's own keys
// (so fields added to the schema are covered without change here). A field within a small edit
// distance of a known one at the same place ("freeboard.dept", "drawdown.hour", "coefficent") is a
// misspelling: the check it names would silently disappear, so it is an error with "did you mean".
// Other unknown fields are notes.
import type { z } from "zod";
import { jsonPath } from "./errors.js";
import { own } from "../own.js";

type AnySchema = z.core.$ZodType;

export interface UnknownField {
  /** JSON path of the field, e.g. "criteria.drawdown.hour". */
  path: string;
  key: string;
  /** The known field it is most likely a misspelling of, if any. */
  near: string | null;
}

export function unknownFields(schema: AnySchema, value: unknown): UnknownField[] {
  const found: UnknownField[] = [];
  walk(schema, value, [], found);
  return found;
}

/** The known key closest to `key` within the misspelling distance, or null. */
export function nearestKey(key: string, known: readonly string[]): string | null {
  let best: string | null = null;
  let bestDistance = Infinity;
  const lower = key.toLowerCase();
  for (const candidate of known) {
    const distance = editDistance(lower, candidate.toLowerCase());
    // No edit for names of one or two letters, one up to five, two from six (case alone counts 0).
    const shorter = Math.min(key.length, candidate.length);
    const allowed = shorter >= 6 ? 2 : shorter >= 3 ? 1 : 0;
    if (distance <= allowed && distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}

/** Optimal string alignment distance (Damerau-Levenshtein with adjacent transpositions). */
export function editDistance(a: string, b: string): number {
  if (Math.abs(a.length - b.length) > 2) return 3;
  const rows = a.length + 1;
  const cols = b.length + 1;
  const d: number[] = new Array<number>(rows * cols).fill(0);
  for (let i = 0; i < rows; i++) d[i * cols] = i;
  for (let j = 0; j < cols; j++) d[j] = j;
  for (let i = 1; i < rows; i++) {
    for (let j = 1; j < cols; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(d[(i - 1) * cols + j] + 1, d[i * cols + j - 1] + 1, d[(i - 1) * cols + j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[(i - 2) * cols + j - 2] + 1);
      d[i * cols + j] = v;
    }
  }
  return d[rows * cols - 1];
}

function walk(schema: AnySchema, value: unknown, path: PropertyKey[], found: UnknownField[]): void {
  const def = schema._zod.def as unknown as Record<string, unknown> & { type: string };
  switch (def.type) {
    case "optional":
    case "nullable":
    case "default":
    case "readonly":
      walk(def.innerType as AnySchema, value, path, found);
      return;
    case "pipe":
      walk(def.in as AnySchema, value, path, found);
      return;
    case "object": {
      if (typeof value !== "object" || value === null || Array.isArray(value)) return;
      const shape = def.shape as Record<string, AnySchema>;
      const known = Object.keys(shape);
      for (const [key, child] of Object.entries(value)) {
        // Fields named "//..." are comments (the starter case explains its fields with them).
        if (key.startsWith("//")) continue;
        const field = own(shape, key);
        if (field === undefined) found.push({ path: jsonPath([...path, key]), key, near: nearestKey(key, known.filter((k) => !Object.prototype.hasOwnProperty.call(value, k))) });
        else walk(field, child, [...path, key], found);
      }
      return;
    }
    case "array":
      if (Array.isArray(value)) value.forEach((item, i) => walk(def.element as AnySchema, item, [...path, i], found));
      return;
    case "tuple":
      if (Array.isArray(value)) (def.items as AnySchema[]).forEach((item, i) => walk(item, value[i], [...path, i], found));
      return;
    case "record":
      if (typeof value === "object" && value !== null && !Array.isArray(value)) {
        for (const [key, child] of Object.entries(value)) walk(def.valueType as AnySchema, child, [...path, key], found);
      }
      return;
    case "union": {
      // Follow the first option that accepts the value; when none does (a misspelling of a required
      // field makes every option fail), the option the value's discriminator or most keys point to.
      const options = def.options as AnySchema[];
      const match = options.find((option) => (option as unknown as z.ZodType).safeParse(value).success) ?? closestOption(options, value);
      if (match) walk(match, value, path, found);
      return;
    }
    default:
      return;
  }
}

/** The object option sharing the most keys with the value (a tie or no object: none). */
function closestOption(options: AnySchema[], value: unknown): AnySchema | undefined {
  if (typeof value !== "object" || value === null || Array.isArray(value)) return undefined;
  options = options.flatMap(flattenUnion);
  let best: AnySchema | undefined;
  let bestScore = 0;
  let tie = false;
  for (const option of options) {
    const shape = objectShape(option);
    if (!shape) continue;
    let score = 0;
    for (const [key, v] of Object.entries(value)) {
      const field = own(shape, key);
      if (field === undefined) continue;
      // A literal discriminator ("type": "orifice") that does not match rules the option out.
      const literal = (field._zod.def as unknown as { type: string; values?: unknown[] });
      if (literal.type === "literal" && !(literal.values ?? []).includes(v)) {
        score = -1;
        break;
      }
      score += 1;
    }
    if (score > bestScore) {
      best = option;
      bestScore = score;
      tie = false;
    } else if (score === bestScore) tie = true;
  }
  return tie ? undefined : best;
}

/** A union's object options, nested unions (a discriminated union of them) included. */
function flattenUnion(schema: AnySchema): AnySchema[] {
  const def = schema._zod.def as unknown as Record<string, unknown> & { type: string };
  return def.type === "union" ? (def.options as AnySchema[]).flatMap(flattenUnion) : [schema];
}

function objectShape(schema: AnySchema): Record<string, AnySchema> | undefined {
  const def = schema._zod.def as unknown as Record<string, unknown> & { type: string };
  if (def.type === "object") return def.shape as Record<string, AnySchema>;
  if (def.type === "optional" || def.type === "nullable" || def.type === "readonly") return objectShape(def.innerType as AnySchema);
  if (def.type === "pipe") return objectShape(def.in as AnySchema);
  return undefined;
}
