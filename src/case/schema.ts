// The case file's schema: the single source of the file's types (see the case-format contract).
// Numbers are in the case's units here; `normalize.ts` turns a parsed case into SI.
import { z } from "zod";
import { LENGTH_UNITS } from "../units.js";

const LENGTH_TEXT = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*([a-zA-Z]+)?\s*$/;
const LENGTH_EXPECTED = `a length: a number, or a number and a unit (${Object.keys(LENGTH_UNITS).join(", ")}) such as "6 in"`;

const finite = z.number({ error: "a finite number" }).refine(Number.isFinite, { message: "a finite number" });

/** A length: a bare number in the case's base unit or a string with a unit ("6 in", "150 mm"). */
export const lengthSchema = z.union([finite, z.string()], { error: LENGTH_EXPECTED }).superRefine((value, ctx) => {
  if (typeof value === "number") return;
  const match = LENGTH_TEXT.exec(value);
  if (!match) ctx.addIssue({ code: "custom", message: LENGTH_EXPECTED, input: value });
  else if (match[1] !== undefined && LENGTH_UNITS[match[1].toLowerCase()] === undefined) {
    const units = Object.keys(LENGTH_UNITS).join(", ");
    ctx.addIssue({ code: "custom", message: `a length unit among ${units} ("${match[1]}" is not one), such as "6 in"`, input: value });
  }
});
const positiveLength = lengthSchema.superRefine((value, ctx) => {
  const n = typeof value === "number" ? value : parseFloat(String(value));
  if (!(n > 0)) ctx.addIssue({ code: "custom", message: "a length greater than zero", input: value });
});
const positive = finite.refine((v) => v > 0, { message: "a number greater than zero" });
const nonNegative = finite.refine((v) => v >= 0, { message: "a number of zero or more" });
const pair = z.tuple([finite, finite], { error: "a pair of numbers [x, y]" });

/** Rows [x, y] strictly increasing in x, non-decreasing (and optionally >= 0) in y. */
function table(xName: string, yName: string, options: { yNonNegative?: boolean; minRows?: number } = {}) {
  const minRows = options.minRows ?? 2;
  return z.array(pair, { error: `a table of [${xName}, ${yName}] rows` }).superRefine((rows, ctx) => {
    if (rows.length < minRows) {
      ctx.addIssue({ code: "custom", message: `at least ${minRows} rows of [${xName}, ${yName}]`, input: rows.length });
      return;
    }
    for (let i = 0; i < rows.length; i++) {
      const [x, y] = rows[i];
      if (options.yNonNegative && y < 0) {
        ctx.addIssue({ code: "custom", path: [i, 1], message: `${yName} of zero or more`, input: y });
      }
      if (i === 0) continue;
      const [px, py] = rows[i - 1];
      if (!(x > px)) {
        ctx.addIssue({ code: "custom", path: [i, 0], message: `${xName} strictly increasing (row before has ${px})`, input: x });
      }
      if (y < py) {
        ctx.addIssue({ code: "custom", path: [i, 1], message: `${yName} not decreasing (row before has ${py})`, input: y });
      }
    }
  });
}

/** Exactly one of the listed keys must be present. */
function exactlyOne<T extends Record<string, unknown>>(keys: string[], what: string) {
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

export const storageSchema = z
  .object({
    prismoid: z
      .object({ length: positiveLength, width: positiveLength, sideSlope: nonNegative })
      .optional(),
    stageArea: table("elevation", "area", { yNonNegative: true }).optional(),
    stageStorage: table("elevation", "volume", { yNonNegative: true }).optional(),
  })
  .superRefine(exactlyOne(["prismoid", "stageArea", "stageStorage"], "storage"));

export const pondSchema = z.object({
  bottom: lengthSchema,
  top: lengthSchema,
  permanentPool: lengthSchema.optional(),
  storage: storageSchema,
});

export const tailwaterSchema = z
  .object({
    free: z.literal(true, { error: "true" }).optional(),
    elevation: lengthSchema.optional(),
    rating: table("flow", "elevation", { yNonNegative: false }).optional(),
  })
  .superRefine(exactlyOne(["free", "elevation", "rating"], "tailwater"));

export const inflowSchema = z
  .object({
    file: z.string({ error: "a file name (CSV relative to the case file)" }).min(1).optional(),
    series: z.array(pair, { error: "a list of [minutes, flow] pairs" }).optional(),
  })
  .superRefine(exactlyOne(["file", "series"], "inflow"));

export const stormSchema = z.object({
  name: z.string({ error: "a storm name" }).min(1, { message: "a non-empty storm name" }),
  returnPeriod: positive,
  target: nonNegative.optional(),
  inflow: inflowSchema,
});

export const criteriaSchema = z.object({
  tolerance: z
    .object({
      over: nonNegative.optional(),
      under: finite.refine((v) => v >= 0 && v <= 1, { message: "a fraction from 0 to 1" }).optional(),
    })
    .optional(),
  freeboard: z.object({ depth: lengthSchema.optional(), storm: z.string().optional() }).optional(),
  drawdown: z.object({ hours: positive.optional(), depth: lengthSchema.optional() }).optional(),
  spillway: z.object({ dryThrough: positive.optional() }).optional(),
});

const keep = z.boolean({ error: "true or false" }).optional();
const count = z.number().int({ message: "a whole number of 1 or more" }).min(1, { message: "a whole number of 1 or more" });

const circularOrificeSchema = z.object({
  type: z.literal("orifice"),
  shape: z.literal("circular"),
  diameter: positiveLength,
  count: count.optional(),
  invert: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
const rectangularOrificeSchema = z.object({
  type: z.literal("orifice"),
  shape: z.literal("rectangular"),
  width: positiveLength,
  height: positiveLength,
  count: count.optional(),
  invert: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
const rectangularWeirSchema = z.object({
  type: z.literal("weir"),
  shape: z.literal("rectangular"),
  length: positiveLength,
  crest: lengthSchema,
  endContractions: z.union([z.literal(0), z.literal(1), z.literal(2)], { error: "0, 1 or 2" }).optional(),
  coefficient: positive.optional(),
  keep,
});
const vNotchWeirSchema = z.object({
  type: z.literal("weir"),
  shape: z.literal("v-notch"),
  angle: finite.refine((a) => a > 0 && a < 180, { message: "an angle in degrees between 0 and 180" }),
  crest: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
const regulatorSchema = z.object({
  type: z.literal("regulator"),
  invert: lengthSchema,
  rating: table("head", "flow", { yNonNegative: true }),
  keep,
});

export const elementSchema = z.discriminatedUnion(
  "type",
  [
    z.discriminatedUnion("shape", [circularOrificeSchema, rectangularOrificeSchema], {
      error: 'an orifice shape: "circular" or "rectangular"',
    }),
    z.discriminatedUnion("shape", [rectangularWeirSchema, vNotchWeirSchema], {
      error: 'a weir shape: "rectangular" or "v-notch"',
    }),
    regulatorSchema,
  ],
  { error: 'an element type: "orifice", "weir" or "regulator"' },
);

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

export const ENTRANCES = [
  "concrete-square-headwall",
  "concrete-groove-headwall",
  "concrete-groove-projecting",
  "cmp-headwall",
  "cmp-mitered",
  "cmp-projecting",
  "box-wingwall-30-75",
  "box-wingwall-15-90",
] as const;

const barrelCommon = {
  length: positiveLength,
  inletInvert: lengthSchema,
  outletInvert: lengthSchema,
  manningN: positive,
  entrance: z.enum(ENTRANCES, { error: `an entrance among ${ENTRANCES.join(", ")}` }),
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

export const spillwaySchema = z.object({
  crest: lengthSchema,
  length: positiveLength,
  sideSlope: nonNegative,
  coefficient: positive.optional(),
  keep,
});

export const outletSchema = z.object({
  elements: z.array(elementSchema).optional(),
  riser: riserSchema.optional(),
  barrel: barrelSchema.optional(),
  spillway: spillwaySchema.optional(),
});

export const catalogueSchema = z.object({
  orifice: z
    .object({ diameters: z.array(positiveLength).min(1), maxCount: count.optional() })
    .optional(),
  weir: z
    .object({
      shapes: z.array(z.enum(["rectangular", "v-notch"], { error: '"rectangular" or "v-notch"' })).optional(),
      lengths: z.array(positiveLength).optional(),
      angles: z.array(finite.refine((a) => a > 0 && a < 180, { message: "an angle between 0 and 180 degrees" })).optional(),
    })
    .optional(),
  riser: z.object({ diameters: z.array(positiveLength).min(1) }).optional(),
  barrel: z.object({ diameters: z.array(positiveLength).min(1) }).optional(),
  maxStages: count.optional(),
  elevationStep: positiveLength.optional(),
});

export const costsSchema = z.record(z.string(), nonNegative, { error: "an object of cost weights (numbers)" });

export const caseSchema = z.object({
  name: z.string({ error: "a case name (text)" }),
  units: z.enum(["US", "SI"], { error: '"US" or "SI"' }),
  pond: pondSchema,
  tailwater: tailwaterSchema.optional(),
  storms: z.array(stormSchema, { error: "a list of storms" }).min(1, { message: "at least one storm" }),
  criteria: criteriaSchema.optional(),
  outlet: outletSchema.optional(),
  catalogue: catalogueSchema.optional(),
  costs: costsSchema.optional(),
});

export type CaseFile = z.infer<typeof caseSchema>;
export type ElementFile = z.infer<typeof elementSchema>;
export type OutletFile = z.infer<typeof outletSchema>;
export type RiserFile = z.infer<typeof riserSchema>;
export type BarrelFile = z.infer<typeof barrelSchema>;
export type SpillwayFile = z.infer<typeof spillwaySchema>;
export type StormFile = z.infer<typeof stormSchema>;
export type CatalogueFile = z.infer<typeof catalogueSchema>;
export type Length = z.infer<typeof lengthSchema>;
