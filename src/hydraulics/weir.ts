// Sharp-crested weirs cut into the riser or headwall.
// Rectangular: Francis form Q = C (L - 0.1 n H) H^1.5, n end contractions (HEC-22 eqs 8-19/8-20;
//   Francis 1883). Default C 3.33 US / 1.84 SI (HEC-22 eq 8-19, H/Hc < 0.3).
// V-notch: Q = C tan(angle/2) H^2.5 (HEC-22 eq 8-23), default C 2.50 US / 1.38 SI.
// Both reduced by Villemonte's formula when the downstream level stands above the crest.
import type { RectangularWeir, VNotchWeir, Weir } from "../model.js";
import { villemonte } from "./submergence.js";

export function weirFlow(w: Weir, ws: number, ds: number): number {
  return w.shape === "rectangular" ? rectangularWeirFlow(w, ws, ds) : vNotchWeirFlow(w, ws, ds);
}

/**
 * Head above which the contracted Francis formula would start to decrease with head
 * (dQ/dH = 0 at H = 6 L / n); the flow is held there so that the rating never falls.
 */
export function francisHeadLimit(w: RectangularWeir): number {
  return w.endContractions === 0 ? Infinity : (6 * w.length) / w.endContractions;
}

export function rectangularWeirFlow(w: RectangularWeir, ws: number, ds: number): number {
  const head = ws - w.crest;
  if (head <= 0 || ds >= ws) return 0;
  const h = Math.min(head, francisHeadLimit(w));
  const free = w.coefficient * (w.length - 0.1 * w.endContractions * h) * h * Math.sqrt(h);
  return villemonte(free, head, ds - w.crest, 1.5);
}

export function vNotchWeirFlow(w: VNotchWeir, ws: number, ds: number): number {
  const head = ws - w.crest;
  if (head <= 0 || ds >= ws) return 0;
  const free = w.coefficient * Math.tan((w.angle * Math.PI) / 360) * head * head * Math.sqrt(head);
  return villemonte(free, head, ds - w.crest, 2.5);
}

/** Width of wall a weir needs at a given head (the notch's top width for a v-notch). */
export function weirWidth(w: Weir, head: number): number {
  return w.shape === "rectangular" ? w.length : 2 * Math.max(head, 0) * Math.tan((w.angle * Math.PI) / 360);
}
