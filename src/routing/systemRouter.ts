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
// The ponds are taken upstream first (each before the pond it drains into), so that Newton's method
// costs two passes over them an iteration: down the array the Newton step by substitution back, the
// trial stages and the evaluation of every table; up the array, only while it goes on, the elimination
// (`SystemStepper`). Nothing is allocated per step: the state is one Float64Array made once per
// routing, a record per pond (see STRIDE). A step's first try starts from the flows last computed
// (those at its start), not evaluated again.
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
  /** The general stepper even for two ponds in a chain (which otherwise take `PairStepper`): the tests compare the two. */
  general?: boolean;
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
 * (m): the step's bookkeeping then gives the residual to the storage, so the mass balance closes and the stage is
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
  /** Its points (empty for none). */
  readonly times: Float64Array;
  readonly flows: Float64Array;
  /** Its first and last times (Infinity and -Infinity for none), its peak, and the change it may make in a step. */
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
  constructor(h: Hydrograph | null, fraction: number) {
    this.times = h ? h.times : new Float64Array(0);
    this.flows = h ? h.flows : new Float64Array(0);
    const n = this.times.length;
    this.slopes = h ? slopesOf(h.times, h.flows) : new Float64Array(0);
    this.first = n ? this.times[0] : Infinity;
    this.last = n ? this.times[n - 1] : -Infinity;
    let peak = 0;
    for (let i = 0; i < n; i++) if (this.flows[i] > peak) peak = this.flows[i];
    this.peak = peak;
    this.change = fraction * peak;
  }
  /** The time of the next `load` (s): a field, so that the call boxes nothing. */
  t = 0;
  /**
   * Value at `t` approached from the left (from the right when `right`): zero outside the points
   * (always, with none). Inside them the walk needs no bounds (a point on either side of t stops it);
   * the ends are another method's, so that this one is small enough for V8 to inline into the steppers.
   */
  load(right: boolean): void {
    const t = this.t;
    if (t > this.first && t < this.last) {
      const times = this.times;
      let j = this.j;
      while (times[j + 1] < t) j++;
      while (times[j] >= t) j--;
      this.j = j;
      this.value = this.flows[j] + this.slopes[j] * (t - times[j]);
    } else this.atEnds(right);
  }
  /** `load` at or outside the first and last points. */
  private atEnds(right: boolean): void {
    const t = this.t;
    if (t < this.first || t > this.last) this.value = 0;
    else if (t === this.first) this.value = right ? this.flows[0] : 0;
    else this.value = right ? 0 : this.flows[this.flows.length - 1];
  }
  /** Sets `nextPoint` and `rate` for the time `t`. */
  advance(): void {
    const t = this.t;
    if (t >= this.last) {
      this.nextPoint = Infinity;
      this.rate = 0;
      return;
    }
    if (t < this.first) {
      this.nextPoint = this.first;
      this.rate = 0;
      return;
    }
    const times = this.times;
    let j = this.j;
    while (j < times.length - 2 && times[j + 1] <= t) j++;
    this.j = j;
    this.nextPoint = times[j + 1];
    this.rate = Math.abs(this.slopes[j]);
  }
}

/*
 * A pond's record in the stepper's `state`: STRIDE numbers a pond, pond i's from i * STRIDE. One array
 * for every pond's numbers, so that a pass over the ponds loads one array: a pass over twenty arrays of
 * two numbers each spends as long loading the arrays as on its arithmetic.
 */
/** The stage being solved, and the stage a trial starts from (m). */
const H = 0;
const BASE = 1;
/** Storage (m3 above the floor) and its slope with stage (m2). */
const STORAGE = 2;
const SLOPE = 3;
/** Flow through the pond's outlet (m3/s, negative back) and its partial derivatives in the pond's own stage and in the stage of the pond below (m2/s). */
const FLOW = 4;
const BY_OWN = 5;
const BY_BELOW = 6;
/** Its step equation's residual and known side, its row's diagonal and right-hand side after the elimination, its Newton step. */
const RESIDUAL = 7;
const KNOWN = 8;
const DIAGONAL = 9;
const RIGHT = 10;
const STEP = 11;
/**
 * What the ponds draining into it hand it in a pass up (zeroed as it takes them): minus their flows
 * (its residual), their flows at the step's start (its known side), minus their links' partials in its
 * stage and their rows' elimination (its diagonal, kept apart so that the sums are those of the
 * elimination written out), their rows' elimination (its right-hand side), their links' rates (its
 * time constant).
 */
const FLOW_ABOVE = 12;
const KNOWN_ABOVE = 13;
const PARTIAL_ABOVE = 14;
const DIAGONAL_ABOVE = 15;
const RIGHT_ABOVE = 16;
const RATE_ABOVE = 17;
/** The step's start: stage, storage, flow, its own inflow; its own inflow at the step's end. */
const H1 = 18;
const S1 = 19;
const Q1 = 20;
const I1 = 21;
const I2 = 22;
/** Its floor (m). */
const FLOOR = 23;
const STRIDE = 24;
/** A pond's integers in `index`: the record of the pond below (-1 the outfall), its cell of its grid, its link's cell (`LinkTable.cell`) at the last evaluation. */
const BELOW = 0;
const CELL = 1;
const LINK_CELL = 2;
const INDEX_STRIDE = 3;

/**
 * The states of the last routings by size, kept for the next of as many ponds: a Float64Array of more
 * than 64 bytes is made outside V8's heap, which costs some microseconds, a few per cent of a storm's
 * routing. A routing takes one (`takeState`) and gives it back when it ends.
 */
const keptStates = new Map<number, Float64Array>();

/** A zeroed state of `size` numbers: a kept one if there is one. */
function takeState(size: number): Float64Array {
  const kept = keptStates.get(size);
  if (kept === undefined) return new Float64Array(size);
  keptStates.delete(size);
  return kept.fill(0);
}

/** A pond's tables as the stepper reads them. */
class PondTables {
  /** The slope of its storage and outflow in each cell of its grid (made once per table). */
  readonly storageSlope: Float64Array;
  readonly outflowSlope: Float64Array | null;
  constructor(
    readonly stage: Float64Array,
    readonly storage: Float64Array,
    /** A pond at the outfall: its outflow on `stage` (its rating table); null for a pond draining into another. */
    readonly outflow: Float64Array | null,
    readonly link: LinkTable | null,
  ) {
    this.storageSlope = slopesOf(stage, storage);
    this.outflowSlope = outflow ? slopesOf(stage, outflow) : null;
  }
}

/**
 * The state of a routing and the solution of one step, the ponds upstream first (each before the pond
 * it drains into), so that a pass up the array visits every pond after the ponds draining into it and
 * a pass down the array every pond after the pond below. Every array is made once per routing (the
 * state kept for the next), every result left in `state` or a field (nothing boxed or allocated per
 * step).
 *
 * A Newton iteration is a pass down the array (`trial`): substitution back gives each pond's Newton
 * step from the step of the pond below, then its trial stage, then its evaluation there (its storage
 * and slope, the flow through its outlet and its partials: the pond below's stage is set by then)
 * and its residual, from which the ponds draining into it take their flows as they come. A short
 * loop sums the residuals' squares and tells whether every residual is small (`small`); the pass has
 * told whether the evaluation stayed on the table pieces of the one before (`samePieces`): the test
 * of convergence. Only if the iteration goes on, a pass up the array (`settle`) eliminates: each pond's
 * row takes what the ponds draining into it hand down, and hands its own to the pond below. A step's
 * first pass up also forms each pond's inflow, the known side of its step equation and its residual.
 */
class SystemStepper {
  readonly n: number;
  /** Every pond's record (see STRIDE), and its integers (see INDEX_STRIDE). */
  readonly state: Float64Array;
  readonly index: Int32Array;
  readonly tables: PondTables[];
  /** 2 / dt of the step being solved, its end (s), and a trial's fraction of the Newton step (fields, so that the calls box nothing). */
  twoOverDt = 0;
  t2 = 0;
  lambda = 1;
  /** The last evaluation (`trial`; `norm` also a step's first pass up): sum of the residuals' squares, whether every residual is small, whether every pond stayed on its pieces. */
  norm = 0;
  small = false;
  samePieces = false;
  /** The last trial's largest stage change (m), the last `timeConstant`. */
  moved = 0;
  tau = 0;
  beyond = false;
  floored = false;
  iterations = 0;

  constructor(
    ponds: readonly SystemRoutePond[],
    /** The pond each drains into (its place here), -1 the outfall. */
    to: Int32Array,
    /** Each pond's own inflow. */
    readonly cursors: readonly InflowCursor[],
    readonly tauFraction: number,
    /** Weight of the links' rates in the time constant: TIME_CONSTANT_FRACTION over the link's own fraction. */
    readonly linkWeight: number,
  ) {
    const n = (this.n = ponds.length);
    this.tables = ponds.map((p) => new PondTables(p.stage, p.storage, p.outflow, p.link));
    this.state = takeState(n * STRIDE);
    this.index = new Int32Array(n * INDEX_STRIDE);
    for (let i = 0; i < n; i++) {
      this.state[i * STRIDE + FLOOR] = ponds[i].pond.bottom;
      this.index[i * INDEX_STRIDE + BELOW] = to[i] < 0 ? -1 : to[i] * STRIDE;
    }
  }

  /** Pond i's storage at stage x (linear between the nodes of its grid), its slope, its cell. */
  storageAt(i: number, x: number): void {
    const { stage: z, storage: V } = this.tables[i];
    const last = z.length - 1;
    let k = this.index[i * INDEX_STRIDE + CELL];
    while (k < last - 1 && x > z[k + 1]) k++;
    while (k > 0 && x < z[k]) k--;
    this.index[i * INDEX_STRIDE + CELL] = k;
    const s = (V[k + 1] - V[k]) / (z[k + 1] - z[k]);
    this.state[i * STRIDE + SLOPE] = s;
    this.state[i * STRIDE + STORAGE] = V[k] + s * (x - z[k]);
  }

  /**
   * A pass up the array: the elimination of J delta = -F from the last evaluation, where pond i's row
   * holds its own stage, the stage of the pond it drains into and those of the ponds draining into it.
   * The ponds form a tree (each drains into one), so elimination from the upstream ponds down to the
   * outfall and substitution back up (`trial`) solve it exactly in O(n), without pivoting: each column
   * of J is diagonally dominant (2 S'/dt plus dQ/dh of the pond's own outlet on the diagonal, the same
   * dQ/dh and the upstream links' below it). With `start`, first each pond's inflow at the step's end
   * `t2`, the known side of its step equation,
   *   N_i = I_i(t1) + I_i(t2) + 2 S_i(t1)/dt - Out_i(t1) + (flows in at t1 from the ponds draining into it),
   * and its residual at the flows last computed (`norm` their sum of squares): a step's first pass.
   */
  settle(start: boolean): void {
    const { n, state: s, index } = this;
    const twoOverDt = this.twoOverDt;
    let norm = 0;
    for (let i = 0, o = 0, k = 0; i < n; i++, o += STRIDE, k += INDEX_STRIDE) {
      const below = index[k + BELOW];
      let f: number;
      if (start) {
        const c = this.cursors[i];
        c.t = this.t2;
        c.load(false);
        s[o + I2] = c.value;
        const known = s[o + I1] + c.value + twoOverDt * s[o + S1] - s[o + Q1] + s[o + KNOWN_ABOVE];
        s[o + KNOWN] = known;
        s[o + KNOWN_ABOVE] = 0;
        const flow = s[o + FLOW];
        f = twoOverDt * s[o + STORAGE] + flow - known + s[o + FLOW_ABOVE];
        s[o + RESIDUAL] = f;
        s[o + FLOW_ABOVE] = 0;
        if (below >= 0) {
          s[below + KNOWN_ABOVE] += s[o + Q1];
          s[below + FLOW_ABOVE] -= flow;
        }
        norm += f * f;
      } else f = s[o + RESIDUAL];
      // Row i: D_i d_i + dQ_i/dh_below d_below = R_i; the row of the pond below holds -dQ_i/dh_i d_i.
      const byOwn = s[o + BY_OWN];
      const d = twoOverDt * s[o + SLOPE] + byOwn + s[o + PARTIAL_ABOVE] + s[o + DIAGONAL_ABOVE];
      const r = s[o + RIGHT_ABOVE] - f;
      s[o + DIAGONAL] = d;
      s[o + RIGHT] = r;
      s[o + PARTIAL_ABOVE] = 0;
      s[o + DIAGONAL_ABOVE] = 0;
      s[o + RIGHT_ABOVE] = 0;
      if (below >= 0) {
        const byBelow = s[o + BY_BELOW];
        s[below + PARTIAL_ABOVE] -= byBelow;
        if (d !== 0) {
          s[below + DIAGONAL_ABOVE] += (byOwn * byBelow) / d;
          s[below + RIGHT_ABOVE] += (byOwn * r) / d;
        }
      }
    }
    if (start) this.norm = norm;
  }

  /**
   * The pass down the array (see the class's head). With `move`, each pond's trial stage at `lambda`
   * of the Newton step from its stage BASE, no lower than its floor (`substitute`: the Newton step
   * first, by substitution back from the last elimination and the step of the pond below, and BASE the
   * stage now solved); then each pond evaluated at its stage H (the pond below's is set by then): its
   * storage and slope, the flow through its outlet and its partials, and its residual
   * F_i = 2 S_i/dt + Out_i - In_i - N_i, In_i the flows of the ponds draining into it, which take theirs
   * from it as they come. Then `norm`, `small`, `samePieces`.
   */
  trial(move: boolean, substitute: boolean): void {
    const { n, state: s, index, tables } = this;
    const lambda = this.lambda;
    const twoOverDt = this.twoOverDt;
    let moved = 0;
    let same = true;
    for (let i = n - 1, o = i * STRIDE, k = i * INDEX_STRIDE; i >= 0; i--, o -= STRIDE, k -= INDEX_STRIDE) {
      const below = index[k + BELOW];
      let x: number;
      if (move) {
        let base: number;
        let step: number;
        if (substitute) {
          const r = below < 0 ? s[o + RIGHT] : s[o + RIGHT] - s[o + BY_BELOW] * s[below + STEP];
          const d = s[o + DIAGONAL];
          step = d !== 0 ? r / d : 0;
          s[o + STEP] = step;
          base = s[o + H];
          s[o + BASE] = base;
        } else {
          base = s[o + BASE];
          step = s[o + STEP];
        }
        x = base + lambda * step;
        if (x < s[o + FLOOR]) {
          // A pond cannot hold less than nothing: it is empty (the single router's clamp).
          x = s[o + FLOOR];
          this.floored = true;
        }
        s[o + H] = x;
        const m = Math.abs(x - base);
        if (m > moved) moved = m;
      } else x = s[o + H];
      // The storage in the cell of the grid holding the stage (walked from the last one).
      const table = tables[i];
      const z = table.stage;
      const last = z.length - 2;
      let c = index[k + CELL];
      while (c < last && x > z[c + 1]) c++;
      while (c > 0 && x < z[c]) c--;
      if (c !== index[k + CELL]) same = false;
      index[k + CELL] = c;
      const slope = table.storageSlope[c];
      s[o + SLOPE] = slope;
      const storage = table.storage[c] + slope * (x - z[c]);
      s[o + STORAGE] = storage;
      const link = table.link;
      let flow: number;
      if (link !== null) {
        link.lookupIn(s, o + H, below + H);
        flow = link.q;
        s[o + BY_OWN] = link.dUp;
        s[o + BY_BELOW] = link.dDown;
        if (link.cell !== index[k + LINK_CELL]) same = false;
        index[k + LINK_CELL] = link.cell;
        if (link.beyond && x > z[last + 1]) this.beyond = true;
      } else {
        const by = table.outflowSlope![c];
        flow = table.outflow![c] + by * (x - z[c]);
        s[o + BY_OWN] = by;
        s[o + BY_BELOW] = 0;
        if (x > z[last + 1]) this.beyond = true;
      }
      s[o + FLOW] = flow;
      s[o + RESIDUAL] = twoOverDt * storage + flow - s[o + KNOWN];
      if (below >= 0) s[below + RESIDUAL] -= flow;
    }
    this.moved = moved;
    this.samePieces = same;
    let norm = 0;
    let small = true;
    for (let o = 0; o < n * STRIDE; o += STRIDE) {
      const f = s[o + RESIDUAL];
      norm += f * f;
      if (Math.abs(f) > STAGE_TOLERANCE * twoOverDt * s[o + SLOPE]) small = false;
    }
    this.norm = norm;
    this.small = small;
  }

  /**
   * Newton's method on the step equations for dt (`twoOverDt`) from the step's start to `t2`; true
   * when converged (the stages end in H, RESIDUAL holds the residual there). `fresh`: the flows last
   * computed are those at the start (not evaluated again).
   */
  solve(fresh: boolean): boolean {
    this.floored = false;
    if (!fresh) {
      for (let o = 0; o < this.state.length; o += STRIDE) this.state[o + H] = this.state[o + H1];
      this.trial(false, false);
    }
    this.settle(true);
    let norm = this.norm;
    for (let iteration = 0; iteration < NEWTON_ITERATIONS; iteration++) {
      this.iterations++;
      if (iteration > 0) this.settle(false);
      // Backtracking: the full step unless it raises the residual. Not accepted, the stages are the
      // last trial's (evaluated).
      this.lambda = 1;
      let accepted = false;
      for (let attempt = 0; attempt < 8; attempt++) {
        this.trial(true, attempt === 0);
        if (this.norm <= norm || this.moved <= NEWTON_TOLERANCE) {
          norm = this.norm;
          accepted = true;
          break;
        }
        this.lambda *= 0.5;
      }
      // Converged: a negligible move, a full step that stayed on the pieces of the tables its Jacobian
      // came from (there the equations are linear, up to the links' bilinear cross term), or one whose
      // residual each pond's storage alone would take up by a stage change under STAGE_TOLERANCE.
      if (this.moved <= NEWTON_TOLERANCE || norm === 0) return true;
      if (accepted && this.lambda === 1 && !this.floored && (this.samePieces || this.small)) return true;
    }
    return false;
  }

  /**
   * Time-constant limit of the step (`tau`): the shortest among the ponds at the stages solved (flows
   * computed) of a pond's storage slope over the rate at which its net outflow rises with its stage.
   * A link's rate is its interpolant's slope (with the upstream stage, or minus it with the
   * downstream one), but near equal levels (where it grows like 1/sqrt of the difference) no more
   * than the chord from the level of the pond below to CHORD_DIFFERENCE above it. One pass up the
   * array: a pond's rate is complete when the ponds draining into it have handed theirs.
   */
  timeConstant(): void {
    const { n, state: s, index, tables } = this;
    let tau = Infinity;
    for (let i = 0, o = 0, k = 0; i < n; i++, o += STRIDE, k += INDEX_STRIDE) {
      const link = tables[i].link;
      let rate = (link === null ? s[o + BY_OWN] : 0) + s[o + RATE_ABOVE];
      s[o + RATE_ABOVE] = 0;
      if (link !== null) {
        const below = index[k + BELOW];
        let up = s[o + BY_OWN];
        let fall = -s[o + BY_BELOW];
        const d = s[o + H] - s[below + H];
        if (d < CHORD_DIFFERENCE && d > -CHORD_DIFFERENCE) {
          link.lookupChord(s, below + H);
          const chord = Math.abs(link.q) / CHORD_DIFFERENCE;
          if (chord < up) up = chord;
          if (chord < fall) fall = chord;
        }
        rate += this.linkWeight * up;
        s[below + RATE_ABOVE] += this.linkWeight * fall;
      }
      if (rate > 0) {
        const t = (this.tauFraction * s[o + SLOPE]) / rate;
        if (t < tau) tau = t;
      }
    }
    this.tau = tau;
  }
}

/**
 * The stepper of the commonest system, two ponds in a chain (the upper pond, place 0, drains into the
 * lower, place 1, which drains to the outfall): `solve` and `timeConstant` of the general stepper
 * written out for it, the numbers of a step held in local variables instead of the state's records
 * and written back to them when the step is solved (the driver's bookkeeping reads them there). Every
 * operation is the general stepper's, in its order, so that both give the same bits (tests/routing/
 * systemPair.test.ts); a term the general stepper adds that is zero in a chain of two (what flows into
 * the upper pond from above) is left out, which changes nothing (x + 0 is x).
 */
class PairStepper extends SystemStepper {
  override solve(fresh: boolean): boolean {
    const s = this.state;
    const index = this.index;
    const [upper, lower] = this.tables;
    const link = upper.link!;
    const twoOverDt = this.twoOverDt;
    const L = STRIDE;
    const LK = INDEX_STRIDE;
    this.floored = false;
    // A step done again starts from the stages at its start, evaluated there (the general trial; rare).
    if (!fresh) {
      s[H] = s[H1];
      s[L + H] = s[L + H1];
      this.trial(false, false);
    }
    let floored = false;
    let beyond = this.beyond;
    // The stages and what the tables give there: those last computed, at the step's start.
    let hU = s[H];
    let hL = s[L + H];
    let storageU = s[STORAGE];
    let slopeU = s[SLOPE];
    let flowU = s[FLOW];
    let byOwnU = s[BY_OWN];
    let byBelowU = s[BY_BELOW];
    let storageL = s[L + STORAGE];
    let slopeL = s[L + SLOPE];
    let flowL = s[L + FLOW];
    let byOwnL = s[L + BY_OWN];
    let cellU = index[CELL];
    let cellL = index[LK + CELL];
    let linkCell = index[LINK_CELL];
    const zU = upper.stage;
    const zL = lower.stage;
    const lastU = zU.length - 2;
    const lastL = zL.length - 2;
    // The step's first pass up (the general `settle(true)`): inflows at t2, known sides, residuals.
    const cursorU = this.cursors[0];
    const cursorL = this.cursors[1];
    cursorU.t = this.t2;
    cursorU.load(false);
    s[I2] = cursorU.value;
    const knownU = s[I1] + cursorU.value + twoOverDt * s[S1] - s[Q1];
    let residualU = twoOverDt * storageU + flowU - knownU;
    cursorL.t = this.t2;
    cursorL.load(false);
    s[L + I2] = cursorL.value;
    const knownL = s[L + I1] + cursorL.value + twoOverDt * s[L + S1] - s[L + Q1] + s[Q1];
    let residualL = twoOverDt * storageL + flowL - knownL + (0 - flowU);
    let norm = residualU * residualU + residualL * residualL;
    let converged = false;
    let iterations = this.iterations;
    let stepU = 0;
    let stepL = 0;
    for (let iteration = 0; iteration < NEWTON_ITERATIONS; iteration++) {
      iterations++;
      // The elimination (the general `settle`): the upper row, then the lower row with what the upper hands it.
      const dU = twoOverDt * slopeU + byOwnU;
      const rU = 0 - residualU;
      let diagonalAbove = 0;
      let rightAbove = 0;
      if (dU !== 0) {
        diagonalAbove = (byOwnU * byBelowU) / dU;
        rightAbove = (byOwnU * rU) / dU;
      }
      const dL = twoOverDt * slopeL + byOwnL + (0 - byBelowU) + diagonalAbove;
      const rL = rightAbove - residualL;
      // Backtracking: the full step unless it raises the residual.
      let lambda = 1;
      let accepted = false;
      let moved = 0;
      let small = true;
      let same = true;
      const baseU = hU;
      const baseL = hL;
      stepL = dL !== 0 ? rL / dL : 0;
      stepU = dU !== 0 ? (rU - byBelowU * stepL) / dU : 0;
      for (let attempt = 0; attempt < 8; attempt++) {
        // The trial (the general `trial(true, ...)`): the lower pond, then the upper.
        moved = 0;
        same = true;
        let x = baseL + lambda * stepL;
        if (x < s[L + FLOOR]) {
          x = s[L + FLOOR];
          floored = true;
        }
        hL = x;
        s[L + H] = x;
        let m = Math.abs(x - baseL);
        if (m > moved) moved = m;
        {
          let c = cellL;
          while (c < lastL && x > zL[c + 1]) c++;
          while (c > 0 && x < zL[c]) c--;
          if (c !== cellL) same = false;
          cellL = c;
          slopeL = lower.storageSlope[c];
          storageL = lower.storage[c] + slopeL * (x - zL[c]);
          const by = lower.outflowSlope![c];
          flowL = lower.outflow![c] + by * (x - zL[c]);
          byOwnL = by;
          if (x > zL[lastL + 1]) beyond = true;
        }
        residualL = twoOverDt * storageL + flowL - knownL;
        x = baseU + lambda * stepU;
        if (x < s[FLOOR]) {
          x = s[FLOOR];
          floored = true;
        }
        hU = x;
        s[H] = x;
        m = Math.abs(x - baseU);
        if (m > moved) moved = m;
        {
          let c = cellU;
          while (c < lastU && x > zU[c + 1]) c++;
          while (c > 0 && x < zU[c]) c--;
          if (c !== cellU) same = false;
          cellU = c;
          slopeU = upper.storageSlope[c];
          storageU = upper.storage[c] + slopeU * (x - zU[c]);
          link.lookupIn(s, H, L + H);
          flowU = link.q;
          byOwnU = link.dUp;
          byBelowU = link.dDown;
          if (link.cell !== linkCell) same = false;
          linkCell = link.cell;
          if (link.beyond && x > zU[lastU + 1]) beyond = true;
        }
        residualU = twoOverDt * storageU + flowU - knownU;
        residualL -= flowU;
        const trialNorm = residualU * residualU + residualL * residualL;
        small = !(Math.abs(residualU) > STAGE_TOLERANCE * twoOverDt * slopeU) && !(Math.abs(residualL) > STAGE_TOLERANCE * twoOverDt * slopeL);
        if (trialNorm <= norm || moved <= NEWTON_TOLERANCE) {
          norm = trialNorm;
          accepted = true;
          break;
        }
        lambda *= 0.5;
      }
      if (moved <= NEWTON_TOLERANCE || norm === 0) {
        converged = true;
        break;
      }
      if (accepted && lambda === 1 && !floored && (same || small)) {
        converged = true;
        break;
      }
    }
    // The solved step written back to the records, as the general stepper leaves it.
    this.iterations = iterations;
    this.floored = floored;
    this.beyond = beyond;
    s[STORAGE] = storageU;
    s[SLOPE] = slopeU;
    s[FLOW] = flowU;
    s[BY_OWN] = byOwnU;
    s[BY_BELOW] = byBelowU;
    s[RESIDUAL] = residualU;
    s[L + STORAGE] = storageL;
    s[L + SLOPE] = slopeL;
    s[L + FLOW] = flowL;
    s[L + BY_OWN] = byOwnL;
    s[L + BY_BELOW] = 0;
    s[L + RESIDUAL] = residualL;
    index[CELL] = cellU;
    index[LK + CELL] = cellL;
    index[LINK_CELL] = linkCell;
    return converged;
  }

  /** The general `timeConstant` for the chain of two: the upper pond's rate is its link's, the lower pond's its outlet's and the link's fall. */
  override timeConstant(): void {
    const s = this.state;
    const L = STRIDE;
    const link = this.tables[0].link!;
    let up = s[BY_OWN];
    let fall = -s[BY_BELOW];
    const d = s[H] - s[L + H];
    if (d < CHORD_DIFFERENCE && d > -CHORD_DIFFERENCE) {
      link.lookupChord(s, L + H);
      const chord = Math.abs(link.q) / CHORD_DIFFERENCE;
      if (chord < up) up = chord;
      if (chord < fall) fall = chord;
    }
    let tau = Infinity;
    const rateU = 0 + this.linkWeight * up;
    if (rateU > 0) {
      const t = (this.tauFraction * s[SLOPE]) / rateU;
      if (t < tau) tau = t;
    }
    const rateL = s[L + BY_OWN] + (0 + this.linkWeight * fall);
    if (rateL > 0) {
      const t = (this.tauFraction * s[L + SLOPE]) / rateL;
      if (t < tau) tau = t;
    }
    this.tau = tau;
  }
}

/** Routes one storm through a system of ponds: `inflows` by pond index (null: none). */
export function routeSystem(ponds: readonly SystemRoutePond[], inflows: readonly (Hydrograph | null)[], options: SystemRouteOptions = {}): SystemRouteResult {
  routingTally.count++;
  const n = ponds.length;
  // The stepper's order, upstream first: `order[k]` is the pond at place k, `place[p]` pond p's place.
  const order = upstreamFirst(Int32Array.from(ponds, (p) => p.to));
  const place = new Int32Array(n);
  order.forEach((p, k) => (place[p] = k));
  const placed = Array.from(order, (p) => ponds[p]);
  const to = Int32Array.from(placed, (p) => (p.to < 0 ? -1 : place[p.to]));
  const fixed = options.step;
  const maxStep = options.maxStep ?? 600;
  const minStep = options.minStep ?? 1;
  const tauFraction = options.timeConstantFraction ?? TIME_CONSTANT_FRACTION;
  const cursors = Array.from(order, (p) => new InflowCursor(inflows[p] ?? null, options.inflowFraction ?? 0.01));
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

  // Two ponds in a chain (the commonest system) take the stepper written out for them.
  const Stepper = n === 2 && to[0] === 1 && to[1] === -1 && options.general !== true ? PairStepper : SystemStepper;
  const stepper = new Stepper(placed, to, cursors, tauFraction, tauFraction / (options.linkTimeConstantFraction ?? LINK_TIME_CONSTANT_FRACTION));
  const s = stepper.state;
  const drainedStorage = new Float64Array(n);
  const drained = Float64Array.from(placed, (p) => p.drainedStage);
  // Per pond results, by place.
  const maxStage = new Float64Array(n);
  const timeOfMaxStage = new Float64Array(n);
  const maxStorage = new Float64Array(n);
  const peakForward = new Float64Array(n);
  const timeOfPeakForward = new Float64Array(n);
  const peakBack = new Float64Array(n);
  const timeOfPeakBack = new Float64Array(n);
  const peakTotalIn = new Float64Array(n);
  /** What the ponds draining into each pond send it forward in a step (its total inflow's). */
  const forwardAbove = new Float64Array(n);
  const volumeForward = new Float64Array(n);
  const volumeBack = new Float64Array(n);
  const drainedAt = new Float64Array(n);
  const S0 = new Float64Array(n);

  for (let i = 0; i < n; i++) {
    const p = placed[i];
    s[i * STRIDE + H] = p.startStage;
    if (p.drainedStage <= p.stage[0]) drainedStorage[i] = 0;
    else {
      stepper.storageAt(i, Math.min(p.drainedStage, p.stage[p.stage.length - 1]));
      drainedStorage[i] = s[i * STRIDE + STORAGE];
    }
  }
  // The storages and flows at the start (the pass's residuals and elimination are not used).
  stepper.trial(false, false);
  let t = tFirst;
  let outfall1 = 0;
  let peakSystemIn = 0;
  for (let i = 0, o = 0; i < n; i++, o += STRIDE) {
    cursors[i].t = t;
    cursors[i].load(true);
    const x = s[o + H];
    const q = s[o + FLOW];
    s[o + I1] = cursors[i].value;
    s[o + S1] = s[o + STORAGE];
    s[o + Q1] = q;
    s[o + H1] = x;
    S0[i] = s[o + STORAGE];
    maxStage[i] = x;
    timeOfMaxStage[i] = t;
    maxStorage[i] = s[o + STORAGE];
    drainedAt[i] = x <= drained[i] ? t : NaN;
    if (q > 0) {
      peakForward[i] = q;
      timeOfPeakForward[i] = t;
    } else if (q < 0) {
      peakBack[i] = -q;
      timeOfPeakBack[i] = t;
    }
    if (to[i] < 0) outfall1 += q;
    peakSystemIn += s[o + I1];
  }
  let peakOutfall = outfall1;
  let timeOfPeakOutfall = t;
  let volumeOutfall = 0;

  // The point of analysis: the flow reaching the outfall plus the bypass (the single router's tracker).
  const points = new PointsOfAnalysis(options.bypass, options.downstream);
  const point = points.point;
  points.start(t, outfall1);
  // The routing goes on at least to the last bypass point, so every sum at a point is routed.
  const tPoint = Math.max(tLast, points.last);
  const ceiling = options.ceiling ? new CeilingTracker(options.ceiling) : null;
  ceiling?.compare(t, points.atPoint(t, outfall1));

  const record = options.record === true;
  const at = (p: number, field: number) => [s[place[p] * STRIDE + field]];
  const series: SystemSeries | undefined = record
    ? { time: [t], outfall: [outfall1], stage: ponds.map((_, p) => at(p, H)), inflow: ponds.map((_, p) => at(p, I1)), outflow: ponds.map((_, p) => at(p, FLOW)) }
    : undefined;
  if (series && point) series.bypass = [point.at(t)];
  // Each pond's series by its place.
  const stageSeries = series ? Array.from(order, (p) => series.stage[p]) : [];
  const inflowSeries = series ? Array.from(order, (p) => series.inflow[p]) : [];
  const outflowSeries = series ? Array.from(order, (p) => series.outflow[p]) : [];

  let steps = 0;
  let smallest = Infinity;
  let largest = 0;
  let refined = 0;
  let redone = 0;
  let unconverged = 0;
  let clamped = 0;
  stepper.timeConstant();
  let tau = stepper.tau;
  // The automatic step's limits from the inflows at t (walked again at each step's end): the longest
  // step in which no pond's inflow changes by more than its share of its peak, and the next inflow point.
  const automatic = fixed === undefined;
  let byInflow = maxStep;
  let next = Infinity;
  if (automatic && t < tLast) {
    for (const c of cursors) {
      c.t = t;
      c.advance();
      if (c.rate > 0 && c.change / c.rate < byInflow) byInflow = c.change / c.rate;
      if (c.nextPoint < next) next = c.nextPoint;
    }
  }

  while (true) {
    let dt: number;
    let t2: number;
    if (fixed !== undefined) {
      dt = fixed;
    } else {
      dt = byInflow;
      if (tau < dt) dt = tau;
      if (dt < minStep) dt = minStep;
      if (dt < byInflow) refined++;
      if (next < Infinity) {
        if (t + dt > next) dt = next - t;
        else if (t + 1.5 * dt > next) dt = 0.5 * (next - t);
      }
    }
    let fresh = true;
    let conserve: boolean;
    for (;;) {
      t2 = t + dt;
      stepper.t2 = t2;
      stepper.twoOverDt = 2 / dt;
      const converged = stepper.solve(fresh);
      conserve = converged && !stepper.floored;
      fresh = false;
      if (fixed !== undefined) {
        if (!converged) unconverged++;
        break;
      }
      stepper.timeConstant();
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

    // Bookkeeping, one pass up the array; the step's end becomes the next step's start.
    steps++;
    if (dt < smallest) smallest = dt;
    if (dt > largest) largest = dt;
    // After a converged step each pond's storage is what its step equation holds exactly at the flows
    // found (RESIDUAL holds the residual where `solve` ended), so that no volume is lost or made by
    // what Newton's method left (the residual of a step accepted on one piece of the tables, the
    // links' bilinear cross term: a stage some micrometres off its storage at most). The mass balance
    // then closes to rounding.
    const halfDt = 1 / stepper.twoOverDt;
    let outfall2 = 0;
    let systemIn = 0;
    let allDrained = true;
    let stored = 0;
    const walk = automatic && t2 < tLast;
    byInflow = maxStep;
    next = Infinity;
    for (let i = 0, o = 0; i < n; i++, o += STRIDE) {
      if (conserve) s[o + STORAGE] -= s[o + RESIDUAL] * halfDt;
      const storage = s[o + STORAGE];
      const a = s[o + Q1];
      const b = s[o + FLOW];
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
      const x = s[o + H];
      const x1 = s[o + H1];
      if (x > maxStage[i]) {
        maxStage[i] = x;
        timeOfMaxStage[i] = t2;
        maxStorage[i] = storage;
        drainedAt[i] = NaN;
      }
      const level = drained[i];
      if (x <= level && !(x1 <= level)) drainedAt[i] = t2 - (dt * (level - x)) / (x1 - x);
      else if (x > level) drainedAt[i] = NaN;
      // Its total inflow: its own, what flows back through its outlet, what the ponds above send.
      const inflow = s[o + I2];
      const total = inflow + (b < 0 ? -b : 0) + forwardAbove[i];
      forwardAbove[i] = 0;
      if (total > peakTotalIn[i]) peakTotalIn[i] = total;
      const down = to[i];
      if (down < 0) outfall2 += b;
      else if (b > 0) forwardAbove[down] += b;
      systemIn += inflow;
      if (record) {
        stageSeries[i].push(x);
        inflowSeries[i].push(inflow);
        outflowSeries[i].push(b);
      }
      // After a pond's last inflow point its inflow is zero; elsewhere it runs on from its value at t2.
      const c = cursors[i];
      s[o + I1] = t2 === c.last ? 0 : t2 === c.first ? c.flows[0] : inflow;
      if (walk) {
        c.t = t2;
        c.advance();
        if (c.rate > 0 && c.change / c.rate < byInflow) byInflow = c.change / c.rate;
        if (c.nextPoint < next) next = c.nextPoint;
      }
      s[o + S1] = storage;
      s[o + Q1] = b;
      s[o + H1] = x;
      if (x > level) allDrained = false;
      if (storage > drainedStorage[i]) stored += storage - drainedStorage[i];
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
    }
    t = t2;
    outfall1 = outfall2;
    if (t >= tLast) {
      if ((allDrained && t >= tPoint) || t >= tEnd) break;
      // With no inflow left the outflow only falls: if even the present flow to the outfall kept up
      // until the end could not empty the stored water, the system does not drain in the time.
      if (outfall2 * (tEnd - t) < stored && t >= tPoint) break;
    }
  }
  points.finish(outfall1);
  const beyond = stepper.beyond;
  const storageAtEnd = Array.from(placed, (_, i) => s[i * STRIDE + STORAGE]);
  keptStates.set(s.length, s);
  const iterations = stepper.iterations;

  let volumeIn = 0;
  let storageChange = 0;
  const stepping = { duration: t - tFirst, steps, smallestStep: smallest, largestStep: largest, refinedSteps: refined, redoneSteps: redone, clampedSteps: clamped, beyondTable: beyond };
  // A system's ponds do not exfiltrate (the loader refuses exfiltration in a system).
  const noExfiltration = { volumeExfiltrated: 0, peakExfiltration: 0 };
  const results: PondRouteResult[] = ponds.map((p, pond) => {
    const i = place[pond];
    const own = inflows[pond] ? hydrographVolume(inflows[pond]!) : 0;
    let received = volumeBack[i];
    let sent = volumeForward[i];
    for (let j = 0; j < n; j++) {
      if (to[j] !== i) continue;
      received += volumeForward[j];
      sent += volumeBack[j];
    }
    const change = storageAtEnd[i] - S0[i];
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
      volumeOut: sent,
      storageChange: change,
      massBalanceError: into > 0 ? (into - sent - change) / into : 0,
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
