// A candidate: a fitted design routed again through the very path `outfit route` uses, assessed with
// warnings, costed, and ranked. The search never reports numbers from its own faster grid.
import type { Outlet } from "../src/case/model.js";
import type { OutletFile } from "../src/case/schema.js";
import { routeCase, type CaseRouting } from "../src/routing/routeCase.js";
import { assess, type Assessment } from "../src/assess/assess.js";
import { describeOutlet } from "../src/report/describe.js";
import { formatter } from "../src/format.js";
import type { SearchProblem } from "./problem.js";
import type { Layout } from "./layout.js";
import { designOutlet } from "./layout.js";
import { outletCost } from "./cost.js";

export interface Candidate {
  layout: Layout;
  /** Floating elevations (case units), on the elevation step. */
  vars: number[];
  file: OutletFile;
  outlet: Outlet;
  routing: CaseRouting;
  assessment: Assessment;
  cost: number;
  /** Largest |peak / target - 1| over the storms with targets. */
  error: number;
  description: string;
  /** On the non-dominated front of error against cost among compliant candidates. */
  pareto: boolean;
  explanation: string[];
}

export function finalizeCandidate(p: SearchProblem, layout: Layout, vars: number[], file: OutletFile): Candidate {
  const outlet = designOutlet(p, file);
  const routing = routeCase(p.case, outlet, { direct: p.options.referencePath });
  const assessment = assess(p.case, routing);
  let error = 0;
  for (const { storm, result } of routing.storms) {
    if (storm.target) error = Math.max(error, Math.abs(result.peakOutflow / storm.target - 1));
  }
  return {
    layout,
    vars,
    file,
    outlet,
    routing,
    assessment,
    cost: outletCost(outlet, p.costs),
    error,
    description: describeOutlet(outlet, formatter(p.case.units)),
    pareto: false,
    explanation: [],
  };
}

/** How far a candidate is from compliance: the sum of its checks' negative slacks. */
export function shortfall(c: Candidate): number {
  return c.assessment.checks.reduce((sum, check) => sum + Math.max(0, -check.slack), 0);
}

/** Ranking group: 0 compliant without warnings, 1 compliant with warnings, 2 not compliant. */
export function rankGroup(c: Candidate): number {
  return c.assessment.compliant ? (c.assessment.warnings.length === 0 ? 0 : 1) : 2;
}

/** Ranking: compliant without warnings, compliant with warnings, then the rest by shortfall; cost, then error. */
export function compareCandidates(a: Candidate, b: Candidate): number {
  const ga = rankGroup(a);
  const gb = rankGroup(b);
  if (ga !== gb) return ga - gb;
  if (ga === 2) return shortfall(a) - shortfall(b) || a.cost - b.cost;
  return a.cost - b.cost || a.error - b.error;
}

/** Marks the compliant candidates no other compliant one beats on both cost and error. */
export function markPareto(candidates: Candidate[]): void {
  const compliant = candidates.filter((c) => c.assessment.compliant);
  for (const c of candidates) {
    c.pareto = c.assessment.compliant && !compliant.some((o) => o !== c && o.cost <= c.cost && o.error <= c.error && (o.cost < c.cost || o.error < c.error));
  }
}
