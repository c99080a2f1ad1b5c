// A storage shortfall in words, with units.
import type { Case } from "../model.js";
import { formatter } from "../format.js";
import type { StorageShortfall } from "../assess/storageShortfall.js";

export function shortfallLines(c: Case, s: StorageShortfall): string[] {
  const f = formatter(c.units);
  const needed = Math.max(s.leastShortfall, s.routedShortfall ?? 0);
  if (needed <= 0) return [];
  const lines = [
    `Storage: the pond holds ${f.volume(s.available)} between the ${c.pond.pool > c.pond.bottom ? "permanent pool" : "floor"} and the freeboard level (${f.elevation(c.pond.top - c.criteria.freeboardDepth)}).`,
  ];
  if (s.leastShortfall > 0) {
    lines.push(`  The ${s.leastStorm} storm's inflow above its allowable peak is ${f.volume(s.leastNeeded)}: no outlet can keep that peak with less, so at least ${f.volume(s.leastShortfall)} more storage is needed.`);
  }
  if (s.routedShortfall !== null && s.routedShortfall > 0) {
    lines.push(`The closest design routed stored ${f.volume(s.routedShortfall)} above the freeboard level in the ${c.criteria.freeboardStorm} storm.`);
  }
  const depth = s.areaAtFreeboard > 0 ? needed / s.areaAtFreeboard : null;
  const footprint = s.usableDepth > 0 ? needed / s.usableDepth : null;
  lines.push(
    `Add about ${f.volume(needed)} of storage below the freeboard level${depth !== null ? `: about ${f.length(depth)} more depth at the present surface area` : ""}${footprint !== null ? `, or about ${Math.round(f.raw.area(footprint)).toLocaleString("en-US")} ${f.labels.length}2 more plan area over the present depth` : ""}.`,
  );
  return lines;
}
