// Which part limits the outflow at a stage, in the trade's words, for tables a reviewer reads.
import type { Outlet } from "../model.js";
import { openingsFlow, type OutletDetail } from "../hydraulics/outlet.js";

/**
 * The barrel (or a tailwater) is named as limiting only when it cuts the flow the openings and rim
 * would pass on their own by more than this fraction. 1 %: below it the difference is smaller than
 * the uncertainty of the openings' own coefficients (a discharge coefficient is known to a few per
 * cent, common practice) and hardly shows in the three figures printed; the hydraulic control the
 * solver reports (`control`) is still the exact one in the JSON.
 */
export const NOTICEABLE_REDUCTION = 0.01;

/** How much the chamber (or the tailwater) cuts the openings' free flow at a stage: 0 to 1. */
export function throttling(outlet: Outlet, d: OutletDetail): number {
  const free = openingsFlow(outlet, d.stage, d.tailwater ?? -Infinity);
  if (!(free > 0)) return 0;
  const passed = d.barrel ?? d.elements.reduce((a, b) => a + b, 0) + d.rim;
  return Math.max(0, (free - passed) / free);
}

/** "barrel, inlet control", "openings", "rim, weir flow", "spillway", ... */
export function limitingPart(outlet: Outlet, d: OutletDetail): string {
  if (d.control === "no flow") return "no flow";
  if (d.control === "spillway") return "spillway";
  const cut = throttling(outlet, d);
  if (cut > NOTICEABLE_REDUCTION) {
    if (d.barrel !== null && d.barrelControl !== null) return `barrel, ${d.barrelControl} control`;
    return "tailwater";
  }
  const openings = d.elements.reduce((a, b) => a + b, 0);
  if (d.rim > 0 && d.rim >= openings) return d.control === "rim orifice flow" ? "rim, orifice flow" : "rim, weir flow";
  return "openings";
}
