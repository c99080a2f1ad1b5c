// Routes every storm of a system of ponds (the case's `ponds`): the path shared by `route`, `report` and
// the checks. Each pond at the outfall is rated exactly as a single pond is (its rating table under
// the case's tailwater), each pond draining into another pond gets its link's table over both stages.
import type { Case, Hydrograph, Outlet, PondSystem, Storm } from "../model.js";
import { buildRatingTable, ratingBreaks, ratingOnsets, stageGrid, type RatingTable, type StageGrid } from "./ratingTable.js";
import { buildLinkTable, LINK_INTERVALS, type LinkTable } from "./linkTable.js";
import { stormRouteOptions } from "./routeCase.js";
import { routeSystem, type SystemRouteOptions, type SystemRouteResult, type SystemRoutePond } from "./systemRouter.js";


export interface SystemStormRouting {
  storm: Storm;
  result: SystemRouteResult;
}

export interface SystemRouting {
  system: PondSystem;
  /** Each pond's outlet as routed (the case's, or a variant's). */
  outlets: Outlet[];
  /** What the router used per pond: grids, the outfall ponds' ratings, the links' tables. */
  ponds: SystemRoutePond[];
  /** The outfall ponds' rating tables (null for a pond draining into another). */
  tables: (RatingTable | null)[];
  storms: SystemStormRouting[];
}

export interface RouteSystemOptions {
  /** Fixed time step (s); default automatic. */
  step?: number;
  record?: boolean;
  /** Intervals of the links' stage axes (linkTable.ts); default LINK_INTERVALS. */
  linkIntervals?: number;
  /**
   * A stage grid per pond to rate on instead of one made for each outlet (the search's: one grid per
   * pond on its elevation lattice, shared by every candidate, so that the rating sweeps reuse the free
   * flows and chamber roots of the parts candidates share, as for one pond).
   */
  grids?: readonly (StageGrid | undefined)[];
}

/** Link tables kept by what they depend on (the checks' variants and the report route the same links again). */
const KEPT_LINKS = 16;
const keptLinks = new Map<string, LinkTable>();

/** The table of a pond's outlet into another pond, built once per outlet and pair of ponds. */
export function linkTable(outlet: Outlet, upPond: SystemRoutePond["pond"], downPond: SystemRoutePond["pond"], intervals = LINK_INTERVALS): LinkTable {
  const key = JSON.stringify([outlet, upPond, downPond, intervals]);
  let table = keptLinks.get(key);
  if (table) keptLinks.delete(key);
  else table = buildLinkTable(outlet, upPond, downPond, intervals);
  keptLinks.set(key, table);
  if (keptLinks.size > KEPT_LINKS) keptLinks.delete(keptLinks.keys().next().value as string);
  return table;
}

/** The router's view of every pond with the given outlets (by pond index). */
export function systemPonds(c: Case, system: PondSystem, outlets: readonly Outlet[], options: RouteSystemOptions = {}): { ponds: SystemRoutePond[]; tables: (RatingTable | null)[] } {
  const drainedDepth = c.criteria.drawdownDepth;
  const tables: (RatingTable | null)[] = [];
  const ponds = system.ponds.map((p, i): SystemRoutePond => {
    const outlet = outlets[i];
    const common = { name: p.name, pond: p.pond, to: p.to, startStage: p.pond.pool, drainedStage: p.pond.pool + drainedDepth };
    const shared = options.grids?.[i];
    if (p.to < 0) {
      const table = buildRatingTable(p.pond, outlet, c.tailwater, { grid: shared });
      tables.push(table);
      return { ...common, stage: table.stage, storage: table.storage, outflow: table.outflow, link: null };
    }
    tables.push(null);
    const grid = shared ?? stageGrid(p.pond, ratingBreaks(p.pond, outlet), undefined, ratingOnsets(outlet, { kind: "free" }));
    const link = linkTable(outlet, p.pond, system.ponds[p.to].pond, options.linkIntervals);
    return { ...common, stage: grid.stage, storage: grid.storage, outflow: null, link };
  });
  return { ponds, tables };
}

/** Routes every storm of a system case through the given outlets (default: the case's own). */
export function routeSystemCase(c: Case, outlets?: readonly Outlet[], options: RouteSystemOptions = {}): SystemRouting {
  const system = c.system!;
  const used = outlets ?? system.ponds.map((p) => p.outlet);
  const { ponds, tables } = systemPonds(c, system, used, options);
  const routeOptions: SystemRouteOptions = { step: options.step, record: options.record };
  const storms = c.storms.map((storm) => ({
    storm,
    result: routeSystem(ponds, stormInflows(storm, system), { ...routeOptions, ...stormRouteOptions(storm) }),
  }));
  return { system, outlets: [...used], ponds, tables, storms };
}

/** A storm's inflow to each pond (a storm without per-pond inflows feeds the first pond at the outfall). */
export function stormInflows(storm: Storm, system: PondSystem): (Hydrograph | null)[] {
  const outfall = system.ponds.findIndex((p) => p.to < 0);
  return storm.inflows ?? system.ponds.map((_, i) => (i === outfall ? storm.inflow : null));
}

