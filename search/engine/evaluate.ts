// Evaluates a design: builds its outlet, rates it on the shared grid, routes the storms and turns
// every check's slack into a residual. The fit is driven by the checks generically, so a rule added
// to the assessment later needs no change here.
import type { Outlet, Storm } from "../../src/model.js";
import { routeSystemCase, type SystemRouting } from "../../src/routing/routeSystem.js";
import { outfallRoutings, pondRoutings, systemChecks } from "../../src/assess/systemAssess.js";
import type { OutletFile } from "../../src/case/schema.js";
import { buildRatingTable, lazyRatingTable, type StageGrid } from "../../src/routing/ratingTable.js";
import { routeSearchInflow } from "../../src/routing/durations.js";
import { drainedStage, stormRouteOptions, type StormRouting } from "../../src/routing/routeCase.js";
import { evaluateChecks, type Check } from "../../src/assess/checks.js";
import { partOf } from "../../src/parts/registry.js";
import type { SearchProblem, Layout } from "./problem.js";
import { ruleOf } from "../../src/assess/rules/registry.js";
import { designFiles, designOutlet, designOutletFile, elevations, pondVariables, reachAboveLevel } from "./layout.js";

export interface Evaluation {
  vars: number[];
  /** The outlet file (a system's: the pond at the outfall's, `files` holding every pond's). */
  file: OutletFile;
  /** A system of ponds: every pond's outlet file, in the system's order. */
  files?: OutletFile[];
  outlet: Outlet;
  storms: StormRouting[];
  checks: Check[];
  residuals: number[];
  /** Sum of squared residuals. */
  objective: number;
  /** Every check passes (the full band, not the aim). */
  compliant: boolean;
  /** Geometric rules broken (ordering, openings above the rim, outside the elevation limits). */
  violations: number;
}

/** Outlets whose routings an evaluator keeps for the checks (least recently used dropped). */
const VARIANT_MEMO_SIZE = 8;

/**
 * Intervals of the links' stage axes in the search's routings of a system (routing/linkTable.ts;
 * `route` uses LINK_INTERVALS): a link whose outlet is designed is tabulated again at every
 * evaluation. Reported candidates are routed again through the `route` path.
 */
export const SEARCH_LINK_INTERVALS = 40;

/**
 * A routing kept by key in a memo of VARIANT_MEMO_SIZE, most recently used last (the variants met at
 * every evaluation stay while clogged outlets pass through), made when missing.
 */
function remembered<T>(memo: Map<string, T>, key: string, make: () => T): T {
  const known = memo.get(key);
  if (known !== undefined) {
    memo.delete(key);
    memo.set(key, known);
    return known;
  }
  const made = make();
  if (memo.size >= VARIANT_MEMO_SIZE) memo.delete(memo.keys().next().value!);
  memo.set(key, made);
  return made;
}

/** Weight of geometric violations, per pond depth of violation. */
const GEOMETRY_WEIGHT = 20;

export class Evaluator {
  /** Storms routed so far (one storm through one rating = one routing). */
  routings = 0;
  evaluations = 0;
  /** Routings of the checks' outlets (variants, clogged) by their content, most recent last. */
  private readonly variantRoutings = new Map<string, StormRouting[]>();
  private readonly drained: number;
  /** A system of ponds: each pond's evaluator (its staged starts), counting into this one. */
  private readonly pondEvaluators: (Evaluator | null)[] = [];
  /** A system of ponds: each pond's search grid, on which its outlet is rated at every evaluation. */
  private systemGrids: StageGrid[] | undefined;
  /** Routings of the systems the checks' variants ask for, by their outlets, most recent last. */
  private readonly systemVariants = new Map<string, SystemRouting>();
  constructor(
    readonly problem: SearchProblem,
    /** Whose routings these are too (a pond's evaluator within a system's). */
    private readonly parent: Evaluator | null = null,
  ) {
    this.drained = drainedStage(problem.case);
  }

  /** A system of ponds: the evaluator of pond `index` on its view of the case (its routings counted here too). */
  pond(index: number): Evaluator {
    let e = this.pondEvaluators[index];
    if (!e) {
      e = new Evaluator(this.problem.system!.ponds[index].problem, this);
      this.pondEvaluators[index] = e;
    }
    return e;
  }

  /** Adds routings to this evaluator's count (and its parent's). */
  private count(routings: number): void {
    this.routings += routings;
    this.parent?.count(routings);
  }

  /**
   * A system of ponds routed on the search's link tables; each storm through the system counts as
   * one routing per pond (it replaces that many single-pond routings).
   */
  routeSystem(outlets: readonly Outlet[]): SystemRouting {
    const c = this.problem.case;
    this.count(c.storms.length * outlets.length);
    if (this.problem.options.referencePath) return routeSystemCase(c, outlets);
    this.systemGrids ??= this.problem.system!.ponds.map((d) => d.problem.grid);
    return routeSystemCase(c, outlets, { linkIntervals: SEARCH_LINK_INTERVALS, grids: this.systemGrids });
  }

  /** A system routed for a check's variant, remembered by its outlets as `routeVariant` does. */
  private routeSystemVariant(outlets: readonly Outlet[]): SystemRouting {
    return remembered(this.systemVariants, JSON.stringify(outlets), () => this.routeSystem(outlets));
  }

  /**
   * Routes an outlet the checks ask for (a routing variant, the clogged outlet), reusing this
   * evaluator's routing of the same outlet: a variant that does not depend on the elevations (the
   * spillway alone of the blocked-outlet rule, the smallest permitted orifice through the layout's
   * barrel) is routed once per fit instead of once per evaluation. Kept per evaluator, so a job's
   * routings stay its own; the reference path routes every one.
   */
  routeVariant(outlet: Outlet): StormRouting[] {
    const p = this.problem;
    if (p.options.referencePath) return this.routeStorms(outlet, p.case.storms);
    return remembered(this.variantRoutings, JSON.stringify(outlet), () => this.routeStorms(outlet, p.case.storms));
  }

  /** Routes the given storms through an outlet on the search grid: on a lazy table (the stages the
   * storms reach; the reference path rates the whole table, directly). The table is not kept. */
  routeStorms(outlet: Outlet, storms: readonly Storm[]): StormRouting[] {
    const p = this.problem;
    const options = { grid: p.grid, direct: p.options.referencePath };
    const table = p.options.referencePath ? buildRatingTable(p.case.pond, outlet, p.case.tailwater, options) : lazyRatingTable(p.case.pond, outlet, p.case.tailwater, options);
    this.count(storms.length);
    return storms.map((storm) => ({
      storm,
      result: routeSearchInflow(table, p.inflows.get(storm) ?? storm.inflow, { drainedStage: this.drained, startStage: p.case.pond.pool, ...stormRouteOptions(storm) }),
    }));
  }

  evaluate(layout: Layout, vars: readonly number[]): Evaluation {
    const p = this.problem;
    this.evaluations++;
    if (p.system) return this.evaluateSystem(layout, vars);
    const file = designOutletFile(p, layout, vars);
    const outlet = designOutlet(p, file);
    const storms = this.routeStorms(outlet, p.case.storms);
    const checks = evaluateChecks(p.case, outlet, storms, (o) => this.routeVariant(o), p.options.referencePath);
    const residuals = checkResiduals(p, checks);
    rangeResiduals(p, outlet, storms, residuals);
    const violations = geometryResiduals(p, layout, vars, residuals);
    let objective = 0;
    for (const r of residuals) objective += r * r;
    return {
      vars: [...vars],
      file,
      outlet,
      storms,
      checks,
      residuals,
      objective,
      compliant: violations === 0 && checks.every((c) => c.passed),
      violations,
    };
  }

  /**
   * A system of ponds: every pond's outlet built, the system routed together, the system's checks (at the
   * outfall and per pond) as residuals, and each designed pond's range and geometric rules.
   */
  private evaluateSystem(layout: Layout, vars: readonly number[]): Evaluation {
    const p = this.problem;
    const ponds = p.system!.ponds;
    const files = designFiles(p, layout, vars);
    const outlets = files.map((file, i) => designOutlet(ponds[i].problem, file));
    const routing = this.routeSystem(outlets);
    const checks = systemChecks(p.case, routing, (o) => this.routeSystemVariant(o));
    const residuals = checkResiduals(p, checks);
    const split = pondVariables(p, layout, vars);
    let violations = 0;
    ponds.forEach((d, i) => {
      if (d.kind !== "designed") return;
      rangeResiduals(d.problem, outlets[i], pondRoutings(routing, i), residuals);
      violations += geometryResiduals(d.problem, layout.ponds![i], split[i], residuals);
    });
    let objective = 0;
    for (const r of residuals) objective += r * r;
    const main = p.case.system!.ponds.findIndex((q) => q.to < 0);
    return {
      vars: [...vars],
      file: files[main],
      files,
      outlet: outlets[main],
      storms: outfallRoutings(routing),
      checks,
      residuals,
      objective,
      compliant: violations === 0 && checks.every((c) => c.passed),
      violations,
    };
  }
}

/** Each check's shortfall against the slack it should keep (the aim's margin for peaks). */
export function checkResiduals(p: SearchProblem, checks: readonly Check[]): number[] {
  const residuals: number[] = [];
  for (const check of checks) {
    residuals.push(Math.max(0, requiredSlack(p, check) - check.slack));
  }
  return residuals;
}

/** Slack a check should keep: its rule's aim (the margin for peak checks, a hair for the others). */
export function requiredSlack(p: SearchProblem, check: Check): number {
  return ruleOf(check).aim(p.case, check, p.options.margin);
}

/** Weight of heads beyond a part's published range, per pond depth of excess (a preference, not a rule). */
const RANGE_WEIGHT = 1;

/**
 * Parts pushed beyond the range their formula covers, as soft residuals so that the fit prefers
 * designs the assessment will not flag: each kind's `headLimit` (a contracted rectangular weir's half
 * length, a v-notch's coefficient range: the same limits as the warnings), one residual per designed
 * part of a kind that has one.
 */
function rangeResiduals(p: SearchProblem, outlet: Outlet, storms: readonly StormRouting[], residuals: number[]): void {
  const depth = p.case.pond.top - p.case.pond.bottom;
  let maxStage = -Infinity;
  for (const s of storms) if (s.result.maxStage > maxStage) maxStage = s.result.maxStage;
  for (const e of outlet.elements) {
    if (e.keep) continue;
    const kind = partOf(e);
    const limit = kind.headLimit(e, p.case.pond.bottom);
    if (limit === null) continue;
    const head = maxStage - kind.bottom(e);
    residuals.push((RANGE_WEIGHT * Math.max(0, head - limit)) / depth);
  }
}

/** Geometric rules a design breaks (ordering, openings above the rim, elevation limits): no routing needed. */
export function geometryViolations(p: SearchProblem, layout: Layout, vars: readonly number[]): number {
  if (p.system) {
    const split = pondVariables(p, layout, vars);
    return p.system.ponds.reduce((n, d, i) => n + (d.kind === "designed" ? geometryResiduals(d.problem, layout.ponds![i], split[i], []) : 0), 0);
  }
  return geometryResiduals(p, layout, vars, []);
}

/**
 * Geometric rules as residuals: levels ordered at least the level spacing apart (`levelGapM`), openings
 * and crests the rim clearance below the rim, elevations between the floor and the top less freeboard.
 * Returns the number broken.
 */
function geometryResiduals(p: SearchProblem, layout: Layout, vars: readonly number[], residuals: number[]): number {
  const depth = p.case.pond.top - p.case.pond.bottom;
  const z = elevations(p, layout, vars);
  let broken = 0;
  const push = (excess: number) => {
    const r = Math.max(0, excess) / depth;
    residuals.push(GEOMETRY_WEIGHT * r);
    if (excess > 1e-9) broken++;
  };
  const floor = p.floor;
  const ceiling = p.ceiling;
  // Kept elements are as they are: only a pair with a designed level is the fit's to space (a pair of
  // kept ones still has its residual, always zero, so that the residuals keep their number).
  const all = [...z.levels.map((at) => ({ at, kept: false })), ...p.keptElevations.map((at) => ({ at, kept: true }))].sort((a, b) => a.at - b.at);
  for (let i = 1; i < all.length; i++) push(all[i - 1].kept && all[i].kept ? 0 : all[i - 1].at + p.levelGapM - all[i].at - 1e-9);
  z.levels.forEach((level, i) => {
    push(floor - level);
    push(level - ceiling);
    const rim = z.rim ?? (p.keptRiser ? p.converter.length(p.keptRiser.crest, "outlet.riser.crest") : null);
    if (rim !== null) {
      const part = layout.levels[i];
      const top = level + reachAboveLevel(part, p);
      push(top - rim);
    }
  });
  if (z.rim !== null) push(z.rim - p.case.pond.top);
  return broken;
}
