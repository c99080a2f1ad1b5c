// The riser (or headwall) chamber drained by a barrel. At a pond stage WS the chamber level c is the
// one at which the flow in through the openings and the rim, openingsFlow(WS, c), equals the
// barrel's flow at headwater c (case-format contract). The first falls and the second rises with c,
// so the level is unique. It is found through the barrel flow Q instead of c: the headwater the
// barrel needs for Q, HW(Q), rises with Q, so g(Q) = openingsFlow(WS, inlet + HW(Q)) - Q falls
// strictly from g(0) >= 0 to g(Qfree) <= 0, Qfree being the openings' flow with an empty chamber.
// This needs no inversion of HW inside the search (Brent's method on [0, Qfree]). The chamber level
// never exceeds WS: every opening passes nothing once the level reaches the pond.
import type { Barrel, Outlet } from "../case/model.js";
import { barrelHeadwater, barrelState, type BarrelState } from "./barrel.js";
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

/** Flow through the openings into the chamber and out through the barrel (m3/s); `tw` is the
 * tailwater elevation (-Infinity for a free outfall). The outlet must have a barrel. */
export function chamberFlow(outlet: Outlet, ws: number, tw: number): number {
  const b = outlet.barrel as Barrel;
  const free = openingsFlow(outlet, ws, -Infinity);
  if (!(free > 0)) return 0;
  const freeLevel = b.inletInvert + barrelHeadwater(b, free, tw);
  if (freeLevel <= lowestOpening(outlet)) return free;
  const freeExcess = freeLevel < ws ? openingsFlow(outlet, ws, freeLevel) - free : -free;
  if (freeExcess >= 0) return free;
  const excess = (q: number) => openingsFlow(outlet, ws, b.inletInvert + barrelHeadwater(b, q, tw)) - q;
  const atZero = b.inletInvert + barrelHeadwater(b, 0, tw) <= lowestOpening(outlet) ? free : excess(0);
  if (!(atZero > 0)) return 0;
  return brentRoot(excess, 0, free, atZero, freeExcess, CHAMBER_TOLERANCE * free);
}

/** The chamber at a pond stage: its level, the barrel's flow and what governs. */
export function chamberLevel(outlet: Outlet, ws: number, tw: number): ChamberSolution {
  const b = outlet.barrel as Barrel;
  const flow = chamberFlow(outlet, ws, tw);
  const state = barrelState(b, flow, tw);
  const free = openingsFlow(outlet, ws, -Infinity);
  const throttled = flow < free * (1 - 1e-9);
  // With no flow the chamber holds still water: the tailwater, or empty down to the barrel's invert.
  const level = flow > 0 ? b.inletInvert + state.headwater : Math.max(b.inletInvert, tw);
  return {
    level: Math.min(ws, level),
    flow,
    control: !throttled ? "openings free" : state.control === "inlet" ? "barrel inlet control" : "barrel outlet control",
    barrel: state,
  };
}
