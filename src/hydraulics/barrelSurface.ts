// A barrel's headwater as a function of its flow and of a tailwater that keeps changing (a pond
// downstream, or the chamber a reversed barrel discharges into): a table over flow and tailwater,
// for the link between two ponds (link.ts), where a curve per tailwater level (barrelCurve.ts, some
// tens of milliseconds each) would be built for every node of the link's table.
//
// Nodes: flows 0, then geometric (ratio FLOW_RATIO) from the largest flow the barrel passes at the
// highest level considered (free outfall, times 1.5) down over six decades; tailwaters evenly from the
// barrel's outlet invert (at or below it the tailwater changes nothing: the free outfall's values, as
// the HDS-5 forms give them) to the highest level, with the outlet's crown inserted. Headwater (the
// exact pointwise HDS-5 value, `barrelHeadwater`) is made non-decreasing in flow at each tailwater by
// its running maximum, as the curve is. Between nodes it is bilinear in flow and tailwater; a flow for
// a headwater is found on the tailwater's interpolated column (which rises with flow) and interpolated
// linearly there. Drowned, HW = TW + losses(Q) is linear in the tailwater, so the interpolation across
// tailwaters keeps the square-root law of a flow driven by a small difference of levels.
import type { Barrel } from "../model.js";
import { barrelRise } from "../parts/barrel.js";
import { barrelHeadwater, exactBarrelFlow } from "./barrel.js";

/** Ratio of neighbouring flow nodes. */
const FLOW_RATIO = 1.1;
/** Decades of flow below the largest that the geometric nodes span. */
const FLOW_DECADES = 6;
/** Tailwater intervals from the outlet invert to PART_FULL_RISES rises above it (where a part-full
 * barrel's profile makes the headwater bend with the tailwater), and from there to the highest level. */
const PART_FULL_INTERVALS = 60;
const PART_FULL_RISES = 1.5;
const DROWNED_INTERVALS = 40;

export class BarrelSurface {
  /** Flow nodes (m3/s): 0, then increasing. */
  readonly flows: Float64Array;
  /** Tailwater nodes (m), increasing from the barrel's outlet invert. */
  readonly tailwaters: Float64Array;
  /** Headwater above the inlet invert (m) at [n * flows.length + m], non-decreasing in m. */
  readonly heads: Float64Array;
  private readonly scratch: Float64Array;

  constructor(readonly barrel: Barrel, highest: number) {
    const outletInvert = barrel.outletInvert;
    const top = Math.max(highest, outletInvert + barrelRise(barrel)) + 1e-6;
    const largest = 1.5 * Math.max(exactBarrelFlow(barrel, Math.max(highest, barrel.inletInvert + barrelRise(barrel)), -Infinity), 1e-9);
    const flows = [0];
    for (let q = largest * Math.pow(10, -FLOW_DECADES); q < largest * FLOW_RATIO; q *= FLOW_RATIO) flows.push(q);
    const levels: number[] = [];
    const partFull = outletInvert + PART_FULL_RISES * barrelRise(barrel);
    for (let i = 0; i <= PART_FULL_INTERVALS; i++) levels.push(outletInvert + (i * (partFull - outletInvert)) / PART_FULL_INTERVALS);
    if (top > partFull) for (let i = 1; i <= DROWNED_INTERVALS; i++) levels.push(partFull + (i * (top - partFull)) / DROWNED_INTERVALS);
    levels.push(outletInvert + barrelRise(barrel));
    levels.sort((a, b) => a - b);
    this.flows = Float64Array.from(flows);
    this.tailwaters = Float64Array.from(levels.filter((z, i) => i === 0 || z - levels[i - 1] > 1e-9));
    const nq = this.flows.length;
    const heads = new Float64Array(this.tailwaters.length * nq);
    for (let n = 0; n < this.tailwaters.length; n++) {
      const tw = n === 0 ? -Infinity : this.tailwaters[n];
      let running = 0;
      for (let m = 0; m < nq; m++) {
        running = Math.max(running, barrelHeadwater(barrel, this.flows[m], tw));
        heads[n * nq + m] = running;
      }
    }
    this.heads = heads;
    this.scratch = new Float64Array(nq);
  }

  /** The tailwater column below `tw` and the weight of the one above. */
  private column(tw: number): [number, number] {
    const t = this.tailwaters;
    const last = t.length - 1;
    if (!(tw > t[0])) return [0, 0];
    if (tw >= t[last]) return [last - 1, 1];
    let lo = 0;
    let hi = last;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (t[mid] <= tw) lo = mid;
      else hi = mid;
    }
    return [lo, (tw - t[lo]) / (t[lo + 1] - t[lo])];
  }

  /** The headwater column at a tailwater: interpolated between the two tailwater nodes around it, into `out`. */
  private columnAt(tw: number): Float64Array {
    const [n, w] = this.column(tw);
    const nq = this.flows.length;
    const h = this.heads;
    const out = this.scratch;
    const a = n * nq;
    for (let m = 0; m < nq; m++) out[m] = h[a + m] + w * (h[a + nq + m] - h[a + m]);
    return out;
  }

  /** Headwater above the inlet invert (m) at a flow and a tailwater elevation. */
  headwater(q: number, tw: number): number {
    const c = this.columnAt(tw);
    const f = this.flows;
    if (!(q > 0)) return c[0];
    const m = Math.min(below(f, q), f.length - 2);
    return c[m] + ((c[m + 1] - c[m]) * (q - f[m])) / (f[m + 1] - f[m]);
  }

  /** Flow (m3/s) at a headwater elevation in front of the inlet and a tailwater elevation: zero while the headwater does not exceed the still one. */
  flow(headwaterElevation: number, tw: number): number {
    const head = headwaterElevation - this.barrel.inletInvert;
    const c = this.columnAt(tw);
    const f = this.flows;
    const last = f.length - 1;
    if (!(head > c[0])) return 0;
    if (head >= c[last]) {
      // Beyond the largest flow node: full flow, the headwater above the still one grows as Q^2.
      return f[last] * Math.sqrt((head - c[0]) / Math.max(c[last] - c[0], 1e-12));
    }
    const m = below(c, head);
    return c[m + 1] > c[m] ? f[m] + ((f[m + 1] - f[m]) * (head - c[m])) / (c[m + 1] - c[m]) : f[m];
  }
}

/** The last index of a non-decreasing array whose value is at most v (0 when none is). */
function below(values: Float64Array, v: number): number {
  let lo = 0;
  let hi = values.length - 1;
  if (values[hi] <= v) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (values[mid] <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}
