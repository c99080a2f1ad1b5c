// A circular orifice: `count` identical round openings side by side at one invert. Flow: the orifice
// equation integrated over the wetted circle (orificeIntegral.ts; HEC-22 eq 8-17), default Cd 0.61.
import { z } from "zod";
import { keep, count, lengthSchema, positiveLength, positive } from "../fields.js";
import { toCaseUnits, type UnitSystem } from "../units.js";
import { circularOpeningIntegral, SHORT_RULE, SHORT_RULE_COVER, SQRT_2G } from "./orificeIntegral.js";
import { wettedCircleTabulated } from "./circleTable.js";
import { ORIFICE_COEFFICIENT, ORIFICE_METHOD, orificeCost, orificeFields, orifices, orificeRowEnd, orificeWarnings } from "./orifice.js";
import { lengthWords, smallSize, written, type ElementPart, type PartOption } from "./part.js";

export interface CircularOrifice {
  type: "orifice";
  shape: "circular";
  diameter: number;
  count: number;
  invert: number;
  coefficient: number;
  keep: boolean;
}

declare module "../model.js" {
  interface ElementKinds {
    "circular orifice": CircularOrifice;
  }
}

const schema = z.object({
  type: z.literal("orifice"),
  shape: z.literal("circular"),
  diameter: positiveLength,
  count: count.optional(),
  invert: lengthSchema,
  coefficient: positive.optional(),
  keep,
});
export type CircularOrificeFile = z.infer<typeof schema>;

/** Cd count sqrt(2g): the factor of one element's integral. */
function factor(e: CircularOrifice): number {
  return e.count * e.coefficient * SQRT_2G;
}

export const circularOrifice: ElementPart<CircularOrifice, CircularOrificeFile> = {
  type: "orifice",
  shape: "circular",
  name: "circular orifice",
  column: "orifice",
  bottomField: "invert",
  schema,
  method: ORIFICE_METHOD,
  submergenceExponent: null,
  level: true,
  defaultCoefficient: () => ORIFICE_COEFFICIENT,

  fileSizes: (file) => [{ field: "diameter", value: file.diameter, what: "orifice", intoBarrel: true }],
  toSI(file, cv, path) {
    const common = orificeFields(file, cv, path);
    return { type: "orifice", shape: "circular", diameter: cv.length(file.diameter, `${path}.diameter`), ...common };
  },
  toFile(e, units) {
    const u = toCaseUnits(units);
    return { type: "orifice", shape: "circular", diameter: smallSize(e.diameter, units), count: e.count, invert: u.length(e.invert), coefficient: e.coefficient, ...(e.keep ? { keep: true } : {}) };
  },

  flow(e, ws, ds) {
    if (ws <= e.invert || ds >= ws) return 0;
    return factor(e) * circularOpeningIntegral(e.diameter, e.invert, ws, ds);
  },
  // The rating sweep's forms (hydraulics/openingsSweep.ts): the free flow from the dimensionless
  // table (circleTable.ts), the drowned flow under a surface over the whole opening by the short rule.
  sweep: {
    free: (e, ws) => (ws > e.invert ? factor(e) * wettedCircleTabulated(e.diameter, ws - e.invert) : 0),
    drowned(e, ws, ds) {
      if (ws < e.invert + (1 + SHORT_RULE_COVER) * e.diameter) return circularOrifice.flow(e, ws, ds);
      return ds < ws ? factor(e) * circularOpeningIntegral(e.diameter, e.invert, ws, ds, SHORT_RULE) : 0;
    },
  },

  bottom: (e) => e.invert,
  top: (e) => e.invert + e.diameter,
  widthAt(e, stage) {
    const r = e.diameter / 2;
    const y = stage - (e.invert + r);
    return Math.abs(y) < r ? e.count * 2 * Math.sqrt(r * r - y * y) : 0;
  },
  count: (e) => e.count,
  outline: (e) => ({ kind: "circle", diameter: e.diameter }),
  breaks(e, out) {
    out.push(e.invert, e.invert + e.diameter);
  },

  warnings: (e) => orificeWarnings(e.coefficient),
  headLimit: () => null,

  label: (e, f) => `${e.count} x ${f.size(e.diameter)} circular orifice`,
  describe: (e, f) => `${e.count} x ${f.size(e.diameter)} ${orifices(e.count)} at ${f.elevation(e.invert)}`,
  size: (e, f) => `${e.count} x ${f.size(e.diameter)}`,
  noun: (e) => orifices(e.count),
  row: (e, f) => ["circular orifice", `${e.count} x ${f.size(e.diameter)} diameter`, ...orificeRowEnd(e.invert, e.coefficient, f)],

  cost: (e, w) => orificeCost(e.count, e.diameter, w),
  openingSize: (e) => e.diameter,
  clogged: (e, open) => ({ ...e, coefficient: e.coefficient * open }),
  dischargeCoefficient: (e) => e.coefficient,

  catalogue: {
    listedAs: null,
    listedByDefault: true,
    options(context) {
      const options: PartOption[] = [];
      for (const d of context.sizes(context.entries.orifice?.diameters)) {
        for (let n = 1; n <= context.catalogue.maxCount; n++) {
          const file: CircularOrificeFile = { type: "orifice", shape: "circular", diameter: d.size, count: n, invert: 0, coefficient: ORIFICE_COEFFICIENT };
          options.push(option(`orifice ${n} x ${written(d.size)}`, file, d.sizeM, context.units, false));
        }
      }
      return options;
    },
    // The next diameter down and up with as many openings, one opening fewer and one more.
    neighbours(part, same) {
      const out: PartOption[] = [];
      const sizes = [...new Set(same.map((o) => o.sizeM))].sort((a, b) => a - b);
      const at = sizes.indexOf(part.sizeM);
      for (const size of [sizes[at - 1], sizes[at + 1]]) {
        const o = same.find((x) => x.sizeM === size && x.count === part.count);
        if (o) out.push(o);
      }
      for (const n of [part.count - 1, part.count + 1]) {
        const o = same.find((x) => x.sizeM === part.sizeM && x.count === n);
        if (o) out.push(o);
      }
      return out;
    },
    existing(file, context) {
      const n = file.count ?? 1;
      const key = `existing orifice ${n} x ${written(file.diameter)} Cd ${file.coefficient ?? ORIFICE_COEFFICIENT}`;
      return option(key, file, context.length(file.diameter), context.units, true);
    },
  },
};

/** An option of `file` (its diameter `sizeM` in m). */
function option(key: string, file: CircularOrificeFile, sizeM: number, units: UnitSystem, existing: boolean): PartOption {
  const n = file.count ?? 1;
  return { key, part: circularOrifice, file, words: `${n} x ${lengthWords(file.diameter, units)} ${orifices(n)}`, count: n, sizeM, height: sizeM, width: n * sizeM, existing };
}
