// A storm of the modified rational method is a family of hydrographs, one per storm duration: the
// critical duration of the storage formula assumes an outflow rising linearly to the target, which no
// outlet does, so the duration that raises a given pond highest (and so its outflow: the rating
// never falls with stage) is found by routing. The durations from Tc to well past the critical one
// are routed on a geometric ladder, then the best rungs (the two highest local maxima) are refined by
// golden-section search on whole minutes; the storm's result is that of the governing duration.
import type { DurationRange, Hydrograph, Storm } from "../model.js";
import type { RatingTable } from "./ratingTable.js";
import { route, type RouteOptions, type RouteResult } from "./router.js";

/** Rungs of the ladder between the shortest and the longest duration (both included). */
export const LADDER_RUNGS = 16;
/** Durations are routed on whole minutes. */
const MINUTE = 60;
const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** Whether a routed result rises higher than another (then the larger peak outflow). */
function higher(a: RouteResult, b: RouteResult): boolean {
  return a.maxStage > b.maxStage || (a.maxStage === b.maxStage && a.peakOutflow > b.peakOutflow);
}

/** The durations (s, whole minutes) of the ladder over a range, with the critical one. */
export function ladder(range: DurationRange): number[] {
  const lo = Math.ceil(range.shortest / MINUTE);
  const hi = Math.max(lo, Math.floor(range.longest / MINUTE));
  const set = new Set<number>([lo, hi, Math.min(hi, Math.max(lo, Math.round(range.critical / MINUTE)))]);
  const ratio = Math.pow(hi / lo, 1 / (LADDER_RUNGS - 1));
  for (let i = 1; i < LADDER_RUNGS - 1; i++) set.add(Math.min(hi, Math.max(lo, Math.round(lo * Math.pow(ratio, i)))));
  return [...set].sort((a, b) => a - b).map((m) => m * MINUTE);
}

/** Routes every duration of a range (ladder, then refinement) and returns the governing one's result. */
export function routeDurationRange(table: RatingTable, range: DurationRange, options: RouteOptions): RouteResult {
  const routed = new Map<number, RouteResult>();
  const at = (minutes: number): RouteResult => {
    let r = routed.get(minutes);
    if (!r) {
      r = route(table, range.inflow(minutes * MINUTE), options);
      routed.set(minutes, r);
    }
    return r;
  };
  const rungs = ladder(range).map((d) => d / MINUTE);
  const results = rungs.map(at);
  // Local maxima of the ladder, highest first; the two highest are refined.
  const peaks: number[] = [];
  for (let i = 0; i < rungs.length; i++) {
    const left = i === 0 || !higher(results[i - 1], results[i]);
    const right = i === rungs.length - 1 || !higher(results[i + 1], results[i]);
    if (left && right) peaks.push(i);
  }
  peaks.sort((a, b) => (higher(results[a], results[b]) ? -1 : higher(results[b], results[a]) ? 1 : a - b));
  for (const i of peaks.slice(0, 2)) goldenSection(rungs[Math.max(0, i - 1)], rungs[Math.min(rungs.length - 1, i + 1)], at);
  let best = -1;
  let bestResult: RouteResult | null = null;
  for (const [minutes, r] of routed) if (bestResult === null || higher(r, bestResult) || (!higher(bestResult, r) && minutes < best)) [best, bestResult] = [minutes, r];
  return { ...bestResult!, governingDuration: best * MINUTE, durationsRouted: routed.size };
}

/** Golden-section search for the highest stage on whole minutes in [a, b]. */
function goldenSection(a: number, b: number, at: (minutes: number) => RouteResult): void {
  let lo = a;
  let hi = b;
  while (hi - lo > 2) {
    const m1 = Math.round(hi - GOLDEN * (hi - lo));
    const m2 = Math.round(lo + GOLDEN * (hi - lo));
    if (m1 >= m2) break;
    if (higher(at(m1), at(m2))) hi = m2;
    else lo = m1;
  }
  for (let m = lo; m <= hi; m++) at(m);
}

/** The inflow a routed storm's result comes from: its own, or its governing duration's. */
export function routedInflow(storm: Storm, result: RouteResult): Hydrograph {
  return storm.durations && result.governingDuration !== undefined ? storm.durations.inflow(result.governingDuration) : storm.inflow;
}

/** One storm routed: its inflow, or the range of its durations (the governing one's result). */
export function routeStorm(table: RatingTable, storm: Storm, options: RouteOptions): RouteResult {
  return storm.durations ? routeDurationRange(table, storm.durations, options) : route(table, storm.inflow, options);
}

/** Inflows of one storm the search routes: a hydrograph, or a few durations of a range (with their durations, s). */
export type SearchInflow = Hydrograph | { durations: number[]; inflows: Hydrograph[] };

/** Routes a search inflow; several durations give the governing one's result. */
export function routeSearchInflow(table: RatingTable, inflow: SearchInflow, options: RouteOptions): RouteResult {
  if (!("durations" in inflow)) return route(table, inflow, options);
  let best: RouteResult | null = null;
  let governing = 0;
  inflow.inflows.forEach((h, i) => {
    const r = route(table, h, options);
    if (best === null || higher(r, best)) [best, governing] = [r, inflow.durations[i]];
  });
  return { ...best!, governingDuration: governing, durationsRouted: inflow.inflows.length };
}
