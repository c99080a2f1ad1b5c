// One layout fitted as a self-contained job: the unit the run hands to worker threads, records in its
// journal and replays on resume. Its result depends only on the problem, the layout, the seed and the
// number of starts (the evaluator holds counters only), so it is the same in whatever thread it runs.
import { Evaluator } from "./evaluate.js";
import { fitLayout } from "./fit.js";
import type { Layout } from "./layout.js";
import type { SearchProblem } from "./problem.js";

export interface FitSettings {
  seed: string;
  /** Seeded starts of the fit per layout. */
  starts: number;
}

export interface FitOutcome {
  /** The fitted designs' variables (case units) that keep every geometric rule, best first. */
  designs: number[][];
  /** Storm routings the fit spent (counted against the budget). */
  routings: number;
  evaluations: number;
}

/** A layout as positions in the problem's option lists (-1: none), so it crosses to a worker intact. */
export interface LayoutIndex {
  levels: number[];
  riser: number;
  barrel: number;
}

export function layoutIndex(p: SearchProblem, l: Layout): LayoutIndex {
  const at = <T>(list: T[], item: T | null) => (item === null ? -1 : list.indexOf(item));
  return { levels: l.levels.map((part) => p.parts.indexOf(part)), riser: at(p.riserOptions, l.riser), barrel: at(p.barrelOptions, l.barrel) };
}

export function layoutAt(p: SearchProblem, index: LayoutIndex): Layout {
  return {
    levels: index.levels.map((i) => p.parts[i]),
    riser: index.riser < 0 ? null : p.riserOptions[index.riser],
    barrel: index.barrel < 0 ? null : p.barrelOptions[index.barrel],
  };
}

export function fitJob(p: SearchProblem, layout: Layout, key: string, settings: FitSettings): FitOutcome {
  const evaluator = new Evaluator(p);
  const result = fitLayout(p, layout, evaluator, { starts: settings.starts, iterations: 12, seed: `${settings.seed}|${key}`, firstCompliant: true });
  // A design that breaks a geometric rule (openings above the rim, levels out of order) is not proposed.
  const designs = result.designs.slice(0, 2).filter((d) => d.violations === 0).map((d) => d.vars);
  return { designs, routings: evaluator.routings, evaluations: evaluator.evaluations };
}
