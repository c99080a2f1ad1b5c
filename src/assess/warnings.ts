// Parts used outside the range their formula or coefficient was published for, openings that do not
// fit their wall, and numerical cautions of the routing. The search prefers designs without them.
import type { Case, Element, Outlet } from "../model.js";
import { drainedStage, type CaseRouting } from "../routing/routeCase.js";
import { formatter, type Formatter } from "../format.js";
import { FOOT } from "../units.js";
import { openingHeight, openingWidth } from "../hydraulics/orifice.js";
import { weirWidth } from "../hydraulics/weir.js";
import { riserPerimeter } from "../hydraulics/riser.js";
import { regulatorMaxHead } from "../hydraulics/regulator.js";
import { elementBottom, openingsFlow, outletDetail, outletDischarge } from "../hydraulics/outlet.js";
import { chamberFlow } from "../hydraulics/chamber.js";
import { tailwaterLevel } from "../hydraulics/tailwater.js";
import { barrelRise, barrelState, outletControlDoubt, type OutletDoubt } from "../hydraulics/barrel.js";

export interface Warning {
  /** Which part: its path in the case file and a short description. */
  part: string;
  reason: string;
}

/** Smallest head at which sharp-crested weir coefficients were measured: 0.2 ft (USBR Water
 * Measurement Manual ch. 7, lower limit of h1 for standard weirs; from memory). */
export const WEIR_MIN_HEAD = 0.2 * FOOT;
/** Fully contracted rectangular weir: h/b <= 0.5 (ISO 1438 practical limits; from memory). */
export const CONTRACTED_WEIR_MAX_HEAD_RATIO = 0.5;
/** V-notch (Kindsvater-Shen) heads up to 1.25 ft = 0.38 m (USBR WMM eq 7-3 limits; from memory). */
export const VNOTCH_MAX_HEAD = 1.25 * FOOT;
/** Kindsvater-Shen notch angles 20 to 100 degrees (ISO 1438). */
export const VNOTCH_ANGLES = [20, 100] as const;
/** Orifice discharge coefficients 0.40 (ragged) to 0.60 (square-edged) (HEC-22 sec. 8.4.4.1) and 0.61-0.62
 * for sharp-edged plates (USBR WMM; from memory). */
export const ORIFICE_COEFFICIENTS = [0.4, 0.62] as const;
/** Largest HW/D the HDS-5 inlet-control charts cover: the regression polynomials fitted to them apply
 * for 0.5 <= HW/D <= 3.0 (TxDOT Hydraulic Design Manual, ch. 8 sec. 3, eq 8-4); beyond it the
 * equations are extrapolated. */
export const BARREL_MAX_HEADWATER_RATIO = 3.0;
/** Stages scanned below the highest routed stage when looking for a doubtful outlet-control headwater. */
const BARREL_SCAN_STAGES = 48;

export function partLabel(e: Element, index: number, f: Formatter): string {
  const where = `outlet.elements[${index}]`;
  switch (e.type) {
    case "orifice":
      return e.shape === "circular"
        ? `${where} (${e.count} x ${f.size(e.diameter)} circular orifice)`
        : `${where} (${e.count} x ${f.size(e.width)} x ${f.size(e.height)} rectangular orifice)`;
    case "weir":
      return e.shape === "rectangular"
        ? `${where} (${f.length(e.length)} rectangular weir)`
        : `${where} (${e.angle} degree v-notch weir)`;
    case "regulator":
      return `${where} (regulator)`;
  }
}

export function outletWarnings(c: Case, outlet: Outlet, routing: CaseRouting): Warning[] {
  const f = formatter(c.units);
  const warnings: Warning[] = [];
  const maxStage = Math.max(...routing.storms.map((s) => s.result.maxStage));
  outlet.elements.forEach((e, i) => {
    const part = partLabel(e, i, f);
    const add = (reason: string) => warnings.push({ part, reason });
    if (e.type === "weir") {
      const head = maxStage - e.crest;
      if (head > 0 && head < WEIR_MIN_HEAD) {
        add(`largest head ${f.length(head)} is below ${f.length(WEIR_MIN_HEAD)}, the smallest head weir coefficients were measured at`);
      }
      if (e.shape === "rectangular" && e.endContractions > 0 && head > CONTRACTED_WEIR_MAX_HEAD_RATIO * e.length) {
        add(`head ${f.length(head)} exceeds half the weir length: the end contractions take away more than the Francis formula covers`);
      }
      if (e.shape === "v-notch") {
        if (head > VNOTCH_MAX_HEAD) add(`head ${f.length(head)} exceeds ${f.length(VNOTCH_MAX_HEAD)}, the largest head the v-notch coefficient covers`);
        if (e.angle < VNOTCH_ANGLES[0] || e.angle > VNOTCH_ANGLES[1]) add(`notch angle ${e.angle} degrees is outside 20 to 100 degrees`);
      }
    }
    if (e.type === "orifice" && (e.coefficient < ORIFICE_COEFFICIENTS[0] || e.coefficient > ORIFICE_COEFFICIENTS[1])) {
      add(`discharge coefficient ${e.coefficient} is outside the published 0.40 to 0.62`);
    }
    if (e.type === "regulator" && maxStage - e.invert > regulatorMaxHead(e)) {
      add(`head ${f.length(maxStage - e.invert)} is above the rating's last point (${f.length(regulatorMaxHead(e))}); flow extrapolated as the square root of head`);
    }
    if (outlet.riser && e.type !== "regulator") {
      const topOfOpening = e.type === "orifice" ? e.invert + openingHeight(e) : e.crest;
      if (topOfOpening > outlet.riser.crest + 1e-9) {
        add(`opening reaches ${f.elevation(topOfOpening)}, above the riser rim at ${f.elevation(outlet.riser.crest)}`);
      }
    }
  });
  if (outlet.riser) warnings.push(...wallWarnings(outlet, maxStage, f));
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

/** Openings at the same elevation must fit side by side in the riser's wall. */
function wallWarnings(outlet: Outlet, maxStage: number, f: Formatter): Warning[] {
  const riser = outlet.riser!;
  const perimeter = riserPerimeter(riser);
  const groups = new Map<number, number>();
  for (const e of outlet.elements) {
    if (e.type === "regulator") continue;
    const bottom = Math.round(elementBottom(e) * 1e6) / 1e6;
    const width = e.type === "orifice" ? openingWidth(e) : weirWidth(e, Math.min(maxStage, riser.crest) - e.crest);
    groups.set(bottom, (groups.get(bottom) ?? 0) + width);
  }
  const warnings: Warning[] = [];
  for (const [bottom, width] of groups) {
    if (width > perimeter) {
      warnings.push({
        part: "outlet.riser",
        reason: `openings at ${f.elevation(bottom)} need ${f.length(width)} of wall, more than the riser's perimeter of ${f.length(perimeter)}`,
      });
    }
  }
  return warnings;
}

/** The barrel used outside what its HDS-5 forms cover, judged where it limits the outflow. */
export function barrelWarnings(c: Case, outlet: Outlet, routing: CaseRouting, f: Formatter): Warning[] {
  const b = outlet.barrel!;
  const rise = barrelRise(b);
  const part = `outlet.barrel (${b.shape === "circular" ? f.size(b.diameter) : `${f.length(b.span)} x ${f.length(b.rise)}`} barrel)`;
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
