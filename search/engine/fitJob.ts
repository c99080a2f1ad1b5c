// One layout fitted as a self-contained job: the unit the run hands to worker threads, records in its
// journal and replays on resume. Its result depends only on the problem, the layout, the seed and the
// number of starts (the evaluator holds counters only), so it is the same in whatever thread it runs.
import { Evaluator } from "./evaluate.js";
import { fitLayout } from "./fit.js";
import type { SearchProblem, Layout } from "./problem.js";
import { candidateFrom, finalizeCandidate, packRoute, routeDesign, verdictOf, type PackedRoute, type Verdict } from "./candidate.js";
import { designOutletFile } from "./layout.js";

export interface FitSettings {
  seed: string;
  /** Seeded starts of the fit per layout. */
  starts: number;
}

export interface FitOutcome {
  /** The fitted designs' variables (elevations in m) that keep every geometric rule, best first. */
  designs: number[][];
  /** Storm routings the fit spent (counted against the budget). */
  routings: number;
  evaluations: number;
  /**
   * The designs routed again through the `route` path, as the fit's last step (on a worker, so the
   * main thread need not): never journalled.
   */
  routed?: PackedRoute[];
  /**
   * What the ranking needs of each design (journalled, so a replayed outcome is ranked without routing
   * its designs again). Absent in a journal written before verdicts were kept: those designs are routed.
   */
  verdicts?: Verdict[];
}

/**
 * A layout as positions in the problem's option lists, so it crosses to a worker intact: -1 is none;
 * a part, riser or barrel of the existing outlet that no option list holds (value engineering) is
 * -2 - its position in the existing layout. Both threads build the same problem, so positions agree.
 */
export interface LayoutIndex {
  levels: number[];
  riser: number;
  barrel: number;
  /** A system of ponds: each pond's layout as positions in its own problem's lists. */
  ponds?: LayoutIndex[];
}

function position<T>(list: readonly T[], existing: readonly (T | null)[], item: T | null): number {
  if (item === null) return -1;
  const at = list.indexOf(item);
  if (at >= 0) return at;
  const own = existing.indexOf(item);
  if (own < 0) throw new Error("a layout part is in neither the problem's options nor the existing outlet");
  return -2 - own;
}

function item<T>(list: readonly T[], existing: readonly (T | null)[], index: number): T | null {
  return index === -1 ? null : index >= 0 ? list[index] : existing[-2 - index];
}

export function layoutIndex(p: SearchProblem, l: Layout): LayoutIndex {
  if (p.system) return { levels: [], riser: -1, barrel: -1, ponds: p.system.ponds.map((d, i) => layoutIndex(d.problem, l.ponds![i])) };
  const own = p.existing?.layout;
  return {
    levels: l.levels.map((part) => position(p.parts, own?.levels ?? [], part)),
    riser: position(p.riserOptions, own ? [own.riser] : [], l.riser),
    barrel: position(p.barrelOptions, own ? [own.barrel] : [], l.barrel),
  };
}

export function layoutAt(p: SearchProblem, index: LayoutIndex): Layout {
  if (p.system) return { levels: [], riser: null, barrel: null, ponds: p.system.ponds.map((d, i) => layoutAt(d.problem, index.ponds![i])) };
  const own = p.existing?.layout;
  return {
    levels: index.levels.map((i) => item(p.parts, own?.levels ?? [], i)!),
    riser: item(p.riserOptions, own ? [own.riser] : [], index.riser),
    barrel: item(p.barrelOptions, own ? [own.barrel] : [], index.barrel),
  };
}

export function fitJob(p: SearchProblem, layout: Layout, key: string, settings: FitSettings): FitOutcome {
  const evaluator = new Evaluator(p);
  const result = fitLayout(p, layout, evaluator, { starts: settings.starts, iterations: 12, seed: `${settings.seed}|${key}`, firstCompliant: true });
  // A design that breaks a geometric rule (openings above the rim, levels out of order) is not proposed.
  const designs = result.designs.slice(0, 2).filter((d) => d.violations === 0).map((d) => d.vars);
  return { designs, routings: evaluator.routings, evaluations: evaluator.evaluations };
}

/** A layout fitted, then its designs routed through the `route` path: what a fitter hands back. */
export function fitAndRoute(p: SearchProblem, layout: Layout, key: string, settings: FitSettings): FitOutcome {
  const outcome = fitJob(p, layout, key, settings);
  if (p.system) {
    // A system: its verdicts only (its routing's link tables do not cross as plain data); the main
    // thread routes again the designs that end in the kept ranking.
    outcome.verdicts = outcome.designs.map((vars) => verdictOf(finalizeCandidate(p, layout, vars, designOutletFile(p, layout, vars))));
    return outcome;
  }
  const routed = outcome.designs.map((vars) => routeDesign(p, designOutletFile(p, layout, vars)));
  outcome.routed = routed.map(packRoute);
  outcome.verdicts = routed.map((r, d) => verdictOf(candidateFrom(p, layout, outcome.designs[d], r)));
  return outcome;
}
