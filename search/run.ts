// The search run: plans layouts, fits them in rounds within a budget, routes every result again
// through the `route` path, ranks and explains. Like an optimiser's result object it says whether it
// succeeded, why it stopped and how much work it did.
//
// Determinism: layouts are fitted in rounds of ROUND layouts chosen from the queue before the round
// starts; each layout's fit depends only on the layout and the seed (search/fitJob.ts) and its
// routings are counted per layout; the round's outcomes enter the ranking and the queue in the
// round's order. So the same seed and routing budget give the same ranking whatever the number of
// workers, and a resumed or gathered run replays the journal's fits into the very same schedule.
import type { SearchProblem, Layout } from "./problem.js";
import type { OutletFile } from "../src/case/schema.js";
import { closestLayouts, layoutCost, layoutScores, layoutSpace, neighbourLayouts, planning, sampleLayouts, type LayoutPlan } from "./layouts.js";
import { scoreWith } from "./scoring.js";
import seedrandom from "seedrandom";
import { createHash } from "node:crypto";
import { designOutletFile, layoutKey } from "./layout.js";
import { candidateFrom, compareCandidates, finalizeCandidate, markPareto, unpackRoute, type Candidate, type PackedRoute } from "./candidate.js";
import { explainInfeasible } from "./explain.js";
import { assessBaseline, type Baseline } from "./baseline.js";
import { InlineFitter, type FitJobRequest, type LayoutFitter } from "./pool.js";
import type { FitOutcome } from "./fitJob.js";

export interface RunOptions {
  seed: string;
  /** Most routings (one storm through one rating) the run may spend (Infinity with a time budget). */
  budget: number;
  /** A time budget in seconds: spent, widening the search while time remains (not reproducible). */
  timeBudget?: number;
  /** Safety stop in seconds (breaks reproducibility when it triggers). */
  timeLimit?: number;
  /** Candidates explained (the ranking itself does not depend on it). */
  top: number;
  /** Seeded starts of the fit per layout. */
  starts: number;
  /** Options kept per level when planning layouts; doubled each round while budget remains. */
  beam: number;
  /** Layouts already fitted (from journals): not fitted again, their outcomes replayed. */
  done?: Map<string, JournalEntry>;
  /** Called as soon as a layout is fitted (the journal), in any order. */
  onLayout?: (entry: JournalEntry) => void;
  /** Called after each round (progress). */
  onProgress?: (progress: Progress) => void;
  /** Fits the rounds' layouts (default: in this thread). */
  fitter?: LayoutFitter;
  /** Fit only this share of the layouts (shard `index` of `count`, from 1). */
  shard?: { index: number; count: number };
  /** Called once, when the first compliant design is in hand (its fit ended and it was routed). */
  onFirstCompliant?: () => void;
  /** Asked between layouts: a reason to stop now (e.g. a signal), or null. */
  interrupt?: () => string | null;
}

/** One fitted layout as the journal keeps it. */
export interface JournalEntry extends FitOutcome {
  key: string;
}

export interface Progress {
  layoutsFitted: number;
  layoutsPlanned: number;
  routings: number;
  compliant: number;
  bestCost: number | null;
  seconds: number;
}

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
  /** Layouts not fitted because they cost at least as much as the BAR_RANK-th compliant candidate. */
  layoutsSkipped: number;
  /** Layouts left to the other shards. */
  layoutsOtherShards: number;
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
  /** The case's own outlet routed and assessed (value engineering), or null. */
  baseline: Baseline | null;
}

/** Layouts per round: chosen before the round, merged in this order after it. */
export const ROUND = 8;
/** Candidates kept in the ranking. */
export const KEPT = 40;
/** A layout costing at least as much as this many compliant, unflagged candidates is skipped. */
export const BAR_RANK = 5;
const MAX_BEAM = 64;
/** Beam from which the search widens by screened random layouts instead of a wider plan. */
const SAMPLING_BEAM = 3;
/** Random layouts screened per round: one batch of scores for the workers, large enough that they
 * share it evenly (40 left them a third idle, waiting on this thread between batches). */
const SAMPLE_BATCH = 160;
/** Sampled layouts scored per chunk (a unit of work for a worker; fixed, whatever the workers). */
const SAMPLE_CHUNK = 5;
/** A sampled layout is fitted when its objective at the staged start is at most this. */
const PROMISING = 0.02;
/** Rounds of sampling in a row without anything worth fitting before the search stops (or widens). */
const MAX_SAMPLING_ROUNDS = 50;
/** Largest layout space enumerated whole, so that a time budget can prove it exhausted. */
const ENUMERABLE = 5000;
/** A time budget fits a layout found wanting again with 3, then 9 times the starts, no more. */
const MAX_STARTS_FACTOR = 9;

/**
 * Marks near-duplicates: a candidate whose openings (parts, counts and sizes, bottom up) repeat a
 * better-ranked one's is a variant of that row (another riser or barrel, or shifted elevations). The
 * order is not changed.
 */
export function markVariants(ranked: Candidate[]): void {
  const first = new Map<string, number>();
  ranked.forEach((c, i) => {
    const signature = c.layout.levels.map((part) => part.key).join(" | ");
    const at = first.get(signature);
    c.variantOf = at === undefined ? null : at + 1;
    if (at === undefined) first.set(signature, i);
  });
}

/** Whether shard `index` of `count` fits this layout: a fixed share by the hash of its key. */
export function inShard(key: string, shard: { index: number; count: number }): boolean {
  return createHash("sha1").update(key).digest().readUInt32BE(0) % shard.count === shard.index - 1;
}

export async function runSearch(p: SearchProblem, options: RunOptions): Promise<SearchRun> {
  const started = performance.now();
  const seconds = () => (performance.now() - started) / 1000;
  const fitter = options.fitter ?? new InlineFitter(p, { seed: options.seed, starts: options.starts });
  // Memory stays bounded however long the run: only the best candidates are kept (ranked), and the
  // designs already routed are remembered by a short hash of their outlet.
  const candidates = new Map<string, Candidate>();
  const seenDesigns = new Set<string>();
  let routedCandidates = 0;
  let compliantFound = 0;
  const tried = new Set<string>();
  // When the first compliant design was in hand (routed through the `route` path, as soon as its
  // layout's fit ended, not when its round was merged): a statistic only, the search never reads it.
  let firstCompliantAt: number | null = null;
  let firstCompliantRoutings: number | null = null;
  // Routings of the round's fits that have ended (counted into `routings` when it is merged).
  let roundRoutings = 0;
  let stoppedBecause = "";
  let interrupted = false;
  let fitted = 0;
  let fromJournal = 0;
  let planned = 0;
  let otherShards = 0;
  // Routings of the fits (per layout) and of the plan's and the widening's scores (per chunk),
  // wherever they ran.
  let routings = 0;
  let evaluations = 0;
  const scored = async <T>(scoring: Parameters<typeof scoreWith<T>>[1]): Promise<T> => {
    const done = await scoreWith(fitter, scoring);
    routings += done.routings;
    evaluations += done.evaluations;
    return done.result;
  };
  const timed = options.timeBudget !== undefined;

  let beam = options.beam;
  // The existing outlet is routed and explained here while the workers score the plan.
  const planScored = scored(planning(p, beam));
  const baseline = assessBaseline(p);
  let plan = await planScored;
  const firstPlan = plan;
  let bestCost: number | null = null;

  const designKey = (layout: Layout, vars: number[]) => {
    const file = designOutletFile(p, layout, vars);
    return { file, key: createHash("sha1").update(JSON.stringify(file)).digest("base64") };
  };
  /** A design routed through the `route` path: here, or taken from a worker's routing of it. */
  const routedCandidate = (layout: Layout, vars: number[], file: OutletFile, routed?: PackedRoute): Candidate =>
    routed ? candidateFrom(p, layout, vars, unpackRoute(p, routed)) : finalizeCandidate(p, layout, vars, file);
  // Designs of the round routed as soon as their fit ended, until the first compliant one is in hand;
  // taken when the round is merged (the same numbers: a pure function of the design).
  const early = new Map<string, Candidate>();
  /** Routes a design of a round early (or takes a worker's routing); whether it is compliant. */
  const routedEarly = (layout: Layout, vars: number[], routed?: PackedRoute): boolean => {
    const { file, key } = designKey(layout, vars);
    if (seenDesigns.has(key)) return false;
    let candidate = early.get(key);
    if (!candidate) {
      candidate = routedCandidate(layout, vars, file, routed);
      early.set(key, candidate);
    }
    return candidate.assessment.compliant;
  };
  const candidateOf = (layout: Layout, vars: number[]) => candidates.get(designKey(layout, vars).key);
  // `routed`: the design already routed through the `route` path on a worker (the same numbers).
  const accept = (layout: Layout, vars: number[], routed?: PackedRoute): Candidate | null => {
    const { file, key } = designKey(layout, vars);
    if (seenDesigns.has(key)) return null;
    seenDesigns.add(key);
    routedCandidates++;
    const candidate = early.get(key) ?? routedCandidate(layout, vars, file, routed);
    early.delete(key);
    candidates.set(key, candidate);
    if (candidates.size > 2 * KEPT) {
      const best = [...candidates.entries()].sort((a, b) => compareCandidates(a[1], b[1])).slice(0, KEPT);
      candidates.clear();
      for (const [k, c] of best) candidates.set(k, c);
    }
    if (candidate.assessment.compliant) {
      compliantFound++;
      if (firstCompliantAt === null) {
        firstCompliantAt = seconds();
        firstCompliantRoutings = routings;
        options.onFirstCompliant?.();
      }
      if (bestCost === null || candidate.cost < bestCost) bestCost = candidate.cost;
    }
    return candidate;
  };

  // Cost does not depend on elevations, so a layout that costs at least as much as the BAR_RANK-th
  // compliant, unflagged candidate found so far cannot improve the ranking's head: it is skipped.
  const costBar = () => {
    const costs = [...candidates.values()]
      .filter((c) => c.assessment.compliant && c.assessment.warnings.length === 0)
      .map((c) => c.cost)
      .sort((a, b) => a - b);
    // Ranked by change, a costlier layout may still be a smaller change: nothing is bounded out.
    if (p.limits.rankBy === "change") return Infinity;
    return costs.length >= BAR_RANK ? costs[BAR_RANK - 1] : Infinity;
  };
  let skipped = 0;
  let samplingRounds = 0;
  let promising = PROMISING;
  const rng = seedrandom(`${options.seed}|layouts`);
  // One queue of layouts to fit: the plan's, and the neighbours of compliant candidates. Until a
  // compliant design exists the most promising (lowest staged score) goes first; after that the
  // cheapest, so effort goes where cheaper compliant designs may be.
  // `starts`: a fit again with more starts (a time budget's widening), journalled under its own key.
  type Entry = { layout: Layout; cost: number; score: number; starts?: number };
  const entryKey = (e: Entry) => layoutKey(e.layout) + (e.starts ? ` | starts ${e.starts}` : "");
  // With a time budget: layouts fitted without a compliant design, to fit again with more starts.
  const missed: Entry[] = [];
  const queue: Entry[] = [];
  const queued = new Set<string>();
  const enqueue = (entries: Entry[]) => {
    for (const e of entries) {
      const key = entryKey(e);
      if (tried.has(key) || queued.has(key)) continue;
      queued.add(key);
      queue.push(e);
      planned++;
    }
  };
  const existingKey = p.existing && p.limits.rankBy === "change" ? layoutKey(p.existing.layout) : null;
  /** The place in `list` of the entry to fit next. */
  const pick = (list: Entry[]): number => {
    // Ranked by change, the existing layout goes first (refitting its elevations is the smallest fix).
    const own = existingKey === null ? -1 : list.findIndex((e) => layoutKey(e.layout) === existingKey);
    if (own >= 0) return own;
    let best = 0;
    // Ranked by change, the most promising layouts (the plan holds the existing one's neighbours) go first throughout.
    const byCost = compliantFound > 0 && p.limits.rankBy !== "change";
    for (let i = 1; i < list.length; i++) {
      const a = list[i];
      const b = list[best];
      if (byCost ? a.cost < b.cost || (a.cost === b.cost && a.score < b.score) : a.score < b.score || (a.score === b.score && a.cost < b.cost)) best = i;
    }
    return best;
  };
  const take = (): Entry | undefined => (queue.length === 0 ? undefined : queue.splice(pick(queue), 1)[0]);
  /** The jobs the next round would hold if nothing entered the queue meanwhile (fitted ahead by idle
   * workers; the round itself is chosen after this one is merged, so a guess costs nothing but an
   * idle worker's time). */
  const nextRound = (bar: number): FitJobRequest[] => {
    const rest = [...queue];
    const out: FitJobRequest[] = [];
    while (out.length < ROUND && rest.length > 0) {
      const entry = rest.splice(pick(rest), 1)[0];
      const key = entryKey(entry);
      if (entry.cost >= bar || (options.shard && !inShard(key, options.shard)) || options.done?.has(key)) continue;
      out.push({ key, layout: entry.layout, starts: entry.starts });
    }
    return out;
  };
  const spent = () => (timed ? seconds() >= options.timeBudget! : routings >= options.budget);
  const budgetWords = () => (timed ? `the time budget of ${options.timeBudget} s was used` : `the budget of ${options.budget} routings was used`);
  // The whole layout space when it is small enough to list: a time budget can then prove it exhausted.
  let space: Layout[] | null | undefined;
  let closestTried = false;
  /** Nothing passed the bound: queue the nearest misses once, so the closest candidates can be shown. */
  const closest = (): boolean => {
    if (candidates.size > 0 || closestTried) return false;
    closestTried = true;
    const before = planned;
    enqueue(closestLayouts(p, firstPlan, ROUND).map((l) => ({ layout: l, cost: layoutCost(p, l), score: 0 })));
    return planned > before;
  };

  /** Widens the search when the queue is dry; returns a reason to stop, or null to go on. */
  const widen = async (): Promise<string | null> => {
    if (p.fixedLayout) return "the one layout the limits allow (the existing parts, only their elevations varied) was fitted";
    if (spent()) return budgetWords();
    if (beam < MAX_BEAM && (timed || beam < SAMPLING_BEAM || compliantFound === 0)) {
      beam *= 2;
      plan = await scored(planning(p, beam));
      const before = planned;
      enqueue(plan.layouts);
      if (planned > before || timed || closest()) return null;
      return `every layout within reach was fitted or bounded out by cost (no new layout with a beam of ${beam} options per level)`;
    }
    if (!timed && beam >= MAX_BEAM && compliantFound === 0) {
      if (closest()) return null;
      return `every layout within reach was fitted or bounded out by cost (beam of ${beam} options per level)`;
    }
    const bar = costBar();
    // A time budget on a space small enough to list goes through the list instead of sampling it.
    if (timed && space === undefined) space = layoutSpace(p, firstPlan, ENUMERABLE);
    // Past a moderate beam, widen by screened random layouts cheaper than the ranking's head.
    if (!(timed && space)) {
      const drawn = sampleLayouts(p, firstPlan, rng, SAMPLE_BATCH, bar);
      const values = await scored(layoutScores(p, drawn, SAMPLE_CHUNK));
      const before = planned;
      enqueue(drawn.map((layout, i) => ({ layout, score: values[i].score, cost: values[i].cost })).filter((s) => s.score <= promising));
      samplingRounds = planned > before ? 0 : samplingRounds + 1;
      if (samplingRounds <= MAX_SAMPLING_ROUNDS) return null;
    }
    if (!timed) return `${MAX_SAMPLING_ROUNDS} rounds of random layouts found nothing more to fit`;
    // A time budget is spent: fit every layout of a small space, fit again with more starts the
    // cheapest layouts whose fit found nothing compliant, and screen with a looser threshold.
    samplingRounds = 0;
    const left = space ? space.filter((l) => !tried.has(layoutKey(l))) : [];
    enqueue(left.map((l) => ({ layout: l, cost: layoutCost(p, l), score: Infinity })));
    const again = missed.filter((e) => e.cost < bar && (e.starts ?? options.starts) < MAX_STARTS_FACTOR * options.starts);
    again.sort((a, b) => a.cost - b.cost).splice(ROUND);
    for (const e of again) missed.splice(missed.indexOf(e), 1);
    enqueue(again.map((e) => ({ ...e, starts: (e.starts ?? options.starts) * 3 })));
    if (space && left.length === 0 && again.length === 0) {
      return `the catalogue is exhausted: all ${space.length} layouts it allows were fitted (those found wanting again with up to ${MAX_STARTS_FACTOR} times the starts) or bounded out by cost`;
    }
    promising *= 4;
    return null;
  };

  enqueue(plan.layouts);
  while (true) {
    const reason = options.interrupt?.();
    if (reason) {
      stoppedBecause = reason;
      interrupted = true;
      break;
    }
    // At least one layout is fitted whatever the budget, so that something can be reported.
    if (fitted > 0 && spent()) {
      stoppedBecause = budgetWords();
      break;
    }
    if (options.timeLimit !== undefined && seconds() >= options.timeLimit) {
      stoppedBecause = `the time limit of ${options.timeLimit} s was reached`;
      break;
    }
    // The round: chosen before any of it is fitted, against the cost bar as it stands.
    const bar = costBar();
    const round: (Entry & { key: string })[] = [];
    while (round.length < ROUND) {
      const entry = take();
      if (!entry) break;
      const key = entryKey(entry);
      tried.add(key);
      if (entry.cost >= bar) skipped++;
      else if (options.shard && !inShard(key, options.shard)) otherShards++;
      else round.push({ ...entry, key });
    }
    if (round.length === 0) {
      const stop = await widen();
      if (stop) {
        stoppedBecause = stop;
        break;
      }
      continue;
    }
    const jobs = round.filter((e) => !options.done?.has(e.key));
    const outcomes = await fitter.fit(
      jobs.map((e) => ({ key: e.key, layout: e.layout, starts: e.starts })),
      (i, outcome) => {
        const { routed, ...fitted } = outcome;
        options.onLayout?.({ key: jobs[i].key, ...fitted });
        roundRoutings += outcome.routings;
        if (firstCompliantAt === null && outcome.designs.some((vars, d) => routedEarly(jobs[i].layout, vars, routed?.[d]))) {
          firstCompliantAt = seconds();
          firstCompliantRoutings = routings + roundRoutings;
          options.onFirstCompliant?.();
        }
      },
      () => options.interrupt?.() != null,
      // Guessed only for workers (in this thread nothing is idle to fit ahead).
      fitter.workers > 1 ? nextRound(bar) : [],
    );
    const byKey = new Map(jobs.map((e, i) => [e.key, outcomes[i]]));
    for (const entry of round) {
      const previous = options.done?.get(entry.key);
      const outcome = previous ?? byKey.get(entry.key);
      // Abandoned when the run was interrupted: a resumed run fits it.
      if (!outcome) continue;
      if (previous) fromJournal++;
      fitted++;
      routings += outcome.routings;
      evaluations += outcome.evaluations;
      // The neighbours of a compliant design without flags (with a time budget, of every compliant one).
      let expand = false;
      for (const [d, vars] of outcome.designs.entries()) {
        const c = accept(entry.layout, vars, outcome.routed?.[d]);
        if (c && c.assessment.compliant && (timed || c.assessment.warnings.length === 0)) expand = true;
      }
      if (timed && !outcome.designs.some((vars) => candidateOf(entry.layout, vars)?.assessment.compliant)) missed.push(entry);
      if (expand) enqueue(neighbourLayouts(p, entry.layout).map((n) => ({ layout: n, cost: layoutCost(p, n), score: entry.score })));
    }
    early.clear();
    roundRoutings = 0;
    options.onProgress?.({ layoutsFitted: fitted, layoutsPlanned: planned, routings, compliant: compliantFound, bestCost, seconds: seconds() });
  }

  const ranked = [...candidates.values()].sort(compareCandidates).slice(0, KEPT);
  markPareto(ranked);
  markVariants(ranked);
  const shown = ranked.slice(0, options.top);
  const explanations = await fitter.explain(shown.map((c) => ({ layout: c.layout, vars: c.vars })));
  shown.forEach((c, i) => (c.explanation = explanations[i]));
  const success = ranked.some((c) => c.assessment.compliant);
  return {
    success,
    stoppedBecause,
    interrupted,
    candidates: ranked,
    layoutsPlanned: planned,
    layoutsFitted: fitted,
    layoutsFromJournal: fromJournal,
    layoutsSkipped: skipped,
    layoutsOtherShards: otherShards,
    candidatesRouted: routedCandidates,
    routings,
    evaluations,
    seconds: seconds(),
    secondsToFirstCompliant: firstCompliantAt,
    routingsToFirstCompliant: firstCompliantRoutings,
    seed: options.seed,
    budget: options.budget,
    timeBudget: options.timeBudget ?? null,
    beam,
    workers: fitter.workers,
    shard: options.shard ?? null,
    plan: firstPlan,
    infeasible: success ? [] : explainInfeasible(p, firstPlan, ranked.slice(0, options.top)),
    baseline,
  };
}
