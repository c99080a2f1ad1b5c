// The case file's field schemas that every section is built from (zod): numbers, lengths and flows
// with units, tables of rows, "exactly one of" rules, and how a value found in the file is shown in a
// message. On the ground floor, so that the loader (case/) and the outlet parts (parts/, whose schema
// fragments the loader assembles) share them. Numbers are in the case's units here.
import { z } from "zod";
import { FLOW_UNITS, isUsableNumber, LENGTH_UNITS, splitQuantity, USABLE_NUMBER } from "./units.js";

const LENGTH_EXPECTED = `a length: a number, or a number and a unit (${Object.keys(LENGTH_UNITS).join(", ")}) such as "6 in"`;

export const finite = z.number({ error: USABLE_NUMBER }).refine(isUsableNumber, { message: USABLE_NUMBER });

/** A number, or a string of a number and one of `units`; `expected` says what in messages. */
export function quantitySchema(units: Readonly<Record<string, number>>, expected: string, noun: string) {
  return z.union([finite, z.string()], { error: expected }).superRefine((value, ctx) => {
    if (typeof value === "number") return;
    const parts = splitQuantity(value, units);
    if ("error" in parts) {
      const example = expected.slice(expected.lastIndexOf("such as ") + 8);
      const message = parts.error.startsWith("a unit") ? `a ${noun} ${parts.error.slice(2)}, such as ${example}` : `${expected}; the number ${USABLE_NUMBER}`;
      ctx.addIssue({ code: "custom", message, input: value });
    }
  });
}
/** The number of a valid quantity (its sign is all the checks below need). */
export function quantityNumber(value: number | string, units: Readonly<Record<string, number>> | undefined): number {
  if (typeof value === "number") return value;
  if (!units) return NaN;
  const parts = splitQuantity(value, units);
  return "error" in parts ? NaN : parts.number;
}
/** The same, greater than zero. */
export function positiveQuantity(schema: ReturnType<typeof quantitySchema>, units: Readonly<Record<string, number>>, what: string) {
  return schema.superRefine((value, ctx) => {
    const n = quantityNumber(value, units);
    if (!Number.isNaN(n) && !(n > 0)) ctx.addIssue({ code: "custom", message: `${what} greater than zero`, input: value });
  });
}

/** A length: a bare number in the case's base unit or a string with a unit ("6 in", "150 mm"). */
export const lengthSchema = quantitySchema(LENGTH_UNITS, LENGTH_EXPECTED, "length");
export const positiveLength = positiveQuantity(lengthSchema, LENGTH_UNITS, "a length");
/** A flow: a bare number in cfs (US) or m3/s (SI), or "6.5 cfs", "184 L/s", "0.18 m3/s". */
export const flowSchema = quantitySchema(FLOW_UNITS, `a flow: a number, or a number and a unit (${Object.keys(FLOW_UNITS).join(", ")}) such as "6.5 cfs"`, "flow");
export type Quantity = number | string;
export type Length = z.infer<typeof lengthSchema>;
export const positive = finite.refine((v) => v > 0, { message: "a number greater than zero" });
export const nonNegative = finite.refine((v) => v >= 0, { message: "a number of zero or more" });
/** Whole numbers of 1 or more (a count of openings, of units). */
export const count = z.number().int({ message: "a whole number of 1 or more" }).min(1, { message: "a whole number of 1 or more" });
/** `keep: true`: the search keeps the part exactly as it is (value engineering). */
export const keep = z.boolean({ error: "true or false" }).optional();

/** Rows [x, y] strictly increasing in x, non-decreasing (unless `yAnyOrder`; optionally >= 0) in y; x or y may be a
 * quantity with units (`xUnits`, `yUnits`: a flow "184 L/s", an area "0.56 ac"). Two rows are
 * compared here when their cells carry the same unit; normalization compares the SI values of
 * rows in different units, which need the case's base units. */
export function table<X extends z.ZodType<Quantity>, Y extends z.ZodType<Quantity>>(
  xName: string,
  yName: string,
  xCell: X,
  yCell: Y,
  options: { yNonNegative?: boolean; minRows?: number; yAnyOrder?: boolean; xUnits?: Readonly<Record<string, number>>; yUnits?: Readonly<Record<string, number>> } = {},
) {
  const minRows = options.minRows ?? 2;
  const row = z.tuple([xCell, yCell], { error: `a pair [${xName}, ${yName}]` });
  return z.array(row, { error: `a table of [${xName}, ${yName}] rows` }).superRefine((rows, ctx) => {
    if (rows.length < minRows) {
      ctx.addIssue({ code: "custom", message: `at least ${minRows} rows of [${xName}, ${yName}]`, input: rows.length });
      return;
    }
    for (let i = 0; i < rows.length; i++) {
      const [x, y] = rows[i] as [Quantity, Quantity];
      if (options.yNonNegative && quantityNumber(y, options.yUnits) < 0) {
        ctx.addIssue({ code: "custom", path: [i, 1], message: `${yName} of zero or more`, input: y });
      }
      if (i === 0) continue;
      const [px, py] = rows[i - 1] as [Quantity, Quantity];
      if (sameUnit(x, px) && !(quantityNumber(x, options.xUnits) > quantityNumber(px, options.xUnits))) {
        ctx.addIssue({ code: "custom", path: [i, 0], message: `${xName} strictly increasing (row before has ${px})`, input: x });
      }
      if (!options.yAnyOrder && sameUnit(y, py) && quantityNumber(y, options.yUnits) < quantityNumber(py, options.yUnits)) {
        ctx.addIssue({ code: "custom", path: [i, 1], message: `${yName} not decreasing (row before has ${py})`, input: y });
      }
    }
  });
}

/** Whether two cells are both bare numbers or carry the same unit text. */
function sameUnit(a: Quantity, b: Quantity): boolean {
  const unit = (v: Quantity) => (typeof v === "number" ? "" : v.replace(/^[\s\d.eE+-]*/, "").trim().toLowerCase());
  return unit(a) === unit(b);
}

/** Exactly one of the listed keys must be present. */
export function exactlyOne<T extends Record<string, unknown>>(keys: string[], what: string) {
  return (value: T, ctx: z.RefinementCtx) => {
    const present = keys.filter((k) => value[k] !== undefined);
    if (present.length !== 1) {
      ctx.addIssue({
        code: "custom",
        message: `exactly one of ${keys.join(", ")} for the ${what}`,
        input: present.length === 0 ? "none of them" : present.join(" and "),
      });
    }
  };
}

/** A short printable form of a value found in the input. */
export function show(value: unknown): string {
  if (value === undefined) return "nothing";
  if (typeof value === "string") return JSON.stringify(value);
  if (typeof value === "number" || typeof value === "boolean" || value === null) return String(value);
  const text = JSON.stringify(value);
  return text.length > 60 ? text.slice(0, 57) + "..." : text;
}
