// The search run: plans layouts, divides them into a fixed set of parts (search/engine/partition.ts), runs
// its parts (each an adaptive search of its own: search/engine/searchPart.ts), routes every result again
// through the `route` path, merges the parts' rankings and explains. Like an optimiser's result
// object it says whether it succeeded, why it stopped and how much work it did.
//
//   plan ──> divide into parts ──> run this run's parts side by side ──> merge, rank ──> explain
//
// Determinism: the plan and the division depend only on the problem, the seed and the budget, and
// each part's work only on its own layouts; the parts' rankings are merged in the parts' order. So
// the same seed and routing budget give the same ranking whatever the number of workers; a shard
// runs a fixed share of the parts, doing exactly the work the single run does for them; and a
// resumed or gathered run replays the journals' fits into the very same schedule, fitting only what
// no journal holds. A shard's run is intermediate: it leaves to the gather what only the gathered
// ranking needs (the existing outlet's assessment, the moves that relax a binding check, the spread).
import type { SearchProblem } from "./problem.js";
import { planning, type LayoutPlan, type ScoredLayout } from "./layouts.js";
import { fitAndRoute, type FitOutcome } from "./fitJob.js";
import { layoutKey } from "./layout.js";
import { journalable, screenKey, scoreWith, type ChunkScorer, type ScoreOutcome, type Scored, type Scoring } from "./scoring.js";
import { compareCandidates, compareVerdicts, routedSpread, finalizeCandidate, markPareto, type Candidate } from "./candidate.js";
import { designOutletFile } from "./layout.js";
import { explainBriefly, explainInfeasible } from "./explain.js";
import { assessBaseline, type Baseline } from "./baseline.js";
import { InlineFitter } from "./fitter.js";
import { inShard, partition } from "./partition.js";
import { exhaustedWords, KEPT, SearchPart, type PartStop, type RunContext } from "./searchPart.js";

export { ROUND, KEPT, BAR_RANK } from "./searchPart.js";
export type { JournalEntry, Progress, RunOptions } from "./runOptions.js";
import type { RunOptions } from "./runOptions.js";

export interface SearchRun {
  success: boolean;
  stoppedBecause: string;
  /** Stopped by `interrupt` before the budget was spent. */
  interrupted: boolean;
  /** The ranking (best first), at most KEPT candidates. */
  candidates: Candidate[];
  layoutsPlanned: number;
  layoutsFitted: number;
  /** Of the fitted layouts, those whose fit came from a journal. */
  layoutsFromJournal: number;
  /** Of the routings, those replayed from a journal (fits and scored layouts) rather than done by this run. */
  routingsFromJournal: number;
  /** Layouts not fitted because they cost at least as much as their part's BAR_RANK-th compliant candidate. */
  layoutsSkipped: number;
  /** Parts the search is divided into (fixed by the problem, the plan and the budget). */
  parts: number;
  /** Of them, those this run ran (all but the other shards'). */
  partsRun: number;
  /**
   * The run's routings when the best design entered the ranking (null when nothing was ranked): well
   * below `routings`, the rest of the budget found nothing better; near it, a longer budget may.
   */
  bestFoundAfter: number | null;
  /** Designs routed through the route path (the best of them are kept in `candidates`). */
  candidatesRouted: number;
  routings: number;
  evaluations: number;
  seconds: number;
  secondsToFirstCompliant: number | null;
  routingsToFirstCompliant: number | null;
  seed: string;
  budget: number;
  timeBudget: number | null;
  beam: number;
  workers: number;
  shard: { index: number; count: number } | null;
  plan: LayoutPlan;
  /** When nothing is compliant: why, in engineering terms. */
  infeasible: string[];
  /** The case's own outlet routed and assessed (value engineering), or null (none, or a shard's run: left to the gather). */
  baseline: Baseline | null;
}

/**
 * What a shard's run leaves to the gather, which ranks every shard's designs together: the existing
 * outlet's assessment, the moves that relax each shown candidate's binding check (its explanation
 * keeps the binding check and why) and each one's spread. Only the gathered ranking needs them, and
 * each shard would route them for a ranking of its own parts alone.
 */
export const RELAX_WHEN_GATHERED = "relax: explained when gathered (outfit gather)";

/** What a shard's run left to the gather, by the names `--json` gives them (`search.leftToGather`). */
export function leftToGather(p: SearchProblem, run: SearchRun): string[] {
  if (!run.shard) return [];
  return [...(p.existing ? ["baseline"] : []), "relax", "spread"];
}

/**
 * Marks near-duplicates: a candidate whose openings (parts, counts and sizes, bottom up) repeat a
 * better-ranked one's is a variant of that row (another riser or barrel, or shifted elevations). The
 * order is not changed.
 */
export function markVariants(ranked: Candidate[]): void {
  const first = new Map<string, number>();
  ranked.forEach((c, i) => {
    // A system's openings: each pond's, pond by pond.
    const openings = (layout: typeof c.layout) => layout.levels.map((part) => part.key).join(" | ");
    const signature = c.layout.ponds ? c.layout.ponds.map(openings).join(" || ") : openings(c.layout);
    const at = first.get(signature);
    c.variantOf = at === undefined ? null : at + 1;
    if (at === undefined) first.set(signature, i);
  });
}


/** Why the run stopped, from why its parts did: one reason when they agree, else each with its count. */
function stopWords(stops: PartStop[]): { words: string; interrupted: boolean } {
  const interrupted = stops.find((s) => s.kind === "interrupted");
  if (interrupted) return { words: interrupted.words, interrupted: true };
  const limit = stops.find((s) => s.kind === "time limit");
  if (limit) return { words: limit.words, interrupted: false };
  if (stops.length > 0 && stops.every((s) => s.kind === "exhausted")) {
    const layouts = stops.reduce((sum, s) => sum + (s.layouts ?? 0), 0);
    return { words: exhaustedWords(layouts), interrupted: false };
  }
  const counts = new Map<string, number>();
  for (const s of stops) counts.set(s.words, (counts.get(s.words) ?? 0) + 1);
  if (counts.size <= 1) return { words: stops[0]?.words ?? "there was nothing to fit", interrupted: false };
  return { words: [...counts].map(([words, n]) => `${n} of ${stops.length} parts: ${words}`).join("; "), interrupted: false };
}

/** Layouts fitted while the first plan is scored, at most (see `scout` in runSearch). */
const SCOUTS = 3;
/** A layout is scouted when its staged score is at most this (the widening's "promising"). */
const SCOUT_SCORE = 0.02;

export async function runSearch(p: SearchProblem, options: RunOptions): Promise<SearchRun> {
  const started = performance.now();
  const seconds = () => (performance.now() - started) / 1000;
  const fitter = options.fitter ?? new InlineFitter(p, { seed: options.seed, starts: options.starts });
  const tally = { routings: 0, evaluations: 0, replayed: 0 };
  // Chunks a journal holds are answered from it; the rest are scored and journalled.
  const scorer: ChunkScorer = {
    async score(chunks) {
      const keys = chunks.map(screenKey);
      const out: (ScoreOutcome | undefined)[] = keys.map((key) => options.screens?.get(key));
      const missing = keys.flatMap((_, i) => (out[i] ? [] : [i]));
      const scoredNow = missing.length > 0 ? await fitter.score(missing.map((i) => chunks[i])) : [];
      missing.forEach((i, j) => {
        out[i] = scoredNow[j];
        if (journalable(scoredNow[j])) options.onScreen?.(keys[i], scoredNow[j]);
      });
      for (const [i, o] of out.entries()) if (!missing.includes(i)) tally.replayed += o!.routings;
      return out as ScoreOutcome[];
    },
  };
  const scored = async <T>(scoring: Scoring<T>): Promise<Scored<T>> => {
    const done = await scoreWith(scorer, scoring);
    tally.routings += done.routings;
    tally.evaluations += done.evaluations;
    return done;
  };
  const timed = options.timeBudget !== undefined;
  // A shard's run is intermediate: what only the gathered ranking needs is left to the gather.
  const intermediate = options.shard !== undefined;

  let firstCompliantAt: number | null = null;
  let firstCompliantRoutings: number | null = null;
  const compliantInHand = (extra: number) => {
    if (firstCompliantAt !== null) return;
    firstCompliantAt = seconds();
    firstCompliantRoutings = tally.routings + extra;
    options.onFirstCompliant?.();
  };
  // Scouting: in this thread, while the first plan is scored, the most promising layout of each
  // batch it scores is fitted at once (at most SCOUTS, until one is compliant), so a first compliant
  // design is in hand before the whole plan is. A scouted fit is the very fit its part makes later (a
  // fit is a pure function of its layout, key and starts): the part takes it then, counts and
  // journals it as its own; a scouted layout no part fits is dropped. So the ranking, the routings and
  // the journals are those of a run without scouting.
  const prefit = new Map<string, FitOutcome>();
  let scouts = 0;
  const scout = (batch: ScoredLayout[]) => {
    // Not in a shard: a batch run, whose first compliant design is a statistic, and a scouted layout
    // may be another shard's (a fit done for nothing).
    if (intermediate || fitter.workers !== 1 || firstCompliantAt !== null || scouts >= SCOUTS || options.interrupt?.()) return;
    let best: ScoredLayout | null = null;
    for (const s of batch) if (s.score <= SCOUT_SCORE && (best === null || s.score < best.score)) best = s;
    if (!best) return;
    const key = layoutKey(best.layout);
    if (prefit.has(key) || options.done?.has(key)) return;
    scouts++;
    const outcome = fitAndRoute(p, best.layout, key, { seed: options.seed, starts: options.starts });
    prefit.set(key, outcome);
    if (outcome.verdicts?.some((v) => v.compliant)) compliantInHand(outcome.routings);
  };

  // With workers, the existing outlet is routed and explained here while they score the plan; in
  // one thread it waits until the parts have run, so that it does not delay the first compliant design.
  // Not in a shard: its gather does it.
  const planScored = scored(planning(p, options.beam, undefined, scout));
  let baseline = intermediate ? null : fitter.workers !== 1 ? assessBaseline(p) : undefined;
  const first = await planScored;
  const firstPlan = first.result;
  const division = partition(p, firstPlan, timed ? null : options.budget);
  // The first plan is every part's; the rest of the budget is shared out evenly.
  const share = timed ? Infinity : Math.max(0, options.budget - first.routings) / division.count;

  const parts: SearchPart[] = [];
  const ctx: RunContext = {
    p,
    options,
    fitter,
    partition: division,
    firstPlan,
    timed,
    seconds,
    scored,
    tally,
    prefit,
    compliantInHand,
    progress: () => {
      let best: number | null = null;
      for (const part of parts) if (part.bestCost !== null && (best === null || part.bestCost < best)) best = part.bestCost;
      options.onProgress?.({
        layoutsFitted: parts.reduce((n, part) => n + part.fitted, 0),
        layoutsPlanned: parts.reduce((n, part) => n + part.planned, 0),
        routings: tally.routings,
        compliant: parts.reduce((n, part) => n + part.compliantFound, 0),
        bestCost: best,
        seconds: seconds(),
        routingsLeft: parts.reduce((n, part) => n + (part.stop ? 0 : Math.max(0, part.budget - part.routings)), 0),
      });
    },
  };
  for (let i = 0; i < division.count; i++) if (!options.shard || inShard(i, division.count, options.shard)) parts.push(new SearchPart(ctx, i, share));
  // The parts side by side: on workers their rounds share the pool; in this thread they take turns.
  await Promise.all(parts.map((part) => part.run()));
  if (baseline === undefined) baseline = assessBaseline(p);

  // The parts' rankings merged by their verdicts; the kept designs a journal replayed are routed now
  // (only they: a gather or a resumed run does not route again every design its journals hold).
  const kept = parts
    .flatMap((part) => [...part.candidates.values()])
    .sort((a, b) => compareVerdicts(a.verdict, b.verdict))
    .slice(0, KEPT);
  const ranked = kept.map((r) => r.candidate ?? finalizeCandidate(p, r.layout, r.vars, designOutletFile(p, r.layout, r.vars))).sort(compareCandidates);
  markPareto(ranked);
  markVariants(ranked);
  const shown = ranked.slice(0, options.top);
  if (intermediate) {
    // A shard's: the binding check and why; the rest is the gather's (RELAX_WHEN_GATHERED).
    for (const c of shown) c.explanation = c.assessment.binding ? [...explainBriefly(p, c), RELAX_WHEN_GATHERED] : explainBriefly(p, c);
  } else {
    // Every design shown says how it fares under the spread (ranked by robustness, each has it already).
    for (const c of shown) c.spread ??= routedSpread(p, c);
    const explanations = await fitter.explain(shown.map((c) => ({ layout: c.layout, vars: c.vars })));
    shown.forEach((c, i) => (c.explanation = explanations[i]));
  }
  const success = ranked.some((c) => c.assessment.compliant);
  const stop = stopWords(parts.map((part) => part.stop!));
  const sum = (of: (part: SearchPart) => number) => parts.reduce((n, part) => n + of(part), 0);
  return {
    success,
    stoppedBecause: stop.words,
    interrupted: stop.interrupted,
    candidates: ranked,
    layoutsPlanned: sum((part) => part.planned),
    layoutsFitted: sum((part) => part.fitted),
    layoutsFromJournal: sum((part) => part.fromJournal),
    routingsFromJournal: tally.replayed,
    layoutsSkipped: sum((part) => part.skipped),
    parts: division.count,
    partsRun: parts.length,
    bestFoundAfter: kept[0]?.foundAt ?? null,
    candidatesRouted: sum((part) => part.routedCandidates),
    routings: tally.routings,
    evaluations: tally.evaluations,
    seconds: seconds(),
    secondsToFirstCompliant: firstCompliantAt,
    routingsToFirstCompliant: firstCompliantRoutings,
    seed: options.seed,
    budget: options.budget,
    timeBudget: options.timeBudget ?? null,
    beam: Math.max(options.beam, ...parts.map((part) => part.beam)),
    workers: fitter.workers,
    shard: options.shard ?? null,
    plan: firstPlan,
    infeasible: success ? [] : explainInfeasible(p, firstPlan, ranked.slice(0, options.top)),
    baseline,
  };
}
