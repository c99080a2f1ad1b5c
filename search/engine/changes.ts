// What an alternative changes against the existing outlet, part by part: parts removed, added,
// resized (from -> to) and moved (by how much), with a change measure to rank fixes by. The parts of
// the two outlets are paired so that the measure is smallest; only parts of the same kind and shape
// pair (an orifice that becomes a weir is one part removed and one added).
import type { Element, Outlet } from "../../src/model.js";
import { formatter, type Formatter } from "../../src/format.js";
import { describeElement } from "../../src/report/describe.js";
import { partOf } from "../../src/parts/registry.js";
import { riserWords } from "../../src/parts/riser.js";
import { barrelSizeWords } from "../../src/parts/barrel.js";
import { spillwayWords } from "../../src/parts/spillway.js";
import type { SearchProblem } from "./problem.js";

export interface Change {
  kind: "removed" | "added" | "resized" | "moved";
  /** The part in words (its size before the change). */
  part: string;
  /** Resized: size before and after; moved: elevation before and after (with units). */
  from?: string;
  to?: string;
  /** Moved: the vertical move in the case's length unit (positive up). */
  by?: number;
  text: string;
}

export interface ChangeList {
  changes: Change[];
  /** The change measure (see CHANGE_WEIGHTS): 0 for the existing outlet itself. */
  score: number;
}

/**
 * Weights of the change measure: each part added or removed counts 1, each part resized (another
 * size, count or rating) 0.5, each part moved (another invert, crest or rim) 0.25, plus the total
 * vertical move as a fraction of the pond's depth times `distance`, so that of two lists otherwise
 * alike the one with the smaller moves ranks first. An invented scale for ranking fixes, not effort.
 */
export const CHANGE_WEIGHTS = { addedOrRemoved: 1, resized: 0.5, moved: 0.25, distance: 0.1 };

/** The changes from `before` (the existing outlet) to `after`, both SI, described in the case's units. */
export function changeList(p: SearchProblem, before: Outlet, after: Outlet): ChangeList {
  const f = formatter(p.case.units);
  const depth = p.case.pond.top - p.case.pond.bottom;
  const changes: Change[] = [];
  let score = 0;
  const add = (c: Change, weight: number) => {
    changes.push(c);
    score += weight;
  };
  const move = (part: string, label: string, from: number, to: number) => {
    if (Math.abs(to - from) < 1e-9) return;
    const by = f.raw.length(to - from);
    add({ kind: "moved", part, from: f.elevation(from), to: f.elevation(to), by, text: `moved: ${part}: ${label} ${f.elevation(from)} -> ${f.elevation(to)} (${by > 0 ? "+" : ""}${f.length(to - from)})` }, CHANGE_WEIGHTS.moved + (CHANGE_WEIGHTS.distance * Math.abs(to - from)) / depth);
  };
  const resize = (part: string, from: string, to: string) => {
    if (from === to) return;
    add({ kind: "resized", part, from, to, text: `resized: ${part}: ${from} -> ${to}` }, CHANGE_WEIGHTS.resized);
  };
  const removed = (part: string) => add({ kind: "removed", part, text: `removed: ${part}` }, CHANGE_WEIGHTS.addedOrRemoved);
  const added = (part: string) => add({ kind: "added", part, text: `added: ${part}` }, CHANGE_WEIGHTS.addedOrRemoved);

  for (const [a, b] of pairElements(before.elements, after.elements, depth)) {
    if (a && !b) removed(describeElement(a, f));
    else if (!a && b) added(describeElement(b, f));
    else if (a && b) {
      const name = `${elementNoun(a)} at ${f.elevation(level(a))}`;
      resize(name, elementSize(a, f), elementSize(b, f));
      move(`${elementSize(b, f)} ${elementNoun(b)}`, partOf(a).bottomField, level(a), level(b));
    }
  }

  if (before.riser && !after.riser) removed(`${riserWords(before.riser, f)} with rim at ${f.elevation(before.riser.crest)}`);
  else if (!before.riser && after.riser) added(`${riserWords(after.riser, f)} with rim at ${f.elevation(after.riser.crest)}`);
  else if (before.riser && after.riser) {
    resize("riser", riserWords(before.riser, f).replace(/ riser$/, ""), riserWords(after.riser, f).replace(/ riser$/, ""));
    move(riserWords(after.riser, f), "rim", before.riser.crest, after.riser.crest);
  }

  if (before.barrel && !after.barrel) removed(`${barrelSizeWords(before.barrel, f)} barrel`);
  else if (!before.barrel && after.barrel) added(`${barrelSizeWords(after.barrel, f)} barrel`);
  else if (before.barrel && after.barrel) resize("barrel", barrelSizeWords(before.barrel, f), barrelSizeWords(after.barrel, f));

  if (before.spillway && !after.spillway) removed("spillway");
  else if (!before.spillway && after.spillway) added(spillwayWords(after.spillway, f));
  else if (before.spillway && after.spillway) {
    resize("spillway", `${f.length(before.spillway.length, 1)} long`, `${f.length(after.spillway.length, 1)} long`);
    move("spillway", "crest", before.spillway.crest, after.spillway.crest);
  }
  return { changes, score };
}

/** Invert or crest (m). */
function level(e: Element): number {
  return partOf(e).bottom(e);
}

function elementNoun(e: Element): string {
  return partOf(e).noun(e);
}

/** The size of a part in words: count and diameter, weir length, notch angle, or a regulator's largest rated flow. */
function elementSize(e: Element, f: Formatter): string {
  return partOf(e).size(e, f);
}

/** Whether two parts may be the same part changed: the same kind. */
function pairable(a: Element, b: Element): boolean {
  return partOf(a) === partOf(b);
}

/** Change measure of pairing a with b. */
function pairScore(a: Element, b: Element, depth: number, f: Formatter): number {
  const resized = elementSize(a, f) !== elementSize(b, f) ? CHANGE_WEIGHTS.resized : 0;
  const dz = Math.abs(level(a) - level(b));
  return resized + (dz > 1e-9 ? CHANGE_WEIGHTS.moved + (CHANGE_WEIGHTS.distance * dz) / depth : 0);
}

/**
 * Pairs the elements of two outlets with the smallest total change measure (an unpaired part counts
 * as removed or added); exhaustive, as outlets have a handful of parts. Pairs in `before`'s order,
 * then the parts added.
 */
export function pairElements(before: readonly Element[], after: readonly Element[], depth: number): [Element | null, Element | null][] {
  const f = formatter("SI");
  let best: { score: number; match: number[] } = { score: Infinity, match: [] };
  const used = new Array<boolean>(after.length).fill(false);
  const match: number[] = [];
  const search = (i: number, score: number) => {
    if (score >= best.score) return;
    if (i === before.length) {
      const total = score + used.filter((u) => !u).length * CHANGE_WEIGHTS.addedOrRemoved;
      if (total < best.score) best = { score: total, match: [...match] };
      return;
    }
    for (let j = 0; j < after.length; j++) {
      if (used[j] || !pairable(before[i], after[j])) continue;
      used[j] = true;
      match.push(j);
      search(i + 1, score + pairScore(before[i], after[j], depth, f));
      match.pop();
      used[j] = false;
    }
    match.push(-1);
    search(i + 1, score + CHANGE_WEIGHTS.addedOrRemoved);
    match.pop();
  };
  search(0, 0);
  const pairs: [Element | null, Element | null][] = before.map((a, i) => [a, best.match[i] >= 0 ? after[best.match[i]] : null]);
  after.forEach((b, j) => {
    if (!best.match.includes(j)) pairs.push([null, b]);
  });
  return pairs;
}
