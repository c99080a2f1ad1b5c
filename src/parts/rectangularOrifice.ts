// A rectangular orifice: `count` identical openings `width` wide and `height` high side by side at one
// invert. Flow: the orifice equation integrated over the wetted rectangle (closed form,
// orificeIntegral.ts; HEC-22 eq 8-17), default Cd 0.61. The catalogue offers none: an existing one is
// kept as it is.
import { z } from "zod";
import { keep, count, lengthSchema, positiveLength, positive } from "../fields.js";
import { toCaseUnits } from "../units.js";
import { rectangularOpeningIntegral, SQRT_2G } from "./orificeIntegral.js";
import { ORIFICE_COEFFICIENT, ORIFICE_METHOD, orificeCost, orificeFields, orifices, orificeRowEnd, orificeWarnings } from "./orifice.js";
import { smallSize, type ElementPart } from "./part.js";

export interface RectangularOrifice {
  type: "orifice";
  shape: "rectangular";
  width: number;
  height: number;
  count: number;
  invert: number;
  coefficient: number;
  keep: boolean;
}

declare module "../model.js" {
  interface ElementKinds {
    "rectangular orifice": RectangularOrifice;
  }
}

const schema = z.object({
  type: z.literal("orifice"),
  shape: z.literal("rectangular"),
  width: positiveLength,
  height: positiveLength,
  count: count.optional(),
  invert: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
export type RectangularOrificeFile = z.infer<typeof schema>;

export const rectangularOrifice: ElementPart<RectangularOrifice, RectangularOrificeFile> = {
  type: "orifice",
  shape: "rectangular",
  name: "rectangular orifice",
  column: "orifice",
  bottomField: "invert",
  schema,
  method: ORIFICE_METHOD,
  submergenceExponent: null,
  level: true,
  catalogue: null,
  sweep: null,
  defaultCoefficient: () => ORIFICE_COEFFICIENT,

  fileSizes: (file) => [
    { field: "width", value: file.width, what: "wide orifice", intoBarrel: false },
    { field: "height", value: file.height, what: "high orifice", intoBarrel: true },
  ],
  toSI(file, cv, path) {
    const common = orificeFields(file, cv, path);
    return { type: "orifice", shape: "rectangular", width: cv.length(file.width, `${path}.width`), height: cv.length(file.height, `${path}.height`), ...common };
  },
  toFile(e, units) {
    const u = toCaseUnits(units);
    return { type: "orifice", shape: "rectangular", width: smallSize(e.width, units), height: smallSize(e.height, units), count: e.count, invert: u.length(e.invert), coefficient: e.coefficient, ...(e.keep ? { keep: true } : {}) };
  },

  flow(e, ws, ds) {
    if (ws <= e.invert || ds >= ws) return 0;
    return e.count * e.coefficient * SQRT_2G * rectangularOpeningIntegral(e.width, e.height, e.invert, ws, ds);
  },

  bottom: (e) => e.invert,
  top: (e) => e.invert + e.height,
  widthAt: (e, stage) => (stage > e.invert && stage < e.invert + e.height ? e.count * e.width : 0),
  count: (e) => e.count,
  outline: (e) => ({ kind: "rectangle", width: e.width, height: e.height }),
  breaks(e, out) {
    out.push(e.invert, e.invert + e.height);
  },

  warnings: (e) => orificeWarnings(e.coefficient),
  headLimit: () => null,

  label: (e, f) => `${e.count} x ${f.size(e.width)} x ${f.size(e.height)} rectangular orifice`,
  describe: (e, f) => `${e.count} x ${f.size(e.width)} x ${f.size(e.height)} rectangular ${orifices(e.count)} at ${f.elevation(e.invert)}`,
  size: (e, f) => `${e.count} x ${f.size(e.width)} x ${f.size(e.height)}`,
  noun: (e) => `rectangular ${orifices(e.count)}`,
  row: (e, f) => ["rectangular orifice", `${e.count} x ${f.size(e.width)} wide x ${f.size(e.height)} high`, ...orificeRowEnd(e.invert, e.coefficient, f)],

  cost: (e, w) => orificeCost(e.count, Math.max(e.width, e.height), w),
  openingSize: (e) => Math.min(e.width, e.height),
  clogged: (e, open) => ({ ...e, coefficient: e.coefficient * open }),
  dischargeCoefficient: (e) => e.coefficient,
};
