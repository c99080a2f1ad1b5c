// Routes every storm of a case through one outlet: the path shared by `route`, `design` and `report`.
import type { Case, Outlet, Storm } from "../model.js";
import { buildRatingTable, type RatingTable, type StageGrid } from "./ratingTable.js";
import type { RouteOptions, RouteResult } from "./router.js";
import { routeStorm } from "./durations.js";

export interface StormRouting {
  storm: Storm;
  result: RouteResult;
}

export interface CaseRouting {
  outlet: Outlet;
  table: RatingTable;
  storms: StormRouting[];
}

export interface RouteCaseOptions {
  /** Fixed time step (s); default automatic. */
  step?: number;
  /** Rating grid step (m); default pond depth / 800. */
  gridStep?: number;
  grid?: StageGrid;
  record?: boolean;
  /** Rate by the direct evaluation at every stage (see RatingOptions.direct). */
  direct?: boolean;
}

export function drainedStage(c: Case): number {
  return c.pond.pool + c.criteria.drawdownDepth;
}

/**
 * What a storm adds to every routing of it, wherever it is routed (`route`, the search, the checks'
 * variants): the ceiling of a below-pre-hydrograph limit, the bypass joining at the point of analysis,
 * and the runoff at further points the pond's outflow reaches.
 */
export function stormRouteOptions(storm: Storm): Pick<RouteOptions, "ceiling" | "bypass" | "downstream"> {
  const joined = storm.points?.filter((p) => p.pond) ?? [];
  return {
    ceiling: storm.ceiling?.hydrograph,
    bypass: storm.bypass ?? undefined,
    downstream: joined.length > 0 ? joined.map((p) => p.bypass ?? NO_FLOW) : undefined,
  };
}

/** A hydrograph of no flow (a further point the pond's outflow alone reaches). */
const NO_FLOW = { times: Float64Array.of(0, 1), flows: Float64Array.of(0, 0) };

export function routeCase(c: Case, outlet: Outlet, options: RouteCaseOptions = {}): CaseRouting {
  const table = buildRatingTable(c.pond, outlet, c.tailwater, { step: options.gridStep, grid: options.grid, direct: options.direct });
  return routeTable(c, outlet, table, options);
}

/** Routes every storm through an already built rating table. */
export function routeTable(c: Case, outlet: Outlet, table: RatingTable, options: RouteCaseOptions = {}): CaseRouting {
  const drained = drainedStage(c);
  const storms = c.storms.map((storm) => ({
    storm,
    result: routeStorm(table, storm, {
      step: options.step,
      drainedStage: drained,
      startStage: c.pond.pool,
      record: options.record,
      ...stormRouteOptions(storm),
    }),
  }));
  return { outlet, table, storms };
}
