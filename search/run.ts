// The search run: plans layouts, fits them one by one within a budget of routings, routes every
// result again through the `route` path, ranks and explains. Like an optimiser's result object it
// says whether it succeeded, why it stopped and how much work it did. The same seed and budget give
// the same ranking; a time limit is only a safety stop.
import type { SearchProblem } from "./problem.js";
import { Evaluator } from "./evaluate.js";
import { planLayouts, type LayoutPlan } from "./layouts.js";
import { fitLayout } from "./fit.js";
import { designOutletFile, layoutKey, type Layout } from "./layout.js";
import { compareCandidates, finalizeCandidate, markPareto, type Candidate } from "./candidate.js";
import { explainCandidate, explainInfeasible } from "./explain.js";

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
}

const MAX_BEAM = 64;

export function runSearch(p: SearchProblem, options: RunOptions): SearchRun {
  const started = performance.now();
  const seconds = () => (performance.now() - started) / 1000;
  const evaluator = new Evaluator(p);
  const candidates = new Map<string, Candidate>();
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

  const accept = (layout: Layout, vars: number[], file: Candidate["file"]) => {
    const key = JSON.stringify(file);
    if (candidates.has(key)) return;
    const candidate = finalizeCandidate(p, layout, vars, file);
    candidates.set(key, candidate);
    if (candidate.assessment.compliant) {
      if (firstCompliantAt === null) {
        firstCompliantAt = seconds();
        firstCompliantRoutings = evaluator.routings;
      }
      if (bestCost === null || candidate.cost < bestCost) bestCost = candidate.cost;
    }
  };

  outer: while (true) {
    const fresh = plan.layouts.filter((s) => !tried.has(layoutKey(s.layout)));
    planned += fresh.length;
    for (const { layout } of fresh) {
      if (evaluator.routings >= options.budget) {
        stoppedBecause = `the budget of ${options.budget} routings was used`;
        break outer;
      }
      if (options.timeLimit !== undefined && seconds() >= options.timeLimit) {
        stoppedBecause = `the time limit of ${options.timeLimit} s was reached`;
        break outer;
      }
      const key = layoutKey(layout);
      tried.add(key);
      let designs: number[][];
      const previous = options.done?.get(key);
      if (previous) designs = previous.designs;
      else {
        const result = fitLayout(p, layout, evaluator, { starts: options.starts, iterations: 12, seed: `${options.seed}|${key}`, firstCompliant: true });
        designs = result.designs.slice(0, 2).map((d) => d.vars);
        // A design that breaks a geometric rule (openings above the rim, levels out of order) is not proposed.
        for (const d of result.designs.slice(0, 2)) if (d.violations === 0) accept(layout, d.vars, d.file);
      }
      if (previous) {
        for (const vars of designs) accept(layout, vars, designOutletFile(p, layout, vars));
      }
      fitted++;
      options.onLayout?.({ key, layout, designs }, {
        layoutsFitted: fitted,
        layoutsPlanned: planned,
        routings: evaluator.routings,
        compliant: [...candidates.values()].filter((c) => c.assessment.compliant).length,
        bestCost,
        seconds: seconds(),
      });
    }
    if (beam >= MAX_BEAM) {
      stoppedBecause = `every layout within reach was fitted (beam of ${beam} options per level)`;
      break;
    }
    beam *= 2;
    plan = planLayouts(p, evaluator, beam);
    if (plan.layouts.every((s) => tried.has(layoutKey(s.layout)))) {
      stoppedBecause = `every layout within reach was fitted (no new layout with a beam of ${beam} options per level)`;
      break;
    }
  }

  const ranked = [...candidates.values()].sort(compareCandidates);
  markPareto(ranked);
  const reported = ranked.slice(0, options.top);
  for (const c of reported) c.explanation = explainCandidate(p, c);
  const success = ranked.some((c) => c.assessment.compliant);
  return {
    success,
    stoppedBecause,
    candidates: ranked,
    layoutsPlanned: planned,
    layoutsFitted: fitted,
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
  };
}
