// A v-notch (triangular) sharp-crested weir of a given notch angle. Flow: Q = C tan(angle/2) H^2.5
// (HEC-22 eq 8-23), default C 2.50 US / 1.38 SI; Villemonte's reduction with n = 2.5 (the exponent of
// its head law) when the downstream level stands above the crest.
import { z } from "zod";
import { finite, keep, lengthSchema, positive } from "../fields.js";
import { baseWeirCoefficient, FOOT, toCaseUnits } from "../units.js";
import { trimNumber } from "../format.js";
import { villemonte } from "./submergence.js";
import { catalogueSteps, lowHeadWarnings, weirRowEnd } from "./weir.js";
import type { ElementPart, PartOption } from "./part.js";

export interface VNotchWeir {
  type: "weir";
  shape: "v-notch";
  /** Notch angle, degrees. */
  angle: number;
  crest: number;
  /** SI (m^0.5/s). */
  coefficient: number;
  keep: boolean;
}

declare module "../model.js" {
  interface ElementKinds {
    "v-notch weir": VNotchWeir;
  }
}

const schema = z.object({
  type: z.literal("weir"),
  shape: z.literal("v-notch"),
  angle: finite.refine((a) => a > 0 && a < 180, { message: "an angle in degrees between 0 and 180" }),
  crest: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
export type VNotchWeirFile = z.infer<typeof schema>;

/** V-notch weir Q = C tan(angle/2) H^2.5: 2.50 US, 1.38 SI (HEC-22 eq 8-23). */
const COEFFICIENT = { US: 2.5, SI: 1.38 };
/** V-notch (Kindsvater-Shen) heads up to 1.25 ft = 0.38 m (USBR WMM eq 7-3 limits; from memory). */
export const VNOTCH_MAX_HEAD = 1.25 * FOOT;
/** Kindsvater-Shen notch angles 20 to 100 degrees (ISO 1438). */
export const VNOTCH_ANGLES = [20, 100] as const;

/** tan(angle / 2). */
function halfTangent(angle: number): number {
  return Math.tan((angle * Math.PI) / 360);
}

export const vNotchWeir: ElementPart<VNotchWeir, VNotchWeirFile> = {
  type: "weir",
  shape: "v-notch",
  name: "v-notch weir",
  column: "v-notch",
  bottomField: "crest",
  schema,
  method: { part: "v-notch weir", method: "Q = C tan(angle/2) H^2.5; default C 2.50 US / 1.38 SI", source: "FHWA HEC-22 (3rd ed., 2009) eq 8-23" },
  submergenceExponent: 2.5,
  level: true,
  sweep: null,
  defaultCoefficient: (units) => COEFFICIENT[units],

  fileSizes: () => [],
  toSI(file, cv, path) {
    return { type: "weir", shape: "v-notch", angle: file.angle, crest: cv.length(file.crest, `${path}.crest`), coefficient: (file.coefficient ?? COEFFICIENT[cv.units]) * baseWeirCoefficient(cv.units), keep: file.keep ?? false };
  },
  toFile(e, units) {
    const u = toCaseUnits(units);
    return { type: "weir", shape: "v-notch", angle: e.angle, crest: u.length(e.crest), coefficient: u.weirCoefficient(e.coefficient), ...(e.keep ? { keep: true } : {}) };
  },

  flow(e, ws, ds) {
    const head = ws - e.crest;
    if (head <= 0 || ds >= ws) return 0;
    const free = e.coefficient * Math.tan((e.angle * Math.PI) / 360) * head * head * Math.sqrt(head);
    return villemonte(free, head, ds - e.crest, 2.5);
  },

  bottom: (e) => e.crest,
  top: (e) => e.crest,
  widthAt: (e, stage) => 2 * Math.max(stage - e.crest, 0) * halfTangent(e.angle),
  count: () => 1,
  outline: (e) => ({ kind: "notch", bottomWidth: 0, spreadPerHeight: halfTangent(e.angle) }),
  breaks(e, out) {
    out.push(e.crest);
  },

  warnings(e, { maxStage }, f) {
    const head = maxStage - e.crest;
    const out = lowHeadWarnings(head, f);
    if (head > VNOTCH_MAX_HEAD) out.push(`head ${f.length(head)} exceeds ${f.length(VNOTCH_MAX_HEAD)}, the largest head the v-notch coefficient covers`);
    if (e.angle < VNOTCH_ANGLES[0] || e.angle > VNOTCH_ANGLES[1]) out.push(`notch angle ${e.angle} degrees is outside 20 to 100 degrees`);
    return out;
  },
  headLimit: () => VNOTCH_MAX_HEAD,

  label: (e) => `${e.angle} degree v-notch weir`,
  describe: (e, f) => `${e.angle} deg v-notch at ${f.elevation(e.crest)}`,
  size: (e) => `${e.angle} deg`,
  noun: () => "v-notch",
  row: (e, f) => ["v-notch weir", `${trimNumber(e.angle, 2)} degree notch`, ...weirRowEnd(e.crest, e.coefficient, f)],

  cost: (_, w) => w.weir,
  // Its width one minimum opening above the vertex, 2 m tan(angle/2): a notch narrower than that at
  // that height closes to a slot below the size the rule permits.
  openingSize: (e, minimum) => 2 * minimum * halfTangent(e.angle),
  clogged: (e, open) => ({ ...e, coefficient: e.coefficient * open }),
  dischargeCoefficient: () => null,

  catalogue: {
    listedAs: "v-notch",
    listedByDefault: true,
    options: (context) => context.catalogue.weirAngles.map((angle) => option(`v-notch ${angle}`, { type: "weir", shape: "v-notch", angle, crest: 0, coefficient: COEFFICIENT[context.units] }, false)),
    neighbours: (part, same) => catalogueSteps(part, same, (o) => (o.file as VNotchWeirFile).angle),
    existing: (file, context) => option(`existing v-notch ${file.angle} C ${file.coefficient ?? COEFFICIENT[context.units]}`, file, true),
  },
};

/** An option of `file`; its wall width is the notch's at one foot of head. */
function option(key: string, file: VNotchWeirFile, existing: boolean): PartOption {
  return { key, part: vNotchWeir, file, words: `${file.angle} deg v-notch`, count: 1, sizeM: 0, height: 0, width: 2 * 0.3048 * Math.tan((file.angle * Math.PI) / 360), existing };
}
