// A pond's outlet that drains into another pond: a link whose downstream level is that pond's stage,
// and whose flow goes either way. Forward (upstream stage at or above the downstream one) it is the
// outlet's discharge under a tailwater at the downstream stage, as for a single pond. In reverse the
// same parts carry water back with the two levels swapped (case-format contract, "Systems of ponds"):
//   - openings and the rim without a barrel: each part's flow with WS the downstream pond's stage and
//     DS the upstream pond's (a drowned orifice passes Cd A sqrt(2g |h1 - h2|) towards the lower
//     level; weirs, the rim and the spillway are reduced by Villemonte's formula from the lower side);
//   - a barrel: reversed, its outlet end taking water from the downstream pond (with the entrance of
//     `barrel.outletEntrance`, by default the same as its inlet's) and its inlet end discharging into
//     the chamber; HDS-5 inlet or outlet control gives its flow with the chamber as its tailwater, and
//     the chamber drains through the openings and over the rim into the upstream pond (their flows
//     with WS the chamber level and DS the upstream stage). The chamber level is the one at which the
//     two flows agree;
//   - a barrel with no openings and no riser is an equaliser pipe: the ponds are its two ends (the
//     upstream pond its headwater forward, the downstream pond its headwater in reverse).
// The spillway always joins the two ponds directly. Below its outlet invert a tailwater changes
// nothing in a barrel's HDS-5 forms (the free outfall's values), so it is passed as a free outfall.
//
// `linkFlow` is the direct evaluation (barrels by their pointwise HDS-5 forms): the reference. The
// router interpolates the link's table (routing/linkTable.ts), whose nodes `LinkEvaluator` rates with
// the barrels' headwater tabulated over flow and tailwater (barrelSurface.ts).
import type { Barrel, Outlet } from "../model.js";
import { spillwayFlow } from "../parts/spillway.js";
import { barrelHeadwater, exactBarrelFlow } from "./barrel.js";
import { BarrelSurface } from "./barrelSurface.js";
import { dischargeAtTailwater } from "./outlet.js";
import { chamberFlow, solveFlow } from "./chamber.js";
import { lowestOpening, openingsFlow } from "./openings.js";
import { brentRoot } from "./roots.js";

/** Relative tolerance of the reverse chamber's flow. */
const REVERSE_TOLERANCE = 1e-10;

/** An outlet that is a pipe between the two ponds: a barrel without openings or riser. */
export function isEqualiserPipe(outlet: Outlet): boolean {
  return outlet.barrel !== undefined && outlet.elements.length === 0 && outlet.riser === undefined;
}

/** The barrel seen from its outlet end: inverts swapped, its outlet end's entrance at the upstream end. */
export function reversedBarrel(b: Barrel): Barrel {
  return { ...b, inletInvert: b.outletInvert, outletInvert: b.inletInvert, entrance: b.outletEntrance ?? b.entrance, outletEntrance: b.entrance };
}

/** A tailwater as a barrel's HDS-5 forms take it: at or below the outlet invert, a free outfall. */
function barrelTailwater(b: Barrel, tw: number): number {
  return tw <= b.outletInvert ? -Infinity : tw;
}

/**
 * Flow from the upstream pond (stage `up`) into the downstream pond (stage `down`), m3/s: positive
 * forward, negative in reverse. The direct evaluation, barrels by their pointwise HDS-5 forms.
 */
export function linkFlow(outlet: Outlet, up: number, down: number): number {
  if (up >= down) return forwardLinkFlow(outlet, up, down);
  return -reverseLinkFlow(outlet, down, up);
}

/** Forward flow (ws >= ds): the outlet under a tailwater at the downstream pond's stage. */
export function forwardLinkFlow(outlet: Outlet, ws: number, ds: number): number {
  if (ds >= ws) return 0;
  const b = outlet.barrel;
  if (!b) return dischargeAtTailwater(outlet, ws, ds);
  const spill = outlet.spillway ? spillwayFlow(outlet.spillway, ws, ds) : 0;
  if (isEqualiserPipe(outlet)) return exactBarrelFlow(b, ws, barrelTailwater(b, ds)) + spill;
  return chamberFlow(outlet, ws, barrelTailwater(b, ds), true) + spill;
}

/** Reverse flow (positive), from the downstream pond at `ws` back into the upstream pond at `ds` (ws > ds). */
export function reverseLinkFlow(outlet: Outlet, ws: number, ds: number): number {
  if (ds >= ws) return 0;
  const spill = outlet.spillway ? spillwayFlow(outlet.spillway, ws, ds) : 0;
  const b = outlet.barrel;
  if (!b) return openingsFlow(outlet, ws, ds) + spill;
  const back = reversedBarrel(b);
  if (isEqualiserPipe(outlet)) return exactBarrelFlow(back, ws, barrelTailwater(back, ds)) + spill;
  return reverseChamberFlow(outlet, back, ws, ds) + spill;
}

/**
 * Reverse flow through a barrel into the chamber and out through the openings and rim: the flow Q at
 * which the chamber level c(Q) that lets the openings pass Q into the upstream pond (at `ds`) is the
 * tailwater under which the reversed barrel passes Q from the downstream pond (at `ws`). The barrel's
 * headwater for Q rises with Q and with c(Q), so g(Q) = inlet + HW(Q; c(Q)) - ws rises and Brent's
 * method finds its root on [0, the smaller of the two flows with the other part out of the way].
 */
export function reverseChamberFlow(outlet: Outlet, back: Barrel, ws: number, ds: number): number {
  const rest = Math.max(ds, lowestOpening(outlet));
  if (!(ws > rest)) return 0;
  const high = Math.min(openingsFlow(outlet, ws, ds), exactBarrelFlow(back, ws, barrelTailwater(back, rest)));
  if (!(high > 0)) return 0;
  const g = (q: number) => back.inletInvert + barrelHeadwater(back, q, barrelTailwater(back, chamberForFlow(outlet, q, rest, ws, ds))) - ws;
  const g0 = g(0);
  if (g0 >= 0) return 0;
  const gHigh = g(high);
  if (gHigh <= 0) return high;
  return brentRoot(g, 0, high, g0, gHigh, REVERSE_TOLERANCE * high);
}

/** The chamber level at which the openings and rim pass `q` into the upstream pond at `ds` (between `rest` and `ws`). */
function chamberForFlow(outlet: Outlet, q: number, rest: number, ws: number, ds: number): number {
  if (!(q > 0)) return rest;
  const excess = (c: number) => openingsFlow(outlet, c, ds) - q;
  const atTop = excess(ws);
  if (atTop <= 0) return ws;
  return brentRoot(excess, rest, ws, -q, atTop, 1e-12 * (1 + Math.abs(ws)));
}

/**
 * The link's flow with its barrel (forward and reversed) tabulated over flow and tailwater up to
 * `highest` (barrelSurface.ts): what the link's table is rated with. Openings, rim and spillway are
 * evaluated directly, as in `linkFlow`.
 */
export class LinkEvaluator {
  private readonly forwardSurface: BarrelSurface | null;
  private readonly backSurface: BarrelSurface | null;
  private readonly pipe: boolean;
  private readonly lowest: number;

  constructor(readonly outlet: Outlet, highest: number) {
    const b = outlet.barrel;
    this.pipe = isEqualiserPipe(outlet);
    this.forwardSurface = b ? new BarrelSurface(b, highest) : null;
    this.backSurface = b ? new BarrelSurface(reversedBarrel(b), highest) : null;
    this.lowest = lowestOpening(outlet);
  }

  /** As `linkFlow`. */
  flow(up: number, down: number): number {
    return up >= down ? this.forward(up, down) : -this.reverse(down, up);
  }

  forward(ws: number, ds: number): number {
    const outlet = this.outlet;
    const b = outlet.barrel;
    const surface = this.forwardSurface;
    if (ds >= ws) return 0;
    if (!b || !surface) return dischargeAtTailwater(outlet, ws, ds);
    const spill = outlet.spillway ? spillwayFlow(outlet.spillway, ws, ds) : 0;
    if (this.pipe) return surface.flow(ws, ds) + spill;
    const law = { headwater: (q: number) => surface.headwater(q, ds), flow: (head: number) => surface.flow(b.inletInvert + head, ds), last: null };
    return solveFlow(outlet, ws, law) + spill;
  }

  reverse(ws: number, ds: number): number {
    const outlet = this.outlet;
    const surface = this.backSurface;
    if (ds >= ws) return 0;
    const spill = outlet.spillway ? spillwayFlow(outlet.spillway, ws, ds) : 0;
    if (!surface) return openingsFlow(outlet, ws, ds) + spill;
    if (this.pipe) return surface.flow(ws, ds) + spill;
    // The chamber level c where the reversed barrel's flow from the downstream pond (tailwater c)
    // equals the openings' flow from the chamber into the upstream pond: the first falls with c, the
    // second rises.
    const rest = Math.max(ds, this.lowest);
    if (!(ws > rest)) return spill;
    const excess = (c: number) => surface.flow(ws, c) - openingsFlow(outlet, c, ds);
    const atRest = excess(rest);
    if (!(atRest > 0)) return spill;
    const atTop = excess(ws);
    if (atTop >= 0) return openingsFlow(outlet, ws, ds) + spill;
    const c = brentRoot(excess, rest, ws, atRest, atTop, 1e-9 * (1 + Math.abs(ws)));
    return openingsFlow(outlet, c, ds) + spill;
  }
}
