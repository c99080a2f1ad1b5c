// Parts used outside the range their formula or coefficient was published for, and numerical cautions
// of the routing. The search prefers designs without them. (Whether the openings fit their wall and
// stay below the rim is judged by the buildability rules, rules/openingWeb.ts and its neighbours.)
import type { Case, Element, Outlet } from "../model.js";
import { drainedStage, type CaseRouting } from "../routing/routeCase.js";
import { formatter, type Formatter } from "../format.js";
import { partOf } from "../parts/registry.js";
import { barrelRise, barrelSizeWords } from "../parts/barrel.js";
import { openingsFlow, outletDetail, outletDischarge } from "../hydraulics/outlet.js";
import { chamberFlow } from "../hydraulics/chamber.js";
import { tailwaterLevel } from "../hydraulics/tailwater.js";
import { barrelState, outletControlDoubt, type OutletDoubt } from "../hydraulics/barrel.js";

export interface Warning {
  /** Which part: its path in the case file and a short description. */
  part: string;
  reason: string;
}

/** Largest HW/D the HDS-5 inlet-control charts cover: the regression polynomials fitted to them apply
 * for 0.5 <= HW/D <= 3.0 (TxDOT Hydraulic Design Manual, ch. 8 sec. 3, eq 8-4); beyond it the
 * equations are extrapolated. */
export const BARREL_MAX_HEADWATER_RATIO = 3.0;
/** Stages scanned below the highest routed stage when looking for a doubtful outlet-control headwater. */
const BARREL_SCAN_STAGES = 48;

/** An element as a warning's subject: its path in the case file and the part in words. */
export function partLabel(e: Element, index: number, f: Formatter): string {
  return `outlet.elements[${index}] (${partOf(e).label(e, f)})`;
}

export function outletWarnings(c: Case, outlet: Outlet, routing: CaseRouting): Warning[] {
  const f = formatter(c.units);
  const warnings: Warning[] = [];
  const maxStage = Math.max(...routing.storms.map((s) => s.result.maxStage));
  outlet.elements.forEach((e, i) => {
    const kind = partOf(e);
    const part = partLabel(e, i, f);
    const add = (reason: string) => warnings.push({ part, reason });
    // Its own range of validity (the kind's).
    kind.warnings(e, { maxStage, floor: c.pond.bottom }, f).forEach(add);
  });
  if (outlet.barrel) warnings.push(...barrelWarnings(c, outlet, routing, f));
  if (routing.table.heldNodes > 0) {
    warnings.push({ part: "outlet", reason: `the combined rating fell with rising stage at ${routing.table.heldNodes} stages and was held level there` });
  }
  for (const { storm, result } of routing.storms) {
    if (result.beyondTable) warnings.push({ part: "routing", reason: `${storm.name}: the stage rose above the rating table (${f.elevation(routing.table.stage[routing.table.stage.length - 1])}); storage and outflow extrapolated` });
    if (result.clampedSteps > 0) warnings.push({ part: "routing", reason: `${storm.name}: ${result.clampedSteps} steps emptied the pond within one step; use a shorter step` });
    if (result.drawdownTime === null) {
      // A pond that never returns to its pool is a defect whether or not a drawdown rule applies.
      warnings.push({
        part: "outlet",
        reason: `${storm.name}: the pond does not drain to ${f.elevation(drainedStage(c))} within ${(result.duration / 86400).toFixed(1)} days of the storm's start: the openings do not drain it to its ${c.pond.pool > c.pond.bottom ? "permanent pool" : "floor"}, or far too slowly`,
      });
    }
  }
  return warnings;
}

/** The barrel used outside what its HDS-5 forms cover, judged where it limits the outflow. */
export function barrelWarnings(c: Case, outlet: Outlet, routing: CaseRouting, f: Formatter): Warning[] {
  const b = outlet.barrel!;
  const rise = barrelRise(b);
  const part = `outlet.barrel (${barrelSizeWords(b, f)} barrel)`;
  const warnings: Warning[] = [];
  const fullAgainstTailwater: string[] = [];
  let steepest: { storm: string; ratio: number } | null = null;
  for (const { storm, result } of routing.storms) {
    const d = outletDetail(outlet, c.tailwater, result.maxStage);
    if (d.chamber === null) continue;
    const ratio = (d.chamber - b.inletInvert) / rise;
    if (ratio > BARREL_MAX_HEADWATER_RATIO && (!steepest || ratio > steepest.ratio)) steepest = { storm: storm.name, ratio };
    if (d.control === "barrel outlet control" && d.tailwater !== null && d.tailwater - b.outletInvert >= rise) {
      fullAgainstTailwater.push(`${storm.name} (tailwater ${f.length(d.tailwater - b.outletInvert)} above the outlet invert)`);
    }
  }
  if (fullAgainstTailwater.length) {
    warnings.push({
      part,
      reason: `runs full under outlet control against a tailwater at or above its crown at the peak of ${fullAgainstTailwater.join(", ")}: the downstream level sets the outlet's capacity, so check the tailwater rating`,
    });
  }
  if (steepest) {
    warnings.push({
      part,
      reason: `headwater reaches HW/D = ${steepest.ratio.toFixed(2)} at the peak of ${steepest.storm}, beyond the ${BARREL_MAX_HEADWATER_RATIO.toFixed(1)} the HDS-5 inlet-control charts cover; the equations are extrapolated`,
    });
  }
  warnings.push(...outletControlNotes(c, outlet, routing, f, part));
  return warnings;
}

/** What a doubtful outlet-control headwater means, in words (see `OutletDoubt` in barrel.ts). */
const DOUBT_REASONS: Record<OutletDoubt, string> = {
  "step limit": "the backwater profile that gives its outlet-control headwater stopped at its step limit short of the inlet, so the chamber level there is uncertain",
  "adverse, part full":
    "the barrel is adverse (its inlet below its outlet) and HDS-5's full-flow approximation applies by its headwater, yet a backwater profile shows the barrel part full over its whole length: the approximation's ho = (dc + D)/2 at the outlet overstates the headwater, so the chamber level there is likely too high",
};

/**
 * Where the barrel holds the openings back under outlet control, its headwater comes from HDS-5's
 * approximation (HW >= 0.75 D, or the barrel full over part of its length) or from a backwater
 * profile of the part-full flow; neither is flagged. A note is raised only where that headwater is
 * doubtful: a profile cut short by its step limit, or an adverse barrel where the approximation
 * applies by its headwater while a profile shows the barrel part full throughout.
 */
function outletControlNotes(c: Case, outlet: Outlet, routing: CaseRouting, f: Formatter, part: string): Warning[] {
  const b = outlet.barrel!;
  const top = Math.max(...routing.storms.map((s) => s.result.maxStage));
  const found = new Map<OutletDoubt, { lowest: number; highest: number }>();
  for (let i = 1; i <= BARREL_SCAN_STAGES; i++) {
    const stage = c.pond.pool + ((top - c.pond.pool) * i) / BARREL_SCAN_STAGES;
    // The values of `outletDetail` at the stage, in the order that skips the barrel's exact state
    // (a backwater profile) where the openings are not held back or the tailwater drowns the pond.
    const tw = c.tailwater.kind === "rating" ? tailwaterLevel(c.tailwater, outletDischarge(outlet, c.tailwater, stage)) : tailwaterLevel(c.tailwater, 0);
    const flow = chamberFlow(outlet, stage, tw, c.tailwater.kind === "rating");
    const held = flow < openingsFlow(outlet, stage, -Infinity) * (1 - 1e-9);
    if (!held || (Number.isFinite(tw) && tw >= stage)) continue;
    if (barrelState(b, flow, tw).control !== "outlet") continue;
    const doubt = outletControlDoubt(b, flow, tw);
    if (doubt === null) continue;
    const range = found.get(doubt) ?? { lowest: stage, highest: stage };
    found.set(doubt, { lowest: Math.min(range.lowest, stage), highest: Math.max(range.highest, stage) });
  }
  return [...found].map(([doubt, { lowest, highest }]) => ({
    part,
    reason: `limits the outflow under outlet control at stages ${f.elevation(lowest)} to ${f.elevation(highest)}, where ${DOUBT_REASONS[doubt]}`,
  }));
}
