// Lists the fields of a JSON value that its schema does not know (typos such as "permanentpool"),
// so they can be reported instead of silently dropped.
import type { z } from "zod";
import { jsonPath } from "./errors.js";

type AnySchema = z.core.$ZodType;

export function unknownFields(schema: AnySchema, value: unknown): string[] {
  const found: string[] = [];
  walk(schema, value, [], found);
  return found;
}

function walk(schema: AnySchema, value: unknown, path: PropertyKey[], found: string[]): void {
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
      for (const [key, child] of Object.entries(value)) {
        // Fields named "//..." are comments (the starter case explains its fields with them).
        if (key.startsWith("//")) continue;
        if (shape[key] === undefined) {
          const near = Object.keys(shape).find((k) => k.toLowerCase() === key.toLowerCase());
          found.push(jsonPath([...path, key]) + (near ? ` (did you mean ${near}?)` : ""));
        } else walk(shape[key], child, [...path, key], found);
      }
      return;
    }
    case "array":
      if (Array.isArray(value)) value.forEach((item, i) => walk(def.element as AnySchema, item, [...path, i], found));
      return;
    case "union": {
      // Follow the first option that accepts the value.
      const options = def.options as AnySchema[];
      const match = options.find((option) => (option as unknown as z.ZodType).safeParse(value).success);
      if (match) walk(match, value, path, found);
      return;
    }
    default:
      return;
  }
}
