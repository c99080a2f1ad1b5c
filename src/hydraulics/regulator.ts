// A manufactured flow regulator given by its rating [head above invert, flow], interpolated by a
// monotone cubic (Fritsch-Carlson). Above the last point the flow grows as the square root of head
// from the last point (orifice-like), and the assessment warns. A downstream level above the
// invert reduces the head to WS - DS (case-format contract).
import type { Regulator } from "../model.js";
import { fritschCarlsonTangents, hermite } from "./monotoneCubic.js";

const tangents = new WeakMap<Regulator, Float64Array>();

export function regulatorFlow(r: Regulator, ws: number, ds: number): number {
  const head = ws - Math.max(r.invert, ds);
  if (head <= 0) return 0;
  const heads = r.heads;
  const flows = r.flows;
  const n = heads.length;
  if (head <= heads[0]) return heads[0] > 0 ? (flows[0] * head) / heads[0] : flows[0];
  if (head >= heads[n - 1]) return flows[n - 1] * Math.sqrt(head / heads[n - 1]);
  let m = tangents.get(r);
  if (!m) {
    m = fritschCarlsonTangents(heads, flows);
    tangents.set(r, m);
  }
  return hermite(heads, flows, m, head);
}

/** Largest head the regulator's rating covers. */
export function regulatorMaxHead(r: Regulator): number {
  return r.heads[r.heads.length - 1];
}
