// An outlet in words, with sizes and elevations in the case's units.
import type { Element, Outlet } from "../model.js";
import type { Formatter } from "../format.js";

export function describeElement(e: Element, f: Formatter): string {
  switch (e.type) {
    case "orifice":
      return e.shape === "circular"
        ? `${e.count} x ${f.size(e.diameter)} orifice${e.count > 1 ? "s" : ""} at ${f.elevation(e.invert)}`
        : `${e.count} x ${f.size(e.width)} x ${f.size(e.height)} rectangular orifice${e.count > 1 ? "s" : ""} at ${f.elevation(e.invert)}`;
    case "weir":
      return e.shape === "rectangular"
        ? `${f.length(e.length)} weir${e.endContractions ? ` (${e.endContractions} end contraction${e.endContractions > 1 ? "s" : ""})` : ""} at ${f.elevation(e.crest)}`
        : `${e.angle} deg v-notch at ${f.elevation(e.crest)}`;
    case "regulator":
      return `regulator at ${f.elevation(e.invert)}`;
  }
}

export function describeOutlet(outlet: Outlet, f: Formatter): string {
  const parts = outlet.elements.map((e) => describeElement(e, f));
  if (outlet.riser) {
    const r = outlet.riser;
    parts.push(`${r.shape === "circular" ? `${f.length(r.diameter)} riser` : `${f.length(r.length)} x ${f.length(r.width)} box riser`} with rim at ${f.elevation(r.crest)}`);
  }
  if (outlet.barrel) {
    const b = outlet.barrel;
    parts.push(`${b.shape === "circular" ? f.size(b.diameter) : `${f.length(b.span)} x ${f.length(b.rise)}`} barrel, ${f.length(b.length, 1)} long`);
  }
  if (outlet.spillway) parts.push(`${f.length(outlet.spillway.length, 1)} spillway at ${f.elevation(outlet.spillway.crest)}`);
  return parts.length ? parts.join("; ") : "no outlet";
}
