// A routed system of ponds judged against the case. Targets and the other rules on the flow that
// leaves the system (peaks, the pre-development hydrograph) apply at the outfall, to the ponds' flows
// reaching it together; every other rule (freeboard, spillway dry, drawdown, overtopping, blocked
// outlet, extended detention, minimum opening) applies to each pond with its own outlet, as to a single
// pond, and so do the peak rules where the case gives a pond its own target (`storms[].pondTargets`).
// A pond's checks are named with the pond; a routing variant of a rule (the principal outlet blocked,
// the smallest permitted opening, clogging) changes that pond's outlet and routes the whole system
// again. Clogging at the outfall clogs every pond's openings at once.
import type { Case, Hydrograph, Outlet, PondSystem, Storm } from "../model.js";
import type { CaseRouting, StormRouting } from "../routing/routeCase.js";
import { routeSystemCase, type SystemRouting } from "../routing/routeSystem.js";
import type { RatingTable } from "../routing/ratingTable.js";
import { RULES } from "./rules/registry.js";
import type { Check, Rule } from "./rules/rule.js";
import { bindingCheck, evaluateChecks } from "./checks.js";
import { cloggedOutlet } from "./rules/clogging.js";
import { outletWarnings, type Warning } from "./warnings.js";
import { implausibleInputWarnings } from "./plausibility.js";
import type { Assessment, OutletWall } from "./assess.js";
import { casePlan } from "./rules/walls.js";

/** Rules on the flow leaving the system: flow checks on the design routing alone (the storm's peaks, the pre-development hydrograph); as-built rules judge each pond's own outlet. */
export const OUTFALL_RULES: readonly Rule[] = RULES.filter((r) => r.quantity === "flow" && !r.asBuilt && r.routings.every((v) => v === "design"));

/** A pond's own inflow, or none. */
const NO_INFLOW: Hydrograph = { times: Float64Array.from([0, 60]), flows: new Float64Array(2) };

/** A storm as one pond sees it: its own inflow, its own target (if the case gives one), no outfall rules. */
export function pondStorm(storm: Storm, index: number): Storm {
  return stormOfPond(storm, storm.inflows?.[index] ?? NO_INFLOW, storm.pondTargets?.[index] ?? null, "pond target", null);
}

/** A storm of one pond: its name and return period, the inflow, a plain target (or none) stated so, a bypass. */
export function stormOfPond(storm: Storm, inflow: Hydrograph, target: number | null, statement: string, bypass: Hydrograph | null): Storm {
  const limit = target === null ? null : { form: "target" as const, flow: target, statement, label: null };
  return {
    name: storm.name,
    returnPeriod: storm.returnPeriod,
    target,
    releaseLimits: limit ? [limit] : [],
    governingLimit: limit,
    inflow,
    ceiling: null,
    bypass,
    points: [],
  };
}

/**
 * The case as one pond of the system sees it: its pond, its outlet, its storms. A pond draining into
 * another has that pond's permanent pool (or floor) as its tailwater here, for the rules that rate the
 * outlet themselves (extended detention's drain) and the barrel's notes: the level the downstream pond
 * returns to.
 */
export function pondCase(c: Case, system: PondSystem, index: number): Case {
  const p = system.ponds[index];
  const { system: _system, ...rest } = c;
  return {
    ...rest,
    pond: p.pond,
    outlet: p.outlet,
    tailwater: p.to < 0 ? c.tailwater : { kind: "elevation", elevation: system.ponds[p.to].pond.pool },
    storms: c.storms.map((s) => pondStorm(s, index)),
    // The plausibility of the pond's own sizes, under the single pond's path (re-rooted when reported).
    sizeWarnings: (c.sizeWarnings ?? []).filter((w) => w.part.startsWith(`ponds[${index}].outlet`)).map((w) => ({ ...w, part: w.part.slice(`ponds[${index}].`.length) })),
  };
}

/** A pond's routed storms, as a single pond's. */
export function pondRoutings(routing: SystemRouting, index: number): StormRouting[] {
  return routing.storms.map((s) => ({ storm: pondStorm(s.storm, index), result: s.result.ponds[index] }));
}

/** The flow reaching the outfall as a single pond's routing (stages: the first pond at the outfall's). */
export function outfallRoutings(routing: SystemRouting): StormRouting[] {
  const main = routing.system.ponds.findIndex((p) => p.to < 0);
  return routing.storms.map(({ storm, result }) => ({
    storm,
    result: {
      ...result.ponds[main],
      peakInflow: result.peakInflow,
      peakOutflow: result.peakOutflow,
      timeOfPeakOutflow: result.timeOfPeakOutflow,
      peakAtPoint: result.peakAtPoint,
      timeOfPeakAtPoint: result.timeOfPeakAtPoint,
      bypassAtPeak: result.bypassAtPeak,
      downstream: result.downstream,
      volumeIn: result.volumeIn,
      volumeOut: result.volumeOut,
      storageChange: result.storageChange,
      massBalanceError: result.massBalanceError,
      ceiling: result.ceiling,
    },
  }));
}

/** A pond's routing in the single pond's form (its table: the rating at the outfall, the storage grid of a link). */
export function pondCaseRouting(routing: SystemRouting, index: number): CaseRouting {
  const p = routing.ponds[index];
  const table: RatingTable = routing.tables[index] ?? { stage: p.stage, storage: p.storage, outflow: new Float64Array(p.stage.length), heldNodes: 0 };
  return { outlet: routing.outlets[index], table, storms: pondRoutings(routing, index) };
}

/** A check of pond `name` (or "outfall"): its name and key carry the pond. */
function named(check: Check, name: string): Check {
  return { ...check, key: `${check.key}@${name}`, name: `${name}: ${check.name}`, pond: name };
}

/** Routes the system with the given outlets (the checks' variants): by default through the `route` path. */
export type SystemRouter = (outlets: readonly Outlet[]) => SystemRouting;

/**
 * Every check of a routed system: at the outfall and per pond (see the file's head). `route` routes
 * the variants the rules ask for (the search passes its own, on its grids and remembered).
 */
export function systemChecks(c: Case, routing: SystemRouting, route: SystemRouter = (outlets) => routeSystemCase(c, outlets)): Check[] {
  const system = routing.system;
  const checks: Check[] = [];
  // At the outfall: the flow rules on the ponds' flows reaching it together; clogged, every pond clogged.
  const main = system.ponds.findIndex((p) => p.to < 0);
  const clog = c.criteria.clogging;
  let clogged: StormRouting[] | null = null;
  const cloggedRouter = () => {
    if (clogged === null) clogged = outfallRoutings(route(routing.outlets.map((o) => cloggedOutlet(o, clog!.fraction))));
    return clogged;
  };
  for (const check of evaluateChecks(c, routing.outlets[main], outfallRoutings(routing), cloggedRouter, false, OUTFALL_RULES)) checks.push(named(check, "outfall"));
  // Each pond: every rule on its own routing; a variant of its outlet routes the system again.
  system.ponds.forEach((p, i) => {
    const view = pondCase(c, system, i);
    const router = (outlet: Outlet) => pondRoutings(route(routing.outlets.map((o, k) => (k === i ? outlet : o))), i);
    for (const check of evaluateChecks(view, routing.outlets[i], pondRoutings(routing, i), router)) checks.push(named(check, p.name));
  });
  return checks;
}

/** Every check, warning and the compliance of a routed system. */
export function assessSystem(c: Case, routing: SystemRouting): Assessment {
  const system = routing.system;
  const checks = systemChecks(c, routing);
  const warnings: Warning[] = [];
  const walls: OutletWall[] = [];
  system.ponds.forEach((p, i) => {
    const view = pondCase(c, system, i);
    walls.push({ pond: p.name, outlet: routing.outlets[i], plan: casePlan(view, routing.outlets[i], pondRoutings(routing, i)) });
    const single = pondCaseRouting(routing, i);
    for (const w of [...outletWarnings(view, single.outlet, single), ...implausibleInputWarnings(view, single.outlet, single)]) warnings.push(rooted(w, p.name, i));
  });
  for (const { storm, result } of routing.storms) {
    if (result.unconverged > 0) warnings.push({ part: `routing (${storm.name})`, reason: `${result.unconverged} steps of the system's routing did not converge within the iteration limit (kept as they ended): use a shorter step` });
  }
  return { checks, warnings, compliant: checks.every((check) => check.passed), binding: bindingCheck(checks), walls };
}

/** A pond's warning with its subject's path in the case file (`ponds[i].outlet...`, `ponds[i].pond...`). */
function rooted(w: Warning, name: string, index: number): Warning {
  let part = w.part;
  if (part.startsWith("outlet") || part.startsWith("pond.")) part = `ponds[${index}].${part}`;
  else if (part.startsWith("routing (")) part = `routing (${name}, ${part.slice("routing (".length)}`;
  else if (part === "routing") part = `routing (${name})`;
  else part = part.replace(/^storms\[(\d+)\]\.inflow/, `storms[$1].inflows.${name}`);
  return { ...w, part };
}

export type { SystemRouting };
