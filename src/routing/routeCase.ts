// Routes every storm of a case through one outlet: the path shared by `route`, `design` and `report`.
import type { Case, Outlet, Storm } from "../model.js";
import { buildRatingTable, type RatingTable, type StageGrid } from "./ratingTable.js";
import type { RouteResult } from "./router.js";
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
      ceiling: storm.ceiling?.hydrograph,
    }),
  }));
  return { outlet, table, storms };
}
