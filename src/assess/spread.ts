// The spread: a design routed again under stated departures from the design case (more inflow, the
// openings half clogged, a higher tailwater), and its reserve under each: how far the highest stage
// stays below the storm's limit level (the freeboard level, or the spillway crest for a storm that
// must keep the spillway dry, or an underground system's top). The least reserve over the spread is
// the design's robustness: a compliant design whose least reserve is negative meets the design storms
// but would overtop its freeboard (or use its spillway) if the storms were 20 % larger or its
// openings half blocked. Peaks are not judged against the targets under a departure: a larger storm
// may release more; what must hold is the embankment.
//
// The departures are stated, not published constants: inflow +10 % and +20 % (a margin for the
// uncertainty of design rainfall and runoff, common practice; for NRCS runoff a 10 % deeper rainfall
// raises runoff by more than 10 %, so this is not a rainfall-depth sensitivity), 50 % of the
// openings' open area blocked (common practice for small openings; the case's own clogging fraction
// when it is larger), and the tailwater 0.5 ft (0.15 m in SI cases) higher where the case has one.
import type { Case, Hydrograph, Outlet, Storm, Tailwater } from "../model.js";
import { routeCase, routeTable } from "../routing/routeCase.js";
import { routeSystemCase, type SystemRouting } from "../routing/routeSystem.js";
import { buildRatingTable } from "../routing/ratingTable.js";
import { cloggedOutlet } from "./rules/clogging.js";
import { limitLevel, type LimitReason } from "../storage/limitLevel.js";

/** The inflow factors of the spread. */
export const SPREAD_INFLOW = [1.1, 1.2];
/** Blocked share of the openings' open area (common practice for small openings). */
export const SPREAD_CLOGGING = 0.5;
/** Rise of a given tailwater (m): 0.5 ft in US cases, 0.15 m in SI cases. */
export const spreadTailwaterRise = (c: Case) => (c.units === "US" ? 0.5 * 0.3048 : 0.15);
const riseWords = (c: Case) => (c.units === "US" ? "0.5 ft" : "0.15 m");

export interface Departure {
  /** Short name for JSON: "inflow+10%", "inflow+20%", "clogged", "tailwater". */
  key: string;
  /** Words for the output ("inflow +20 %", "openings 50 % clogged"). */
  label: string;
}

export interface DepartureReserve extends Departure {
  /** Least reserve (m) over the storms under this departure: limit level minus highest stage. */
  reserve: number;
  /** The storm where it is least (a system's: the storm and the pond, "100-yr, pond upper"). */
  storm: string;
  /** What sets that storm's limit level. */
  by: LimitReason;
}

export interface Spread {
  /** The least reserve (m) over every departure and storm; negative when a limit level is passed. */
  reserve: number;
  /** The departure, storm and limit of the least reserve. */
  worst: DepartureReserve;
  departures: DepartureReserve[];
  /** Storm routings the spread took. */
  routings: number;
}

const scaled = (h: Hydrograph, factor: number): Hydrograph => ({ times: h.times, flows: h.flows.map((q) => q * factor) });

/** The storm with its inflow (and every bypass joining downstream) scaled by `factor`. */
function scaledStorm(storm: Storm, factor: number): Storm {
  const durations = storm.durations;
  return {
    ...storm,
    inflow: scaled(storm.inflow, factor),
    durations: durations ? { ...durations, inflow: (d: number) => scaled(durations.inflow(d), factor) } : undefined,
    bypass: storm.bypass ? scaled(storm.bypass, factor) : null,
    points: storm.points.map((p) => ({ ...p, bypass: p.bypass ? scaled(p.bypass, factor) : null })),
  };
}

/** The tailwater `rise` m higher, or null when the outlet discharges freely. */
function raisedTailwater(t: Tailwater, rise: number): Tailwater | null {
  switch (t.kind) {
    case "free":
      return null;
    case "elevation":
      return { kind: "elevation", elevation: t.elevation + rise };
    case "rating":
      return { kind: "rating", flows: t.flows, elevations: t.elevations.map((e) => e + rise) };
  }
}

/** The departures of the spread for this case, in the order they are reported. */
export function spreadDepartures(c: Case): Departure[] {
  const clogging = Math.max(SPREAD_CLOGGING, c.criteria.clogging?.fraction ?? 0);
  const out: Departure[] = SPREAD_INFLOW.map((f) => ({ key: `inflow+${Math.round((f - 1) * 100)}%`, label: `inflow +${Math.round((f - 1) * 100)} %` }));
  out.push({ key: "clogged", label: `openings ${Math.round(clogging * 100)} % clogged` });
  if (raisedTailwater(c.tailwater, spreadTailwaterRise(c))) out.push({ key: "tailwater", label: `tailwater ${riseWords(c)} higher` });
  return out;
}

/** The least reserve of a routing: limit level minus highest stage, over its storms. */
function leastReserve(c: Case, storms: readonly { storm: Storm; result: { maxStage: number } }[], departure: Departure): DepartureReserve {
  let worst: DepartureReserve | null = null;
  for (const { storm, result } of storms) {
    const limit = limitLevel(c.pond, c.criteria, c.outlet?.spillway, storm.returnPeriod);
    const reserve = limit.level - result.maxStage;
    if (worst === null || reserve < worst.reserve) worst = { ...departure, reserve, storm: storm.name, by: limit.by };
  }
  return worst ?? { ...departure, reserve: Infinity, storm: "", by: "freeboard level" };
}

/** The design routed under every departure of the spread, and its reserve under each. */
export function spreadOf(c: Case, outlet: Outlet, options: { direct?: boolean } = {}): Spread {
  const departures = spreadDepartures(c);
  const out: DepartureReserve[] = [];
  let routings = 0;
  const table = buildRatingTable(c.pond, outlet, c.tailwater, { direct: options.direct });
  const clogging = Math.max(SPREAD_CLOGGING, c.criteria.clogging?.fraction ?? 0);
  for (const d of departures) {
    let storms;
    if (d.key.startsWith("inflow")) {
      const factor = SPREAD_INFLOW[departures.indexOf(d)];
      storms = routeTable({ ...c, storms: c.storms.map((s) => scaledStorm(s, factor)) }, outlet, table).storms;
    } else if (d.key === "clogged") {
      storms = routeCase(c, cloggedOutlet(outlet, clogging), { direct: options.direct }).storms;
    } else {
      const tailwater = raisedTailwater(c.tailwater, spreadTailwaterRise(c))!;
      storms = routeCase({ ...c, tailwater }, outlet, { direct: options.direct }).storms;
    }
    routings += storms.length;
    out.push(leastReserve(c, storms, d));
  }
  const worst = out.reduce((a, b) => (b.reserve < a.reserve ? b : a));
  return { reserve: worst.reserve, worst, departures: out, routings };
}

/**
 * A system of ponds routed together under every departure of the spread (every pond's inflow and the
 * bypass scaled, every pond's openings clogged, the tailwater at the outfall higher), and the least
 * reserve under each over the storms and the ponds, each pond against its own limit level.
 */
export function systemSpreadOf(c: Case, outlets: readonly Outlet[]): Spread {
  const system = c.system!;
  const departures = spreadDepartures(c);
  const clogging = Math.max(SPREAD_CLOGGING, c.criteria.clogging?.fraction ?? 0);
  const out: DepartureReserve[] = [];
  let routings = 0;
  for (const d of departures) {
    let routed: SystemRouting;
    if (d.key.startsWith("inflow")) {
      const factor = SPREAD_INFLOW[departures.indexOf(d)];
      routed = routeSystemCase({ ...c, storms: c.storms.map((s) => ({ ...scaledStorm(s, factor), inflows: s.inflows?.map((h) => (h ? scaled(h, factor) : null)) })) }, outlets);
    } else if (d.key === "clogged") {
      routed = routeSystemCase(c, outlets.map((o) => cloggedOutlet(o, clogging)));
    } else {
      routed = routeSystemCase({ ...c, tailwater: raisedTailwater(c.tailwater, spreadTailwaterRise(c))! }, outlets);
    }
    routings += routed.storms.length * outlets.length;
    let worst: DepartureReserve | null = null;
    for (const { storm, result } of routed.storms) {
      system.ponds.forEach((p, i) => {
        const limit = limitLevel(p.pond, c.criteria, outlets[i].spillway, storm.returnPeriod);
        const reserve = limit.level - result.ponds[i].maxStage;
        if (worst === null || reserve < worst.reserve) worst = { ...d, reserve, storm: `${storm.name}, pond ${p.name}`, by: limit.by };
      });
    }
    out.push(worst ?? { ...d, reserve: Infinity, storm: "", by: "freeboard level" });
  }
  const worst = out.reduce((a, b) => (b.reserve < a.reserve ? b : a));
  return { reserve: worst.reserve, worst, departures: out, routings };
}

