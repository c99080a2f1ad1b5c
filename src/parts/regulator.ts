// A manufactured flow regulator (vortex or other) at an invert, given by the maker's rating [head above
// invert, flow], interpolated by a monotone cubic (Fritsch-Carlson). Above the last point the flow
// grows as the square root of head from the last point (orifice-like), and the assessment warns. A
// downstream level above the invert reduces the head to WS - DS (case-format contract). The catalogue
// offers none: an existing one is kept as it is.
import { z } from "zod";
import { finite, flowSchema, keep, lengthSchema, show, table } from "../fields.js";
import { baseLength, FLOW_UNITS, toCaseUnits } from "../units.js";
import { fritschCarlsonTangents, hermite } from "./monotoneCubic.js";
import type { ElementPart } from "./part.js";

export interface Regulator {
  type: "regulator";
  invert: number;
  /** Rating points: head above invert (m) and flow (m3/s). */
  heads: number[];
  flows: number[];
  keep: boolean;
}

declare module "../model.js" {
  interface ElementKinds {
    regulator: Regulator;
  }
}

const schema = z.object({
  type: z.literal("regulator"),
  invert: lengthSchema,
  rating: table("head", "flow", finite, flowSchema, { yNonNegative: true, yUnits: FLOW_UNITS }),
  keep,
});
export type RegulatorFile = z.infer<typeof schema>;

const tangents = new WeakMap<Regulator, Float64Array>();

/** Largest head the regulator's rating covers. */
export function regulatorMaxHead(r: Regulator): number {
  return r.heads[r.heads.length - 1];
}

/** The size a regulator is drawn at on its wall (m): its rating gives none (a small housing, about 1 ft; common practice). */
const DRAWN_SIZE = 0.3;

export const regulator: ElementPart<Regulator, RegulatorFile> = {
  type: "regulator",
  shape: null,
  name: "flow regulator",
  column: "regulator",
  bottomField: "invert",
  schema,
  method: { part: "regulator", method: "maker's rating, monotone cubic interpolation", source: "Fritsch & Carlson (1980), SIAM J. Numer. Anal. 17(2)" },
  submergenceExponent: null,
  level: false,
  catalogue: null,
  sweep: null,
  defaultCoefficient: () => null,

  fileSizes: () => [],
  toSI(file, cv, path) {
    const L = baseLength(cv.units);
    if (file.rating[0][0] < 0) cv.problem(`${path}.rating[0][0]`, show(file.rating[0][0]), "a head of zero or more");
    return {
      type: "regulator",
      invert: cv.length(file.invert, `${path}.invert`),
      heads: file.rating.map((r) => r[0] * L),
      flows: cv.increasing(file.rating.map((r, i) => cv.flowOf(r[1], `${path}.rating[${i}][1]`)), false, "flow", (i) => ({ path: `${path}.rating[${i}][1]`, found: file.rating[i][1] })),
      keep: file.keep ?? false,
    };
  },
  toFile(e, units) {
    const u = toCaseUnits(units);
    return { type: "regulator", invert: u.length(e.invert), rating: e.heads.map((h, i) => [u.length(h), u.flow(e.flows[i])] as [number, number]), ...(e.keep ? { keep: true } : {}) };
  },

  flow(e, ws, ds) {
    const head = ws - Math.max(e.invert, ds);
    if (head <= 0) return 0;
    const heads = e.heads;
    const flows = e.flows;
    const n = heads.length;
    if (head <= heads[0]) return heads[0] > 0 ? (flows[0] * head) / heads[0] : flows[0];
    if (head >= heads[n - 1]) return flows[n - 1] * Math.sqrt(head / heads[n - 1]);
    let m = tangents.get(e);
    if (!m) {
      m = fritschCarlsonTangents(heads, flows);
      tangents.set(e, m);
    }
    return hermite(heads, flows, m, head);
  },

  bottom: (e) => e.invert,
  top: (e) => e.invert,
  widthAt: () => 0,
  count: () => 1,
  outline: () => ({ kind: "device", width: DRAWN_SIZE, height: DRAWN_SIZE }),
  breaks(e, out) {
    out.push(e.invert, ...e.heads.map((h) => e.invert + h));
  },

  warnings(e, { maxStage }, f) {
    const head = maxStage - e.invert;
    return head > regulatorMaxHead(e) ? [`head ${f.length(head)} is above the rating's last point (${f.length(regulatorMaxHead(e))}); flow extrapolated as the square root of head`] : [];
  },
  headLimit: () => null,

  label: () => "regulator",
  describe: (e, f) => `regulator at ${f.elevation(e.invert)}`,
  size: (e, f) => `rated to ${f.flow(e.flows[e.flows.length - 1])}`,
  noun: () => "regulator",
  row: (e, f) => ["flow regulator", `rating of ${e.heads.length} points to ${f.length(e.heads[e.heads.length - 1])} of head`, `invert ${f.elevation(e.invert)}`, "maker's rating"],

  cost: () => 0,
  // A manufactured device: its throat is the maker's to state against the rule.
  openingSize: () => null,
  clogged: (e, open) => ({ ...e, flows: e.flows.map((q) => q * open) }),
  dischargeCoefficient: () => null,
};
