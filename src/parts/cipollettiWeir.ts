// A Cipolletti weir: a trapezoidal sharp-crested notch whose sides incline outward at 1 horizontal to 4
// vertical, so that the widening of the notch makes up for the end contractions and the crest length L
// alone sets the flow: Q = C L H^1.5, C = 3.367 ft^0.5/s (USBR Water Measurement Manual, 3rd ed. 1997,
// rev. 2001, ch. 7 sec. 12, eq 7-7; velocity of approach neglected), 1.859 m^0.5/s in SI (the same
// coefficient: 3.367 x sqrt(0.3048 m/ft) = 1.8589). Accurate within 5 % for heads up to a third of the
// crest length (the same section, on its Table A7-5), and under the conditions of a standard
// contracted weir: heads of at least 0.2 ft (weir.ts) and the crest at least twice the head above the
// approach's bottom (from memory, ch. 7 sec. 10; the pond's floor here). Submerged by Villemonte's
// formula with n = 1.5, the exponent of its free-flow head law (Villemonte 1947, as documented for
// the Cassiopee hydraulic toolbox, "Villemonte 1947": n is the exponent of the free-flow relation).
import { z } from "zod";
import { keep, lengthSchema, positive, positiveLength } from "../fields.js";
import { baseWeirCoefficient, FOOT, toCaseUnits } from "../units.js";
import { villemonte } from "./submergence.js";
import { catalogueSteps, lowHeadWarnings, weirRowEnd } from "./weir.js";
import { lengthWords, written, type ElementPart, type PartOption } from "./part.js";

export interface CipollettiWeir {
  type: "weir";
  shape: "cipolletti";
  /** Crest length (m). */
  length: number;
  crest: number;
  /** SI (m^0.5/s). */
  coefficient: number;
  keep: boolean;
}

declare module "../model.js" {
  interface ElementKinds {
    "cipolletti weir": CipollettiWeir;
  }
}

const schema = z.object({
  type: z.literal("weir"),
  shape: z.literal("cipolletti"),
  length: positiveLength,
  crest: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
export type CipollettiWeirFile = z.infer<typeof schema>;

/** Q = C L H^1.5: 3.367 ft^0.5/s (USBR WMM ch. 7 eq 7-7), 1.859 m^0.5/s (the same, converted). */
export const CIPOLLETTI_COEFFICIENT = { US: 3.367, SI: 1.859 };
/** Horizontal run of each side per unit of rise: 1 H : 4 V. */
export const SIDE_SLOPE = 0.25;
/** The coefficient is stated within 5 % for heads up to this share of the crest length (USBR WMM ch. 7 sec. 12). */
export const CIPOLLETTI_MAX_HEAD_RATIO = 1 / 3;
/** The crest at least this many heads above the approach's bottom (standard contracted weir; from memory). */
export const CREST_HEIGHT_IN_HEADS = 2;

/** Top width of the notch at a head above its crest (m). */
function topWidth(e: CipollettiWeir, head: number): number {
  return e.length + 2 * SIDE_SLOPE * Math.max(head, 0);
}

export const cipollettiWeir: ElementPart<CipollettiWeir, CipollettiWeirFile> = {
  type: "weir",
  shape: "cipolletti",
  name: "Cipolletti weir",
  column: "Cipolletti",
  bottomField: "crest",
  schema,
  method: {
    part: "Cipolletti weir",
    method: "Q = C L H^1.5, sides 1 H : 4 V; default C 3.367 US / 1.859 SI; within 5 % for heads up to L/3",
    source: "USBR Water Measurement Manual (3rd ed., 1997, rev. 2001) ch. 7 sec. 12, eq 7-7",
  },
  submergenceExponent: 1.5,
  level: true,
  sweep: null,
  defaultCoefficient: (units) => CIPOLLETTI_COEFFICIENT[units],

  fileSizes: () => [],
  toSI(file, cv, path) {
    return {
      type: "weir",
      shape: "cipolletti",
      length: cv.length(file.length, `${path}.length`),
      crest: cv.length(file.crest, `${path}.crest`),
      coefficient: (file.coefficient ?? CIPOLLETTI_COEFFICIENT[cv.units]) * baseWeirCoefficient(cv.units),
      keep: file.keep ?? false,
    };
  },
  toFile(e, units) {
    const u = toCaseUnits(units);
    return { type: "weir", shape: "cipolletti", length: u.length(e.length), crest: u.length(e.crest), coefficient: u.weirCoefficient(e.coefficient), ...(e.keep ? { keep: true } : {}) };
  },

  flow(e, ws, ds) {
    const head = ws - e.crest;
    if (head <= 0 || ds >= ws) return 0;
    return villemonte(e.coefficient * e.length * head * Math.sqrt(head), head, ds - e.crest, 1.5);
  },

  bottom: (e) => e.crest,
  top: (e) => e.crest,
  widthAt: (e, stage) => (stage > e.crest ? topWidth(e, stage - e.crest) : 0),
  count: () => 1,
  outline: (e) => ({ kind: "notch", bottomWidth: e.length, spreadPerHeight: SIDE_SLOPE }),
  breaks(e, out) {
    out.push(e.crest);
  },

  warnings(e, { maxStage, floor }, f) {
    const head = maxStage - e.crest;
    const out = lowHeadWarnings(head, f);
    if (head > CIPOLLETTI_MAX_HEAD_RATIO * e.length) {
      out.push(`head ${f.length(head)} exceeds a third of the crest length (${f.length(CIPOLLETTI_MAX_HEAD_RATIO * e.length)}), the largest head the Cipolletti coefficient is stated for`);
    }
    if (head > 0 && e.crest - floor < CREST_HEIGHT_IN_HEADS * head) {
      out.push(`crest ${f.length(e.crest - floor)} above the pond floor, less than twice the head of ${f.length(head)}: the flow over it is not fully contracted, as the Cipolletti coefficient assumes`);
    }
    return out;
  },
  headLimit: (e, floor) => Math.min(CIPOLLETTI_MAX_HEAD_RATIO * e.length, (e.crest - floor) / CREST_HEIGHT_IN_HEADS),

  label: (e, f) => `${f.length(e.length)} Cipolletti weir`,
  describe: (e, f) => `${f.length(e.length)} Cipolletti weir at ${f.elevation(e.crest)}`,
  size: (e, f) => f.length(e.length),
  noun: () => "Cipolletti weir",
  row: (e, f) => ["Cipolletti weir", `${f.length(e.length)} crest, sides 1 H : 4 V`, ...weirRowEnd(e.crest, e.coefficient, f)],

  cost: (e, w) => w.weir + w.weirLength * e.length,
  // Its crest length, the narrowest width of the trapezoid.
  openingSize: (e) => e.length,
  clogged: (e, open) => ({ ...e, coefficient: e.coefficient * open }),
  dischargeCoefficient: () => null,

  catalogue: {
    listedAs: "cipolletti",
    listedByDefault: false,
    options(context) {
      return context.sizes(context.entries.weir?.lengths).map((w) => {
        const file: CipollettiWeirFile = { type: "weir", shape: "cipolletti", length: w.size, crest: 0, coefficient: CIPOLLETTI_COEFFICIENT[context.units] };
        return option(`cipolletti ${written(w.size)}`, file, w.sizeM, context.units, false);
      });
    },
    neighbours: (part, same) => catalogueSteps(part, same, (o) => o.sizeM),
    existing(file, context) {
      const key = `existing cipolletti ${written(file.length)} C ${file.coefficient ?? CIPOLLETTI_COEFFICIENT[context.units]}`;
      return option(key, file, context.length(file.length), context.units, true);
    },
  },
};

/** An option of `file` (its crest length `sizeM` in m); its wall width is the notch's at one foot of head. */
function option(key: string, file: CipollettiWeirFile, sizeM: number, units: "US" | "SI", existing: boolean): PartOption {
  return { key, part: cipollettiWeir, file, words: `${lengthWords(file.length, units)} Cipolletti weir`, count: 1, sizeM, height: 0, width: sizeM + 2 * SIDE_SLOPE * FOOT, existing };
}
