// Reference solution of level-pool routing with a general-purpose ODE solver (odex 2.0.4: Hairer and
// Wanner's ODEX, a Gragg-Bulirsch-Stoer extrapolation integrator), in storage form:
//   dS/dt = I(t) - O(h(S)) - X(h(S)),
// with O from the project's pure hydraulics (`outletDischarge`), X the exfiltration of a pond that has
// it (`src/storage/exfiltration.ts`) and S(h) from `src/storage` (h(S) by
// bisection on that curve). The storage form is used rather than dh/dt = (I - O)/A(h) because the
// case-format contract defines a stage-area pond by its volume (the conic formula with the linearly
// interpolated area), whose derivative is not exactly the interpolated area inside a row interval.
// The inflow is linear between its points and has a kink at each, so the integration restarts at
// every inflow point (piecewise between them). Used by the tests only, never by outfit itself.
import { Outcome, Solver } from "odex";
import type { Hydrograph, Outlet, Pond, Tailwater } from "../../../src/model.js";
import { outletDischarge } from "../../../src/hydraulics/outlet.js";
import { storageCurve } from "../../../src/storage/curve.js";
import { exfiltrationRate, WETTING_DEPTH } from "../../../src/storage/exfiltration.js";

export interface OdeRouting {
  /** Highest stage (m) and when (s). */
  maxStage: number;
  timeOfMaxStage: number;
  /** Outflow at the highest stage (the rating rises with stage, so this is the peak outflow). */
  peakOutflow: number;
  /** Stage sampled every `sampleStep` seconds from the first inflow point (m). */
  times: number[];
  stages: number[];
  /** Right-hand side evaluations made by the solver (for the record). */
  evaluations: number;
}

export interface OdeOptions {
  startStage: number;
  /** Seconds after the first inflow point to stop (default: the last inflow point). */
  endTime?: number;
  /** Sampling interval of the dense output (s), default 1. */
  sampleStep?: number;
  /** Relative tolerance of the solver, default 1e-11 (the absolute one is that times 1 m3). */
  tolerance?: number;
}

/** Integrates the level-pool equation through a hydrograph with odex. */
export function routeByOde(pond: Pond, outlet: Outlet, tail: Tailwater, inflow: Hydrograph, options: OdeOptions): OdeRouting {
  const curve = storageCurve(pond);
  const times = inflow.times;
  const flows = inflow.flows;
  const n = times.length;
  const end = options.endTime ?? times[n - 1];
  const sampleStep = options.sampleStep ?? 1;
  const solver = new Solver(1);
  solver.denseOutput = true;
  solver.relativeTolerance = options.tolerance ?? 1e-11;
  solver.absoluteTolerance = options.tolerance ?? 1e-11;
  const stageOf = stageFromStorage(curve.volume, curve.area, pond.bottom, pond.top);
  solver.maxSteps = 1_000_000;

  // Exfiltration over the first millimetre, where the floor takes up its rate: the stage's round-off
  // there (about 1e-15 m at a stage of tens of metres) is a large part of the depth, and a rate read
  // at that stage is noise that stalls odex at the first instant. Over that millimetre the storage and
  // the rate are both linear in the depth to 1e-3 (the sides' area is), so the rate is taken linear in
  // the storage there; above it, the rate at the stage.
  const wetted = pond.bottom + WETTING_DEPTH;
  const wettedStorage = curve.volume(wetted);
  const wettedRate = exfiltrationRate(pond, wetted);
  const exfiltrationAt = (storage: number, stage: number) =>
    storage < wettedStorage ? (wettedRate * Math.max(0, storage)) / wettedStorage : exfiltrationRate(pond, stage);
  const sampleTimes: number[] = [];
  const sampleStages: number[] = [];
  let evaluations = 0;
  let storage = curve.volume(options.startStage);
  let nextSample = times[0];

  // Segments: [times[i], times[i+1]] with linear inflow, then zero inflow to `end`.
  const bounds: number[] = [];
  for (let i = 0; i < n; i++) if (times[i] <= end) bounds.push(times[i]);
  if (end > bounds[bounds.length - 1]) bounds.push(end);
  for (let s = 0; s + 1 < bounds.length; s++) {
    const t0 = bounds[s];
    const t1 = bounds[s + 1];
    const inSeries = s + 1 < n;
    const q0 = inSeries ? flows[s] : 0;
    const slope = inSeries ? (flows[s + 1] - flows[s]) / (times[s + 1] - times[s]) : 0;
    const inflowAt = (t: number) => Math.max(0, q0 + slope * (t - t0));
    const rhs = (t: number, y: number[]): number[] => {
      evaluations++;
      const h = stageOf(y[0]);
      return [inflowAt(t) - outletDischarge(outlet, tail, h) - exfiltrationAt(y[0], h)];
    };
    const result = solver.solve(rhs, t0, [storage], t1, (_step, xOld, x, y, dense) => {
      while (nextSample <= x + 1e-9 && nextSample <= t1) {
        const value = nextSample <= xOld || dense === undefined ? y[0] : dense(0, nextSample);
        sampleTimes.push(nextSample);
        sampleStages.push(stageOf(nextSample >= x ? y[0] : value));
        nextSample += sampleStep;
      }
    });
    if (result.outcome !== Outcome.Converged) throw new Error(`odex did not converge on [${t0}, ${t1}] s (${Outcome[result.outcome]})`);
    storage = result.y[0];
  }
  let best = 0;
  for (let i = 1; i < sampleStages.length; i++) if (sampleStages[i] > sampleStages[best]) best = i;
  // Refine the maximum with a parabola through the three samples around it.
  let maxStage = sampleStages[best];
  let timeOfMaxStage = sampleTimes[best];
  if (best > 0 && best < sampleStages.length - 1) {
    const a = sampleStages[best - 1];
    const b = sampleStages[best];
    const c = sampleStages[best + 1];
    const curvature = a - 2 * b + c;
    if (curvature < 0) {
      const offset = (0.5 * (a - c)) / curvature;
      maxStage = b - 0.25 * (a - c) * offset;
      timeOfMaxStage += offset * sampleStep;
    }
  }
  return {
    maxStage,
    timeOfMaxStage,
    peakOutflow: outletDischarge(outlet, tail, maxStage),
    times: sampleTimes,
    stages: sampleStages,
    evaluations,
  };
}

/**
 * Inverse of a storage curve: the stage holding a volume to machine precision. Newton steps with the
 * plan area as the slope (close to dV/dh), kept inside a bracket that bisection narrows when a Newton
 * step would leave it.
 */
export function stageFromStorage(
  volume: (stage: number) => number,
  area: (stage: number) => number,
  bottom: number,
  top: number,
): (storage: number) => number {
  let last = bottom;
  return (storage: number) => {
    if (storage <= 0) return bottom;
    let low = bottom;
    let high = top;
    while (volume(high) < storage) high += top - bottom;
    let h = last > low && last < high ? last : 0.5 * (low + high);
    for (let i = 0; i < 200; i++) {
      const excess = volume(h) - storage;
      if (excess === 0) break;
      if (excess < 0) low = h;
      else high = h;
      let next = h - excess / area(h);
      if (!(next > low && next < high)) next = 0.5 * (low + high);
      if (Math.abs(next - h) <= 1e-14 * (1 + Math.abs(h)) || high - low <= 1e-14 * (1 + Math.abs(h))) {
        h = next;
        break;
      }
      h = next;
    }
    last = h;
    return h;
  };
}
