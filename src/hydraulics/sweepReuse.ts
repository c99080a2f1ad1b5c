// A rating sweep's roots kept for the next outlet that shares its lower parts: the chamber sweep
// (ChamberSweep) and the root under a tailwater rating (outletRating.ts). Below the lowest part in
// which two outlets differ (the bottom of an opening, a crest, the rim), that part passes nothing at
// any chamber or tailwater level, so the equation solved at those stages is the same function for
// both outlets, and the sweep, started from the same state, gives the same roots. A search's fit
// moves one elevation at a time (the Jacobian's steps, the polish's single steps), so the stages
// below the lowest part it moved are taken from an earlier rating with the same context (barrel,
// tailwater, spillway) on the same grid, bit for bit, and the sweep resumes above them in the state
// a sweep from the bottom would have reached there. A memo of a pure function: the flows do not
// depend on what was rated before.

/** Ratings kept per stage grid (each two Float64Arrays of the grid's length), oldest dropped. */
export const KEPT_SWEEPS = 8;

export interface SweepColumns {
  /** What the roots depend on besides the openings and the grid (the barrel, tailwater, spillway). */
  context: string;
  /** Every part as `bottom key`, sorted by bottom, then key. */
  bottoms: number[];
  keys: string[];
  /** The root and the root search's slope after each stage (e.g. ChamberSweep's `flow`, `slope`),
   * and a flag of the sweep's state (1 or 0). */
  flows: Float64Array;
  slopes: Float64Array;
  flags: Uint8Array;
  /** Stages rated so far from the bottom (a lazy rating rates only the stages its storms reach;
   * the columns hold valid values below this index). */
  rated: number;
  /** The arrays went to a newer rating (`sweepColumns`): the sweep that filled them may not go on. */
  retired: boolean;
}

const kept = new WeakMap<Float64Array, SweepColumns[]>();

/** The parts (bottom and key) sorted by bottom, then key. */
export function sortedParts(bottoms: readonly number[], keys: readonly string[]): { bottoms: number[]; keys: string[] } {
  const order = bottoms.map((_, i) => i).sort((a, b) => bottoms[a] - bottoms[b] || (keys[a] < keys[b] ? -1 : keys[a] > keys[b] ? 1 : 0));
  return { bottoms: order.map((i) => bottoms[i]), keys: order.map((i) => keys[i]) };
}

/** The lowest bottom of a part the two sorted part lists do not share (Infinity when they are the same). */
export function lowestDifference(aBottoms: readonly number[], aKeys: readonly string[], bBottoms: readonly number[], bKeys: readonly string[]): number {
  const n = Math.min(aBottoms.length, bBottoms.length);
  let i = 0;
  while (i < n && aBottoms[i] === bBottoms[i] && aKeys[i] === bKeys[i]) i++;
  return Math.min(i < aBottoms.length ? aBottoms[i] : Infinity, i < bBottoms.length ? bBottoms[i] : Infinity);
}

/** Number of stages (from the bottom) strictly below z. */
function stagesBelow(stages: Float64Array, z: number): number {
  let lo = 0;
  let hi = stages.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (stages[mid] < z) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The kept rating on this grid and with this context that shares the most stages with the parts,
 * and the number of stages shared (0 and null when none does). */
export function sharedSweep(stages: Float64Array, context: string, bottoms: readonly number[], keys: readonly string[]): { rating: SweepColumns | null; count: number } {
  let best: SweepColumns | null = null;
  let count = 0;
  for (const rating of kept.get(stages) ?? []) {
    if (rating.context !== context) continue;
    const shared = Math.min(rating.rated, stagesBelow(stages, lowestDifference(rating.bottoms, rating.keys, bottoms, keys)));
    if (shared > count) {
      best = rating;
      count = shared;
    }
  }
  return { rating: best, count };
}

/** Columns for a new rating on the grid: the oldest kept rating's arrays when the list is full. */
export function sweepColumns(stages: Float64Array, context: string, bottoms: number[], keys: string[]): SweepColumns {
  let list = kept.get(stages);
  if (!list) {
    list = [];
    kept.set(stages, list);
  }
  const reused = list.length >= KEPT_SWEEPS ? list.pop()! : null;
  const n = stages.length;
  if (reused) {
    reused.retired = true;
    return { context, bottoms, keys, flows: reused.flows, slopes: reused.slopes, flags: reused.flags, rated: 0, retired: false };
  }
  return { context, bottoms, keys, flows: new Float64Array(n), slopes: new Float64Array(n), flags: new Uint8Array(n), rated: 0, retired: false };
}

/** Keeps a rating's columns (newest first), valid below their `rated`, which grows as the rating
 * goes on. */
export function keepSweep(stages: Float64Array, columns: SweepColumns): void {
  const list = kept.get(stages)!;
  list.unshift(columns);
}
