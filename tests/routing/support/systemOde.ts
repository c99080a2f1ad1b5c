// Reference solution of a system of ponds with a general-purpose ODE solver (odex 2.0.4: Hairer and
// Wanner's ODEX, a Gragg-Bulirsch-Stoer extrapolation integrator), in storage form, one equation per
// pond:
//   dS_i/dt = I_i(t) + sum over ponds j draining into i of Q_j(h_j, h_i) - Out_i,
// Out_i = Q_i(h_i, h_to) for a pond draining into pond `to` (the link's flow, either sign), or its
// outlet's discharge under the case's tailwater at the outfall. The flows are the project's direct
// evaluations (`linkFlow`, `outletDischarge`), or a given function per link; stages from storages by
// inverting each pond's storage curve. The inflows are linear between their points with kinks there,
// so the integration restarts at every inflow point of any pond. Used by the tests only.
import { Outcome, Solver } from "odex";
import type { Case, Hydrograph } from "../../../src/model.js";
import { outletDischarge } from "../../../src/hydraulics/outlet.js";
import { linkFlow } from "../../../src/hydraulics/link.js";
import { storageCurve } from "../../../src/storage/curve.js";
import { stageFromStorage } from "./levelPoolOde.js";

export interface SystemOdeResult {
  /** Per pond: highest stage (m), largest forward and reverse flow through its outlet (m3/s). */
  maxStage: number[];
  peakForward: number[];
  peakReverse: number[];
  /** Largest flow reaching the outfall (m3/s). */
  peakOutfall: number;
  /** With `options.bypass`: the largest flow reaching the outfall plus the bypass at the same instant (m3/s). */
  peakAtPoint: number;
  evaluations: number;
}

export interface SystemOdeOptions {
  /** Seconds after the last inflow point to stop (default 0: at the last inflow point). */
  after?: number;
  /** Sampling interval of the dense output (s), default 1. */
  sampleStep?: number;
  /** Relative tolerance, default 1e-9 (the absolute one is that times 1 m3). */
  tolerance?: number;
  /** Each link's flow (up, down) instead of `linkFlow`, by pond index (e.g. the barrel tabulated). */
  links?: ((up: number, down: number) => number)[];
  /** Runoff joining the flow reaching the outfall (the point of analysis): sampled with it, and its points are restarts. */
  bypass?: Hydrograph;
}

/** Integrates the system's storage equations through one storm's inflows with odex. */
export function routeSystemByOde(c: Case, inflows: readonly (Hydrograph | null)[], options: SystemOdeOptions = {}): SystemOdeResult {
  const system = c.system!;
  const n = system.ponds.length;
  const curves = system.ponds.map((p) => storageCurve(p.pond));
  const stageOf = system.ponds.map((p, i) => stageFromStorage(curves[i].volume, curves[i].area, p.pond.bottom, p.pond.top));
  const out = system.ponds.map((p, i) => {
    if (p.to < 0) return (h: number[]) => outletDischarge(p.outlet, c.tailwater, h[i]);
    const f = options.links?.[i] ?? ((up: number, down: number) => linkFlow(p.outlet, up, down));
    return (h: number[]) => f(h[i], h[p.to]);
  });
  const points = new Set<number>();
  for (const h of inflows) if (h) for (const t of h.times) points.add(t);
  if (options.bypass) for (const t of options.bypass.times) points.add(t);
  const bounds = [...points].sort((a, b) => a - b);
  const end = bounds[bounds.length - 1] + (options.after ?? 0);
  if (end > bounds[bounds.length - 1]) bounds.push(end);
  const sampleStep = options.sampleStep ?? 1;
  const solver = new Solver(n);
  solver.denseOutput = true;
  solver.relativeTolerance = options.tolerance ?? 1e-9;
  solver.absoluteTolerance = options.tolerance ?? 1e-9;
  solver.maxSteps = 2_000_000;
  let evaluations = 0;
  const stages = (y: number[]) => y.map((s, i) => stageOf[i](s));
  const maxStage = system.ponds.map((p) => p.pond.pool);
  const peakForward = system.ponds.map(() => 0);
  const peakReverse = system.ponds.map(() => 0);
  let peakOutfall = 0;
  let peakAtPoint = 0;
  const bypassAt = (t: number) => (options.bypass ? segmentLine(options.bypass, t, t)[0] : 0);
  const observe = (y: number[], t: number) => {
    const h = stages(y);
    let outfall = 0;
    for (let i = 0; i < n; i++) {
      maxStage[i] = Math.max(maxStage[i], h[i]);
      const q = out[i](h);
      if (q > peakForward[i]) peakForward[i] = q;
      if (-q > peakReverse[i]) peakReverse[i] = -q;
      if (system.ponds[i].to < 0) outfall += q;
    }
    peakOutfall = Math.max(peakOutfall, outfall);
    peakAtPoint = Math.max(peakAtPoint, outfall + bypassAt(t));
  };
  let y = system.ponds.map((p, i) => curves[i].volume(p.pond.pool));
  observe(y, bounds[0]);
  let nextSample = bounds[0] + sampleStep;
  for (let s = 0; s + 1 < bounds.length; s++) {
    const t0 = bounds[s];
    const t1 = bounds[s + 1];
    // Each pond's inflow on [t0, t1]: linear (the segment holding the interval), zero outside its points.
    const lines = inflows.map((h) => segmentLine(h, t0, t1));
    const rhs = (t: number, state: number[]): number[] => {
      evaluations++;
      const h = stages(state);
      const dS = lines.map(([a, b]) => Math.max(0, a + b * (t - t0)));
      for (let i = 0; i < n; i++) {
        const q = out[i](h);
        dS[i] -= q;
        const to = system.ponds[i].to;
        if (to >= 0) dS[to] += q;
      }
      return dS;
    };
    const result = solver.solve(rhs, t0, y, t1, (_step, xOld, x, yy, dense) => {
      while (nextSample <= x + 1e-9 && nextSample <= t1) {
        const value = nextSample <= xOld || dense === undefined || nextSample >= x ? yy : yy.map((_, i) => dense(i, nextSample));
        observe(value, nextSample);
        nextSample += sampleStep;
      }
    });
    if (result.outcome !== Outcome.Converged) throw new Error(`odex did not converge on [${t0}, ${t1}] s`);
    y = result.y;
    observe(y, t1);
  }
  return { maxStage, peakForward, peakReverse, peakOutfall, peakAtPoint, evaluations };
}

/** A hydrograph's line [value at t0, slope] over [t0, t1] (inside one segment of its points), zero outside its span. */
function segmentLine(h: Hydrograph | null, t0: number, t1: number): [number, number] {
  if (!h) return [0, 0];
  const times = h.times;
  const last = times.length - 1;
  const mid = 0.5 * (t0 + t1);
  if (mid < times[0] || mid > times[last]) return [0, 0];
  let j = 0;
  while (j < last - 1 && times[j + 1] <= mid) j++;
  const slope = (h.flows[j + 1] - h.flows[j]) / (times[j + 1] - times[j]);
  return [h.flows[j] + slope * (t0 - times[j]), slope];
}
