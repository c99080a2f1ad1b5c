// A long, finely sampled inflow (e.g. a 1-second record of a million rows) thinned for routings that
// are repeated many times (the search's). The router lands on every inflow point, so a fine record
// makes every routing as many steps as the record has points, although the hydrograph changes little
// from one point to the next.
//
// Thinning keeps a subset of the points as nodes: runs of points are merged while the flow over the
// run stays within `tolerance` of the peak and the run spans at most `maxGap` seconds (the router's
// own largest step); the peak point, its two neighbours and the first and last points are always
// nodes. Each node's flow is the mean flow of the full hydrograph over the node's cell (from half way
// to the previous node to half way to the next; the first and last cells are halves). The trapezoid
// volume of the thinned hydrograph (what the router integrates) is then sum(mean * cell width), the
// exact volume of the full hydrograph: the volume is conserved, and so is where it arrives to within
// a cell. The peak's cell spans one point spacing, so the thinned peak is the full peak less an eighth
// of its second difference.
import type { Hydrograph } from "../model.js";

export interface ThinOptions {
  /** Fraction of the peak inflow the flow may vary over a merged run (default 0.002). */
  tolerance?: number;
  /** Longest merged run (s), default 600 (the router's default largest step). */
  maxGap?: number;
}

/**
 * Inflows with more points than this are thinned for the search: below it a routing costs less than
 * the rating table it runs on, and the search sees the inflow exactly as `route` does.
 */
export const SEARCH_THIN_ABOVE = 20000;

/** The inflow the search routes on: `inflow` itself when short, else thinned (see `thinInflow`). */
export function searchInflow(inflow: Hydrograph): Hydrograph {
  if (inflow.times.length <= SEARCH_THIN_ABOVE) return inflow;
  const thin = thinInflow(inflow);
  return thin.times.length * 2 < inflow.times.length ? thin : inflow;
}

/** The thinned hydrograph (new arrays; the input is not changed). */
export function thinInflow(inflow: Hydrograph, options: ThinOptions = {}): Hydrograph {
  const { times, flows } = inflow;
  const n = times.length;
  if (n < 3) return { times: times.slice(), flows: flows.slice() };
  let p = 0;
  for (let i = 1; i < n; i++) if (flows[i] > flows[p]) p = i;
  const tol = (options.tolerance ?? 0.002) * Math.max(flows[p], 0);
  const maxGap = options.maxGap ?? 600;
  const forced = (i: number) => i === p - 1 || i === p || i === p + 1;

  // 1. Nodes (indices into the full hydrograph).
  let nodes = new Int32Array(1024);
  let count = 0;
  const push = (i: number) => {
    if (count === nodes.length) {
      const grown = new Int32Array(2 * nodes.length);
      grown.set(nodes);
      nodes = grown;
    }
    nodes[count++] = i;
  };
  push(0);
  let a = 0;
  while (a < n - 1) {
    let end = a + 1;
    let lo = Math.min(flows[a], flows[end]);
    let hi = Math.max(flows[a], flows[end]);
    while (end < n - 1 && !forced(end)) {
      const c = end + 1;
      if (times[c] - times[a] > maxGap) break;
      const f = flows[c];
      const nlo = f < lo ? f : lo;
      const nhi = f > hi ? f : hi;
      if (nhi - nlo > tol) break;
      lo = nlo;
      hi = nhi;
      end = c;
    }
    push(end);
    a = end;
  }

  // 2. Each node's mean flow over its cell, from the cumulative volume of the full hydrograph.
  const outTimes = new Float64Array(count);
  const outFlows = new Float64Array(count);
  for (let k = 0; k < count; k++) outTimes[k] = times[nodes[k]];
  const volume = new CumulativeVolume(inflow);
  let left = outTimes[0];
  let vLeft = 0;
  for (let k = 0; k < count; k++) {
    const right = k + 1 < count ? 0.5 * (outTimes[k] + outTimes[k + 1]) : outTimes[k];
    const vRight = volume.at(right);
    outFlows[k] = right > left ? (vRight - vLeft) / (right - left) : flows[nodes[k]];
    left = right;
    vLeft = vRight;
  }
  return { times: outTimes, flows: outFlows };
}

/** Volume of a piecewise-linear hydrograph from its first point to t, for increasing t (a cursor). */
class CumulativeVolume {
  private i = 0;
  private before = 0;
  constructor(private readonly h: Hydrograph) {}

  at(t: number): number {
    const { times, flows } = this.h;
    const last = times.length - 1;
    while (this.i < last - 1 && times[this.i + 1] <= t) {
      this.before += 0.5 * (flows[this.i] + flows[this.i + 1]) * (times[this.i + 1] - times[this.i]);
      this.i++;
    }
    const i = this.i;
    const t0 = times[i];
    const s = Math.min(Math.max(t, t0), times[i + 1]);
    const f = flows[i] + ((flows[i + 1] - flows[i]) * (s - t0)) / (times[i + 1] - t0);
    return this.before + 0.5 * (flows[i] + f) * (s - t0);
  }
}
