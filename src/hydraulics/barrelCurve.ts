// The barrel's performance curve: headwater above the inlet invert against flow, tabulated once per
// barrel and downstream level (free outfall or a constant tailwater elevation), so that the chamber
// solve at every stage of a rating costs a table look-up instead of an HDS-5 evaluation with a
// backwater profile.
//
// Nodes: flows evenly spaced in ln x, x = Ku Q/(A D^0.5) from 1e-5 to 400 (far beyond any pond:
// the submerged form's HW/D is some 60 at x = 40), so densest at low flow, plus both sides of each
// flow at which the barrel's slope is critical. Wherever the governing formula changes between two
// nodes (inlet or outlet control, HDS-5 form, ho, profile type, approximation, blend or profile) a
// node pair is placed at the change, found by bisection to 1e-7 of the flow, so that no kink or
// step of HW(Q) falls inside an interval. Where the exact headwater is not monotone between nodes
// the interval is halved a few times to see its shape.
//
// Monotone: the headwater is made non-decreasing by its running maximum (the exact HW may dip where
// a steep barrel's drowned inlet gives way to a jump in the barrel, or inside the blend; see
// barrel.ts), with a node where the exact HW climbs back to the held level.
//
// Between two nodes HW is linear in Q, or its rise above the zero-flow headwater is a power of Q
// (HW rises like Q^(2/3) at small flows and like Q^2 against a drowned outlet, where it is nearly
// level and a straight line would misplace the flow). Each interval takes the one that fits the
// exact headwater better at a third and two thirds of it (in ln Q), and is split there until that
// one misplaces the flow by no more than 0.01 %. The inverse follows the same segments. Beyond the
// last node the exact functions are used.
import type { Barrel } from "../model.js";
import { barrelHeadwater, barrelPoint, exactBarrelFlow, flowParameter } from "./barrel.js";
import { criticalSlopeFlows } from "./normalDepth.js";

export interface BarrelCurve {
  /** Flows (m3/s), strictly increasing from 0. */
  flow: Float64Array;
  /** Headwater above the inlet invert (m) at each flow, non-decreasing. */
  headwater: Float64Array;
  /** Per interval [i, i+1]: 1 where HW - HW(0) is a power of Q, 0 where HW is linear in Q. */
  power: Uint8Array;
  /** Per power interval its exponent (computed once: the chamber solve's hot path), 0 elsewhere. */
  exponent: Float64Array;
  /** Nodes the running maximum raised above the exact headwater (by more than 1e-9 m). */
  heldNodes: number;
  /** The intervals of the last look-ups by flow and by headwater, tried first by the next (a sweep's
   * look-ups move little from one to the next); they change no result (see `intervalOf`). */
  flowHint: { at: number };
  headHint: { at: number };
  /** The barrel (a copy of its values) and tailwater elevation (-Infinity: free outfall). */
  barrel: Barrel;
  tailwater: number;
}

/** Evenly spaced nodes in ln x between the smallest and largest x of the table. */
export const CURVE_POINTS = 100;
export const CURVE_SMALLEST_X = 1e-5;
export const CURVE_LARGEST_X = 400;
/** An interval is split in three until its interpolant misplaces the flow at a third and two thirds of
 * it (in ln Q) by no more than this fraction. */
export const CURVE_FLOW_TOLERANCE = 1e-4;
/** Most splits of one interval of the ln x grid. */
const MAX_SPLITS = 6;
/** Most halvings spent on an interval where the exact headwater is not monotone. */
const SHAPE_SPLITS = 3;
/** Relative width of the bracket a change of formula is narrowed to. */
const CHANGE_WIDTH = 1e-7;
/** Most changes of formula sought between two neighbouring nodes. */
const CHANGES_PER_INTERVAL = 4;

/** Nodes of the ln x grid with a node pair at every change of formula, before the running maximum. */
function gridNodes(b: Barrel, tailwater: number): { flows: number[]; heads: number[] } {
  const q0 = CURVE_SMALLEST_X / flowParameter(b, 1);
  const ratio = Math.pow(CURVE_LARGEST_X / CURVE_SMALLEST_X, 1 / (CURVE_POINTS - 1));
  // The ln x grid, with both sides of each flow at which the slope is critical: a band of flows
  // over which the barrel is steep may be narrower than one grid interval.
  const grid: number[] = [];
  for (let i = 0; i < CURVE_POINTS; i++) grid.push(q0 * Math.pow(ratio, i));
  for (const q of criticalSlopeFlows(b)) if (q > q0 && q < grid[CURVE_POINTS - 1]) grid.push(q * (1 - 1e-4), q * (1 + 1e-4));
  grid.sort((p, q) => p - q);
  const flows: number[] = [0];
  const heads: number[] = [barrelHeadwater(b, 0, tailwater)];
  // From zero to the first node (x = 1e-5) the curve is a straight line.
  let previous = { q: q0, point: barrelPoint(b, q0, tailwater) };
  flows.push(q0);
  heads.push(previous.point.headwater);
  for (let i = 1; i < grid.length; i++) {
    const q = grid[i];
    const point = barrelPoint(b, q, tailwater);
    // Place nodes on both sides of every change of formula between the previous node and this one.
    let left = previous;
    for (let change = 0; change < CHANGES_PER_INTERVAL && left.point.regime !== point.regime; change++) {
      let low = left.q;
      let lowHead = left.point.headwater;
      let high = q;
      let highPoint = point;
      while (high - low > CHANGE_WIDTH * high) {
        const mid = 0.5 * (low + high);
        const midPoint = barrelPoint(b, mid, tailwater);
        if (midPoint.regime === left.point.regime) {
          low = mid;
          lowHead = midPoint.headwater;
        } else {
          high = mid;
          highPoint = midPoint;
        }
      }
      if (low > left.q) {
        flows.push(low);
        heads.push(lowHead);
      }
      if (high < q) {
        flows.push(high);
        heads.push(highPoint.headwater);
      }
      left = { q: high, point: highPoint };
    }
    flows.push(q);
    heads.push(point.headwater);
    previous = { q, point };
  }
  return { flows, heads };
}

/** HW at q on the segment (qa, ha)-(qb, hb): linear, or HW - base a power of Q. */
function segmentHeadwater(qa: number, ha: number, qb: number, hb: number, base: number, power: boolean, q: number): number {
  if (!power) return ha + ((hb - ha) * (q - qa)) / (qb - qa);
  return powerHeadwater(qa, ha, base, segmentExponent(qa, ha, qb, hb, base), q);
}

/** Exponent of a power segment: HW - base = (ha - base) (q / qa)^exponent through both nodes. */
function segmentExponent(qa: number, ha: number, qb: number, hb: number, base: number): number {
  return Math.log((hb - base) / (ha - base)) / Math.log(qb / qa);
}

function powerHeadwater(qa: number, ha: number, base: number, exponent: number, q: number): number {
  return base + (ha - base) * Math.exp(exponent * Math.log(q / qa));
}

/** Whether a segment can be a power of Q: it starts at a positive flow and a positive rise, and rises. */
function powerSegment(qa: number, ha: number, hb: number, base: number): boolean {
  return qa > 0 && ha > base && hb > ha;
}

/** Tabulates HW(Q) for a barrel and a downstream level (see the file's header). */
export function buildBarrelCurve(b: Barrel, tailwater: number): BarrelCurve {
  const known = new Map<number, number>();
  const exact = (q: number) => {
    let h = known.get(q);
    if (h === undefined) {
      h = barrelHeadwater(b, q, tailwater);
      known.set(q, h);
    }
    return h;
  };
  const grid = gridNodes(b, tailwater);

  // 1. Where the exact headwater is not monotone between two nodes (it dips or humps), halve the
  //    interval a few times so that the running maximum below sees the shape.
  const rawFlows: number[] = [grid.flows[0]];
  const rawHeads: number[] = [grid.heads[0]];
  const resolve = (qa: number, ha: number, qb: number, hb: number, depth: number): void => {
    if (qa === 0 || qb - qa <= 1e-6 * qb || depth >= SHAPE_SPLITS) return;
    const mid = Math.sqrt(qa * qb);
    const h = exact(mid);
    if (hb > ha && h >= ha && h <= hb) return;
    resolve(qa, ha, mid, h, depth + 1);
    rawFlows.push(mid);
    rawHeads.push(h);
    resolve(mid, h, qb, hb, depth + 1);
  };
  for (let i = 1; i < grid.flows.length; i++) {
    resolve(grid.flows[i - 1], grid.heads[i - 1], grid.flows[i], grid.heads[i], 0);
    rawFlows.push(grid.flows[i]);
    rawHeads.push(grid.heads[i]);
  }

  // 2. The running maximum; nodes it raises sit where the exact headwater dips. Where the exact
  //    headwater climbs back to the held level, a node is placed (by bisection), so that the curve
  //    leaves the level exactly there.
  const flows: number[] = [rawFlows[0]];
  const heads: number[] = [rawHeads[0]];
  const raised: boolean[] = [false];
  let held = 0;
  for (let i = 1; i < rawFlows.length; i++) {
    const level = heads[heads.length - 1];
    const q = rawFlows[i];
    const h = rawHeads[i];
    if (h < level) {
      if (level - h > 1e-9) held++;
      flows.push(q);
      heads.push(level);
      raised.push(true);
      continue;
    }
    if (raised[raised.length - 1] && h > level) {
      let low = flows[flows.length - 1];
      let high = q;
      for (let k = 0; k < 60 && high - low > CHANGE_WIDTH * high; k++) {
        const mid = 0.5 * (low + high);
        if (exact(mid) < level) low = mid;
        else high = mid;
      }
      if (high < q) {
        flows.push(high);
        heads.push(level);
        raised.push(false);
      }
    }
    flows.push(q);
    heads.push(h);
    raised.push(false);
  }

  // 3. Each rising interval between exact nodes gets the interpolant that fits the exact headwater
  //    better at a third and two thirds of it, and is split there until that one misplaces the flow
  //    by no more than CURVE_FLOW_TOLERANCE. Held intervals are level.
  const base = heads[0];
  const outFlows: number[] = [flows[0]];
  const outHeads: number[] = [heads[0]];
  const power: number[] = [];
  const fit = (qa: number, ha: number, qb: number, hb: number, depth: number): void => {
    if (hb > ha && qa > 0 && qb - qa > 1e-6 * qb) {
      // Checked at a third and two thirds of the interval in ln Q.
      const q1 = qa * Math.pow(qb / qa, 1 / 3);
      const q2 = qa * Math.pow(qb / qa, 2 / 3);
      const h1 = exact(q1);
      const h2 = exact(q2);
      if (h1 >= ha && h2 >= h1 && hb >= h2) {
        const misplaced = (usePower: boolean) =>
          Math.max(Math.abs(segmentHeadwater(qa, ha, qb, hb, base, usePower, q1) - h1) / q1, Math.abs(segmentHeadwater(qa, ha, qb, hb, base, usePower, q2) - h2) / q2) *
          ((qb - qa) / (hb - ha));
        const linear = misplaced(false);
        const usePower = powerSegment(qa, ha, hb, base) && misplaced(true) < linear;
        if ((usePower ? misplaced(true) : linear) > CURVE_FLOW_TOLERANCE && depth < MAX_SPLITS) {
          fit(qa, ha, q1, h1, depth + 1);
          outFlows.push(q1);
          outHeads.push(h1);
          fit(q1, h1, q2, h2, depth + 1);
          outFlows.push(q2);
          outHeads.push(h2);
          fit(q2, h2, qb, hb, depth + 1);
          return;
        }
        power.push(usePower ? 1 : 0);
        return;
      }
    }
    power.push(0);
  };
  for (let i = 1; i < flows.length; i++) {
    if (raised[i] || raised[i - 1]) power.push(0);
    else fit(flows[i - 1], heads[i - 1], flows[i], heads[i], 0);
    outFlows.push(flows[i]);
    outHeads.push(heads[i]);
  }
  // Non-decreasing to the last bit: a node placed inside a rising interval takes the exact headwater,
  // which rounding may leave a few 1e-16 m below the node before it (found by the property test).
  for (let i = 1; i < outHeads.length; i++) if (outHeads[i] < outHeads[i - 1]) outHeads[i] = outHeads[i - 1];
  const exponent = new Float64Array(power.length);
  for (let i = 0; i < power.length; i++) {
    if (power[i] === 1) exponent[i] = segmentExponent(outFlows[i], outHeads[i], outFlows[i + 1], outHeads[i + 1], base);
  }
  return {
    flow: Float64Array.from(outFlows),
    headwater: Float64Array.from(outHeads),
    power: Uint8Array.from(power),
    exponent,
    heldNodes: held,
    flowHint: { at: 0 },
    headHint: { at: 0 },
    barrel: { ...b },
    tailwater,
  };
}

/** Index i of the interval [x[i], x[i+1]] holding v (x non-decreasing, x[0] <= v < x[n-1]); the last
 * such interval: the one i with x[i] <= v < x[i+1]. The hinted interval and the one above it are
 * tried first; either is that i when it passes the same test, else the bisection finds it. */
function intervalOf(x: Float64Array, v: number, hint: { at: number }): number {
  const h = hint.at;
  if (x[h] <= v) {
    if (v < x[h + 1]) return h;
    if (h + 2 < x.length && v < x[h + 2]) return (hint.at = h + 1);
  }
  return (hint.at = bisectInterval(x, v));
}

function bisectInterval(x: Float64Array, v: number): number {
  let lo = 0;
  let hi = x.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid] <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Headwater above the inlet invert (m) at a flow, from the curve (exact beyond its last node). */
export function curveHeadwater(c: BarrelCurve, flow: number): number {
  const q = c.flow;
  const h = c.headwater;
  const n = q.length;
  if (!(flow > 0)) return h[0];
  if (flow >= q[n - 1]) return Math.max(barrelHeadwater(c.barrel, flow, c.tailwater), h[n - 1]);
  const i = intervalOf(q, flow, c.flowHint);
  if (c.power[i] !== 1) return h[i] + ((h[i + 1] - h[i]) * (flow - q[i])) / (q[i + 1] - q[i]);
  return powerHeadwater(q[i], h[i], h[0], c.exponent[i], flow);
}

/**
 * Flow (m3/s) at a headwater above the inlet invert, from the curve: the largest flow whose
 * headwater does not exceed it (zero at or below the headwater of zero flow; exact beyond the last node).
 */
export function curveFlow(c: BarrelCurve, head: number): number {
  const q = c.flow;
  const h = c.headwater;
  const n = h.length;
  if (!(head > h[0])) return 0;
  if (head >= h[n - 1]) return Math.max(exactBarrelFlow(c.barrel, c.barrel.inletInvert + head, c.tailwater), q[n - 1]);
  const i = intervalOf(h, head, c.headHint);
  if (c.power[i] !== 1) return q[i] + ((q[i + 1] - q[i]) * (head - h[i])) / (h[i + 1] - h[i]);
  return q[i] * Math.exp(Math.log((head - h[0]) / (h[i] - h[0])) / c.exponent[i]);
}

/** Curves kept by the barrel's values and tailwater (the search builds a new barrel object per candidate). */
const CACHE_SIZE = 64;
const byValue = new Map<string, BarrelCurve>();
const byObject = new WeakMap<Barrel, BarrelCurve[]>();

/** The barrel's values and the tailwater as a key: what its curve depends on. */
export function valueKey(b: Barrel, tailwater: number): string {
  const size = b.shape === "circular" ? `${b.diameter}` : `${b.span}x${b.rise}`;
  return `${b.shape} ${size} ${b.length} ${b.inletInvert} ${b.outletInvert} ${b.manningN} ${b.entrance} ${tailwater}`;
}

function sameBarrel(a: Barrel, b: Barrel): boolean {
  if (a.shape !== b.shape || a.length !== b.length || a.inletInvert !== b.inletInvert || a.outletInvert !== b.outletInvert) return false;
  if (a.manningN !== b.manningN || a.entrance !== b.entrance) return false;
  if (a.shape === "circular" && b.shape === "circular") return a.diameter === b.diameter;
  return a.shape === "box" && b.shape === "box" && a.span === b.span && a.rise === b.rise;
}

/** The curve of a barrel and a constant downstream level, built on first use and cached. */
export function barrelCurve(b: Barrel, tailwater: number): BarrelCurve {
  const known = byObject.get(b);
  if (known) {
    for (const c of known) if (c.tailwater === tailwater && sameBarrel(c.barrel, b)) return c;
  }
  const key = valueKey(b, tailwater);
  let curve = byValue.get(key);
  if (curve) byValue.delete(key);
  else curve = buildBarrelCurve(b, tailwater);
  byValue.set(key, curve);
  if (byValue.size > CACHE_SIZE) byValue.delete(byValue.keys().next().value as string);
  const list = known && known.length < 8 ? known : [];
  list.push(curve);
  byObject.set(b, list);
  return curve;
}

/**
 * The barrel's flow (m3/s) for a headwater elevation in front of its inlet (the chamber level),
 * from its tabulated curve: zero while the headwater does not exceed the one at zero flow,
 * non-decreasing and finite. `exactBarrelFlow` is the pointwise reference.
 */
export function barrelFlow(b: Barrel, headwaterElevation: number, tailwater: number): number {
  return curveFlow(barrelCurve(b, tailwater), headwaterElevation - b.inletInvert);
}
