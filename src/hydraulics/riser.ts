// The riser's rim: the smaller of weir flow over the perimeter, Cw P H^1.5, and orifice flow through
// the top opening, Cd A sqrt(2 g H) (HEC-22 sec. 8.4.4.2 and Example 8-6). Defaults Cw 3.0 US /
// 1.66 SI, Cd 0.60 (case-format contract). A chamber level above the rim reduces the weir flow by
// Villemonte's formula (n = 1.5) and the orifice head to WS - DS.
import type { Riser } from "../model.js";
import { GRAVITY } from "../units.js";
import { villemonte } from "./submergence.js";

export function riserPerimeter(r: Riser): number {
  return r.shape === "circular" ? Math.PI * r.diameter : 2 * (r.length + r.width);
}

export function riserArea(r: Riser): number {
  return r.shape === "circular" ? (Math.PI * r.diameter * r.diameter) / 4 : r.length * r.width;
}

export interface RimFlow {
  flow: number;
  /** True when the top opening (orifice flow) limits the rim. */
  orificeControls: boolean;
}

export function rimFlow(r: Riser, ws: number, ds: number): RimFlow {
  const weir = rimWeirFlow(r, ws, ds);
  const orifice = rimOrificeFlow(r, ws, ds);
  return orifice < weir ? { flow: orifice, orificeControls: true } : { flow: weir, orificeControls: false };
}

/** The rim's flow alone (the smaller of the two forms), without allocating: the rating's hot path. */
export function rimDischarge(r: Riser, ws: number, ds: number): number {
  return Math.min(rimWeirFlow(r, ws, ds), rimOrificeFlow(r, ws, ds));
}

function rimWeirFlow(r: Riser, ws: number, ds: number): number {
  const head = ws - r.crest;
  if (head <= 0 || ds >= ws) return 0;
  return villemonte(r.coefficient * riserPerimeter(r) * head * Math.sqrt(head), head, ds - r.crest, 1.5);
}

function rimOrificeFlow(r: Riser, ws: number, ds: number): number {
  const head = ws - Math.max(r.crest, ds);
  if (ws <= r.crest || head <= 0) return 0;
  return r.orificeCoefficient * riserArea(r) * Math.sqrt(2 * GRAVITY * head);
}
