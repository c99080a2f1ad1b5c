// Broad-crested trapezoidal overflow spillway: Q = C (L H^1.5 + 0.8 z H^2.5) (case-format
// contract; the first term is HEC-22 eq 8-22 / 8-26, the second the side slopes' share).
// Default C 2.8 US / 1.55 SI, within HEC-22 Table 8-1 (Brater & King). Villemonte n = 1.5 when the
// tailwater stands above the crest.
import type { Spillway } from "../model.js";
import { villemonte } from "./submergence.js";

export function spillwayFlow(s: Spillway, ws: number, tw: number): number {
  const head = ws - s.crest;
  if (head <= 0 || tw >= ws) return 0;
  const h15 = head * Math.sqrt(head);
  const free = s.coefficient * h15 * (s.length + 0.8 * s.sideSlope * head);
  return villemonte(free, head, tw - s.crest, 1.5);
}
