// JSON output in the case's units, with the fields the case-format contract names.
import type { AnalysisPoint, Case } from "../model.js";
import type { CaseRouting, StormRouting } from "../routing/routeCase.js";
import { outletWall, type Assessment } from "../assess/assess.js";
import type { Check } from "../assess/checks.js";
import { toCaseUnits } from "../units.js";
import { targetBand, withinTargetBand } from "../assess/rules/band.js";
import { PASS_TOLERANCE, upperFlowSlack } from "../assess/rules/rule.js";
import { furtherPointPeak } from "../assess/rules/furtherPointPeak.js";
import { ruleOf } from "../assess/rules/registry.js";
import { jsonHead } from "./caution.js";
import { outletToFile } from "./outletFile.js";
import { outletDetail } from "../hydraulics/outlet.js";
import { storageJsonFields } from "./storageNotes.js";
import { wallJson } from "./wall.js";

export interface StormJson {
  name: string;
  returnPeriod: number;
  target: number | null;
  /** The release limit that governs the target (the smallest of the storm's limits). */
  governingLimit: { form: string; statement: string; label: string | null } | null;
  /** Every release limit of the storm, in case units. */
  releaseLimits: { form: string; statement: string; label: string | null; flow: number }[];
  peakInflow: number;
  peakOutflow: number;
  timeOfPeakOutflow: number;
  /** With a bypass (contract): the largest flow at the point of analysis, outflow plus bypass at the same instant. */
  peakAtPoint?: number;
  /** With a bypass: when `peakAtPoint` occurs (min), the bypass's share of it, and the bypass's own peak. */
  timeOfPeakAtPoint?: number;
  bypassAtPeak?: number;
  peakBypass?: number;
  /** Further points of analysis (a site that drains two ways), when the storm has any. */
  points?: PointJson[];
  maxStage: number;
  maxStorage: number;
  ratio: number | null;
  withinTolerance: boolean | null;
  volumeIn: number;
  volumeOut: number;
  massBalanceError: number;
  drawdownHours: number | null;
  timeOfMaxStage: number;
  steps: number;
  /** Where they apply (report/storageNotes.ts): governingDuration, durationsRouted, volumeExfiltrated, peakExfiltration, aboveSystemTop, surchargeWhere. */
  [storage: string]: unknown;
}

export interface PointJson {
  name: string;
  /** Whether the pond's outflow reaches the point. */
  pond: boolean;
  target: number | null;
  peak: number;
  ratio: number | null;
  /** Within the upper edge of the point's band (further points have no lower limit); null without a target. */
  withinTolerance: boolean | null;
}

/** Whether a peak lies inside its target band (band edges count as inside). */
export function withinBand(c: Case, peak: number, target: number | null): boolean | null {
  return target === null ? null : withinTargetBand(peak, target, c.criteria);
}

export function stormJson(c: Case, s: StormRouting): StormJson {
  const u = toCaseUnits(c.units);
  const r = s.result;
  const target = s.storm.target;
  return {
    name: s.storm.name,
    returnPeriod: s.storm.returnPeriod,
    target: target === null ? null : u.flow(target),
    governingLimit: s.storm.governingLimit && { form: s.storm.governingLimit.form, statement: s.storm.governingLimit.statement, label: s.storm.governingLimit.label },
    releaseLimits: s.storm.releaseLimits.map((l) => ({ form: l.form, statement: l.statement, label: l.label, flow: u.flow(l.flow) })),
    peakInflow: u.flow(r.peakInflow),
    peakOutflow: u.flow(r.peakOutflow),
    timeOfPeakOutflow: r.timeOfPeakOutflow / 60,
    ...(s.storm.bypass
      ? {
          peakAtPoint: u.flow(r.peakAtPoint),
          timeOfPeakAtPoint: r.timeOfPeakAtPoint / 60,
          bypassAtPeak: u.flow(r.bypassAtPeak),
          peakBypass: u.flow(hydrographPeak(s.storm.bypass)),
        }
      : {}),
    ...(s.storm.points?.length ? { points: s.storm.points.map((p) => pointJson(c, s, p)) } : {}),
    maxStage: u.length(r.maxStage),
    maxStorage: u.volume(r.maxStorage),
    // The target applies at the point of analysis (the pond's outlet without a bypass).
    ratio: target === null || target === 0 ? null : r.peakAtPoint / target,
    withinTolerance: withinBand(c, r.peakAtPoint, target),
    volumeIn: u.volume(r.volumeIn),
    volumeOut: u.volume(r.volumeOut),
    massBalanceError: r.massBalanceError,
    drawdownHours: r.drawdownTime === null ? null : r.drawdownTime / 3600,
    timeOfMaxStage: r.timeOfMaxStage / 60,
    steps: r.steps,
    ...storageJsonFields(c, s),
  };
}

/** The largest flow of a hydrograph (m3/s). */
export function hydrographPeak(h: { flows: ArrayLike<number> }): number {
  let peak = 0;
  for (let i = 0; i < h.flows.length; i++) if (h.flows[i] > peak) peak = h.flows[i];
  return peak;
}

function pointJson(c: Case, s: StormRouting, p: AnalysisPoint): PointJson {
  const u = toCaseUnits(c.units);
  const peak = furtherPointPeak(s.storm, p, s.result);
  const upper = p.target === null ? null : targetBand(p.target, c.criteria)[1];
  return {
    name: p.name,
    pond: p.pond,
    target: p.target === null ? null : u.flow(p.target),
    peak: u.flow(peak),
    ratio: p.target === null ? null : peak / p.target,
    withinTolerance: upper === null ? null : upperFlowSlack(peak, upper) >= -PASS_TOLERANCE,
  };
}

export interface CheckJson {
  name: string;
  kind: string;
  storm: string;
  key: string;
  label: string | null;
  /** "design", or "clogged" for the twin evaluated with criteria.clogging. */
  condition: string;
  /** Where a flow check measures its value when not at the pond's outlet ("point of analysis", or a further point's name). */
  point?: string;
  passed: boolean;
  value: number | null;
  limit: number;
  slack: number;
  unit: string;
  /** A system of ponds: the pond the check judges, or "outfall". */
  pond?: string;
}

export function checkJson(c: Case, check: Check): CheckJson {
  const u = toCaseUnits(c.units);
  const labels = c.units === "US" ? { flow: "cfs", length: "ft" } : { flow: "m3/s", length: "m" };
  const quantity = ruleOf(check).quantity;
  const flow = quantity === "flow";
  const hours = quantity === "hours";
  const size = quantity === "size";
  // Elevations and lengths alike in the case's length unit.
  const convert = (x: number) => (flow ? u.flow(x) : hours ? x : size ? u.smallLength(x) : u.length(x));
  return {
    name: check.name,
    kind: check.kind,
    storm: check.storm,
    key: check.key,
    label: check.label,
    condition: check.condition,
    ...(check.point === null ? {} : { point: check.point }),
    passed: check.passed,
    value: check.value === null ? null : convert(check.value),
    limit: convert(check.limit),
    slack: check.slack,
    unit: flow ? labels.flow : hours ? "h" : size ? (c.units === "US" ? "in" : "mm") : labels.length,
    ...(check.pond !== undefined ? { pond: check.pond } : {}),
  };
}

/** Per-storm results, checks, warnings and compliance of one routed outlet. */
export function assessmentJson(c: Case, routing: CaseRouting, assessment: Assessment) {
  return {
    storms: routing.storms.map((s) => ({ ...stormJson(c, s), controlAtPeak: outletDetail(routing.outlet, c.tailwater, s.result.maxStage).control })),
    ...verdictJson(c, assessment),
    wall: wallJson(c, routing.outlet, outletWall(assessment)),
  };
}

/** The checks, warnings, compliance and binding check of an assessment. */
export function verdictJson(c: Case, assessment: Assessment) {
  return {
    checks: assessment.checks.map((check) => checkJson(c, check)),
    warnings: assessment.warnings,
    compliant: assessment.compliant,
    binding: assessment.binding ? checkJson(c, assessment.binding) : null,
  };
}

export function routeJson(c: Case, routing: CaseRouting, assessment: Assessment, extra: Record<string, unknown> = {}) {
  return {
    ...jsonHead("route", c),
    outlet: outletToFile(routing.outlet, c.units),
    ...(c.hydrologyMethods ? { hydrologyMethods: c.hydrologyMethods } : {}),
    ...assessmentJson(c, routing, assessment),
    ...extra,
  };
}
