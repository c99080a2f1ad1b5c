// The search run: plans layouts, fits them one by one within a budget of routings, routes every
// result again through the `route` path, ranks and explains. Like an optimiser's result object it
// says whether it succeeded, why it stopped and how much work it did. The same seed and budget give
// the same ranking; a time limit is only a safety stop.
import type { SearchProblem } from "./problem.js";
import { Evaluator } from "./evaluate.js";
import { layoutCost, neighbourLayouts, planLayouts, sampleLayouts, type LayoutPlan } from "./layouts.js";
import seedrandom from "seedrandom";
import { createHash } from "node:crypto";
import { fitLayout } from "./fit.js";
import { designOutletFile, layoutKey, type Layout } from "./layout.js";
import { compareCandidates, finalizeCandidate, markPareto, rankGroup, type Candidate } from "./candidate.js";
import { explainCandidate, explainInfeasible } from "./explain.js";
import { assessBaseline, type Baseline } from "./baseline.js";

export interface RunOptions {
  seed: string;
  /** Most routings (one storm through one rating) the run may spend. */
  budget: number;
  /** Safety stop in seconds (breaks reproducibility when it triggers). */
  timeLimit?: number;
  /** Candidates explained and reported. */
  top: number;
  /** Seeded starts of the fit per layout. */
  starts: number;
  /** Options kept per level when planning layouts; doubled each round while budget remains. */
  beam: number;
  /** Layouts already fitted (from a journal): skipped, their designs given back. */
  done?: Map<string, JournalEntry>;
  /** Called after each layout is fitted (journal, progress). */
  onLayout?: (entry: JournalEntry, progress: Progress) => void;
}

export interface JournalEntry {
  key: string;
  layout: Layout;
  /** The fitted designs' variables (case units). */
  designs: number[][];
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
  candidates: Candidate[];
  layoutsPlanned: number;
  layoutsFitted: number;
  /** Layouts not fitted because they cost at least as much as the top-th compliant candidate. */
  layoutsSkipped: number;
  /** Designs routed through the route path (the best of them are kept in `candidates`). */
  candidatesRouted: number;
  routings: number;
  evaluations: number;
  seconds: number;
  secondsToFirstCompliant: number | null;
  routingsToFirstCompliant: number | null;
  seed: string;
  budget: number;
  beam: number;
  plan: LayoutPlan;
  /** When nothing is compliant: why, in engineering terms. */
  infeasible: string[];
  /** The case's own outlet routed and assessed (value engineering), or null. */
  baseline: Baseline | null;
}

const MAX_BEAM = 64;
/** Beam from which the search widens by screened random layouts instead of a wider plan. */
const SAMPLING_BEAM = 3;
/** Random layouts screened per round. */
const SAMPLE_BATCH = 40;
/** A sampled layout is fitted when its objective at the staged start is at most this. */
const PROMISING = 0.02;
/** Rounds of sampling in a row without anything worth fitting before the search stops. */
const MAX_SAMPLING_ROUNDS = 200;

/**
 * The ranking with alternatives first: among the top, a candidate whose openings (parts, counts and
 * sizes, bottom up) repeat a better one's is moved behind the distinct ones, so that the reported
 * candidates are different designs rather than one design with another riser or a shifted crest.
 */
export function distinctFirst(sorted: Candidate[], top: number): Candidate[] {
  const signature = (c: Candidate) => c.layout.levels.map((part) => part.key).join(" | ");
  const seen = new Set<string>();
  const distinct: Candidate[] = [];
  const repeats: Candidate[] = [];
  for (const c of sorted) {
    const key = signature(c);
    if (seen.has(key) || distinct.length >= top) repeats.push(c);
    else {
      seen.add(key);
      distinct.push(c);
    }
  }
  // A repeat never jumps ahead of a better-ranked group (compliant before not, unflagged before flagged).
  return [...distinct, ...repeats].sort((a, b) => rankGroup(a) - rankGroup(b));
}

export function runSearch(p: SearchProblem, options: RunOptions): SearchRun {
  const started = performance.now();
  const seconds = () => (performance.now() - started) / 1000;
  const evaluator = new Evaluator(p);
  const baseline = assessBaseline(p);
  // Memory stays bounded however long the run: only the best candidates are kept (ranked), and the
  // designs already routed are remembered by a short hash of their outlet.
  const candidates = new Map<string, Candidate>();
  const seenDesigns = new Set<string>();
  const keep = Math.max(4 * options.top, 40);
  let routedCandidates = 0;
  let compliantFound = 0;
  const tried = new Set<string>();
  let firstCompliantAt: number | null = null;
  let firstCompliantRoutings: number | null = null;
  let stoppedBecause = "";
  let fitted = 0;
  let planned = 0;

  let beam = options.beam;
  let plan = planLayouts(p, evaluator, beam);
  const firstPlan = plan;
  let bestCost: number | null = null;

  const accept = (layout: Layout, vars: number[], file: Candidate["file"]): Candidate[] => {
    const key = createHash("sha1").update(JSON.stringify(file)).digest("base64");
    if (seenDesigns.has(key)) return [];
    seenDesigns.add(key);
    routedCandidates++;
    const candidate = finalizeCandidate(p, layout, vars, file);
    candidates.set(key, candidate);
    if (candidates.size > 2 * keep) {
      const best = [...candidates.entries()].sort((a, b) => compareCandidates(a[1], b[1])).slice(0, keep);
      candidates.clear();
      for (const [k, c] of best) candidates.set(k, c);
    }
    if (candidate.assessment.compliant) {
      compliantFound++;
      if (firstCompliantAt === null) {
        firstCompliantAt = seconds();
        firstCompliantRoutings = evaluator.routings;
      }
      if (bestCost === null || candidate.cost < bestCost) bestCost = candidate.cost;
    }
    return [candidate];
  };

  // Cost does not depend on elevations, so a layout that costs at least as much as the top-th
  // compliant, unflagged candidate found so far cannot improve the ranking's head: it is skipped.
  const costBar = () => {
    const costs = [...candidates.values()]
      .filter((c) => c.assessment.compliant && c.assessment.warnings.length === 0)
      .map((c) => c.cost)
      .sort((a, b) => a - b);
    // Ranked by change, a costlier layout may still be a smaller change: nothing is bounded out.
    if (p.limits.rankBy === "change") return Infinity;
    return costs.length >= options.top ? costs[options.top - 1] : Infinity;
  };
  let skipped = 0;
  let samplingRounds = 0;
  const rng = seedrandom(`${options.seed}|layouts`);
  // One queue of layouts to fit: the plan's, and the neighbours of compliant candidates. Until a
  // compliant design exists the most promising (lowest staged score) goes first; after that the
  // cheapest, so effort goes where cheaper compliant designs may be.
  type Entry = { layout: Layout; cost: number; score: number };
  const queue: Entry[] = [];
  const queued = new Set<string>();
  const enqueue = (entries: Entry[]) => {
    for (const e of entries) {
      const key = layoutKey(e.layout);
      if (tried.has(key) || queued.has(key)) continue;
      queued.add(key);
      queue.push(e);
      planned++;
    }
  };
  const existingKey = p.existing && p.limits.rankBy === "change" ? layoutKey(p.existing.layout) : null;
  const take = (): Entry | undefined => {
    if (queue.length === 0) return undefined;
    // Ranked by change, the existing layout goes first (refitting its elevations is the smallest fix).
    const own = existingKey === null ? -1 : queue.findIndex((e) => layoutKey(e.layout) === existingKey);
    if (own >= 0) return queue.splice(own, 1)[0];
    let best = 0;
    // Ranked by change, the most promising layouts (the plan holds the existing one's neighbours) go first throughout.
    const byCost = firstCompliantAt !== null && p.limits.rankBy !== "change";
    for (let i = 1; i < queue.length; i++) {
      const a = queue[i];
      const b = queue[best];
      if (byCost ? a.cost < b.cost || (a.cost === b.cost && a.score < b.score) : a.score < b.score || (a.score === b.score && a.cost < b.cost)) best = i;
    }
    return queue.splice(best, 1)[0];
  };
  enqueue(plan.layouts);
  while (true) {
    const entry = take();
    if (!entry) {
      if (p.fixedLayout) {
        stoppedBecause = "the one layout the limits allow (the existing parts, only their elevations varied) was fitted";
        break;
      }
      if (beam >= SAMPLING_BEAM && firstCompliantAt !== null) {
        // Past a moderate beam, widen by screened random layouts cheaper than the ranking's head.
        if (evaluator.routings >= options.budget) {
          stoppedBecause = `the budget of ${options.budget} routings was used`;
          break;
        }
        const sampled = sampleLayouts(p, firstPlan, evaluator, rng, SAMPLE_BATCH, costBar());
        enqueue(sampled.filter((s) => s.score <= PROMISING));
        samplingRounds++;
        if (samplingRounds > MAX_SAMPLING_ROUNDS) {
          stoppedBecause = `${MAX_SAMPLING_ROUNDS} rounds of random layouts found nothing more to fit`;
          break;
        }
        continue;
      }
      if (beam >= MAX_BEAM) {
        stoppedBecause = `every layout within reach was fitted or bounded out by cost (beam of ${beam} options per level)`;
        break;
      }
      beam *= 2;
      plan = planLayouts(p, evaluator, beam);
      const before = planned;
      enqueue(plan.layouts);
      if (planned === before) {
        stoppedBecause = `every layout within reach was fitted or bounded out by cost (no new layout with a beam of ${beam} options per level)`;
        break;
      }
      continue;
    }
    samplingRounds = 0;
    const { layout, cost } = entry;
    const key = layoutKey(layout);
    if (cost >= costBar()) {
      tried.add(key);
      skipped++;
      continue;
    }
    // At least one layout is fitted whatever the budget, so that something can be reported.
    if (evaluator.routings >= options.budget && fitted > 0) {
      stoppedBecause = `the budget of ${options.budget} routings was used`;
      break;
    }
    if (options.timeLimit !== undefined && seconds() >= options.timeLimit) {
      stoppedBecause = `the time limit of ${options.timeLimit} s was reached`;
      break;
    }
    tried.add(key);
    let designs: number[][];
    const previous = options.done?.get(key);
    const accepted: Candidate[] = [];
    if (previous) {
      designs = previous.designs;
      for (const vars of designs) accepted.push(...accept(layout, vars, designOutletFile(p, layout, vars)));
    } else {
      const result = fitLayout(p, layout, evaluator, { starts: options.starts, iterations: 12, seed: `${options.seed}|${key}`, firstCompliant: true });
      designs = result.designs.slice(0, 2).map((d) => d.vars);
      // A design that breaks a geometric rule (openings above the rim, levels out of order) is not proposed.
      for (const d of result.designs.slice(0, 2)) if (d.violations === 0) accepted.push(...accept(layout, d.vars, d.file));
    }
    if (accepted.some((c) => c.assessment.compliant && c.assessment.warnings.length === 0)) {
      enqueue(neighbourLayouts(p, layout).map((n) => ({ layout: n, cost: layoutCost(p, n), score: entry.score })));
    }
    fitted++;
    options.onLayout?.({ key, layout, designs }, {
      layoutsFitted: fitted,
      layoutsPlanned: planned,
      routings: evaluator.routings,
      compliant: compliantFound,
      bestCost,
      seconds: seconds(),
    });
  }

  const sorted = [...candidates.values()].sort(compareCandidates);
  markPareto(sorted);
  const ranked = distinctFirst(sorted, options.top);
  const reported = ranked.slice(0, options.top);
  for (const c of reported) c.explanation = explainCandidate(p, c);
  const success = ranked.some((c) => c.assessment.compliant);
  return {
    success,
    stoppedBecause,
    candidates: ranked,
    layoutsPlanned: planned,
    layoutsFitted: fitted,
    layoutsSkipped: skipped,
    candidatesRouted: routedCandidates,
    routings: evaluator.routings,
    evaluations: evaluator.evaluations,
    seconds: seconds(),
    secondsToFirstCompliant: firstCompliantAt,
    routingsToFirstCompliant: firstCompliantRoutings,
    seed: options.seed,
    budget: options.budget,
    beam,
    plan: firstPlan,
    infeasible: success ? [] : explainInfeasible(p, firstPlan, reported),
    baseline,
  };
}
