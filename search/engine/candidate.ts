// A candidate: a fitted design routed again through the very path `outfit route` uses, assessed with
// warnings, costed, and ranked. The search never reports numbers from its own faster grid.
import type { Outlet } from "../../src/model.js";
import type { OutletFile } from "../../src/case/schema.js";
import { routeCase, type CaseRouting } from "../../src/routing/routeCase.js";
import type { RatingTable } from "../../src/routing/ratingTable.js";
import type { RouteResult } from "../../src/routing/router.js";
import { assess, type Assessment } from "../../src/assess/assess.js";
import { describeOutlet } from "../../src/report/describe.js";
import { formatter } from "../../src/format.js";
import type { SearchProblem, Layout } from "./problem.js";
import { designFiles, designOutlet } from "./layout.js";
import { routeSystemCase, type SystemRouting } from "../../src/routing/routeSystem.js";
import { assessSystem, outfallRoutings } from "../../src/assess/systemAssess.js";
import { outletCost } from "./cost.js";
import { changeList, type ChangeList } from "./changes.js";
import { spreadOf, systemSpreadOf, type Spread } from "../../src/assess/spread.js";

/** An outlet routed through the `route` path, assessed and costed (a candidate, or the existing outlet). */
export interface RoutedOutlet {
  file: OutletFile;
  outlet: Outlet;
  routing: CaseRouting;
  assessment: Assessment;
  cost: number;
  /** Largest |peak / target - 1| over the storms with targets. */
  error: number;
  description: string;
  /**
   * The design routed under the spread (more inflow, clogged openings, a higher tailwater) and its
   * reserve under each: for every compliant design when ranking by robustness, else for those shown.
   */
  spread: Spread | null;
  /**
   * A system of ponds: every pond's outlet file and outlet, and the system routed together through the
   * `route` path; the fields above then stand for the pond at the outfall (its outlet; the flow
   * reaching the outfall as its routing), and `assessment` and `cost` are the system's.
   */
  system?: { files: OutletFile[]; outlets: Outlet[]; routing: SystemRouting };
}

export interface Candidate extends RoutedOutlet {
  layout: Layout;
  /** Floating elevations (m), on the elevation step's lattice. */
  vars: number[];
  /** Part by part against the existing outlet, when the case has one (value engineering). */
  changes: ChangeList | null;
  /** Rank by the change measure before cost (the fixes of an existing outlet, smallest first). */
  rankByChange: boolean;
  /** On the non-dominated front of error against cost among compliant candidates. */
  pareto: boolean;
  /** Rank (from 1) of the better candidate whose openings this one repeats, or null. */
  variantOf: number | null;
  explanation: string[];
}

export function finalizeCandidate(p: SearchProblem, layout: Layout, vars: number[], file: OutletFile): Candidate {
  if (p.system) {
    const files = designFiles(p, layout, vars);
    return candidateFrom(p, layout, vars, routeSystemOutlets(p, files, files.map((f, i) => designOutlet(p.system!.ponds[i].problem, f))));
  }
  return candidateFrom(p, layout, vars, routeDesign(p, file));
}

/**
 * A system of ponds with these outlets routed together through the `route` path, assessed (checks at
 * the outfall and per pond), costed (every pond's designed parts) and described pond by pond.
 */
export function routeSystemOutlets(p: SearchProblem, files: OutletFile[], outlets: Outlet[]): RoutedOutlet {
  const c = p.case;
  const system = c.system!;
  const routing = routeSystemCase(c, outlets);
  const assessment = assessSystem(c, routing);
  const main = system.ponds.findIndex((q) => q.to < 0);
  const storms = outfallRoutings(routing);
  let error = 0;
  for (const { storm, result } of storms) {
    if (storm.target) error = Math.max(error, Math.abs(result.peakAtPoint / storm.target - 1));
  }
  const f = formatter(c.units);
  return {
    file: files[main],
    outlet: outlets[main],
    routing: { outlet: outlets[main], table: routing.tables[main]!, storms },
    assessment,
    cost: outlets.reduce((sum, o) => sum + outletCost(o, p.costs, c.criteria.buildability.levelSpacing), 0),
    error,
    description: system.ponds.map((q, i) => `${q.name}: ${describeOutlet(outlets[i], f)}`).join("; "),
    // Ranking by robustness needs the spread of every compliant design.
    spread: p.limits.rankBy === "robust" && assessment.compliant ? systemSpreadOf(c, outlets) : null,
    system: { files, outlets, routing },
  };
}

/** A design's outlet file routed through the `route` path, assessed and costed. */
export function routeDesign(p: SearchProblem, file: OutletFile): RoutedOutlet {
  return routeOutlet(p, file, designOutlet(p, file));
}

/** A candidate from its design and its routing through the `route` path (here or on a worker). */
export function candidateFrom(p: SearchProblem, layout: Layout, vars: number[], routed: RoutedOutlet): Candidate {
  return {
    ...routed,
    layout,
    vars,
    changes: p.existing ? (p.system ? systemChanges(p, routed) : changeList(p, p.existing.outlet, routed.outlet)) : null,
    rankByChange: p.limits.rankBy === "change" && p.existing !== null,
    pareto: false,
    variantOf: null,
    explanation: [],
  };
}

/** The design routed under the spread (on the route path's rating, as the candidate itself). */
export function designSpread(p: SearchProblem, outlet: Outlet): Spread {
  return spreadOf(p.case, outlet, { direct: p.options.referencePath });
}

/** A routed design's spread: a system's, its ponds routed together under each departure; else its outlet's. */
export function routedSpread(p: SearchProblem, routed: RoutedOutlet): Spread {
  return routed.system ? systemSpreadOf(p.case, routed.system.outlets) : designSpread(p, routed.outlet);
}

/** A system's changes against the system as given, pond by pond (each named with its pond), one measure. */
function systemChanges(p: SearchProblem, routed: RoutedOutlet): ChangeList {
  const system = p.case.system!;
  const lists = p.system!.ponds.map((d, i) => changeList(d.problem, system.ponds[i].outlet, routed.system!.outlets[i]));
  return {
    changes: lists.flatMap((list, i) => list.changes.map((change) => ({ ...change, part: `${system.ponds[i].name}: ${change.part}`, text: `${system.ponds[i].name}: ${change.text}` }))),
    score: lists.reduce((sum, list) => sum + list.score, 0),
  };
}

/**
 * A routed outlet as it crosses from a worker thread: plain data, without the outlet (rebuilt from
 * its file) and the storms (the case's own, by position).
 */
export interface PackedRoute {
  file: OutletFile;
  table: RatingTable;
  results: RouteResult[];
  assessment: Assessment;
  cost: number;
  error: number;
  description: string;
  spread: Spread | null;
}

export function packRoute(r: RoutedOutlet): PackedRoute {
  return { file: r.file, table: r.routing.table, results: r.routing.storms.map((s) => s.result), assessment: r.assessment, cost: r.cost, error: r.error, description: r.description, spread: r.spread };
}

/** The routed outlet again, on this thread's problem (the same case as the worker's). */
export function unpackRoute(p: SearchProblem, packed: PackedRoute): RoutedOutlet {
  const outlet = designOutlet(p, packed.file);
  const storms = p.case.storms.map((storm, i) => ({ storm, result: packed.results[i] }));
  const { table, results: _results, ...rest } = packed;
  return { ...rest, outlet, routing: { outlet, table, storms } };
}

/** Routes an outlet through the `route` path, assesses and costs it. */
export function routeOutlet(p: SearchProblem, file: OutletFile, outlet: Outlet): RoutedOutlet {
  const routing = routeCase(p.case, outlet, { direct: p.options.referencePath });
  const assessment = assess(p.case, routing, p.options.referencePath);
  let error = 0;
  for (const { storm, result } of routing.storms) {
    if (storm.target) error = Math.max(error, Math.abs(result.peakAtPoint / storm.target - 1));
  }
  return {
    file,
    outlet,
    routing,
    assessment,
    cost: outletCost(outlet, p.costs, p.case.criteria.buildability.levelSpacing),
    error,
    description: describeOutlet(outlet, formatter(p.case.units)),
    // Ranking by robustness needs the spread of every compliant design (routed where it was fitted).
    spread: p.limits.rankBy === "robust" && assessment.compliant ? designSpread(p, outlet) : null,
  };
}

/** How far a candidate is from compliance: the sum of its checks' negative slacks. */
export function shortfall(c: RoutedOutlet): number {
  return c.assessment.checks.reduce((sum, check) => sum + Math.max(0, -check.slack), 0);
}

/**
 * What the ranking needs of a routed design, and no more: plain numbers, so a shard's journal can
 * carry them and a gather or a resumed run ranks the designs it replays without routing them again
 * (only the designs that end in the kept ranking are routed, for their report).
 */
export interface Verdict {
  compliant: boolean;
  /** Warnings of the assessment (a compliant design with warnings ranks after those without). */
  warnings: number;
  /** Sum of the checks' negative slacks (ranks the designs that are not compliant). */
  shortfall: number;
  cost: number;
  error: number;
  /** The change measure against the existing outlet, when fixes are ranked by it; else null. */
  change: number | null;
  /**
   * Ranking by robustness, a compliant design's least reserve over the spread (m, to the millimetre, so
   * that cost decides between designs whose reserves differ by less); else null.
   */
  reserve: number | null;
}

export function verdictOf(c: Candidate): Verdict {
  return {
    compliant: c.assessment.compliant,
    warnings: c.assessment.warnings.length,
    shortfall: shortfall(c),
    cost: c.cost,
    error: c.error,
    change: c.rankByChange && c.changes ? c.changes.score : null,
    reserve: c.spread && c.assessment.compliant ? Math.round(c.spread.reserve * 1000) / 1000 : null,
  };
}

/** A verdict as read back from a journal, or null when the value is not one. */
export function readVerdict(value: unknown): Verdict | null {
  if (typeof value !== "object" || value === null) return null;
  const v = value as Record<string, unknown>;
  const finite = (x: unknown): x is number => typeof x === "number" && Number.isFinite(x);
  if (typeof v.compliant !== "boolean" || !Number.isInteger(v.warnings) || !finite(v.shortfall) || !finite(v.cost) || !finite(v.error)) return null;
  if (v.change !== null && !finite(v.change)) return null;
  const reserve = v.reserve ?? null;
  if (reserve !== null && !finite(reserve)) return null;
  return { compliant: v.compliant, warnings: v.warnings as number, shortfall: v.shortfall, cost: v.cost, error: v.error, change: v.change as number | null, reserve };
}

/** Ranking group: 0 compliant without warnings, 1 compliant with warnings, 2 not compliant. */
function rankGroup(v: Verdict): number {
  return v.compliant ? (v.warnings === 0 ? 0 : 1) : 2;
}

/**
 * Ranking: compliant without warnings, compliant with warnings, then the rest by shortfall; cost, then
 * error (or, ranking fixes of an existing outlet, the change measure first; ranking by robustness, the
 * largest least reserve over the spread first).
 */
export function compareVerdicts(a: Verdict, b: Verdict): number {
  const ga = rankGroup(a);
  const gb = rankGroup(b);
  if (ga !== gb) return ga - gb;
  if (ga === 2) return a.shortfall - b.shortfall || a.cost - b.cost;
  if (a.change !== null && b.change !== null) return a.change - b.change || a.cost - b.cost || a.error - b.error;
  if (a.reserve !== null && b.reserve !== null) return b.reserve - a.reserve || a.cost - b.cost || a.error - b.error;
  return a.cost - b.cost || a.error - b.error;
}

export function compareCandidates(a: Candidate, b: Candidate): number {
  return compareVerdicts(verdictOf(a), verdictOf(b));
}

/** Marks the compliant candidates no other compliant one beats on both cost and error. */
export function markPareto(candidates: Candidate[]): void {
  const compliant = candidates.filter((c) => c.assessment.compliant);
  for (const c of candidates) {
    c.pareto = c.assessment.compliant && !compliant.some((o) => o !== c && o.cost <= c.cost && o.error <= c.error && (o.cost < c.cost || o.error < c.error));
  }
}
