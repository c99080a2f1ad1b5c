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
// chord over at least CHORD_DIFFERENCE of level difference so that levels at rest against each other do
// not shrink the step to nothing); a step that ends where that limit is much shorter is done again.
// Nothing is allocated per step: the state lives in Float64Arrays made once per routing. A step's
// first try starts from the flows last computed (those at its start), not evaluated again.
import type { Hydrograph, Pond } from "../model.js";
import { CHORD_DIFFERENCE, type LinkTable } from "./linkTable.js";
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
  /** Automatic step: fraction of a link's own time constant a step may span (LINK_TIME_CONSTANT_FRACTION). */
  linkTimeConstantFraction?: number;
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
/**
 * A step is converged when each pond's residual is no more than its storage holds in this much stage
 * (m): `conserve` then gives the residual to the storage, so the mass balance closes and the stage is
 * at most this far from the storage's (a thousandth of the contract's 0.003 m).
 */
const STAGE_TOLERANCE = 3e-6;
/** The step spans at most this fraction of the shortest time constant (the single router's). */
const TIME_CONSTANT_FRACTION = 0.15;
/**
 * The step spans at most this fraction of a link's own time constant (a pond's storage over the rate
 * at which the link's flow changes with its level, near equal levels the chord's): the mode in which
 * two ponds' levels even out through a link is fast and stiff, and the trapezoidal rule damps it
 * (by (1 - r/2) / (1 + r/2) a step, r = dt / time constant) while it follows the slow inflows that
 * drive the flow through the link to the accuracy of the step; the slow modes keep TIME_CONSTANT_FRACTION.
 */
export const LINK_TIME_CONSTANT_FRACTION = 1;

/**
 * A pond's inflow walked by a cursor. Its look-ups leave their results in fields (`value`, `nextPoint`,
 * `rate`) instead of returning them, so that nothing is boxed per step.
 */
class InflowCursor {
  private j = 0;
  readonly first: number;
  readonly last: number;
  readonly peak: number;
  readonly change: number;
  /** The value of the last `load`. */
  value = 0;
  /** After `advance(t)`: the next point after t (Infinity after the last) and |slope| of the segment holding t (0 outside). */
  nextPoint = Infinity;
  rate = 0;
  /** The slope of each segment of the inflow (m3/s per s), made once per hydrograph. */
  private readonly slopes: Float64Array;
  constructor(readonly h: Hydrograph | null, fraction: number) {
    const n = h ? h.times.length : 0;
    this.slopes = h ? slopesOf(h.times, h.flows) : new Float64Array(0);
    this.first = n ? h!.times[0] : Infinity;
    this.last = n ? h!.times[n - 1] : -Infinity;
    let peak = 0;
    if (h) for (let i = 0; i < n; i++) if (h.flows[i] > peak) peak = h.flows[i];
    this.peak = peak;
    this.change = fraction * peak;
  }
  /** The time of the next `load` (s): a field, so that the call boxes nothing. */
  t = 0;
  /** Value at `t` approached from the left (from the right when `right`): zero outside the points. */
  load(right: boolean): void {
    const h = this.h;
    const t = this.t;
    if (!h || t < this.first || t > this.last) this.value = 0;
    else if (t === this.first) this.value = right ? h.flows[0] : 0;
    else if (t === this.last) this.value = right ? 0 : h.flows[h.times.length - 1];
    else {
      const times = h.times;
      const end = times.length - 2;
      let j = this.j;
      while (j < end && times[j + 1] < t) j++;
      while (j > 0 && times[j] >= t) j--;
      this.j = j;
      this.value = h.flows[j] + this.slopes[j] * (t - times[j]);
    }
  }
  /** Sets `nextPoint` and `rate` for the time `t`. */
  advance(): void {
    const h = this.h;
    const t = this.t;
    if (!h || t >= this.last) {
      this.nextPoint = Infinity;
      this.rate = 0;
      return;
    }
    if (t < this.first) {
      this.nextPoint = this.first;
      this.rate = 0;
      return;
    }
    const times = h.times;
    let j = this.j;
    while (j < times.length - 2 && times[j + 1] <= t) j++;
    this.j = j;
    this.nextPoint = times[j + 1];
    this.rate = Math.abs(this.slopes[j]);
  }
}

/**
 * The state of a routing and the solution of one step: every array made once per routing, every
 * result left in an array or a field (nothing boxed or allocated per step).
 */
class SystemStepper {
  readonly n: number;
  readonly to: Int32Array;
  /** Ponds upstream first (every pond before the pond it drains into): the order of the elimination. */
  readonly order: Int32Array;
  readonly links: (LinkTable | null)[];
  readonly floor: Float64Array;
  readonly drained: Float64Array;
  readonly stage: Float64Array[];
  readonly storage: Float64Array[];
  readonly outflow: (Float64Array | null)[];
  /** The slope of each pond's storage and outflow in each cell of its grid (made once per table). */
  readonly storageSlope: Float64Array[];
  readonly outflowSlope: (Float64Array | null)[];
  /** Each pond's cell of its stage grid (a cursor). */
  readonly cell: Int32Array;
  /** Stages being solved, a trial's stages, storage and its slope, flows through each outlet and their partial derivatives. */
  readonly h: Float64Array;
  readonly hTry: Float64Array;
  readonly S: Float64Array;
  readonly slopeS: Float64Array;
  readonly q: Float64Array;
  readonly dqUp: Float64Array;
  readonly dqDown: Float64Array;
  /** Residuals, the known side of each step equation, the elimination's diagonal and right-hand side, the Newton step. */
  readonly F: Float64Array;
  readonly N: Float64Array;
  readonly D: Float64Array;
  readonly R: Float64Array;
  readonly delta: Float64Array;
  /** Each pond's rate of net outflow with its own stage (the time constant's). */
  readonly rates: Float64Array;
  /** The start of the step: stages, storages, flows. */
  readonly h1: Float64Array;
  readonly S1: Float64Array;
  readonly q1: Float64Array;
  /**
   * The pieces of the tables the last evaluation used (storage cell per pond, the link's cell), and
   * those of the evaluation before: equal, the step's equations are linear between the two.
   */
  readonly pieces: Float64Array;
  readonly piecesBefore: Float64Array;
  /** 2 / dt of the step being solved (set before `solve`: a field, so that the call boxes nothing). */
  twoOverDt = 0;
  /** The last `residual` (sum of squares) and `timeConstant`. */
  norm = 0;
  tau = 0;
  beyond = false;
  floored = false;
  iterations = 0;

  constructor(
    readonly ponds: readonly SystemRoutePond[],
    readonly tauFraction: number,
    /** Weight of the links' rates in the time constant: TIME_CONSTANT_FRACTION over the link's own fraction. */
    readonly linkWeight: number,
  ) {
    const n = (this.n = ponds.length);
    this.to = Int32Array.from(ponds, (p) => p.to);
    this.order = upstreamFirst(this.to);
    this.links = ponds.map((p) => p.link);
    this.floor = Float64Array.from(ponds, (p) => p.pond.bottom);
    this.drained = Float64Array.from(ponds, (p) => p.drainedStage);
    this.stage = ponds.map((p) => p.stage);
    this.storage = ponds.map((p) => p.storage);
    this.outflow = ponds.map((p) => p.outflow);
    this.storageSlope = ponds.map((p) => slopesOf(p.stage, p.storage));
    this.outflowSlope = ponds.map((p) => (p.outflow ? slopesOf(p.stage, p.outflow) : null));
    this.cell = new Int32Array(n);
    const arrays = () => new Float64Array(n);
    this.h = arrays();
    this.hTry = arrays();
    this.S = arrays();
    this.slopeS = arrays();
    this.q = arrays();
    this.dqUp = arrays();
    this.dqDown = arrays();
    this.F = arrays();
    this.N = arrays();
    this.D = arrays();
    this.R = arrays();
    this.delta = arrays();
    this.rates = arrays();
    this.h1 = arrays();
    this.S1 = arrays();
    this.q1 = arrays();
    this.pieces = new Float64Array(2 * n);
    this.piecesBefore = new Float64Array(2 * n);
  }

  /** Pond i's storage at stage x (linear between the nodes of its grid), its slope, its cell. */
  storageAt(i: number, x: number): void {
    const z = this.stage[i];
    const V = this.storage[i];
    const last = z.length - 1;
    let k = this.cell[i];
    while (k < last - 1 && x > z[k + 1]) k++;
    while (k > 0 && x < z[k]) k--;
    this.cell[i] = k;
    const s = (V[k + 1] - V[k]) / (z[k + 1] - z[k]);
    this.slopeS[i] = s;
    this.S[i] = V[k] + s * (x - z[k]);
  }

  /** Every pond's storage and the flow through every outlet at the stages `x`, and the table pieces used. */
  flowsAt(x: Float64Array): void {
    const n = this.n;
    const { pieces, piecesBefore, q, dqUp, dqDown, to } = this;
    const { cell, slopeS, S } = this;
    for (let i = 0; i < n; i++) {
      piecesBefore[2 * i] = pieces[2 * i];
      piecesBefore[2 * i + 1] = pieces[2 * i + 1];
      // The storage (as `storageAt`, written out: a call would box the stage).
      const z = this.stage[i];
      const V = this.storage[i];
      const xi = x[i];
      const last = z.length - 1;
      let k = cell[i];
      while (k < last - 1 && xi > z[k + 1]) k++;
      while (k > 0 && xi < z[k]) k--;
      cell[i] = k;
      const slope = this.storageSlope[i][k];
      slopeS[i] = slope;
      S[i] = V[k] + slope * (xi - z[k]);
      pieces[2 * i] = k;
      const link = this.links[i];
      if (link !== null) {
        link.lookupIn(x, i, to[i]);
        q[i] = link.q;
        dqUp[i] = link.dUp;
        dqDown[i] = link.dDown;
        pieces[2 * i + 1] = link.cell;
        if (link.beyond && x[i] > z[z.length - 1]) this.beyond = true;
      } else {
        const O = this.outflow[i]!;
        const s = this.outflowSlope[i]![k];
        q[i] = O[k] + s * (xi - z[k]);
        dqUp[i] = s;
        dqDown[i] = 0;
        if (xi > z[last]) this.beyond = true;
      }
    }
  }

  /** Whether the last two evaluations used the same pieces of every table. */
  samePieces(): boolean {
    const { pieces, piecesBefore } = this;
    for (let i = 0; i < pieces.length; i++) if (pieces[i] !== piecesBefore[i]) return false;
    return true;
  }

  /** Whether every pond's residual is what its storage takes up by a stage change under STAGE_TOLERANCE. */
  small(): boolean {
    const { n, F, slopeS } = this;
    for (let i = 0; i < n; i++) if (Math.abs(F[i]) > STAGE_TOLERANCE * this.twoOverDt * slopeS[i]) return false;
    return true;
  }

  /** Residual of every pond's step equation at the flows and storages last computed; `norm` its sum of squares. */
  residual(): void {
    const { n, F, S, q, N, to } = this;
    const twoOverDt = this.twoOverDt;
    for (let i = 0; i < n; i++) F[i] = twoOverDt * S[i] + q[i] - N[i];
    for (let i = 0; i < n; i++) if (to[i] >= 0) F[to[i]] -= q[i];
    let sum = 0;
    for (let i = 0; i < n; i++) sum += F[i] * F[i];
    this.norm = sum;
  }

  /**
   * The Newton step `delta` of the step equations at the flows last computed: J delta = -F, where pond
   * i's row holds its own stage, the stage of the pond it drains into and those of the ponds draining
   * into it. The ponds form a tree (each drains into one), so elimination from the upstream ponds down
   * to the outfall and substitution back up solve it exactly in O(n), without pivoting: each column of
   * J is diagonally dominant (2 S'/dt plus dQ/dh of the pond's own outlet on the diagonal, the same
   * dQ/dh and the upstream links' below it).
   */
  newtonStep(): void {
    const { n, D, R, F, to, order, slopeS, dqUp, dqDown, delta } = this;
    const twoOverDt = this.twoOverDt;
    for (let i = 0; i < n; i++) {
      D[i] = twoOverDt * slopeS[i] + dqUp[i];
      R[i] = -F[i];
    }
    for (let i = 0; i < n; i++) if (to[i] >= 0) D[to[i]] -= dqDown[i];
    for (let k = 0; k < n; k++) {
      const i = order[k];
      const down = to[i];
      if (down < 0 || D[i] === 0) continue;
      // Row i: D_i d_i + dQ_i/dh_down d_down = R_i; the pond below holds -dQ_i/dh_i d_i.
      D[down] += (dqUp[i] * dqDown[i]) / D[i];
      R[down] += (dqUp[i] * R[i]) / D[i];
    }
    for (let k = n - 1; k >= 0; k--) {
      const i = order[k];
      const down = to[i];
      const r = down < 0 ? R[i] : R[i] - dqDown[i] * delta[down];
      delta[i] = D[i] !== 0 ? r / D[i] : 0;
    }
  }

  /**
   * Newton's method on the step equations for dt from the step's start; true when converged (the
   * stages end in `h`). `fresh`: the flows last computed are those at the start (not evaluated again).
   */
  solve(fresh: boolean): boolean {
    const { n, h, hTry, h1, delta, floor } = this;
    this.floored = false;
    for (let i = 0; i < n; i++) h[i] = h1[i];
    if (!fresh) this.flowsAt(h);
    this.residual();
    let norm = this.norm;
    for (let iteration = 0; iteration < NEWTON_ITERATIONS; iteration++) {
      this.iterations++;
      this.newtonStep();
      // Backtracking: the full step unless it raises the residual.
      let lambda = 1;
      let accepted = false;
      let moved = 0;
      for (let attempt = 0; attempt < 8; attempt++) {
        moved = 0;
        for (let i = 0; i < n; i++) {
          let x = h[i] + lambda * delta[i];
          if (x < floor[i]) {
            // A pond cannot hold less than nothing: it is empty (the single router's clamp).
            x = floor[i];
            this.floored = true;
          }
          hTry[i] = x;
          const m = Math.abs(x - h[i]);
          if (m > moved) moved = m;
        }
        this.flowsAt(hTry);
        this.residual();
        if (this.norm <= norm || moved <= NEWTON_TOLERANCE) {
          norm = this.norm;
          accepted = true;
          break;
        }
        lambda *= 0.5;
      }
      for (let i = 0; i < n; i++) h[i] = hTry[i];
      if (!accepted) {
        this.flowsAt(h);
        this.residual();
      }
      // Converged: a negligible move, a full step that stayed on the pieces of the tables its Jacobian
      // came from (there the equations are linear, up to the links' bilinear cross term), or one whose
      // residual each pond's storage alone would take up by a stage change under STAGE_TOLERANCE.
      if (moved <= NEWTON_TOLERANCE || norm === 0) return true;
      if (accepted && lambda === 1 && !this.floored && (this.samePieces() || this.small())) return true;
    }
    return false;
  }

  /**
   * After a converged step: each pond's storage is set to what its step equation holds exactly at the
   * flows found, so that no volume is lost or made by what Newton's method left (the residual of a
   * step accepted on one piece of the tables, the links' bilinear cross term: a stage some micrometres
   * off its storage at most). The mass balance then closes to rounding.
   */
  conserve(): void {
    // `F` holds the residual at the stages `solve` ended on (every evaluation there is followed by one).
    const { n, S, F } = this;
    const halfDt = 1 / this.twoOverDt;
    for (let i = 0; i < n; i++) S[i] -= F[i] * halfDt;
  }

  /**
   * Time-constant limit of the step (`tau`): the shortest among the ponds at the stages `x` (flows
   * computed) of a pond's storage slope over the rate at which its net outflow rises with its stage.
   * A link's rate is its interpolant's slope (with the upstream stage, or minus it with the
   * downstream one), but near equal levels (where it grows like 1/sqrt of the difference) no more
   * than the chord from the level of the pond below to CHORD_DIFFERENCE above it (`chords`).
   */
  timeConstant(x: Float64Array): void {
    const { n, links, to, dqUp, dqDown, slopeS, rates } = this;
    for (let i = 0; i < n; i++) rates[i] = links[i] === null ? dqUp[i] : 0;
    for (let j = 0; j < n; j++) {
      const link = links[j];
      if (link === null) continue;
      let up = dqUp[j];
      let down = -dqDown[j];
      const d = x[j] - x[to[j]];
      if (d < CHORD_DIFFERENCE && d > -CHORD_DIFFERENCE) {
        link.lookupChord(x, to[j]);
        const chord = Math.abs(link.q) / CHORD_DIFFERENCE;
        if (chord < up) up = chord;
        if (chord < down) down = chord;
      }
      rates[j] += this.linkWeight * up;
      rates[to[j]] += this.linkWeight * down;
    }
    let tau = Infinity;
    for (let i = 0; i < n; i++) {
      if (rates[i] > 0) {
        const t = (this.tauFraction * slopeS[i]) / rates[i];
        if (t < tau) tau = t;
      }
    }
    this.tau = tau;
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

  const stepper = new SystemStepper(ponds, tauFraction, tauFraction / (options.linkTimeConstantFraction ?? LINK_TIME_CONSTANT_FRACTION));
  const { h, S, q, N, S1, q1, h1, to } = stepper;
  const I1 = new Float64Array(n);
  const I2 = new Float64Array(n);
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

  for (let i = 0; i < n; i++) {
    const p = ponds[i];
    h[i] = p.startStage;
    if (p.drainedStage <= p.stage[0]) drainedStorage[i] = 0;
    else {
      stepper.storageAt(i, Math.min(p.drainedStage, p.stage[p.stage.length - 1]));
      drainedStorage[i] = S[i];
    }
  }
  stepper.flowsAt(h);
  let t = tFirst;
  for (let i = 0; i < n; i++) {
    cursors[i].t = t;
    cursors[i].load(true);
    I1[i] = cursors[i].value;
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
  for (let i = 0; i < n; i++) if (to[i] < 0) outfall1 += q[i];
  let peakOutfall = outfall1;
  let timeOfPeakOutfall = t;
  let volumeOutfall = 0;
  let peakSystemIn = 0;
  for (let i = 0; i < n; i++) peakSystemIn += I1[i];

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
  let unconverged = 0;
  let clamped = 0;
  stepper.timeConstant(h);
  let tau = stepper.tau;

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
          c.t = t;
          c.advance();
          if (c.rate > 0 && c.change / c.rate < dt) dt = c.change / c.rate;
          if (c.nextPoint < next) next = c.nextPoint;
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
    let fresh = true;
    for (;;) {
      t2 = t + dt;
      const twoOverDt = 2 / dt;
      for (let i = 0; i < n; i++) {
        cursors[i].t = t2;
        cursors[i].load(false);
        I2[i] = cursors[i].value;
        N[i] = I1[i] + I2[i] + twoOverDt * S1[i] - q1[i];
      }
      for (let i = 0; i < n; i++) if (to[i] >= 0) N[to[i]] += q1[i];
      stepper.twoOverDt = twoOverDt;
      const converged = stepper.solve(fresh);
      if (converged && !stepper.floored) stepper.conserve();
      fresh = false;
      if (fixed !== undefined) {
        if (!converged) unconverged++;
        break;
      }
      stepper.timeConstant(h);
      const tauEnd = stepper.tau;
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
    if (stepper.floored) clamped++;

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
      if (to[i] < 0) outfall2 += b;
      systemIn += I2[i];
      if (h[i] > maxStage[i]) {
        maxStage[i] = h[i];
        timeOfMaxStage[i] = t2;
        maxStorage[i] = S[i];
        drainedAt[i] = NaN;
      }
      const drained = stepper.drained[i];
      if (h[i] <= drained && !(h1[i] <= drained)) drainedAt[i] = t2 - (dt * (drained - h[i])) / (h1[i] - h[i]);
      else if (h[i] > drained) drainedAt[i] = NaN;
    }
    for (let i = 0; i < n; i++) {
      let total = I2[i] + (q[i] < 0 ? -q[i] : 0);
      for (let j = 0; j < n; j++) if (to[j] === i && q[j] > 0) total += q[j];
      if (total > peakTotalIn[i]) peakTotalIn[i] = total;
    }
    if (systemIn > peakSystemIn) peakSystemIn = systemIn;
    volumeOutfall += 0.5 * (outfall1 + outfall2) * dt;
    if (outfall2 > peakOutfall) {
      peakOutfall = outfall2;
      timeOfPeakOutfall = t2;
    }
    if (points.active) points.step(t, outfall1, t2, outfall2);
    if (ceiling) ceiling.compare(t2, points.atPoint(t2, outfall2));
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
      // After a pond's last inflow point its inflow is zero; elsewhere it runs on from its value at t.
      I1[i] = t === cursors[i].last ? 0 : t === cursors[i].first ? cursors[i].h!.flows[0] : I2[i];
      S1[i] = S[i];
      q1[i] = q[i];
      h1[i] = h[i];
      if (h[i] > stepper.drained[i]) allDrained = false;
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
  const beyond = stepper.beyond;
  const iterations = stepper.iterations;

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

/** Slopes of a broken line's segments, kept per table (by its values) so that each is made once. */
const keptSlopes = new WeakMap<Float64Array, Float64Array>();

/** The slope of each segment of y over x (a broken line): made once per pair of arrays. */
function slopesOf(x: Float64Array, y: Float64Array): Float64Array {
  let slopes = keptSlopes.get(y);
  if (!slopes || slopes.length !== Math.max(0, y.length - 1)) {
    slopes = new Float64Array(Math.max(0, y.length - 1));
    for (let k = 0; k < slopes.length; k++) slopes[k] = (y[k + 1] - y[k]) / (x[k + 1] - x[k]);
    keptSlopes.set(y, slopes);
  }
  return slopes;
}

/** The ponds ordered so that every pond comes before the pond it drains into (`to`: -1 the outfall; no cycles). */
export function upstreamFirst(to: Int32Array): Int32Array {
  const n = to.length;
  const depth = new Int32Array(n);
  for (let i = 0; i < n; i++) for (let j = to[i], d = 1; j >= 0 && d <= n; j = to[j], d++) depth[i] = d;
  return Int32Array.from(Array.from({ length: n }, (_, i) => i).sort((a, b) => depth[b] - depth[a] || a - b));
}
