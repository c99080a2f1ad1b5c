// Storage-indication (Modified Puls) routing (Chow, Maidment & Mays 1988 sec. 8.2; HDS-5 eq 16):
//   (I1 + I2) + (2 S1/dt - O1) = (2 S2/dt + O2),
// with linear interpolation in the (2S/dt + O, O) relation built from the rating table. The step may
// vary from step to step (the table's 2S/dt + O is formed on the fly), so the router refines it where
// the inflow or the outflow changes fast, and lands on every inflow point. With exfiltration (a column
// of the table) O is the outlet's outflow plus the exfiltration at the same stage; the outlet's outflow
// and the exfiltration are kept apart in the result (peakOutflow is the outlet's).
import type { Hydrograph } from "../model.js";
import type { RatingTable } from "./ratingTable.js";
import { interpolateAtStage } from "./ratingTable.js";
import { hydrographVolume } from "../hydrology/hydrograph.js";
import { PointsOfAnalysis, type PointPeak } from "./pointOfAnalysis.js";

export interface RouteOptions {
  /** Fixed time step (s). Without it the router chooses and refines the step itself. */
  step?: number;
  /** Stage at which the pond counts as drained (permanent pool + drawdown depth). */
  drainedStage: number;
  /** Initial stage (the permanent pool, or pond.bottom). */
  startStage: number;
  /** Seconds simulated after the last inflow point at most (default 10 days). */
  maxAfterInflow?: number;
  /**
   * A hydrograph the outflow must stay under (e.g. the pre-development hydrograph): compared at the
   * start and at every step end inside its time span; the closest approach is reported as `ceiling`.
   */
  ceiling?: Hydrograph;
  /**
   * Runoff that bypasses the pond and joins its outflow at the point of analysis: the router tracks the
   * largest sum (`peakAtPoint`) and compares the sum, not the outflow alone, with `ceiling`. The
   * routing goes on at least to the bypass's last point.
   */
  bypass?: Hydrograph;
  /** Runoff joining the pond's outflow at further points (one per point): their largest sums in `downstream`. */
  downstream?: readonly Hydrograph[];
  /** Keep the series of time, inflow, outflow and stage (for plots); off in the search. */
  record?: boolean;
  /** Automatic step: largest step (s), default 600. */
  maxStep?: number;
  /** Automatic step: smallest step (s), default 1. */
  minStep?: number;
  /** Automatic step: fraction of the peak inflow the inflow may change in one step, default 0.01. */
  inflowFraction?: number;
  /** Automatic step: fraction of the local time constant dS/dO a step may span, default 0.15. */
  timeConstantFraction?: number;
}

export interface RouteSeries {
  time: number[];
  inflow: number[];
  /** Outflow through the outlet. */
  outflow: number[];
  stage: number[];
  /** Exfiltration, when the pond has it. */
  exfiltration?: number[];
  /** With `options.bypass`: the bypass at each time (outflow + bypass is the flow at the point). */
  bypass?: number[];
}

export interface RouteResult {
  peakInflow: number;
  /** Peak outflow through the outlet (spillway included; exfiltration not). */
  peakOutflow: number;
  /** Seconds. */
  timeOfPeakOutflow: number;
  /**
   * Largest flow at the point of analysis: outflow plus bypass at the same instant (the outflow alone
   * when there is no bypass). The target and the release rules on peaks apply to it.
   */
  peakAtPoint: number;
  /** Seconds. */
  timeOfPeakAtPoint: number;
  /** The bypass's share of `peakAtPoint` (0 without a bypass). */
  bypassAtPeak: number;
  /** With `options.downstream`: the largest flow at each further point the pond's outflow reaches. */
  downstream?: PointPeak[];
  maxStage: number;
  /** Seconds. */
  timeOfMaxStage: number;
  /** Above pond.bottom (m3). */
  maxStorage: number;
  volumeIn: number;
  /** Volume through the outlet (m3). */
  volumeOut: number;
  /** Volume exfiltrated into the ground (m3; 0 without exfiltration). */
  volumeExfiltrated: number;
  /** Largest exfiltration rate (m3/s; 0 without). */
  peakExfiltration: number;
  storageChange: number;
  /** (volumeIn - volumeOut - volumeExfiltrated - storageChange) / volumeIn. */
  massBalanceError: number;
  /** Seconds from the peak stage until drained; null when not drained in the simulated time. */
  drawdownTime: number | null;
  /** Seconds simulated. */
  duration: number;
  steps: number;
  smallestStep: number;
  largestStep: number;
  /** Steps shortened below the inflow's own step because the outflow changes fast relative to storage. */
  refinedSteps: number;
  /** Automatic mode: steps done again, shorter, because they ended where the outflow changes fast. */
  redoneSteps: number;
  /** Steps where the storage-indication value fell below zero and the pond was taken as empty. */
  clampedSteps: number;
  /** The stage rose above the last row of the rating table (extrapolated). */
  beyondTable: boolean;
  series?: RouteSeries;
  /** With `options.ceiling`: the least of ceiling - outflow (m3/s) over its span, where and what. */
  ceiling?: CeilingApproach;
  /** A storm of several durations (modified rational): the duration that governs (s), and how many were routed. */
  governingDuration?: number;
  durationsRouted?: number;
}

export interface CeilingApproach {
  /** Least ceiling - outflow (m3/s); negative when the outflow rose above the ceiling. */
  margin: number;
  /** Outflow and ceiling (m3/s) at that instant, and the instant (s). */
  outflow: number;
  limit: number;
  time: number;
}

const TEN_DAYS = 10 * 86400;
/**
 * Automatic step: a step is done again when it is longer than this many times the time-constant
 * limit of the table interval it ends in (the limit of the interval it starts in is applied before).
 */
const REDO_FACTOR = 1.5;

// Fixed step: the 2S/dt + O column and the reciprocals of its interval widths, formed once per route
// call in scratch buffers reused from call to call (no allocation once they are large enough), so
// that each step compares against a stored value and multiplies instead of dividing.
let indication = new Float64Array(0);
let inverseWidth = new Float64Array(0);
/** The exfiltration column of a table without exfiltration: zeros, grown as tables grow (never per step). */
let noExfiltration = new Float64Array(0);

function zeros(n: number): Float64Array {
  if (noExfiltration.length < n) noExfiltration = new Float64Array(n);
  return noExfiltration;
}

function fillIndication(S: Float64Array, O: Float64Array, X: Float64Array, step: number): void {
  const n = S.length;
  if (indication.length < n) {
    indication = new Float64Array(n);
    inverseWidth = new Float64Array(n);
  }
  const twoOverDt = 2 / step;
  for (let i = 0; i < n; i++) indication[i] = twoOverDt * S[i] + O[i] + X[i];
  for (let i = 0; i + 1 < n; i++) {
    const width = indication[i + 1] - indication[i];
    inverseWidth[i] = width > 0 ? 1 / width : 0;
  }
}

/**
 * Storms routed by `route` in this thread since it started, wherever the call came from (the
 * search's scores and fits, the `route` path's candidates, explanations, the existing outlet): read
 * by the bench, which divides every routing by the processor time. Nothing in a result reads it.
 */
export const routingTally = { count: 0 };

/** Routes one inflow hydrograph through a rating table. */
export function route(table: RatingTable, inflow: Hydrograph, options: RouteOptions): RouteResult {
  routingTally.count++;
  const S = table.storage;
  const O = table.outflow;
  const Z = table.stage;
  const X = table.exfiltration ?? zeros(Z.length);
  // Without exfiltration its column is zeros: the indication reads it, the bookkeeping skips it.
  const exfiltrates = table.exfiltration !== undefined;
  const last = Z.length - 1;
  const times = inflow.times;
  const flows = inflow.flows;
  const nIn = times.length;
  const tFirst = times[0];
  const tLast = times[nIn - 1];
  const tEnd = tLast + (options.maxAfterInflow ?? TEN_DAYS);
  const fixed = options.step;
  const maxStep = options.maxStep ?? 600;
  const minStep = options.minStep ?? 1;
  const tauFraction = options.timeConstantFraction ?? 0.15;
  const drained = options.drainedStage;
  let peakInflow = 0;
  for (let i = 0; i < nIn; i++) if (flows[i] > peakInflow) peakInflow = flows[i];
  const inflowChange = (options.inflowFraction ?? 0.01) * peakInflow;

  const drainedStorage = drained <= Z[0] ? 0 : interpolateAtStage(table, S, Math.min(drained, Z[last]));

  // A lazy table (ratingTable.ts) rates its stages as the cursor climbs: O holds the stages below
  // `rated`, and the cursor's interval [k, k + 1] is always rated.
  const extend = table.extend;
  let rated = extend ? (table.rated as number) : Z.length;
  if (extend && fixed !== undefined) rated = extend(Z.length);

  // Start: pond at the start stage with zero inflow history, at the first inflow point.
  let k = locate(Z, options.startStage);
  if (k + 2 > rated) rated = extend!(k + 2);
  let u = (options.startStage - Z[k]) / (Z[k + 1] - Z[k]);
  let S1 = S[k] + u * (S[k + 1] - S[k]);
  // O1: everything leaving the pond (outlet and exfiltration); Q1 the outlet's share, E1 the ground's.
  let Q1 = O[k] + u * (O[k + 1] - O[k]);
  let E1 = X[k] + u * (X[k + 1] - X[k]);
  let O1 = Q1 + E1;
  let H1 = options.startStage;
  const S0 = S1;
  let t = tFirst;
  let j = 0; // inflow segment: times[j] <= t < times[j+1]
  let I1 = flows[0];

  let peakOutflow = Q1;
  let timeOfPeakOutflow = t;
  let peakExfiltration = E1;
  let volumeExfiltrated = 0;
  let maxStage = H1;
  let timeOfMaxStage = t;
  let maxStorage = S1;
  let volumeOut = 0;
  let steps = 0;
  let smallest = Infinity;
  let largest = 0;
  let refined = 0;
  let clamped = 0;
  let redone = 0;
  let beyond = false;
  let drainedAt = H1 <= drained ? t : NaN;

  if (fixed !== undefined) fillIndication(S, O, X, fixed);
  const F = indication;
  const G = inverseWidth;
  const fixedTwoOverDt = fixed !== undefined ? 2 / fixed : 0;

  const ceiling = options.ceiling;
  const cTimes = ceiling?.times;
  const cFlows = ceiling?.flows;
  const cFirst = cTimes ? cTimes[0] : 0;
  const cLast = cTimes ? cTimes[cTimes.length - 1] : -Infinity;
  let cj = 0;
  let cMargin = Infinity;
  const points = new PointsOfAnalysis(options.bypass, options.downstream);
  const point = points.point;
  points.start(t, Q1);
  // The routing goes on at least to the last bypass point, so every sum at a point is routed.
  const tPoint = Math.max(tLast, points.last);
  let cOutflow = 0;
  let cLimit = 0;
  let cTime = 0;
  /** Compares the outflow at time tt with the ceiling (allocation-free; a cursor walks the ceiling). */
  const compareCeiling = (tt: number, outflow: number) => {
    if (!cTimes || !cFlows || tt < cFirst || tt > cLast) return;
    cj = cTimes.length < 2 ? 0 : segmentAt(cTimes, cj, tt);
    const limit = cTimes.length < 2 ? cFlows[0] : inflowOn(cTimes, cFlows, cj, tt);
    if (limit - outflow < cMargin) {
      cMargin = limit - outflow;
      cOutflow = outflow;
      cLimit = limit;
      cTime = tt;
    }
  };
  compareCeiling(t, points.atPoint(t, Q1));

  const record = options.record === true;
  const series: RouteSeries | undefined = record ? { time: [t], inflow: [I1], outflow: [Q1], stage: [H1] } : undefined;
  if (series && table.exfiltration) series.exfiltration = [E1];
  if (series && point) series.bypass = [point.at(t)];

  while (true) {
    let dt: number;
    let t2: number;
    let I2: number;
    let N: number;
    if (fixed !== undefined) {
      // Fixed step: inflow at the end of the step, storage indication, walk, interpolate.
      dt = fixed;
      t2 = t + dt;
      j = segmentAt(times, j, t2);
      I2 = t2 > tLast ? 0 : inflowOn(times, flows, j, t2);
      N = I1 + I2 + fixedTwoOverDt * S1 - O1;
      if (N < 0) {
        N = 0;
        clamped++;
      }
      while (k < last - 1 && F[k + 1] < N) k++;
      while (k > 0 && F[k] > N) k--;
      u = (N - F[k]) * G[k];
    } else {
      // 1. The step.
      dt = maxStep;
      if (t < tLast) {
        while (j < nIn - 2 && times[j + 1] <= t) j++;
        const next = times[j + 1];
        const slope = Math.abs(flows[j + 1] - flows[j]) / (times[j + 1] - times[j]);
        if (slope > 0 && inflowChange / slope < dt) dt = inflowChange / slope;
        const byInflow = dt;
        const dO = O[k + 1] + X[k + 1] - O[k] - X[k];
        if (dO > 0) {
          const tau = (tauFraction * (S[k + 1] - S[k])) / dO;
          if (tau < dt) dt = tau;
        }
        if (dt < minStep) dt = minStep;
        if (dt < byInflow) refined++;
        if (t + dt > next) dt = next - t;
        else if (t + 1.5 * dt > next) dt = 0.5 * (next - t);
      } else {
        const dO = O[k + 1] + X[k + 1] - O[k] - X[k];
        if (dO > 0) {
          const tau = (tauFraction * (S[k + 1] - S[k])) / dO;
          if (tau < dt) {
            dt = tau < minStep ? minStep : tau;
            refined++;
          }
        }
      }
      // 2-4. Solve the step. A step that lands in a table interval whose time constant is much
      // shorter than the step (the outflow turned steep inside the step, e.g. over a weir crest) is
      // done again, shorter.
      let twoOverDt: number;
      for (;;) {
        t2 = t + dt;
        // Inflow at the end of the step (linear between points, zero outside them).
        j = segmentAt(times, j, t2);
        I2 = t2 > tLast ? 0 : inflowOn(times, flows, j, t2);
        // Storage indication: 2 S2/dt + O2 = N.
        twoOverDt = 2 / dt;
        N = I1 + I2 + twoOverDt * S1 - O1;
        if (N < 0) N = 0;
        // Walk the cursor to the table interval holding N.
        while (k < last - 1 && twoOverDt * S[k + 1] + O[k + 1] + X[k + 1] < N) {
          k++;
          if (k + 2 > rated) rated = extend!(k + 2);
        }
        while (k > 0 && twoOverDt * S[k] + O[k] + X[k] > N) k--;
        if (dt <= minStep) break;
        const dO = O[k + 1] + X[k + 1] - O[k] - X[k];
        if (!(dO > 0)) break;
        const tau = (tauFraction * (S[k + 1] - S[k])) / dO;
        if (dt <= REDO_FACTOR * tau) break;
        dt = tau < minStep ? minStep : tau;
        redone++;
      }
      if (I1 + I2 + twoOverDt * S1 - O1 < 0) clamped++;
      const f0 = twoOverDt * S[k] + O[k] + X[k];
      const f1 = twoOverDt * S[k + 1] + O[k + 1] + X[k + 1];
      u = f1 > f0 ? (N - f0) / (f1 - f0) : 0;
    }
    if (u > 1) beyond = true;
    else if (u < 0) u = 0;
    const S2 = S[k] + u * (S[k + 1] - S[k]);
    const Q2 = O[k] + u * (O[k + 1] - O[k]);
    const E2 = exfiltrates ? X[k] + u * (X[k + 1] - X[k]) : 0;
    const O2 = Q2 + E2;
    const H2 = Z[k] + u * (Z[k + 1] - Z[k]);

    // 5. Bookkeeping.
    volumeOut += 0.5 * (Q1 + Q2) * dt;
    if (exfiltrates) {
      volumeExfiltrated += 0.5 * (E1 + E2) * dt;
      if (E2 > peakExfiltration) peakExfiltration = E2;
    }
    steps++;
    if (dt < smallest) smallest = dt;
    if (dt > largest) largest = dt;
    if (Q2 > peakOutflow) {
      peakOutflow = Q2;
      timeOfPeakOutflow = t2;
    }
    if (H2 > maxStage) {
      maxStage = H2;
      timeOfMaxStage = t2;
      maxStorage = S2;
      drainedAt = NaN;
    }
    if (H2 <= drained && !(H1 <= drained)) drainedAt = t2 - (dt * (drained - H2)) / (H1 - H2);
    else if (H2 > drained) drainedAt = NaN;
    // Exfiltration goes into the ground: the point of analysis receives the outlet's outflow.
    points.step(t, Q1, t2, Q2);
    if (ceiling) compareCeiling(t2, points.atPoint(t2, Q2));
    if (record) {
      series!.time.push(t2);
      series!.inflow.push(I2);
      series!.outflow.push(Q2);
      series!.stage.push(H2);
      series!.exfiltration?.push(E2);
      if (point) series!.bypass!.push(point.at(t2));
    }
    t = t2;
    // After the last inflow point the inflow is zero: a hydrograph that ends above zero drops there.
    I1 = t >= tLast ? 0 : I2;
    S1 = S2;
    O1 = O2;
    Q1 = Q2;
    E1 = E2;
    H1 = H2;
    if (t >= tLast) {
      if ((H2 <= drained && t >= tPoint) || t >= tEnd) break;
      // With no inflow left the outflow only falls. If even the present outflow kept up until the end
      // could not empty the storage above the drained stage, the pond does not drain in the simulated
      // time (e.g. it is held up by tailwater): stop here rather than creep on in tiny steps.
      if (O2 * (tEnd - t) < S2 - drainedStorage && t >= tPoint) break;
    }
  }
  points.finish(Q1);

  const storageChange = S1 - S0;
  // Steps land on every inflow point in the automatic mode, so the trapezoid sum is the exact volume;
  // a fixed step may straddle points, and the exact volume then shows the sampling in the balance.
  const exactIn = hydrographVolume(inflow);
  const reference = exactIn;
  let drawdownTime: number | null = null;
  if (maxStage <= drained) drawdownTime = 0;
  else if (!Number.isNaN(drainedAt)) drawdownTime = Math.max(0, drainedAt - timeOfMaxStage);
  return {
    peakInflow,
    peakOutflow,
    timeOfPeakOutflow,
    ...points.result(peakOutflow, timeOfPeakOutflow),
    maxStage,
    timeOfMaxStage,
    maxStorage,
    volumeIn: exactIn,
    volumeOut,
    volumeExfiltrated,
    peakExfiltration,
    storageChange,
    massBalanceError: reference > 0 ? (reference - volumeOut - volumeExfiltrated - storageChange) / reference : 0,
    drawdownTime,
    duration: t - tFirst,
    steps,
    smallestStep: smallest,
    largestStep: largest,
    refinedSteps: refined,
    redoneSteps: redone,
    clampedSteps: clamped,
    beyondTable: beyond,
    series,
    ceiling: ceiling ? { margin: cMargin === Infinity ? 0 : cMargin, outflow: cOutflow, limit: cLimit, time: cTime } : undefined,
  };
}

/** The inflow segment holding t (times[j] < t <= times[j+1], or the last), searching on from j. */
function segmentAt(times: Float64Array, j: number, t: number): number {
  const end = times.length - 2;
  while (j < end && times[j + 1] < t) j++;
  return j;
}

/** Inflow at t, linear on segment j. */
function inflowOn(times: Float64Array, flows: Float64Array, j: number, t: number): number {
  const t0 = times[j];
  return flows[j] + ((flows[j + 1] - flows[j]) * (t - t0)) / (times[j + 1] - t0);
}

/** Index k of the table interval [Z[k], Z[k+1]] holding a stage (clamped to the table). */
function locate(Z: Float64Array, stage: number): number {
  let k = 0;
  while (k < Z.length - 2 && Z[k + 1] <= stage) k++;
  return k;
}

/** Outflow from the table at a stage (used to report the starting outflow). */
export function tableOutflow(table: RatingTable, stage: number): number {
  return interpolateAtStage(table, table.outflow, stage);
}
