// A rectangular sharp-crested weir of length L with n end contractions (0, 1 or 2). Flow: the Francis
// form Q = C (L - 0.1 n H) H^1.5 (HEC-22 eqs 8-19/8-20; Francis 1883), default C 3.33 US / 1.84 SI
// (HEC-22 eq 8-19, H/Hc < 0.3); Villemonte's reduction (n = 1.5) when the downstream level stands
// above the crest. The search's catalogue weirs are contracted at both ends.
import { z } from "zod";
import { keep, lengthSchema, positiveLength, positive } from "../fields.js";
import { baseWeirCoefficient, toCaseUnits } from "../units.js";
import { villemonte } from "./submergence.js";
import { catalogueSteps, lowHeadWarnings, weirRowEnd } from "./weir.js";
import { lengthWords, written, type ElementPart, type PartOption } from "./part.js";

export interface RectangularWeir {
  type: "weir";
  shape: "rectangular";
  length: number;
  crest: number;
  endContractions: 0 | 1 | 2;
  /** Francis coefficient, SI (m^0.5/s). */
  coefficient: number;
  keep: boolean;
}

declare module "../model.js" {
  interface ElementKinds {
    "rectangular weir": RectangularWeir;
  }
}

const schema = z.object({
  type: z.literal("weir"),
  shape: z.literal("rectangular"),
  length: positiveLength,
  crest: lengthSchema,
  endContractions: z.union([z.literal(0), z.literal(1), z.literal(2)], { error: "0, 1 or 2" }).optional(),
  coefficient: positive.optional(),
  keep,
});
export type RectangularWeirFile = z.infer<typeof schema>;

/** Francis coefficient: 3.33 ft^0.5/s, 1.84 m^0.5/s (HEC-22 eq 8-19, H/Hc < 0.3). */
const FRANCIS = { US: 3.33, SI: 1.84 };
/** Fully contracted rectangular weir: h/b <= 0.5 (ISO 1438 practical limits; from memory). */
export const CONTRACTED_WEIR_MAX_HEAD_RATIO = 0.5;

/**
 * Head above which the contracted Francis formula would start to decrease with head
 * (dQ/dH = 0 at H = 6 L / n); the flow is held there so that the rating never falls.
 */
export function francisHeadLimit(w: RectangularWeir): number {
  return w.endContractions === 0 ? Infinity : (6 * w.length) / w.endContractions;
}

/** " (2 end contractions)", or nothing without. */
function contractions(e: RectangularWeir): string {
  return e.endContractions ? ` (${e.endContractions} end contraction${e.endContractions > 1 ? "s" : ""})` : "";
}

export const rectangularWeir: ElementPart<RectangularWeir, RectangularWeirFile> = {
  type: "weir",
  shape: "rectangular",
  name: "rectangular weir",
  column: "weir",
  bottomField: "crest",
  schema,
  method: { part: "rectangular weir", method: "Francis Q = C (L - 0.1 n H) H^1.5; default C 3.33 US / 1.84 SI", source: "FHWA HEC-22 (3rd ed., 2009) eqs 8-19, 8-20" },
  submergenceExponent: 1.5,
  level: true,
  sweep: null,
  defaultCoefficient: (units) => FRANCIS[units],

  fileSizes: () => [],
  toSI(file, cv, path) {
    return {
      type: "weir",
      shape: "rectangular",
      length: cv.length(file.length, `${path}.length`),
      crest: cv.length(file.crest, `${path}.crest`),
      endContractions: file.endContractions ?? 0,
      coefficient: (file.coefficient ?? FRANCIS[cv.units]) * baseWeirCoefficient(cv.units),
      keep: file.keep ?? false,
    };
  },
  toFile(e, units) {
    const u = toCaseUnits(units);
    return { type: "weir", shape: "rectangular", length: u.length(e.length), crest: u.length(e.crest), endContractions: e.endContractions, coefficient: u.weirCoefficient(e.coefficient), ...(e.keep ? { keep: true } : {}) };
  },

  flow(e, ws, ds) {
    const head = ws - e.crest;
    if (head <= 0 || ds >= ws) return 0;
    const h = Math.min(head, francisHeadLimit(e));
    const free = e.coefficient * (e.length - 0.1 * e.endContractions * h) * h * Math.sqrt(h);
    return villemonte(free, head, ds - e.crest, 1.5);
  },

  bottom: (e) => e.crest,
  top: (e) => e.crest,
  widthAt: (e, stage) => (stage > e.crest ? e.length : 0),
  count: () => 1,
  outline: (e) => ({ kind: "notch", bottomWidth: e.length, spreadPerHeight: 0 }),
  breaks(e, out) {
    out.push(e.crest);
  },

  warnings(e, { maxStage }, f) {
    const head = maxStage - e.crest;
    const out = lowHeadWarnings(head, f);
    if (e.endContractions > 0 && head > CONTRACTED_WEIR_MAX_HEAD_RATIO * e.length) {
      out.push(`head ${f.length(head)} exceeds half the weir length: the end contractions take away more than the Francis formula covers`);
    }
    return out;
  },
  headLimit: (e) => (e.endContractions > 0 ? CONTRACTED_WEIR_MAX_HEAD_RATIO * e.length : Infinity),

  label: (e, f) => `${f.length(e.length)} rectangular weir`,
  describe: (e, f) => `${f.length(e.length)} weir${contractions(e)} at ${f.elevation(e.crest)}`,
  size: (e, f) => `${f.length(e.length)}${contractions(e)}`,
  noun: () => "weir",
  row: (e, f) => ["rectangular weir", `${f.length(e.length)} long, ${e.endContractions} end contraction${e.endContractions === 1 ? "" : "s"}`, ...weirRowEnd(e.crest, e.coefficient, f)],

  cost: (e, w) => w.weir + w.weirLength * e.length,
  // Its crest length (the water passes the whole length at any head).
  openingSize: (e) => e.length,
  clogged: (e, open) => ({ ...e, coefficient: e.coefficient * open }),
  dischargeCoefficient: () => null,

  catalogue: {
    listedAs: "rectangular",
    listedByDefault: true,
    options(context) {
      return context.sizes(context.entries.weir?.lengths).map((w) => {
        const file: RectangularWeirFile = { type: "weir", shape: "rectangular", length: w.size, crest: 0, endContractions: 2, coefficient: FRANCIS[context.units] };
        return option(`weir ${written(w.size)}`, file, w.sizeM, context.units, false);
      });
    },
    neighbours: (part, same) => catalogueSteps(part, same, (o) => o.sizeM),
    existing(file, context) {
      const key = `existing weir ${written(file.length)} n ${file.endContractions ?? 0} C ${file.coefficient ?? FRANCIS[context.units]}`;
      return option(key, file, context.length(file.length), context.units, true);
    },
  },
};

function option(key: string, file: RectangularWeirFile, sizeM: number, units: "US" | "SI", existing: boolean): PartOption {
  return { key, part: rectangularWeir, file, words: `${lengthWords(file.length, units)} weir`, count: 1, sizeM, height: 0, width: sizeM, existing };
}
