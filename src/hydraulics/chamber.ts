// The riser (or headwall) chamber drained by a barrel. At a pond stage WS the chamber level c is the
// one at which the flow in through the openings and the rim, openingsFlow(WS, c), equals the
// barrel's flow at headwater c (case-format contract). The first falls and the second rises with c,
// so the level is unique. It is found through the barrel flow Q instead of c: the headwater the
// barrel needs for Q, HW(Q), does not fall with Q, so g(Q) = openingsFlow(WS, inlet + HW(Q)) - Q
// falls strictly from g(0) >= 0 to g(Qfree) <= 0, Qfree being the openings' flow with an empty
// chamber. This needs no inversion of HW inside the search (Brent's method on [0, Qfree]). The
// chamber level never exceeds WS: every opening passes nothing once the level reaches the pond.
//
// HW(Q) is the barrel's tabulated curve for the tailwater (barrelCurve.ts), built once per barrel
// and downstream level; with `exact` it is the pointwise HDS-5 and backwater evaluation instead
// (for a tailwater that changes with the outflow, where a curve would serve one evaluation only).
import type { Barrel, Outlet } from "../model.js";
import { barrelHeadwater, barrelState, type BarrelState } from "./barrel.js";
import { barrelCurve, curveFlow, curveHeadwater } from "./barrelCurve.js";
import { lowestOpening, openingsFlow } from "./openings.js";
import { brentRoot } from "./roots.js";

/** Relative tolerance on the barrel flow of the chamber solution. */
export const CHAMBER_TOLERANCE = 1e-11;

export type ChamberControl = "openings free" | "barrel inlet control" | "barrel outlet control";

export interface ChamberSolution {
  /** Chamber water level (m), never above the pond stage. */
  level: number;
  /** Flow through the barrel = flow in through the openings and rim (m3/s). */
  flow: number;
  /** "openings free" when the chamber does not reduce the openings' flow. */
  control: ChamberControl;
  /** The barrel at that flow: both headwaters and which of them governs. */
  barrel: BarrelState;
}

/** The barrel's headwater above its inlet invert as a function of flow for one tailwater, and (from
 * the curve only) the flow at a headwater. */
export interface BarrelLaw {
  headwater: (q: number) => number;
  flow: ((head: number) => number) | null;
  /** The curve's last node (flow, headwater): beyond it the headwater is at least that (see
   * `curveHeadwater`); null for the pointwise evaluation. */
  last: { flow: number; headwater: number } | null;
}

function barrelLaw(b: Barrel, tw: number, exact: boolean): BarrelLaw {
  if (exact) return { headwater: (q) => barrelHeadwater(b, q, tw), flow: null, last: null };
  const curve = barrelCurve(b, tw);
  const n = curve.flow.length;
  return { headwater: (q) => curveHeadwater(curve, q), flow: (head) => curveFlow(curve, head), last: { flow: curve.flow[n - 1], headwater: curve.headwater[n - 1] } };
}

/** The chamber's flow for a barrel given by its law (a curve, the pointwise HDS-5 forms, or a link's table of them). */
export function solveFlow(outlet: Outlet, ws: number, law: BarrelLaw): number {
  const b = outlet.barrel as Barrel;
  const free = openingsFlow(outlet, ws, -Infinity);
  if (!(free > 0)) return 0;
  const lowest = lowestOpening(outlet);
  // A free flow beyond the curve's last node whose headwater there already reaches the pond (e.g. a
  // riser rim far wider than the barrel): the chamber would stand at or above the pond, so g(free) =
  // -free as below, without the pointwise barrel evaluation the curve falls back to there.
  const last = law.last;
  const drowned = last !== null && free >= last.flow && ws > lowest && b.inletInvert + last.headwater >= ws;
  const freeLevel = drowned ? ws : b.inletInvert + law.headwater(free);
  if (freeLevel <= lowest) return free;
  const freeExcess = freeLevel < ws ? openingsFlow(outlet, ws, freeLevel) - free : -free;
  if (freeExcess >= 0) return free;
  const excess = (q: number) => openingsFlow(outlet, ws, b.inletInvert + law.headwater(q)) - q;
  const tolerance = CHAMBER_TOLERANCE * free;
  if (b.inletInvert + law.headwater(0) > lowest) {
    const atZero = excess(0);
    return atZero > 0 ? brentRoot(excess, 0, free, atZero, freeExcess, tolerance) : 0;
  }
  if (!law.flow) return brentRoot(excess, 0, free, free, freeExcess, tolerance);
  // With the curve's inverse the bracket narrows at no cost: up to the flow that raises the chamber
  // to the lowest opening nothing is throttled (g = free - q), and from the flow that raises it to
  // the pond stage on the openings pass nothing (g = -q).
  const start = Math.min(law.flow(lowest - b.inletInvert), free);
  const end = Math.min(law.flow(ws - b.inletInvert), free);
  if (end === free) return brentRoot(excess, start, free, free - start, freeExcess, tolerance);
  // Solved as O^2 - q^2 = 0 there: the openings' flow O falls like the square root of the head
  // left as the chamber nears the pond, and its square is nearly linear, which Brent's
  // interpolation steps follow well (about a fifth fewer evaluations).
  const squared = (q: number) => {
    const o = openingsFlow(outlet, ws, b.inletInvert + law.headwater(q));
    return o * o - q * q;
  };
  return brentRoot(squared, start, end, free * free - start * start, -end * end, tolerance);
}

/** Flow through the openings into the chamber and out through the barrel (m3/s); `tw` is the
 * tailwater elevation (-Infinity for a free outfall). The outlet must have a barrel. */
export function chamberFlow(outlet: Outlet, ws: number, tw: number, exact = false): number {
  return solveFlow(outlet, ws, barrelLaw(outlet.barrel as Barrel, tw, exact));
}

/** The chamber at a pond stage: its level, the barrel's flow and what governs. */
export function chamberLevel(outlet: Outlet, ws: number, tw: number, exact = false): ChamberSolution {
  const b = outlet.barrel as Barrel;
  const law = barrelLaw(b, tw, exact);
  const flow = solveFlow(outlet, ws, law);
  const state = barrelState(b, flow, tw);
  const free = openingsFlow(outlet, ws, -Infinity);
  const throttled = flow < free * (1 - 1e-9);
  // With no flow the chamber holds still water: the tailwater, or empty down to the barrel's invert
  // (on an adverse barrel, up to its outlet invert).
  const level = flow > 0 ? b.inletInvert + law.headwater(flow) : Math.max(b.inletInvert, b.outletInvert, tw);
  return {
    level: Math.min(ws, level),
    flow,
    control: !throttled ? "openings free" : state.control === "inlet" ? "barrel inlet control" : "barrel outlet control",
    barrel: state,
  };
}
