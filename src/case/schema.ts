// The case file's schema: the single source of the file's types (see the case-format contract), built
// from the field schemas (src/fields.ts) and the outlet parts' fragments (src/parts/). Numbers are in
// the case's units here; `normalize.ts` turns a parsed case into SI.
import { z } from "zod";
import { AREA_UNITS, FLOW_UNITS, INTENSITY_UNITS, LENGTH_UNITS, UNIT_AREA_RATE_UNITS } from "../units.js";
import { count, exactlyOne, finite, flowSchema, lengthSchema, nonNegative, positive, positiveLength, positiveQuantity, quantityNumber, quantitySchema, table } from "../fields.js";
import { elementSchema, listedShapeSchema } from "../parts/registry.js";
import { riserSchema } from "../parts/riser.js";
import { barrelSchema } from "../parts/barrel.js";
import { spillwaySchema } from "../parts/spillway.js";
import { COST_KEYS } from "../parts/cost.js";
import { POND_COST_NAMES } from "../sizing/pondCost.js";

// The outlet parts' file types are the parts' own (src/parts/); named here with the rest of the file's.
export type { ElementFile } from "../parts/registry.js";
export type { RiserFile } from "../parts/riser.js";
export type { BarrelFile } from "../parts/barrel.js";
export type { SpillwayFile } from "../parts/spillway.js";
export type { Length } from "../fields.js";

/** A pond surface area: a bare number in ft2 (US) or m2 (SI), or "0.56 ac", "0.2 ha", "2300 m2". */
export const pondAreaSchema = quantitySchema(AREA_UNITS, `an area: a number, or a number and a unit (${Object.keys(AREA_UNITS).join(", ")}) such as "0.56 ac"`, "area");

const unitCount = z.number({ error: "a whole number of 1 or more" }).int({ message: "a whole number of 1 or more" }).min(1, { message: "a whole number of 1 or more" });
const voidRatio = finite.refine((v) => v > 0 && v < 1, { message: "a void ratio (porosity) greater than 0 and less than 1, e.g. 0.4" });

/** A rectangular stone bed around pipes or chambers; `bottom` and `top` default to the pond's. */
export const stoneSchema = z.object({
  voidRatio,
  length: positiveLength,
  width: positiveLength,
  bottom: lengthSchema.optional(),
  top: lengthSchema.optional(),
});

/** A structure rising above an underground system's top: the plan area of water inside it and its rim. */
export const risingStructureSchema = z.object({
  name: z.string({ error: "a name for the structure (text), e.g. \"MH-1\"" }).min(1, { message: "a non-empty name" }),
  area: positiveQuantity(pondAreaSchema, AREA_UNITS, "an area"),
  rim: lengthSchema,
});

/** Surface ponding above an underground system: its own stage-area rows and the highest level permitted. */
export const surfacePondingSchema = z.object({
  stageArea: table("elevation", "area", finite, pondAreaSchema, { yNonNegative: true, yUnits: AREA_UNITS }),
  limit: lengthSchema.optional(),
});

/** What an underground system holds above its top: nothing unless declared. */
const aboveTop = {
  structures: z.array(risingStructureSchema, { error: "a list of structures (name, area, rim)" }).optional(),
  surfacePonding: surfacePondingSchema.optional(),
};

/** Parallel pipes: inside diameter, length and count; `invert` (low end) defaults to pond.bottom. */
export const pipeGallerySchema = z.object({
  diameter: positiveLength,
  length: positiveLength,
  count: unitCount,
  slope: nonNegative.refine((v) => v < 1, { message: "a slope in ft/ft or m/m of 0 or more and less than 1" }).optional(),
  invert: lengthSchema.optional(),
  stone: stoneSchema.optional(),
  ...aboveTop,
});

/** Identical chambers from one unit's [height above its base, plan area of water inside] rows. */
export const chambersSchema = z.object({
  count: unitCount,
  stageArea: table("height", "area", finite, finite, { yNonNegative: true, yAnyOrder: true }),
  base: lengthSchema.optional(),
  stone: stoneSchema.optional(),
  ...aboveTop,
});

export const storageSchema = z
  .object({
    prismoid: z
      .object({ length: positiveLength, width: positiveLength, sideSlope: nonNegative })
      .optional(),
    stageArea: table("elevation", "area", finite, pondAreaSchema, { yNonNegative: true, yUnits: AREA_UNITS }).optional(),
    stageStorage: table("elevation", "volume", finite, finite, { yNonNegative: true }).optional(),
    pipeGallery: pipeGallerySchema.optional(),
    chambers: chambersSchema.optional(),
  })
  .superRefine(exactlyOne(["prismoid", "stageArea", "stageStorage", "pipeGallery", "chambers"], "storage"));


export const tailwaterSchema = z
  .object({
    free: z.literal(true, { error: "true" }).optional(),
    elevation: lengthSchema.optional(),
    rating: table("flow", "elevation", flowSchema, finite, { yNonNegative: false, xUnits: FLOW_UNITS }).optional(),
  })
  .superRefine(exactlyOne(["free", "elevation", "rating"], "tailwater"));

/** A hydrograph's source: a CSV file beside the case, or [minutes, flow] pairs. */
const hydrographSource = {
  file: z.string({ error: "a file name (CSV relative to the case file)" }).min(1).optional(),
  series: z.array(z.tuple([finite, flowSchema], { error: "a pair [minutes, flow]" }), { error: "a list of [minutes, flow] pairs" }).optional(),
};
export const inflowSchema = z.object(hydrographSource).superRefine(exactlyOne(["file", "series"], "inflow"));

/** A lag in minutes (zero or more): how much later a bypassing runoff reaches the point of analysis. */
const lagMinutes = finite.refine((v) => v >= 0 && v <= 1440, { message: "a lag in minutes from 0 to 1440" });

/**
 * Runoff that bypasses the pond and joins its outflow at the point of analysis (case-format contract,
 * "Bypass and the point of analysis"): the forms of an inflow, plus an optional `lag` (minutes, default 0).
 */
export const bypassSchema = z.object({ ...hydrographSource, lag: lagMinutes.optional() }).superRefine(exactlyOne(["file", "series"], "bypass"));

// --- hydrology: rainfall and watershed data from which storms derive inflows and targets ---

/** A watershed area: a bare number in acres (US) or hectares (SI), or "12 ac", "4.9 ha", "0.3 km2". */
const positiveArea = positiveQuantity(
  quantitySchema(AREA_UNITS, `an area: a number, or a number and a unit (${Object.keys(AREA_UNITS).join(", ")}) such as "12 ac"`, "area"),
  AREA_UNITS,
  "an area",
);
/** A rainfall depth: a bare number in inches (US) or millimetres (SI), or "3.2 in", "81 mm". */
export const depthSchema = quantitySchema(LENGTH_UNITS, `a depth: a number, or a number and a unit (${Object.keys(LENGTH_UNITS).join(", ")}) such as "3.2 in"`, "depth");
const positiveDepth = positiveQuantity(depthSchema, LENGTH_UNITS, "a depth");
/** A rainfall intensity: a bare number in in/h (US) or mm/h (SI), or "2.5 in/h", "60 mm/h". */
const positiveIntensity = positiveQuantity(
  quantitySchema(INTENSITY_UNITS, `an intensity: a number, or a number and a unit (${Object.keys(INTENSITY_UNITS).join(", ")}) such as "2.5 in/h"`, "intensity"),
  INTENSITY_UNITS,
  "an intensity",
);
const slope = finite.refine((v) => v > 0 && v <= 1, { message: "a slope in ft/ft or m/m greater than 0 and at most 1 (0.02 for 2 %)" });
const manningN = finite.refine((v) => v > 0 && v < 1, { message: "a Manning's n greater than 0 and less than 1" });
const curveNumber = finite.refine((v) => v >= 30 && v <= 100, { message: "a runoff curve number from 30 to 100" });
const runoffCoefficient = finite.refine((v) => v > 0 && v <= 1, { message: "a runoff coefficient greater than 0 and at most 1" });

export const flowSegmentSchema = z.discriminatedUnion(
  "type",
  [
    z.object({ type: z.literal("sheet"), length: positiveLength, slope, manningN }),
    z.object({
      type: z.literal("shallow"),
      length: positiveLength,
      slope,
      surface: z.enum(["paved", "unpaved"], { error: '"paved" or "unpaved"' }),
    }),
    z.object({ type: z.literal("channel"), length: positiveLength, slope, manningN, hydraulicRadius: positiveLength }),
  ],
  { error: 'a flow segment type: "sheet", "shallow" or "channel"' },
);

const fraction = finite.refine((v) => v >= 0 && v <= 1, { message: "a fraction from 0 to 1 (0.35 for 35 %)" });

/**
 * The runoff fields of an area or sub-area: an NRCS curve number (`curveNumber`, or a pervious curve
 * number with the impervious share, TR-55 ch. 2 Figures 2-3 and 2-4) and/or a rational runoff coefficient.
 */
const runoffFields = {
  curveNumber: curveNumber.optional(),
  perviousCurveNumber: curveNumber.optional(),
  /** Share of the area that is impervious (CN 98), 0 to 1. */
  impervious: fraction.optional(),
  /** Share of the impervious area that is not directly connected (it drains over pervious ground), 0 to 1. */
  unconnected: fraction.optional(),
  runoffCoefficient: runoffCoefficient.optional(),
};
type RunoffFields = { curveNumber?: number; perviousCurveNumber?: number; impervious?: number; unconnected?: number; runoffCoefficient?: number };

/** The runoff fields agree: one way to the curve number, the impervious share with a pervious number. */
function runoffFieldsAgree(what: string) {
  return (part: RunoffFields, ctx: z.RefinementCtx) => {
    if (part.curveNumber !== undefined && part.perviousCurveNumber !== undefined) {
      ctx.addIssue({ code: "custom", path: ["perviousCurveNumber"], message: "either curveNumber or perviousCurveNumber with impervious, not both", input: part.perviousCurveNumber });
    }
    if ((part.perviousCurveNumber === undefined) !== (part.impervious === undefined)) {
      const missing = part.impervious === undefined ? "impervious" : "perviousCurveNumber";
      const message = missing === "impervious" ? "the impervious share (0 to 1) with perviousCurveNumber (TR-55 ch. 2)" : "the pervious curve number with impervious (TR-55 ch. 2)";
      ctx.addIssue({ code: "custom", path: [missing], message, input: undefined });
    }
    if (part.unconnected !== undefined && part.impervious === undefined) {
      ctx.addIssue({ code: "custom", path: ["unconnected"], message: "an unconnected share only with impervious and perviousCurveNumber", input: part.unconnected });
    }
    if (part.curveNumber === undefined && part.perviousCurveNumber === undefined && part.runoffCoefficient === undefined) {
      ctx.addIssue({ code: "custom", message: `a curveNumber (or perviousCurveNumber with impervious) or a runoffCoefficient for the ${what}`, input: "neither" });
    }
  };
}

const subAreaSchema = z.object({ name: z.string().optional(), area: positiveArea, ...runoffFields }).superRefine(runoffFieldsAgree("sub-area"));

/** One drainage area: size, runoff parameters and Tc (the shape without its checks, so others may extend it). */
const catchmentShape = {
  area: positiveArea.optional(),
  ...runoffFields,
  parts: z.array(subAreaSchema, { error: "a list of sub-areas" }).min(1, { message: "at least one sub-area" }).optional(),
  tc: positive.optional(),
  flowPath: z.array(flowSegmentSchema, { error: "a list of flow segments" }).min(1, { message: "at least one flow segment" }).optional(),
  watershedLag: z.object({ flowLength: positiveLength, slope }).optional(),
};
type CatchmentFields = RunoffFields & { area?: number | string; parts?: unknown[]; tc?: number; flowPath?: unknown[]; watershedLag?: unknown };

function catchmentAgrees(c: CatchmentFields, ctx: z.RefinementCtx): void {
  exactlyOne(["tc", "flowPath", "watershedLag"], "time of concentration")(c, ctx);
  if (c.parts !== undefined) {
    const extra = (["area", "curveNumber", "perviousCurveNumber", "impervious", "unconnected", "runoffCoefficient"] as const).filter((k) => c[k] !== undefined);
    if (extra.length > 0) {
      ctx.addIssue({ code: "custom", message: "either parts or the area with its runoff fields, not both", input: `parts and ${extra.join(", ")}` });
    }
  } else {
    if (c.area === undefined) ctx.addIssue({ code: "custom", path: ["area"], message: "an area (or a list of parts)", input: undefined });
    runoffFieldsAgree("area")(c, ctx);
  }
}

/** One drainage area (before or after development): size, runoff parameters and Tc. */
export const catchmentSchema = z.object(catchmentShape).superRefine(catchmentAgrees);

/** A drainage area whose runoff bypasses the pond: a drainage area plus its `lag` (minutes, default 0) to the point. */
export const bypassAreaSchema = z.object({ ...catchmentShape, lag: lagMinutes.optional() }).superRefine(catchmentAgrees);

/** A further point of analysis in the hydrology: the areas draining to it before and after development. */
export const hydrologyPointSchema = z.object({
  name: z.string({ error: "the name of the point of analysis" }).min(1, { message: "a non-empty name" }),
  pre: catchmentSchema.optional(),
  post: bypassAreaSchema.optional(),
  pond: z.boolean({ error: "true or false" }).optional(),
});

/** A rainfall intensity-duration relation for the rational method. */
export const idfSchema = z
  .object({
    table: z
      .array(z.tuple([positive, positiveIntensity], { error: "a pair [minutes, intensity]" }), { error: "a table of [minutes, intensity] rows" })
      .min(2, { message: "at least two [minutes, intensity] rows" })
      .optional(),
    formula: z.object({ a: positive, b: nonNegative, c: positive }).optional(),
  })
  .superRefine(exactlyOne(["table", "formula"], "IDF curve"));

export const hydrologySchema = z.object({
  pre: catchmentSchema.optional(),
  post: catchmentSchema.optional(),
  /** A system of ponds: the post-development drainage area of each pond, by the name of the pond it drains to. */
  ponds: z.record(z.string(), catchmentSchema, { error: "an object from pond name to the drainage area that drains to it" }).optional(),
  twoYearRainfall: positiveDepth.optional(),
  initialAbstractionRatio: z.union([z.literal(0.2), z.literal(0.05)], { error: "0.2 or 0.05" }).optional(),
  peakRateFactor: finite.refine((v) => v >= 100 && v <= 700, { message: "a peak rate factor from 100 to 700 (484 standard)" }).optional(),
  idf: z.record(z.string(), idfSchema, { error: "an object of named IDF curves" }).optional(),
  /** The area after development whose runoff bypasses the pond and joins its outflow at the point of analysis. */
  bypass: bypassAreaSchema.optional(),
  /** Further points of analysis (a site that drains two ways), each with its own areas. */
  points: z.array(hydrologyPointSchema, { error: "a list of points of analysis" }).min(1, { message: "at least one point" }).optional(),
  /** NRCS runoff of areas with sub-areas: one composite curve number (TR-55 worksheet 2), or each part separately. */
  runoffMethod: z.enum(["composite", "separate"], { error: '"composite" (TR-55 composite curve number) or "separate" (pervious and impervious runoff computed separately)' }).optional(),
  /** NRCS unit duration: "standard" (the largest step <= 0.133 Tc on the rainfall's step), "converged" (halved until the peak settles), or minutes. */
  unitDuration: z
    .union([z.enum(["standard", "converged"]), positive], { error: '"standard" (at most 0.133 Tc, NEH 630 ch. 16), "converged", or a number of minutes' })
    .optional(),
});

export const DISTRIBUTION_NAMES = ["I", "IA", "II", "III"] as const;

/** A storm's rainfall: an NRCS 24-hour depth and distribution, a hyetograph, or an IDF curve by name. */
export const rainfallSchema = z
  .object({
    depth: positiveDepth.optional(),
    distribution: z.enum(DISTRIBUTION_NAMES, { error: 'an NRCS 24-hour distribution: "I", "IA", "II" or "III"' }).optional(),
    hyetograph: z
      .array(z.tuple([finite, depthSchema], { error: "a pair [minutes, cumulative depth]" }), { error: "a list of [minutes, cumulative depth] pairs" })
      .min(2, { message: "at least two [minutes, cumulative depth] points" })
      .optional(),
    idf: z.string({ error: "the name of a curve in hydrology.idf" }).min(1).optional(),
  })
  .superRefine((r, ctx) => {
    exactlyOne(["distribution", "hyetograph", "idf"], "rainfall")(r, ctx);
    if (r.distribution !== undefined && r.depth === undefined) {
      ctx.addIssue({ code: "custom", path: ["depth"], message: "the 24-hour rainfall depth for the distribution", input: undefined });
    }
    if (r.distribution === undefined && r.depth !== undefined) {
      ctx.addIssue({ code: "custom", path: ["depth"], message: "no depth here: a hyetograph carries its own depths, an IDF curve its intensities", input: r.depth });
    }
  });

/** Free-text source of a rule (an ordinance clause, a design manual section), shown with its checks. */
const sourceLabel = z.string({ error: "a free-text source label such as \"county ordinance 4.2\"" }).min(1, { message: "a non-empty source label" }).optional();

/** Exfiltration into the ground at a design infiltration rate over the wetted bottom (and sides when asked). */
export const exfiltrationSchema = z.object({
  rate: positiveIntensity,
  sides: z.boolean({ error: "true or false" }).optional(),
  drainHours: positive.optional(),
  source: sourceLabel,
});

export const pondSchema = z.object({
  bottom: lengthSchema,
  top: lengthSchema,
  permanentPool: lengthSchema.optional(),
  storage: storageSchema,
  exfiltration: exfiltrationSchema.optional(),
});

const nonNegativeFlow = flowSchema.superRefine((value, ctx) => {
  const n = quantityNumber(value, FLOW_UNITS);
  if (!Number.isNaN(n) && !(n >= 0)) ctx.addIssue({ code: "custom", message: "a flow of zero or more", input: value });
});

/**
 * One allowable-release form of a storm (several may be given; the smallest governs): a flow, a share
 * of the pre-development peak, or a release per unit of area over a stated area.
 */
export const releaseLimitSchema = z
  .object({
    flow: nonNegativeFlow.optional(),
    shareOfPre: finite.refine((v) => v > 0 && v <= 1, { message: "a fraction greater than 0 and at most 1" }).optional(),
    prePeak: nonNegativeFlow.optional(),
    perArea: positiveQuantity(
      quantitySchema(UNIT_AREA_RATE_UNITS, `a release per area: a number, or a number and a unit (cfs/ac, L/s/ha, m3/s/ha) such as "0.04 cfs/ac"`, "release-per-area"),
      UNIT_AREA_RATE_UNITS,
      "a release per area",
    ).optional(),
    area: positiveArea.optional(),
    belowPreHydrograph: z.literal(true, { error: "true" }).optional(),
    preHydrograph: inflowSchema.optional(),
    source: sourceLabel,
  })
  .superRefine(exactlyOne(["flow", "shareOfPre", "perArea", "belowPreHydrograph"], "release limit"))
  .superRefine((limit, ctx) => {
    if (limit.perArea !== undefined && limit.area === undefined) {
      ctx.addIssue({ code: "custom", path: ["area"], message: 'the area the release per area applies to, such as "12 ac"', input: undefined });
    }
    if (limit.perArea === undefined && limit.area !== undefined) {
      ctx.addIssue({ code: "custom", path: ["area"], message: "an area only with perArea", input: limit.area });
    }
    if (limit.belowPreHydrograph === undefined && limit.preHydrograph !== undefined) {
      ctx.addIssue({ code: "custom", path: ["preHydrograph"], message: "a pre-development hydrograph only with belowPreHydrograph", input: "given" });
    }
    if (limit.shareOfPre === undefined && limit.prePeak !== undefined) {
      ctx.addIssue({ code: "custom", path: ["prePeak"], message: "a pre-development peak only with shareOfPre", input: limit.prePeak });
    }
  });

/**
 * A further point of analysis of a storm (a site that drains two ways): its allowable peak, the runoff
 * joining there, and whether the pond's outflow reaches it (default false). `bypass` keeps the storm's
 * meaning: the pond's own point of analysis.
 */
export const stormPointSchema = z.object({
  name: z.string({ error: "the name of the point of analysis" }).min(1, { message: "a non-empty name" }),
  target: positiveQuantity(flowSchema, FLOW_UNITS, "an allowable peak at the point").optional(),
  targetSource: sourceLabel,
  bypass: bypassSchema.optional(),
  pond: z.boolean({ error: "true or false" }).optional(),
});

export const stormSchema = z
  .object({
    name: z.string({ error: "a storm name" }).min(1, { message: "a non-empty storm name" }),
    returnPeriod: positive,
    target: positiveQuantity(flowSchema, FLOW_UNITS, "an allowable peak outflow").optional(),
    releaseLimits: z.array(releaseLimitSchema, { error: "a list of release limits" }).min(1, { message: "at least one release limit" }).optional(),
    targetSource: sourceLabel,
    inflow: inflowSchema.optional(),
    /** A system of ponds: each pond's own inflow, by pond name (a pond not named has none). */
    inflows: z.record(z.string(), inflowSchema, { error: "an object from pond name to an inflow (file or series)" }).optional(),
    /** A system of ponds: allowable peak outflow of named ponds' outlets (outfit's addition; the target applies at the outfall). */
    pondTargets: z
      .record(z.string(), positiveQuantity(flowSchema, FLOW_UNITS, "an allowable peak outflow"), { error: "an object from pond name to an allowable peak outflow" })
      .optional(),
    rainfall: rainfallSchema.optional(),
    bypass: bypassSchema.optional(),
    points: z.array(stormPointSchema, { error: "a list of further points of analysis" }).min(1, { message: "at least one point" }).optional(),
  })
  .superRefine((storm, ctx) => {
    if (storm.inflow === undefined && storm.rainfall === undefined && storm.inflows === undefined) {
      ctx.addIssue({ code: "custom", path: ["inflow"], message: "an inflow, or a rainfall to derive it from the hydrology section", input: undefined });
    }
  });

export const criteriaSchema = z.object({
  tolerance: z
    .object({
      over: nonNegative.optional(),
      under: finite.refine((v) => v >= 0 && v <= 1, { message: "a fraction from 0 to 1" }).optional(),
    })
    .optional(),
  freeboard: z.object({ depth: lengthSchema.optional(), storm: z.string().optional(), source: sourceLabel }).optional(),
  drawdown: z.object({ hours: positive.optional(), depth: lengthSchema.optional(), source: sourceLabel }).optional(),
  spillway: z.object({ dryThrough: positive.optional(), source: sourceLabel }).optional(),
  /** The principal outlet blocked: the spillway alone must pass `storm` with `freeboard` (default freeboard.depth). */
  blockedOutlet: z.object({ storm: z.string({ error: "the name of a storm" }), freeboard: lengthSchema.optional(), source: sourceLabel }).optional(),
  /** An assumed blocked share of the openings' open area, applied to every "at most" check or to the named kinds. */
  clogging: z
    .object({
      fraction: finite.refine((v) => v > 0 && v < 1, { message: "a fraction greater than 0 and less than 1 (0.5 for 50 %)" }),
      checks: z.array(z.string(), { error: "a list of check kinds" }).min(1, { message: "at least one check kind" }).optional(),
      source: sourceLabel,
    })
    .optional(),
  /** Extended detention: a storm or a water-quality volume takes at least `hours` to release `share` of itself. */
  extendedDetention: z
    .array(
      z
        .object({
          storm: z.string({ error: "the name of a storm" }).optional(),
          volume: finite.refine((v) => v > 0, { message: "a volume greater than zero (ft3 or m3)" }).optional(),
          depth: positiveQuantity(lengthSchema, LENGTH_UNITS, "a depth").optional(),
          area: positiveArea.optional(),
          hours: positive,
          share: finite.refine((v) => v > 0 && v <= 1, { message: "a fraction greater than 0 and at most 1" }).optional(),
          source: sourceLabel,
        })
        .superRefine(exactlyOne(["storm", "volume", "depth"], "extended-detention rule (a storm, a volume, or a depth over an area)"))
        .superRefine((r, ctx) => {
          if ((r.depth === undefined) !== (r.area === undefined)) {
            ctx.addIssue({ code: "custom", path: [r.depth === undefined ? "depth" : "area"], message: "a depth and an area together (a water-quality depth over its area)", input: undefined });
          }
        }),
      { error: "a list of extended-detention rules" },
    )
    .optional(),
  /** The smallest opening the rules permit (each kind's size: an orifice's diameter or smaller side, a weir's length, a notch's width one minimum above its vertex). */
  minimumOpening: z.object({ size: positiveLength, source: sourceLabel }).optional(),
  /** Overtopping check's source label (the check itself always applies). */
  overtopping: z.object({ source: sourceLabel }).optional(),
  /**
   * Buildable geometry (defaults from common practice): the clear web between openings on one wall and
   * to a box's corners, the least spacing of distinct control levels, the least distance of weir crests
   * and the tops of holes below the rim, and the usable width of a headwall without a riser.
   */
  buildability: z
    .object({
      web: positiveLength.optional(),
      levelSpacing: positiveLength.optional(),
      rimClearance: positiveLength.optional(),
      headwallWidth: positiveLength.optional(),
      source: sourceLabel,
    })
    .optional(),
});

export const outletSchema = z.object({
  elements: z.array(elementSchema).optional(),
  riser: riserSchema.optional(),
  barrel: barrelSchema.optional(),
  spillway: spillwaySchema.optional(),
});

/** One pond of a system: its name, geometry and outlet, and where the outlet drains (another pond's name or "outfall"). */
export const systemPondSchema = z.object({
  name: z.string({ error: "a pond name (text)" }).min(1, { message: "a non-empty pond name" }),
  pond: pondSchema,
  outlet: outletSchema,
  to: z.string({ error: 'another pond\'s name or "outfall"' }).min(1, { message: 'another pond\'s name or "outfall"' }),
});

export const catalogueSchema = z.object({
  orifice: z
    .object({ diameters: z.array(positiveLength).min(1), maxCount: count.optional() })
    .optional(),
  weir: z
    .object({
      shapes: z.array(listedShapeSchema).optional(),
      lengths: z.array(positiveLength).optional(),
      angles: z.array(finite.refine((a) => a > 0 && a < 180, { message: "an angle between 0 and 180 degrees" })).optional(),
    })
    .optional(),
  riser: z.object({ diameters: z.array(positiveLength).min(1) }).optional(),
  barrel: z.object({ diameters: z.array(positiveLength).min(1) }).optional(),
  maxStages: count.optional(),
  elevationStep: positiveLength.optional(),
});

/** Site limits from which outfit sizes a pond (the pond field may then be left out). */
export const siteSchema = z.object({
  floor: lengthSchema.optional(),
  maxDepth: positiveLength,
  existingGrade: lengthSchema.optional(),
  embankment: z.object({ maxHeight: lengthSchema.optional(), topWidth: lengthSchema.optional(), outsideSlope: nonNegative.optional() }).optional(),
  groundwater: z.object({ seasonalHigh: lengthSchema, separation: lengthSchema.optional() }).optional(),
  outfallInvert: lengthSchema.optional(),
  outfallFall: lengthSchema.optional(),
  depthStep: positiveLength.optional(),
  exfiltration: exfiltrationSchema.optional(),
  sideSlope: nonNegative.optional(),
  lengthToWidth: positive.optional(),
  maxTopLength: positiveLength.optional(),
  maxTopWidth: positiveLength.optional(),
  maxTopArea: positiveArea.optional(),
  permanentPool: z
    .object({ depth: positiveLength.optional(), volume: positive.optional() })
    .superRefine(exactlyOne(["depth", "volume"], "permanent pool"))
    .optional(),
  shape: z.object({ stageArea: table("depth", "area", finite, finite, { yNonNegative: true }) }).optional(),
  step: positive.optional(),
});


/** The cost proxy's weights (parts/cost.ts holds their defaults and meaning); each optional. */
export const costsSchema = z.object(
  Object.fromEntries([...COST_KEYS, ...POND_COST_NAMES].map((name) => [name, nonNegative.optional()])) as Record<(typeof COST_KEYS)[number] | (typeof POND_COST_NAMES)[number], z.ZodOptional<typeof nonNegative>>,
  { error: "an object of cost weights (numbers)" },
);

/** Optional project facts for the review report's project block; all free text. */
const projectText = z.string({ error: "text" });
export const projectSchema = z.object(
  {
    name: projectText.optional(),
    number: projectText.optional(),
    client: projectText.optional(),
    location: projectText.optional(),
    jurisdiction: projectText.optional(),
    engineer: projectText.optional(),
    revision: projectText.optional(),
  },
  { error: "an object of project facts (name, number, client, location, jurisdiction, engineer, revision)" },
);

export const caseSchema = z.object({
  /** The JSON Schema the file names for editor completion (`outfit schema`); not used otherwise. */
  $schema: z.string({ error: "the address of a JSON Schema (text)" }).optional(),
  name: z.string({ error: "a case name (text)" }),
  units: z.enum(["US", "SI"], { error: '"US" or "SI"' }),
  pond: pondSchema.optional(),
  /** A system of ponds joined by their outlets, instead of `pond` and `outlet`. */
  ponds: z.array(systemPondSchema, { error: "a list of ponds (name, pond, outlet, to)" }).min(1, { message: "at least one pond" }).optional(),
  site: siteSchema.optional(),
  tailwater: tailwaterSchema.optional(),
  storms: z.array(stormSchema, { error: "a list of storms" }).min(1, { message: "at least one storm" }),
  criteria: criteriaSchema.optional(),
  outlet: outletSchema.optional(),
  catalogue: catalogueSchema.optional(),
  costs: costsSchema.optional(),
  hydrology: hydrologySchema.optional(),
  project: projectSchema.optional(),
});

export type CaseFile = z.infer<typeof caseSchema>;
export type OutletFile = z.infer<typeof outletSchema>;
export type SystemPondFile = z.infer<typeof systemPondSchema>;
export type PondFile = z.infer<typeof pondSchema>;
export type StormFile = z.infer<typeof stormSchema>;
export type CatalogueFile = z.infer<typeof catalogueSchema>;
export type StorageFile = z.infer<typeof storageSchema>;
export type StoneFile = z.infer<typeof stoneSchema>;
export type ExfiltrationFile = z.infer<typeof exfiltrationSchema>;
export type SiteFile = z.infer<typeof siteSchema>;
export type HydrologyFile = z.infer<typeof hydrologySchema>;
export type CatchmentFile = z.infer<typeof catchmentSchema>;
export type RainfallFile = z.infer<typeof rainfallSchema>;
export type BypassFile = z.infer<typeof bypassSchema>;
export type BypassAreaFile = z.infer<typeof bypassAreaSchema>;
export type StormPointFile = z.infer<typeof stormPointSchema>;
export type ProjectFile = z.infer<typeof projectSchema>;
