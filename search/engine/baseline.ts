// The baseline of value engineering: the case's own outlet, routed through the `route` path,
// assessed, costed and explained like a candidate, and what each alternative saves against it.
import type { SearchProblem } from "./problem.js";
import { routeOutlet, routeSystemOutlets, type Candidate, type RoutedOutlet } from "./candidate.js";
import { explainExisting } from "./explain.js";
import { complianceWords } from "../../src/report/console.js";

export interface Baseline extends RoutedOutlet {
  explanation: string[];
}

/** Routes and assesses the existing outlet (null when the case has none). */
export function assessBaseline(p: SearchProblem): Baseline | null {
  if (!p.existing) return null;
  // A system: every pond's outlet as the case gives it, routed together.
  const routed = p.system
    ? routeSystemOutlets(p, p.system.ponds.map((d) => d.problem.file.outlet ?? {}), p.case.system!.ponds.map((q) => q.outlet))
    : routeOutlet(p, p.existing.file, p.existing.outlet);
  return { ...routed, explanation: explainExisting(p, routed) };
}

export interface Saving {
  /** Baseline cost less the alternative's (cost proxy units; positive: the alternative is cheaper). */
  cost: number;
  /** The same as a fraction of the baseline's cost (null when the baseline costs nothing). */
  fraction: number | null;
}

export function saving(baseline: RoutedOutlet, c: RoutedOutlet): Saving {
  const cost = baseline.cost - c.cost;
  return { cost, fraction: baseline.cost > 0 ? cost / baseline.cost : null };
}

/**
 * What the run found against the existing outlet, in words: on a compliant baseline, the cheapest
 * compliant alternative's saving or that none cheaper was found; on a failing one, the fixes.
 */
export function baselineVerdict(baseline: Baseline, candidates: readonly Candidate[], stoppedBecause: string): string {
  const compliant = candidates.filter((c) => c.assessment.compliant);
  // "The existing outlet is compliant, 2 warnings; ...": its warnings beside the word.
  const is = `The existing ${baseline.system ? "system" : "outlet"} is ${complianceWords(baseline.assessment)}`;
  if (!baseline.assessment.compliant) {
    if (compliant.length === 0) return `${is}, and the search found no compliant fix in the catalogue (it stopped because ${stoppedBecause}).`;
    const smallest = [...compliant].sort((a, b) => (a.changes?.score ?? 0) - (b.changes?.score ?? 0) || a.cost - b.cost)[0];
    return `${is}; ${compliant.length} compliant fix${compliant.length > 1 ? "es were" : " was"} found, the smallest change with ${smallest.changes?.changes.length ?? 0} part change${smallest.changes?.changes.length === 1 ? "" : "s"} (${describeSaving(saving(baseline, smallest))}).`;
  }
  const cheaper = compliant.filter((c) => c.cost < baseline.cost - 1e-9).sort((a, b) => a.cost - b.cost);
  if (cheaper.length === 0) {
    return `${is}, and the catalogue holds no compliant outlet cheaper than it (cost ${baseline.cost.toFixed(1)} units) among the layouts the search reached (it stopped because ${stoppedBecause}).`;
  }
  return `${is}; ${cheaper.length} compliant alternative${cheaper.length > 1 ? "s are" : " is"} cheaper, the cheapest ${describeSaving(saving(baseline, cheaper[0]))}.`;
}

/** "saves 2.4 units (12.0 %)" or "costs 1.1 units more (5.0 %)". */
export function describeSaving(s: Saving): string {
  const percent = s.fraction === null ? "" : ` (${(100 * Math.abs(s.fraction)).toFixed(1)} %)`;
  if (Math.abs(s.cost) < 0.05) return "costs the same";
  return s.cost > 0 ? `saves ${s.cost.toFixed(1)} units${percent}` : `costs ${(-s.cost).toFixed(1)} units more${percent}`;
}
