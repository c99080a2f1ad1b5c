// Routing a system of ponds joined by their outlets, all ponds together at every step. Each pond i
// obeys dS_i/dt = I_i(t) + (flows in from the ponds that drain into it) - (flow out through its own
// outlet), where a link's flow depends on both ponds' stages and may run backwards (hydraulics/
// link.ts, routing/linkTable.ts) and a pond at the outfall has its single-pond rating. The step is the
// trapezoidal rule, the storage-indication method of one pond (Chow, Maidment & Mays 1988 sec. 8.2)
// written for several:
//   2 S_i(t2)/dt + Out_i(t2) - In_i(t2) = I_i(t1) + I_i(t2) + 2 S_i(t1)/dt - Out_i(t1) + In_i(t1),
// solved for the stages at t2 by Newton's method on the coupled equations (the Jacobian from the
// tables' interpolants, a backtracking line search on the residual), storage linear between the
// nodes of each pond's stage grid as in the single-pond table. The automatic step follows the single
// router: it lands on every pond's inflow points, limits the change of each pond's inflow per step to
// 1 % of its peak, and limits the step to 0.15 of the shortest time constant among the ponds (a pond's
// storage over the rate at which its net outflow changes with its own stage, a link's flow taken as a
// chord over at least TAU_DIFFERENCE of level difference so that levels at rest against each other do
// not shrink the step to nothing); a step that ends where that limit is much shorter is done again.
// Nothing is allocated per step: the state lives in Float64Arrays made once per routing. A step's
// first try starts from the flows last computed (those at its start), not evaluated again.
import type { Hydrograph, Pond } from "../model.js";
import type { LinkTable } from "./linkTable.js";
import type { CeilingApproach, RouteResult } from "./router.js";
import { routingTally } from "./router.js";
import { hydrographVolume } from "../hydrology/hydrograph.js";
import { PointsOfAnalysis } from "./pointOfAnalysis.js";

/** One pond as the system router sees it. */
export interface SystemRoutePond {
  name: string;
  pond: Pond;
  /** Stage grid (m) and the storage on it (m3 above pond.bottom). */
  stage: Float64Array;
  storage: Float64Array;
  /** A pond at the outfall: its outflow on `stage` (its single-pond rating table); null for a link. */
  outflow: Float64Array | null;
  /** A pond draining into pond `to`: its outlet's table; null at the outfall. */
  link: LinkTable | null;
  /** Index of the pond it drains into; -1 for the outfall. */
  to: number;
  startStage: number;
  drainedStage: number;
}

export interface SystemRouteOptions {
  /** Fixed time step (s); default automatic. */
  step?: number;
  /** Keep the series of every pond (for plots and CSV). */
  record?: boolean;
  /** A hydrograph the flow reaching the outfall (plus the bypass, with one) must stay under (release-limit form). */
  ceiling?: Hydrograph;
  /**
   * Runoff that bypasses every pond and joins the flow reaching the outfall at the point of analysis:
   * the router tracks the largest sum (`peakAtPoint`), as the single router does with a pond's outflow.
   */
  bypass?: Hydrograph;
  /** Runoff joining the flow reaching the outfall at further points (one per point): their largest sums in `downstream`. */
  downstream?: readonly Hydrograph[];
  /** Seconds simulated after the last inflow point at most (default 10 days). */
  maxAfterInflow?: number;
  maxStep?: number;
  minStep?: number;
  inflowFraction?: number;
  timeConstantFraction?: number;
}

/** One pond's results: a single pond's `RouteResult` (its outflow the forward flow through its own outlet) and what flowed back. */
export interface PondRouteResult extends RouteResult {
  name: string;
  /** Largest flow back through its own outlet, from the pond downstream (m3/s, 0 if none), and when (s). */
  peakReverse: number;
  timeOfPeakReverse: number;
  /** Volume that flowed back into this pond through its own outlet (m3). */
  volumeBack: number;
  /** Largest total inflow: its own, the ponds draining into it, and water flowing back through its outlet (m3/s). */
  peakTotalInflow: number;
}

export interface SystemSeries {
  time: number[];
  /** Flow reaching the outfall (m3/s). */
  outfall: number[];
  /** With a bypass: the bypass at each time (outfall + bypass is the flow at the point of analysis). */
  bypass?: number[];
  /** Per pond: stage (m), own inflow (m3/s), flow through its outlet (m3/s, negative back). */
  stage: number[][];
  inflow: number[][];
  outflow: number[][];
}

/** The system's results: the single router's fields for the system as a whole (inflow the ponds' own
 * inflows together, outflow the flow reaching the outfall: the ponds draining there together), each
 * pond's, and the Newton iterations. */
export interface SystemRouteResult
  extends Pick<
    RouteResult,
    "peakInflow" | "peakOutflow" | "timeOfPeakOutflow" | "peakAtPoint" | "timeOfPeakAtPoint" | "bypassAtPeak" | "downstream" | "volumeIn" | "volumeOut" | "storageChange" | "massBalanceError" | "duration" | "steps" | "smallestStep" | "largestStep" | "refinedSteps" | "redoneSteps" | "clampedSteps" | "beyondTable" | "ceiling"
  > {
  ponds: PondRouteResult[];
  /** Newton iterations over all steps, and steps that did not converge in NEWTON_ITERATIONS (done again shorter, or kept with a fixed step). */
  iterations: number;
  unconverged: number;
  series?: SystemSeries;
}

const TEN_DAYS = 10 * 86400;
const REDO_FACTOR = 1.5;
/** Newton's method: most iterations per step, and the largest stage correction (m) at which it has converged. */
const NEWTON_ITERATIONS = 40;
const NEWTON_TOLERANCE = 1e-10;
/** The step spans at most this fraction of the shortest time constant (the single router's). */
const TIME_CONSTANT_FRACTION = 0.15;
/** Level difference (m) over which a link's flow is taken as a chord for the time constant. */
export const TAU_DIFFERENCE = 0.002;

/** A pond's inflow walked by a cursor: value at the end of a step (from the left) and at the start of the next (from the right). */
class InflowCursor {
  private j = 0;
  readonly first: number;
  readonly last: number;
  readonly peak: number;
  readonly change: number;
  constructor(readonly h: Hydrograph | null, fraction: number) {
    const n = h ? h.times.length : 0;
    this.first = n ? h!.times[0] : Infinity;
    this.last = n ? h!.times[n - 1] : -Infinity;
    let peak = 0;
    if (h) for (let i = 0; i < n; i++) if (h.flows[i] > peak) peak = h.flows[i];
    this.peak = peak;
    this.change = fraction * peak;
  }
  /** Value at t approached from the left (from the right when `right`): zero outside the points. */
  at(t: number, right: boolean): number {
    const h = this.h;
    if (!h) return 0;
    if (t < this.first || t > this.last) return 0;
    if (t === this.first) return right ? h.flows[0] : 0;
    if (t === this.last) return right ? 0 : h.flows[h.times.length - 1];
    const times = h.times;
    const end = times.length - 2;
    let j = this.j;
    while (j < end && times[j + 1] < t) j++;
    while (j > 0 && times[j] >= t) j--;
    this.j = j;
    return h.flows[j] + ((h.flows[j + 1] - h.flows[j]) * (t - times[j])) / (times[j + 1] - times[j]);
  }
  /** The next point after t (Infinity after the last), and the slope of the segment holding t (0 outside). */
  next(t: number): number {
    const h = this.h;
    if (!h || t >= this.last) return Infinity;
    if (t < this.first) return this.first;
    const times = h.times;
    let j = this.j;
    while (j < times.length - 2 && times[j + 1] <= t) j++;
    this.j = j;
    return times[j + 1];
  }
  slope(t: number): number {
    const h = this.h;
    if (!h || t < this.first || t >= this.last) return 0;
    this.next(t);
    const j = this.j;
    return Math.abs(h.flows[j + 1] - h.flows[j]) / (h.times[j + 1] - h.times[j]);
  }
}

/** Routes one storm through a system of ponds: `inflows` by pond index (null: none). */
export function routeSystem(ponds: readonly SystemRoutePond[], inflows: readonly (Hydrograph | null)[], options: SystemRouteOptions = {}): SystemRouteResult {
  routingTally.count++;
  const n = ponds.length;
  const fixed = options.step;
  const maxStep = options.maxStep ?? 600;
  const minStep = options.minStep ?? 1;
  const tauFraction = options.timeConstantFraction ?? TIME_CONSTANT_FRACTION;
  const cursors = ponds.map((_, i) => new InflowCursor(inflows[i] ?? null, options.inflowFraction ?? 0.01));
  let tFirst = Infinity;
  let tLast = -Infinity;
  for (const c of cursors) {
    tFirst = Math.min(tFirst, c.first);
    tLast = Math.max(tLast, c.last);
  }
  if (!Number.isFinite(tFirst)) {
    tFirst = 0;
    tLast = 0;
  }
  const tEnd = tLast + (options.maxAfterInflow ?? TEN_DAYS);

  // State and scratch (made once per routing).
  const cell = new Int32Array(n);
  const h = new Float64Array(n);
  const hTry = new Float64Array(n);
  const S = new Float64Array(n);
  const slopeS = new Float64Array(n);
  const q = new Float64Array(n);
  const dqUp = new Float64Array(n);
  const dqDown = new Float64Array(n);
  const F = new Float64Array(n);
  const J = new Float64Array(n * n);
  const delta = new Float64Array(n);
  const N = new Float64Array(n);
  const I1 = new Float64Array(n);
  const I2 = new Float64Array(n);
  const S1 = new Float64Array(n);
  const q1 = new Float64Array(n);
  const h1 = new Float64Array(n);
  const drainedStorage = new Float64Array(n);
  // Per pond results.
  const maxStage = new Float64Array(n);
  const timeOfMaxStage = new Float64Array(n);
  const maxStorage = new Float64Array(n);
  const peakForward = new Float64Array(n);
  const timeOfPeakForward = new Float64Array(n);
  const peakBack = new Float64Array(n);
  const timeOfPeakBack = new Float64Array(n);
  const peakTotalIn = new Float64Array(n);
  const volumeForward = new Float64Array(n);
  const volumeBack = new Float64Array(n);
  const drainedAt = new Float64Array(n);
  const S0 = new Float64Array(n);

  const storageAt = (i: number, x: number): number => {
    const p = ponds[i];
    const z = p.stage;
    const last = z.length - 1;
    let k = cell[i];
    while (k < last - 1 && x > z[k + 1]) k++;
    while (k > 0 && x < z[k]) k--;
    cell[i] = k;
    const w = z[k + 1] - z[k];
    const s = (p.storage[k + 1] - p.storage[k]) / w;
    slopeS[i] = s;
    return p.storage[k] + s * (x - z[k]);
  };
  let beyond = false;
  /** Every pond's storage and the flow through every outlet at the stages `x` (cells from `storageAt`). */
  const flowsAt = (x: Float64Array): void => {
    for (let i = 0; i < n; i++) S[i] = storageAt(i, x[i]);
    for (let i = 0; i < n; i++) {
      const p = ponds[i];
      if (p.link) {
        q[i] = p.link.flow(x[i], x[p.to]);
        dqUp[i] = p.link.dUp;
        dqDown[i] = p.link.dDown;
        if (p.link.beyond && x[i] > p.stage[p.stage.length - 1]) beyond = true;
      } else {
        const z = p.stage;
        const O = p.outflow!;
        const k = cell[i];
        const s = (O[k + 1] - O[k]) / (z[k + 1] - z[k]);
        q[i] = O[k] + s * (x[i] - z[k]);
        dqUp[i] = s;
        dqDown[i] = 0;
        if (x[i] > z[z.length - 1]) beyond = true;
      }
    }
  };
  /** Residual of every pond's step equation at the flows and storages last computed. */
  const residual = (twoOverDt: number): number => {
    let worst = 0;
    for (let i = 0; i < n; i++) F[i] = twoOverDt * S[i] + q[i] - N[i];
    for (let i = 0; i < n; i++) {
      const to = ponds[i].to;
      if (to >= 0) F[to] -= q[i];
    }
    for (let i = 0; i < n; i++) worst += F[i] * F[i];
    return worst;
  };
  /** Time constant limit of the step: the shortest among the ponds at the stages `x` (flows computed). */
  const timeConstant = (x: Float64Array): number => {
    let tau = Infinity;
    for (let i = 0; i < n; i++) {
      let rate = ponds[i].link ? linkRate(ponds[i].link!, x[i], x[ponds[i].to], dqUp[i]) : dqUp[i];
      for (let j = 0; j < n; j++) if (ponds[j].to === i) rate += linkRate(ponds[j].link!, x[j], x[i], -dqDown[j]);
      if (rate > 0) {
        const t = (tauFraction * slopeS[i]) / rate;
        if (t < tau) tau = t;
      }
    }
    return tau;
  };

  for (let i = 0; i < n; i++) {
    const p = ponds[i];
    h[i] = p.startStage;
    cell[i] = 0;
    drainedStorage[i] = p.drainedStage <= p.stage[0] ? 0 : storageAt(i, Math.min(p.drainedStage, p.stage[p.stage.length - 1]));
  }
  flowsAt(h);
  let t = tFirst;
  for (let i = 0; i < n; i++) {
    I1[i] = cursors[i].at(t, true);
    S1[i] = S[i];
    S0[i] = S[i];
    q1[i] = q[i];
    h1[i] = h[i];
    maxStage[i] = h[i];
    timeOfMaxStage[i] = t;
    maxStorage[i] = S[i];
    drainedAt[i] = h[i] <= ponds[i].drainedStage ? t : NaN;
    if (q[i] > 0) {
      peakForward[i] = q[i];
      timeOfPeakForward[i] = t;
    } else if (q[i] < 0) {
      peakBack[i] = -q[i];
      timeOfPeakBack[i] = t;
    }
  }
  let outfall1 = 0;
  for (let i = 0; i < n; i++) if (ponds[i].to < 0) outfall1 += q[i];
  let peakOutfall = outfall1;
  let timeOfPeakOutfall = t;
  let volumeOutfall = 0;
  let peakSystemIn = 0;
  {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += I1[i];
    peakSystemIn = sum;
  }

  // The point of analysis: the flow reaching the outfall plus the bypass (the single router's tracker).
  const points = new PointsOfAnalysis(options.bypass, options.downstream);
  const point = points.point;
  points.start(t, outfall1);
  // The routing goes on at least to the last bypass point, so every sum at a point is routed.
  const tPoint = Math.max(tLast, points.last);
  const ceiling = options.ceiling ? new CeilingTracker(options.ceiling) : null;
  ceiling?.compare(t, points.atPoint(t, outfall1));

  const record = options.record === true;
  const series: SystemSeries | undefined = record
    ? { time: [t], outfall: [outfall1], stage: ponds.map((_, i) => [h[i]]), inflow: ponds.map((_, i) => [I1[i]]), outflow: ponds.map((_, i) => [q[i]]) }
    : undefined;
  if (series && point) series.bypass = [point.at(t)];

  let steps = 0;
  let smallest = Infinity;
  let largest = 0;
  let refined = 0;
  let redone = 0;
  let iterations = 0;
  let unconverged = 0;
  let clamped = 0;
  let tau = timeConstant(h);

  let floored = false;
  /** Newton's method on the step equations for dt; true when converged. The stages end in `h`. */
  const solveStep = (twoOverDt: number, fresh: boolean): boolean => {
    floored = false;
    for (let i = 0; i < n; i++) h[i] = h1[i];
    // The flows at the step's start are those last computed, unless a try of this step moved them.
    if (!fresh) flowsAt(h);
    let norm = residual(twoOverDt);
    for (let iteration = 0; iteration < NEWTON_ITERATIONS; iteration++) {
      iterations++;
      // Jacobian of F at h.
      J.fill(0);
      for (let i = 0; i < n; i++) {
        const to = ponds[i].to;
        J[i * n + i] += twoOverDt * slopeS[i] + dqUp[i];
        if (to >= 0) {
          J[i * n + to] += dqDown[i];
          J[to * n + i] -= dqUp[i];
          J[to * n + to] -= dqDown[i];
        }
      }
      for (let i = 0; i < n; i++) delta[i] = -F[i];
      solveLinear(J, delta, n);
      // Backtracking: the full step unless it raises the residual.
      let lambda = 1;
      let accepted = false;
      let moved = 0;
      for (let attempt = 0; attempt < 8; attempt++) {
        moved = 0;
        for (let i = 0; i < n; i++) {
          let x = h[i] + lambda * delta[i];
          const floor = ponds[i].pond.bottom;
          if (x < floor) {
            // A pond cannot hold less than nothing: it is empty (the single router's clamp).
            x = floor;
            floored = true;
          }
          hTry[i] = x;
          const m = Math.abs(x - h[i]);
          if (m > moved) moved = m;
        }
        flowsAt(hTry);
        const tried = residual(twoOverDt);
        if (tried <= norm || moved <= NEWTON_TOLERANCE) {
          norm = tried;
          accepted = true;
          break;
        }
        lambda *= 0.5;
      }
      for (let i = 0; i < n; i++) h[i] = hTry[i];
      if (!accepted) flowsAt(h);
      if (moved <= NEWTON_TOLERANCE || norm === 0) return true;
    }
    return false;
  };

  while (true) {
    let dt: number;
    let t2: number;
    if (fixed !== undefined) {
      dt = fixed;
    } else {
      dt = maxStep;
      let next = Infinity;
      if (t < tLast) {
        for (let i = 0; i < n; i++) {
          const c = cursors[i];
          const slope = c.slope(t);
          if (slope > 0 && c.change / slope < dt) dt = c.change / slope;
          const np = c.next(t);
          if (np < next) next = np;
        }
      }
      const byInflow = dt;
      if (tau < dt) dt = tau;
      if (dt < minStep) dt = minStep;
      if (dt < byInflow) refined++;
      if (next < Infinity) {
        if (t + dt > next) dt = next - t;
        else if (t + 1.5 * dt > next) dt = 0.5 * (next - t);
      }
    }
    let twoOverDt = 2 / dt;
    let fresh = true;
    for (;;) {
      t2 = t + dt;
      twoOverDt = 2 / dt;
      for (let i = 0; i < n; i++) {
        I2[i] = cursors[i].at(t2, false);
        N[i] = I1[i] + I2[i] + twoOverDt * S1[i] - q1[i];
      }
      for (let i = 0; i < n; i++) {
        const to = ponds[i].to;
        if (to >= 0) N[to] += q1[i];
      }
      const converged = solveStep(twoOverDt, fresh);
      fresh = false;
      if (fixed !== undefined) {
        if (!converged) unconverged++;
        break;
      }
      const tauEnd = timeConstant(h);
      if (!converged) {
        unconverged++;
        if (dt > minStep) {
          dt = Math.max(minStep, 0.5 * dt);
          redone++;
          continue;
        }
      }
      if (dt <= minStep || dt <= REDO_FACTOR * tauEnd) {
        tau = tauEnd;
        break;
      }
      dt = tauEnd < minStep ? minStep : tauEnd;
      redone++;
    }
    if (fixed !== undefined) tau = Infinity;
    if (floored) clamped++;

    // Bookkeeping.
    steps++;
    if (dt < smallest) smallest = dt;
    if (dt > largest) largest = dt;
    let outfall2 = 0;
    let systemIn = 0;
    for (let i = 0; i < n; i++) {
      const a = q1[i];
      const b = q[i];
      // The trapezoid of the flow through outlet i, split where it changes sign.
      if (a >= 0 && b >= 0) volumeForward[i] += 0.5 * (a + b) * dt;
      else if (a <= 0 && b <= 0) volumeBack[i] -= 0.5 * (a + b) * dt;
      else {
        const share = a / (a - b);
        if (a > 0) {
          volumeForward[i] += 0.5 * a * share * dt;
          volumeBack[i] -= 0.5 * b * (1 - share) * dt;
        } else {
          volumeBack[i] -= 0.5 * a * share * dt;
          volumeForward[i] += 0.5 * b * (1 - share) * dt;
        }
      }
      if (b > peakForward[i]) {
        peakForward[i] = b;
        timeOfPeakForward[i] = t2;
      }
      if (-b > peakBack[i]) {
        peakBack[i] = -b;
        timeOfPeakBack[i] = t2;
      }
      if (ponds[i].to < 0) outfall2 += b;
      systemIn += I2[i];
      if (h[i] > maxStage[i]) {
        maxStage[i] = h[i];
        timeOfMaxStage[i] = t2;
        maxStorage[i] = S[i];
        drainedAt[i] = NaN;
      }
      const drained = ponds[i].drainedStage;
      if (h[i] <= drained && !(h1[i] <= drained)) drainedAt[i] = t2 - (dt * (drained - h[i])) / (h1[i] - h[i]);
      else if (h[i] > drained) drainedAt[i] = NaN;
    }
    for (let i = 0; i < n; i++) {
      let total = I2[i] + (q[i] < 0 ? -q[i] : 0);
      for (let j = 0; j < n; j++) if (ponds[j].to === i && q[j] > 0) total += q[j];
      if (total > peakTotalIn[i]) peakTotalIn[i] = total;
    }
    if (systemIn > peakSystemIn) peakSystemIn = systemIn;
    volumeOutfall += 0.5 * (outfall1 + outfall2) * dt;
    if (outfall2 > peakOutfall) {
      peakOutfall = outfall2;
      timeOfPeakOutfall = t2;
    }
    points.step(t, outfall1, t2, outfall2);
    ceiling?.compare(t2, points.atPoint(t2, outfall2));
    if (record) {
      series!.time.push(t2);
      series!.outfall.push(outfall2);
      if (point) series!.bypass!.push(point.at(t2));
      for (let i = 0; i < n; i++) {
        series!.stage[i].push(h[i]);
        series!.inflow[i].push(I2[i]);
        series!.outflow[i].push(q[i]);
      }
    }
    t = t2;
    outfall1 = outfall2;
    let allDrained = true;
    let stored = 0;
    for (let i = 0; i < n; i++) {
      I1[i] = cursors[i].at(t, true);
      S1[i] = S[i];
      q1[i] = q[i];
      h1[i] = h[i];
      if (h[i] > ponds[i].drainedStage) allDrained = false;
      if (S[i] > drainedStorage[i]) stored += S[i] - drainedStorage[i];
    }
    if (t >= tLast) {
      if ((allDrained && t >= tPoint) || t >= tEnd) break;
      // With no inflow left the outflow only falls: if even the present flow to the outfall kept up
      // until the end could not empty the stored water, the system does not drain in the time.
      if (outfall2 * (tEnd - t) < stored && t >= tPoint) break;
    }
  }
  points.finish(outfall1);

  let volumeIn = 0;
  let storageChange = 0;
  const stepping = { duration: t - tFirst, steps, smallestStep: smallest, largestStep: largest, refinedSteps: refined, redoneSteps: redone, clampedSteps: clamped, beyondTable: beyond };
  // A system's ponds do not exfiltrate (the loader refuses exfiltration in a system).
  const noExfiltration = { volumeExfiltrated: 0, peakExfiltration: 0 };
  const results: PondRouteResult[] = ponds.map((p, i) => {
    const own = inflows[i] ? hydrographVolume(inflows[i]!) : 0;
    let received = volumeBack[i];
    let given = volumeForward[i];
    for (let j = 0; j < n; j++) {
      if (ponds[j].to !== i) continue;
      received += volumeForward[j];
      given += volumeBack[j];
    }
    const change = S[i] - S0[i];
    volumeIn += own;
    storageChange += change;
    const into = own + received;
    let drawdownTime: number | null = null;
    if (maxStage[i] <= p.drainedStage) drawdownTime = 0;
    else if (!Number.isNaN(drainedAt[i])) drawdownTime = Math.max(0, drainedAt[i] - timeOfMaxStage[i]);
    return {
      name: p.name,
      peakInflow: cursors[i].peak,
      peakTotalInflow: Math.max(peakTotalIn[i], cursors[i].peak),
      peakOutflow: peakForward[i],
      timeOfPeakOutflow: timeOfPeakForward[i],
      peakAtPoint: peakForward[i],
      timeOfPeakAtPoint: timeOfPeakForward[i],
      bypassAtPeak: 0,
      peakReverse: peakBack[i],
      timeOfPeakReverse: timeOfPeakBack[i],
      volumeBack: volumeBack[i],
      maxStage: maxStage[i],
      timeOfMaxStage: timeOfMaxStage[i],
      maxStorage: maxStorage[i],
      volumeIn: into,
      volumeOut: given,
      storageChange: change,
      massBalanceError: into > 0 ? (into - given - change) / into : 0,
      drawdownTime,
      ...noExfiltration,
      ...stepping,
    };
  });
  return {
    ponds: results,
    peakInflow: peakSystemIn,
    peakOutflow: peakOutfall,
    timeOfPeakOutflow: timeOfPeakOutfall,
    ...points.result(peakOutfall, timeOfPeakOutfall),
    volumeIn,
    volumeOut: volumeOutfall,
    storageChange,
    massBalanceError: volumeIn > 0 ? (volumeIn - volumeOutfall - storageChange) / volumeIn : 0,
    ...stepping,
    iterations,
    unconverged,
    series,
    ceiling: ceiling?.approach(),
  };
}

/** The closest approach of a flow to a ceiling hydrograph over the ceiling's span (compared at step ends). */
class CeilingTracker {
  private j = 0;
  private margin = Infinity;
  private flow = 0;
  private limit = 0;
  private time = 0;
  constructor(private readonly h: Hydrograph) {}
  compare(t: number, flow: number): void {
    const { times, flows } = this.h;
    const last = times.length - 1;
    if (t < times[0] || t > times[last]) return;
    let j = this.j;
    while (j < last - 1 && times[j + 1] < t) j++;
    this.j = j;
    const limit = last < 1 ? flows[0] : flows[j] + ((flows[j + 1] - flows[j]) * (t - times[j])) / (times[j + 1] - times[j]);
    if (limit - flow >= this.margin) return;
    this.margin = limit - flow;
    this.flow = flow;
    this.limit = limit;
    this.time = t;
  }
  approach(): CeilingApproach {
    return { margin: this.margin === Infinity ? 0 : this.margin, outflow: this.flow, limit: this.limit, time: this.time };
  }
}

/**
 * How fast a link's flow changes with one pond's stage, for the time constant: the interpolant's
 * slope `slope`, but near equal levels (where it grows like 1/sqrt of the difference) no more than the
 * chord from the level of the other pond to TAU_DIFFERENCE away.
 */
function linkRate(link: LinkTable, up: number, down: number, slope: number): number {
  const d = up - down;
  const size = d < 0 ? -d : d;
  if (size >= TAU_DIFFERENCE) return slope;
  const i0 = link.dUp;
  const i1 = link.dDown;
  const chord = Math.abs(link.flow(down + TAU_DIFFERENCE, down)) / TAU_DIFFERENCE;
  link.dUp = i0;
  link.dDown = i1;
  return slope < chord ? slope : chord;
}

/** Solves A x = b in place (b becomes x) by Gaussian elimination with partial pivoting; A is overwritten. */
export function solveLinear(A: Float64Array, b: Float64Array, n: number): void {
  for (let c = 0; c < n; c++) {
    let pivot = c;
    let best = Math.abs(A[c * n + c]);
    for (let r = c + 1; r < n; r++) {
      const v = Math.abs(A[r * n + c]);
      if (v > best) {
        best = v;
        pivot = r;
      }
    }
    if (best === 0) continue;
    if (pivot !== c) {
      for (let k = 0; k < n; k++) {
        const tmp = A[c * n + k];
        A[c * n + k] = A[pivot * n + k];
        A[pivot * n + k] = tmp;
      }
      const tb = b[c];
      b[c] = b[pivot];
      b[pivot] = tb;
    }
    const d = A[c * n + c];
    for (let r = c + 1; r < n; r++) {
      const f = A[r * n + c] / d;
      if (f === 0) continue;
      for (let k = c; k < n; k++) A[r * n + k] -= f * A[c * n + k];
      b[r] -= f * b[c];
    }
  }
  for (let c = n - 1; c >= 0; c--) {
    let s = b[c];
    for (let k = c + 1; k < n; k++) s -= A[c * n + k] * b[k];
    const d = A[c * n + c];
    b[c] = d !== 0 ? s / d : 0;
  }
}
