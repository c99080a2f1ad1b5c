// Scores of layouts for planning and widening, as self-contained chunks: with the layout fits, the
// units of work the run hands to worker threads. A chunk is scored with an evaluator of its own (the
// staged start's memo is shared within the chunk only), so its result depends only on the problem and
// the chunk: the same in whatever thread, and the same whatever the number of workers.
import { createHash } from "node:crypto";
import { layoutIndex, type LayoutIndex } from "./fitJob.js";
import type { SearchProblem, Layout } from "./problem.js";

/** One thing to score: positions in the problem's option lists, so it crosses to a worker intact. */
export type ScoreItem =
  /** A first-level option alone, through the most open barrel, on the smallest storm. */
  | { kind: "first"; part: number }
  /** Levels (part positions) with the last one just added, on the storm it must hold. */
  | { kind: "extend"; levels: number[]; storm: number }
  /** A whole layout at its staged start, every check (the fit's objective) and its cost. */
  | { kind: "staged"; layout: LayoutIndex }
  /** The existing outlet's layout at its own elevations. */
  | { kind: "existing"; layout: LayoutIndex }
  /** A system of ponds: an item of pond `pond`'s own plan, scored on its view of the case. */
  | { kind: "pond"; pond: number; item: ScoreItem };

export interface ScoreValue {
  /** The fit's objective at the start (staged, existing), or the level's distance score (first). */
  score: number;
  cost: number;
  /** Peak outflow (m3/s) of the storm the item was routed with (first, extend). */
  peak: number;
  /** Drawdown time (s) of that routing, null when not drained (first). */
  drawdown: number | null;
  /** A first-level option that cannot meet the smallest storm's band (the bound). */
  pruned: boolean;
  /** A first-level option alone failing a check that only gets worse as openings are added (a rule's `boundFirstLevel`). */
  bounded: boolean;
}

export interface ScoreChunk {
  items: ScoreItem[];
}

export interface ScoreOutcome {
  values: ScoreValue[];
  routings: number;
  evaluations: number;
}

/** A chunk's key in a journal: its items hashed (its outcome depends only on them and the problem). */
export function screenKey(chunk: ScoreChunk): string {
  return createHash("sha1").update(JSON.stringify(chunk.items)).digest("base64");
}

// JSON has no infinite number: an infinite score (a level that cannot hold its storm) is written as
// the string "Infinity" and read back as the number.
const written = (x: number): number | string => (Number.isFinite(x) ? x : String(x));
const readNumber = (x: unknown): number | null => (typeof x === "number" && Number.isFinite(x) ? x : x === "Infinity" ? Infinity : x === "-Infinity" ? -Infinity : null);

/** A chunk's scores as a journal line holds them. */
export function writtenValues(values: ScoreValue[]): unknown[] {
  return values.map((v) => ({ ...v, score: written(v.score), cost: written(v.cost), peak: written(v.peak), drawdown: v.drawdown === null ? null : written(v.drawdown) }));
}

/** A chunk's outcome as read back from a journal, or null when the value is not one. */
export function readScreen(value: Record<string, unknown>): ScoreOutcome | null {
  const count = (x: unknown) => typeof x === "number" && Number.isInteger(x) && x >= 0;
  if (!count(value.routings) || !count(value.evaluations) || !Array.isArray(value.values)) return null;
  const values: ScoreValue[] = [];
  for (const v of value.values as unknown[]) {
    if (typeof v !== "object" || v === null) return null;
    const x = v as Record<string, unknown>;
    const [score, cost, peak] = [readNumber(x.score), readNumber(x.cost), readNumber(x.peak)];
    const drawdown = x.drawdown === null ? null : readNumber(x.drawdown);
    if (score === null || cost === null || peak === null || (x.drawdown !== null && drawdown === null)) return null;
    if (typeof x.pruned !== "boolean" || typeof x.bounded !== "boolean") return null;
    values.push({ score, cost, peak, drawdown, pruned: x.pruned, bounded: x.bounded });
  }
  return { values, routings: value.routings as number, evaluations: value.evaluations as number };
}

/** Whether an outcome can be journalled (every number is one, if infinite; none is NaN). */
export function journalable(outcome: ScoreOutcome): boolean {
  return outcome.values.every((v) => !Number.isNaN(v.score) && !Number.isNaN(v.cost) && !Number.isNaN(v.peak) && !(v.drawdown !== null && Number.isNaN(v.drawdown)));
}

export const stagedItem = (p: SearchProblem, layout: Layout): ScoreItem => ({ kind: "staged", layout: layoutIndex(p, layout) });

/** Something that scores chunks, in this thread or on workers; outcomes in the chunks' order. */
export interface ChunkScorer {
  score(chunks: ScoreChunk[]): Promise<ScoreOutcome[]>;
}

/** A generator of scoring requests (chunks) that returns its result once every request is answered. */
export type Scoring<T> = Generator<ScoreChunk[], T, ScoreOutcome[]>;

/** Work done answering a scoring generator. */
export interface Scored<T> {
  result: T;
  routings: number;
  evaluations: number;
}

/** Answers a scoring generator with a scorer (worker threads, or this thread between events). */
export async function scoreWith<T>(scorer: ChunkScorer, scoring: Scoring<T>): Promise<Scored<T>> {
  let routings = 0;
  let evaluations = 0;
  let step = scoring.next([]);
  while (!step.done) {
    const outcomes = await scorer.score(step.value);
    for (const o of outcomes) {
      routings += o.routings;
      evaluations += o.evaluations;
    }
    step = scoring.next(outcomes);
  }
  return { result: step.value, routings, evaluations };
}

/** Splits items into chunks of at most `size` (fixed, whatever the number of workers). */
export function chunked(items: ScoreItem[], size: number): ScoreChunk[] {
  const out: ScoreChunk[] = [];
  for (let i = 0; i < items.length; i += size) out.push({ items: items.slice(i, i + size) });
  return out;
}
