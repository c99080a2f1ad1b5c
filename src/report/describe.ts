// An outlet in words, with sizes and elevations in the case's units.
import type { Element, Outlet } from "../model.js";
import type { Formatter } from "../format.js";
import { partOf } from "../parts/registry.js";
import { riserWords } from "../parts/riser.js";
import { barrelSizeWords } from "../parts/barrel.js";
import { spillwayWords } from "../parts/spillway.js";

export function describeElement(e: Element, f: Formatter): string {
  return partOf(e).describe(e, f);
}

export function describeOutlet(outlet: Outlet, f: Formatter): string {
  const parts = outlet.elements.map((e) => describeElement(e, f));
  if (outlet.riser) parts.push(`${riserWords(outlet.riser, f)} with rim at ${f.elevation(outlet.riser.crest)}`);
  if (outlet.barrel) parts.push(`${barrelSizeWords(outlet.barrel, f)} barrel, ${f.length(outlet.barrel.length, 1)} long`);
  if (outlet.spillway) parts.push(spillwayWords(outlet.spillway, f));
  return parts.length ? parts.join("; ") : "no outlet";
}
