// A storage shortfall in words, with units: each storm counted below its limit level.
import type { Case } from "../model.js";
import { formatter } from "../format.js";
import type { StorageShortfall } from "../assess/storageShortfall.js";
import { NOTIONAL_WORDS } from "../sizing/routedEstimate.js";
import { CATALOGUE_ALLOWANCE } from "../sizing/pondChoice.js";

export function shortfallLines(c: Case, s: StorageShortfall): string[] {
  const f = formatter(c.units);
  const needed = Math.max(s.leastShortfall, s.routedShortfall, s.designShortfall ?? 0);
  if (needed <= 0) return [];
  const base = c.pond.pool > c.pond.bottom ? "permanent pool" : "floor";
  const lines = [`Storage: the pond holds ${f.volume(s.tightest.available)} between the ${base} and the ${s.tightest.storm} storm's limit level (${f.elevation(s.tightest.limit.level)}, ${s.tightest.limit.by}).`];
  if (s.leastShortfall > 0) {
    lines.push(`  The ${s.leastStorm} storm's inflow above its allowable peak is ${f.volume(s.leastNeeded)}: no outlet can keep that peak with less, so at least ${f.volume(s.leastShortfall)} more storage is needed.`);
  }
  if (s.routedShortfall > 0 && s.routedKind !== null) {
    lines.push(`  Routed through a notional outlet (${NOTIONAL_WORDS[s.routedKind]}) sized to meet its target, the ${s.routedStorm} storm needs about ${f.volume(s.routedNeeded / (1 + CATALOGUE_ALLOWANCE))}; with ${Math.round(100 * CATALOGUE_ALLOWANCE)} % more for catalogue sizes, ${f.volume(s.routedShortfall)} more than the pond holds below that storm's limit level.`);
  }
  if (s.designShortfall !== null && s.designShortfall > 0) {
    lines.push(`The closest design routed stored ${f.volume(s.designShortfall)} above the limit level in the ${s.designStorm} storm.`);
  }
  const depth = s.areaAtLimit > 0 ? needed / s.areaAtLimit : null;
  const footprint = s.usableDepth > 0 ? needed / s.usableDepth : null;
  lines.push(
    `Add about ${f.volume(needed)} of storage below the limit level${depth !== null ? `: about ${f.length(depth)} more depth at the present surface area` : ""}${footprint !== null ? `, or about ${Math.round(f.raw.area(footprint)).toLocaleString("en-US")} ${f.labels.length}2 more plan area over the present depth` : ""}.`,
  );
  return lines;
}
