// The whole outlet at one pond stage: openings (elements) and the riser rim discharge into the
// chamber, which the barrel drains; without a barrel they discharge straight to tailwater. The
// spillway always discharges straight downstream. No reverse flow: a downstream level above the
// pond stage gives zero outflow.
import type { Outlet, Tailwater } from "../model.js";
import { rimFlow } from "../parts/riser.js";
import { spillwayFlow } from "../parts/spillway.js";
import { bottomOf } from "../parts/registry.js";
import { tailwaterLevel } from "./tailwater.js";
import { chamberFlow, chamberLevel, type ChamberSolution } from "./chamber.js";
import { elementFlow, lowestOpening, openingsFlow } from "./openings.js";
import { brentRoot } from "./roots.js";

export { elementFlow, openingsFlow } from "./openings.js";

/** Total outflow for a given tailwater level (-Infinity for a free outfall); `exact`: the barrel
 * by pointwise evaluation instead of its tabulated curve (for a tailwater that keeps changing). */
export function dischargeAtTailwater(outlet: Outlet, ws: number, tw: number, exact = false): number {
  const spill = outlet.spillway ? spillwayFlow(outlet.spillway, ws, tw) : 0;
  if (outlet.barrel) return chamberFlow(outlet, ws, tw, exact) + spill;
  return openingsFlow(outlet, ws, tw) + spill;
}

/** Total outflow of the pond at a stage (m3/s). */
export function outletDischarge(outlet: Outlet, tail: Tailwater, ws: number): number {
  if (tail.kind !== "rating") return dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, 0));
  return solveWithTailwaterRating(outlet, tail, ws);
}

/**
 * With a downstream channel rating the tailwater depends on the outflow itself: find O with
 * O = discharge(ws, TW(O)). The right side falls as O rises, so the root is unique; Brent's method
 * on [0, discharge at the lowest tailwater] (each evaluation may be a chamber solve, so few matter).
 */
function solveWithTailwaterRating(outlet: Outlet, tail: Tailwater, ws: number): number {
  const high = dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, 0), true);
  if (!(high > 0)) return 0;
  // When even the largest possible outflow leaves the tailwater below every part, it does not matter.
  if (tailwaterLevel(tail, high) <= lowestTailwaterEffect(outlet)) return high;
  const excess = (o: number) => dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, o), true) - o;
  return brentRoot(excess, 0, high, high, excess(high), 1e-11 * high);
}

/** Lowest tailwater elevation that any part (openings, rim, spillway, barrel outlet) would feel. */
function lowestTailwaterEffect(outlet: Outlet): number {
  let z = lowestOpening(outlet);
  if (outlet.spillway) z = Math.min(z, outlet.spillway.crest);
  if (outlet.barrel) z = Math.min(z, outlet.barrel.outletInvert);
  return z;
}

/** What limits the flow at a stage, in words an engineer uses. */
export type Control =
  | "no flow"
  | "openings free"
  | "openings submerged by tailwater"
  | "rim weir flow"
  | "rim orifice flow"
  | "barrel inlet control"
  | "barrel outlet control"
  | "spillway";

export interface OutletDetail {
  stage: number;
  total: number;
  /** Flow of each element, in the order of outlet.elements. */
  elements: number[];
  rim: number;
  spillway: number;
  /** Flow through the barrel (= openings + rim) when there is one. */
  barrel: number | null;
  /** Chamber level when a barrel drains the chamber. */
  chamber: number | null;
  /** The barrel's headwater above its inlet invert (m) at its flow: the larger of inlet and
   * outlet control, which may stand above the pond when nothing flows. */
  barrelHeadwater: number | null;
  /** Which control the barrel is under at its flow (even while the openings govern). */
  barrelControl: "inlet" | "outlet" | null;
  /** Tailwater level, null for a free outfall. */
  tailwater: number | null;
  control: Control;
}

/** Every part's flow at a stage, the chamber and tailwater levels, and the governing control. */
export function outletDetail(outlet: Outlet, tail: Tailwater, ws: number): OutletDetail {
  const total = outletDischarge(outlet, tail, ws);
  const twRaw = tailwaterLevel(tail, total);
  const tw = Number.isFinite(twRaw) ? twRaw : null;
  let ds = twRaw;
  let chamber: ChamberSolution | null = null;
  if (outlet.barrel) {
    chamber = chamberLevel(outlet, ws, twRaw, tail.kind === "rating");
    ds = chamber.level;
  }
  const elements = outlet.elements.map((e) => elementFlow(e, ws, ds));
  const rim = outlet.riser ? rimFlow(outlet.riser, ws, ds) : { flow: 0, orificeControls: false };
  const spillway = outlet.spillway ? spillwayFlow(outlet.spillway, ws, twRaw) : 0;
  const openings = elements.reduce((a, b) => a + b, 0) + rim.flow;
  let control: Control;
  if (total <= 0) control = "no flow";
  else if (spillway > openings) control = "spillway";
  else if (chamber && chamber.control !== "openings free") control = chamber.control;
  else if (rim.flow > 0 && rim.flow >= 0.5 * openings) control = rim.orificeControls ? "rim orifice flow" : "rim weir flow";
  else if (!chamber && tw !== null && outlet.elements.some((e) => bottomOf(e) < tw)) control = "openings submerged by tailwater";
  else control = "openings free";
  return {
    stage: ws,
    total,
    elements,
    rim: rim.flow,
    spillway,
    barrel: chamber ? chamber.flow : null,
    chamber: chamber ? chamber.level : null,
    barrelHeadwater: chamber ? chamber.barrel.headwater : null,
    barrelControl: chamber ? chamber.barrel.control : null,
    tailwater: tw,
    control,
  };
}
