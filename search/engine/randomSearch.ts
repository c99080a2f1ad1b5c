// Plain random search, the baseline the optimiser is measured against in `npm run bench`: random
// layouts from the same catalogue, random elevations on the elevation step, each evaluated exactly as
// the optimiser evaluates, the best compliant one routed again through the route path.
import seedrandom from "seedrandom";
import type { SearchProblem, Layout } from "./problem.js";
import { Evaluator } from "./evaluate.js";
import { variableBounds, snap } from "./fit.js";
import { variableCount } from "./layout.js";
import { barrelChoices, riserChoices } from "./layouts.js";
import { compareCandidates, finalizeCandidate, type Candidate } from "./candidate.js";

export interface RandomSearchResult {
  best: Candidate | null;
  routings: number;
  evaluations: number;
  seconds: number;
  secondsToFirstCompliant: number | null;
}

export function randomSearch(p: SearchProblem, budget: number, seed: string): RandomSearchResult {
  const started = performance.now();
  const rng = seedrandom(seed);
  const pick = <T>(list: T[]): T => list[Math.floor(rng() * list.length)];
  const evaluator = new Evaluator(p);
  let best: Candidate | null = null;
  let first: number | null = null;
  const barrels = p.barrelOptions.length ? p.barrelOptions : barrelChoices(p);
  while (evaluator.routings < budget) {
    const count = 1 + Math.floor(rng() * Math.max(1, p.maxLevels));
    const levels = Array.from({ length: Math.min(count, p.maxLevels) }, () => pick(p.parts));
    const barrel = pick(barrels);
    const risers = riserChoices(p, levels, barrel);
    const layout: Layout = { levels, riser: risers.length ? pick(risers) : null, barrel };
    const { min, max } = variableBounds(p, layout);
    const n = variableCount(p, layout);
    const vars: number[] = [];
    for (let i = 0; i < n; i++) vars.push(snap(p, min[i] + rng() * (max[i] - min[i])));
    // Levels bottom up, the rim last.
    const levelCount = n - (layout.riser ? 1 : 0);
    const sorted = vars.slice(0, levelCount).sort((a, b) => a - b);
    const e = evaluator.evaluate(layout, [...sorted, ...vars.slice(levelCount)]);
    if (!e.compliant) continue;
    const candidate = finalizeCandidate(p, layout, e.vars, e.file);
    if (!candidate.assessment.compliant) continue;
    if (first === null) first = (performance.now() - started) / 1000;
    // The same preference as the optimiser's ranking: unflagged before flagged, then cost.
    if (!best || compareCandidates(candidate, best) < 0) best = candidate;
  }
  return { best, routings: evaluator.routings, evaluations: evaluator.evaluations, seconds: (performance.now() - started) / 1000, secondsToFirstCompliant: first };
}
