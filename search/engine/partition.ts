// The search's fixed division into parts. A layout's family is the part at its first level (the
// opening at the floor, which the plan scores alone before anything else); families are dealt to
// parts in their order of promise, so every part holds some of the most promising ones. The division
// depends only on the problem, the first plan and the budget: never on the number of workers or
// shards, so a shard that runs a fixed share of the parts does the very work the single run does.
import { createHash } from "node:crypto";
import type { Layout, SearchProblem } from "./problem.js";
import type { LayoutPlan } from "./layouts.js";
import { familyOf } from "./layout.js";

/** The most parts a search is divided into (and so the most shards that each get work). */
export const MAX_PARTS = 16;
/** Routings of the budget per part: fewer and a part's own adaptive search has too little to adapt. */
export const ROUTINGS_PER_PART = 5000;

export interface Partition {
  /** Number of parts. */
  count: number;
  /** The families each part owns, most promising first. */
  families: string[][];
  /** The part that owns a layout. */
  partOf(layout: Layout): number;
}

/** Parts wanted for a budget of routings (null: a time budget, which takes the most). */
export function partsFor(budget: number | null): number {
  if (budget === null || !Number.isFinite(budget)) return MAX_PARTS;
  return Math.max(1, Math.min(MAX_PARTS, Math.floor(budget / ROUTINGS_PER_PART)));
}

/** Divides the search: families of the plan's layouts (and of the first-level options it kept), best score first. */
export function partition(p: SearchProblem, plan: LayoutPlan, budget: number | null): Partition {
  const best = new Map<string, number>();
  for (const s of plan.layouts) {
    const family = familyOf(s.layout);
    const score = Number.isFinite(s.score) ? s.score : Number.MAX_VALUE;
    if (!best.has(family) || score < best.get(family)!) best.set(family, score);
  }
  for (const option of plan.firstOptions) if (!best.has(option.key)) best.set(option.key, Number.MAX_VALUE);
  const ordered = [...best.entries()].sort((a, b) => a[1] - b[1] || (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0)).map(([family]) => family);
  const count = p.fixedLayout ? 1 : Math.max(1, Math.min(partsFor(budget), ordered.length));
  const owner = new Map<string, number>();
  const families: string[][] = Array.from({ length: count }, () => []);
  ordered.forEach((family, i) => {
    owner.set(family, i % count);
    families[i % count].push(family);
  });
  return {
    count,
    families,
    // A family the plan did not hold (a pruned first level shown as a closest miss, or any first
    // level where the lowest level floats) goes to a part by a fixed hash of its name.
    partOf: (layout) => owner.get(familyOf(layout)) ?? hashShare(familyOf(layout), count),
  };
}

/** A fixed share (0 to count - 1) of a name. */
export function hashShare(name: string, count: number): number {
  return createHash("sha1").update(name).digest().readUInt32BE(0) % count;
}

/**
 * The shard (from 0) of `shards` that runs part `part` (from 0) of `parts`. The parts are dealt in rounds
 * of one part per shard, each round in the direction opposite to the one before (shards 0 to n - 1, then
 * n - 1 to 0: a snake), and the parts left over after the last whole round go to the shards from the
 * last one back. The parts are in their order of promise; dealt in turn (part % n), shard 1 held the
 * first part of every round. Measured part by part in one thread, the first part took the most time of
 * all on three of four bundled cases (the two-ponds system: 11-16 % of the parts' time, 1.8-2.9 times
 * the median part), and the other parts' times follow no order. So a shard that holds an earlier part
 * of one round holds a later one of the next, the shares differ by one part at most, and the shard of
 * the first part never holds an extra one (unless there are fewer parts than shards). Depends only on
 * the part, the number of parts and the number of shards, so every shard deals alike.
 */
export function shardOf(part: number, parts: number, shards: number): number {
  const round = Math.floor(part / shards);
  const place = part % shards;
  // Fewer parts than shards: no whole round, so shard k runs part k (the rest have none).
  const leftOver = round > 0 && round === Math.floor(parts / shards);
  return leftOver || round % 2 === 1 ? shards - 1 - place : place;
}

/** Whether shard `index` (from 1) of `count` runs part `part` (from 0) of `parts` (`shardOf`). */
export function inShard(part: number, parts: number, shard: { index: number; count: number }): boolean {
  return shardOf(part, parts, shard.count) === shard.index - 1;
}
