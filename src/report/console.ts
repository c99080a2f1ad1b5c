// Aligned console tables with a unit on every number.
import type { Case } from "../model.js";
import type { CaseRouting, StormRouting } from "../routing/routeCase.js";
import type { Assessment } from "../assess/assess.js";
import type { Check } from "../assess/checks.js";
import { formatter, quantityText, significant, trimNumber, type Formatter } from "../format.js";
import { ruleOf } from "../assess/rules/registry.js";
import { outletDetail } from "../hydraulics/outlet.js";
import { hydrographPeak, withinBand } from "./json.js";
import { furtherPointPeak } from "../assess/rules/furtherPointPeak.js";
import { CAUTION } from "./caution.js";
import { describeOutlet } from "./describe.js";
import { limitingPart } from "./limiting.js";
import { storageTable } from "./storageNotes.js";
import { wallLines } from "./wall.js";
import { paint, PLAIN, renderTable, STORM_NAME_WIDTH, wrap, type Column, type Layout, type Row } from "./terminal.js";

export function hours(h: number | null): string {
  return h === null ? "not drained" : `${h.toFixed(1)} h`;
}

/** A fraction as a percentage, no negative zero ("-0.0 %" reads as a failure that is not one). */
export function percent(x: number, digits = 1): string {
  const text = (100 * x).toFixed(digits);
  return `${Number(text) === 0 ? (0).toFixed(digits) : text} %`;
}

/** Per-storm table of a routed outlet: units in the headings, compact rows when narrow. */
export function stormTable(c: Case, routing: CaseRouting, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const L = f.labels;
  // With a bypass the target applies at the point of analysis: the pond's outflow plus the bypass.
  const atPoint = routing.storms.some(({ storm }) => storm.bypass);
  const columns: Column[] = [
    { head: "Storm", wrap: STORM_NAME_WIDTH },
    { head: `Peak out\n(${L.flow})`, align: "right" },
    ...(atPoint ? [{ head: `At point\n(${L.flow})`, align: "right" as const }] : []),
    { head: `Target\n(${L.flow})`, align: "right" },
    { head: atPoint ? "Point/target\n(%)" : "Out/target\n(%)", align: "right" },
    { head: `Max stage\n(${L.length})`, align: "right" },
    // With the point's column the drawdown moves below the row first when narrow.
    { head: "Drawdown\n(h)", align: "right", ...(atPoint ? { narrow: "detail" as const, rank: 0 } : {}) },
    { head: "Return\n(yr)", align: "right", narrow: "detail" },
    { head: `Peak in\n(${L.flow})`, align: "right", narrow: "detail" },
    { head: `Freeboard left\n(${L.length})`, align: "right", narrow: "detail" },
    { head: "Limited by\n(at max stage)", narrow: "detail", unit: "" },
  ];
  const rows: Row[] = routing.storms.map(({ storm, result }) => {
    const inBand = withinBand(c, result.peakAtPoint, storm.target);
    const detail = outletDetail(routing.outlet, c.tailwater, result.maxStage);
    return [
      storm.name,
      significant(f.raw.flow(result.peakOutflow)),
      ...(atPoint ? [storm.bypass ? significant(f.raw.flow(result.peakAtPoint)) : "-"] : []),
      storm.target === null ? "none" : significant(f.raw.flow(storm.target)),
      storm.target ? { text: `${(100 * result.peakAtPoint / storm.target).toFixed(1)}${inBand ? "" : " !"}`, tone: inBand ? "pass" : "fail" } : "-",
      f.raw.length(result.maxStage).toFixed(c.units === "US" ? 2 : 3),
      result.drawdownTime === null ? "not drained" : (result.drawdownTime / 3600).toFixed(1),
      trimNumber(storm.returnPeriod, 2),
      significant(f.raw.flow(result.peakInflow)),
      f.raw.length(c.pond.top - result.maxStage).toFixed(2),
      limitingPart(routing.outlet, detail),
    ];
  });
  const table = renderTable(layout, columns, rows);
  const marks = routing.storms.some(({ storm, result }) => storm.target !== null && !withinBand(c, result.peakAtPoint, storm.target)) ? "\n! outside the target band" : "";
  return [table.text + marks, ...pointLines(c, routing.storms, layout), ...governingLimitLines(c).map((line) => wrap(line, layout.width, 4))].join("\n");
}

/** The storage table (exfiltration, surcharge, governing durations) with the line before it, or nothing. */
export function storageLines(c: Case, routing: CaseRouting, layout: Layout = PLAIN): string[] {
  const table = storageTable(c, routing, layout);
  return table === null ? [] : ["", table];
}

/**
 * What the point of analysis is, when a storm has a bypass, and each storm's flow at further points:
 * the reader sees where the target is measured.
 */
export function pointLines(c: Case, storms: readonly StormRouting[], layout: Layout = PLAIN): string[] {
  const f = formatter(c.units);
  const lines: string[] = [];
  // A system of ponds: the flow reaching its outfall stands where one pond's outflow does.
  const system = c.system !== undefined && c.system.ponds.length > 1;
  const outflow = system ? "the flow reaching the outfall (every pond draining there, spillways included)" : "the pond's outflow (spillway included)";
  if (storms.some(({ storm }) => storm.bypass)) {
    lines.push(`At point: ${outflow} plus the runoff bypassing the ${system ? "ponds" : "pond"}, summed at each instant (the point of analysis); the target applies there.`);
    for (const { storm, result } of storms) {
      if (!storm.bypass) continue;
      lines.push(`  ${storm.name}: ${f.flow(result.peakAtPoint)} at ${(result.timeOfPeakAtPoint / 3600).toFixed(2)} h = ${system ? "outfall" : "outflow"} ${f.flow(result.peakAtPoint - result.bypassAtPeak)} + bypass ${f.flow(result.bypassAtPeak)} (bypass peak ${f.flow(hydrographPeak(storm.bypass))})`);
    }
  }
  const further = storms.flatMap(({ storm, result }) =>
    storm.points.map((p) => {
      const peak = furtherPointPeak(storm, p, result);
      const target = p.target === null ? "no target" : `target ${f.flow(p.target)} (${percent(peak / p.target)})`;
      const joined = system ? "the flow reaching the outfall plus the runoff joining there" : "pond outflow plus the runoff joining there";
      return `  ${storm.name} at ${p.name}: ${f.flow(peak)}, ${target}; ${p.pond ? joined : `runoff not passing through the ${system ? "ponds" : "pond"}`}`;
    }),
  );
  if (further.length > 0) lines.push("Further points of analysis:", ...further);
  return lines.map((line) => wrap(line, layout.width, line.startsWith("  ") ? 4 : 0));
}

export function checkValue(c: Case, check: Check, value: number | null): string {
  return quantityText(formatter(c.units), ruleOf(check).quantity, value);
}

/**
 * A check's slack in words: the fraction of its limit as a percentage, and for an elevation or a length
 * check first the distance to its limit in ft or m ("0.52 ft (10.5 %)"), which is what an engineer
 * compares with a freeboard, a crest or a spacing.
 */
export function slackText(units: Case["units"], check: Check): string {
  const rule = ruleOf(check);
  if ((rule.quantity !== "elevation" && rule.quantity !== "length") || check.value === null) return percent(check.slack);
  const margin = rule.comparison === "at least" ? check.value - check.limit : check.limit - check.value;
  const digits = units === "US" ? 2 : 3;
  const text = formatter(units).length(margin, digits);
  // No negative zero: a margin that rounds to nothing is shown as none.
  return `${Number(text.split(" ")[0]) === 0 ? formatter(units).length(0, digits) : text} (${percent(check.slack)})`;
}

/** How many warnings, to stand beside the word "compliant": ", 2 warnings" (nothing when none). */
export function warningCount(assessment: { warnings: readonly unknown[] }): string {
  const n = assessment.warnings.length;
  return n === 0 ? "" : `, ${n} warning${n > 1 ? "s" : ""}`;
}

/** The verdict with its warnings beside it: "compliant", "compliant, 2 warnings", "not compliant, 1 warning". */
export function complianceWords(assessment: Pick<Assessment, "compliant" | "warnings">): string {
  return `${assessment.compliant ? "compliant" : "not compliant"}${warningCount(assessment)}`;
}

/** A check's name with its rule's source label, if any. */
export function checkTitle(check: Check): string {
  return check.label === null ? check.name : `${check.name} [${check.label}]`;
}

/** The storm's target with the release limit that governs it, when that is not the plain target. */
export function targetText(c: Case, storm: Case["storms"][number]): string {
  if (storm.target === null) return "none";
  const g = storm.governingLimit;
  const words = g === null || (g.form === "target" && g.label === null) ? "" : ` (${g.statement}${g.label === null ? "" : `, ${g.label}`})`;
  return `${formatter(c.units).flow(storm.target)}${words}`;
}

/** Lines naming each storm's governing release limit and its source (none when every storm has a plain, unlabelled target). */
export function governingLimitLines(c: Case): string[] {
  const stated = c.storms.filter((s) => s.governingLimit !== null && (s.governingLimit.form !== "target" || s.governingLimit.label !== null));
  if (stated.length === 0) return [];
  return ["Governing release limit (the smallest of each storm's limits):", ...stated.map((s) => `  ${s.name}: ${targetText(c, s)}`)];
}

/** The narrowest a check's name becomes in a narrowed checks table (its longest word if wider). */
const CHECK_NAME_WIDTH = 22;

/** Every check with its value, limit, slack and result (values carry their units: the rows mix quantities). */
export function checksTable(c: Case, checks: readonly Check[], layout: Layout = PLAIN): string {
  // Narrow: the check's name and source wrap within their column; value and limit go below the row
  // only when even that leaves too little room (60 columns), never the slack or the result.
  const columns: Column[] = [
    { head: "Check", wrap: CHECK_NAME_WIDTH },
    { head: "Value", align: "right", narrow: "detail", unit: "" },
    { head: "Limit", align: "right", narrow: "detail", unit: "" },
    // An elevation check's slack "0.52 ft (10.5 %)" may go on two lines.
    { head: "Slack", align: "right", wrap: 8 },
    { head: "Result" },
  ];
  const rows: Row[] = checks.map((check) => [
    checkTitle(check),
    checkValue(c, check, check.value),
    `${limitWord(check)} ${checkValue(c, check, check.limit)}`,
    slackText(c.units, check),
    { text: check.passed ? "pass" : "FAIL", tone: check.passed ? "pass" : "fail" },
  ]);
  return renderTable(layout, columns, rows).text;
}

function limitWord(check: Check): string {
  return ruleOf(check).comparison === "at least" ? ">=" : "<=";
}

/** Where each opening sits on its wall, each pond's of a system (lines, then a blank line), or nothing without openings in a wall. */
export function wallSection(c: Case, assessment: Assessment, layout: Layout): string[] {
  const lines = assessment.walls.flatMap((w) => wallLines(c, w.outlet, w.plan, w.pond));
  return lines.length ? [...lines.map((line) => wrap(line, layout.width, 4)), ""] : [];
}

export function warningsText(assessment: Assessment, layout: Layout = PLAIN): string {
  if (assessment.warnings.length === 0) return "Warnings: none";
  return ["Warnings:", ...assessment.warnings.map((w) => wrap(`  - ${w.part}: ${w.reason}`, layout.width, 4))].join("\n");
}

export function verdictText(c: Case, assessment: Assessment, layout: Layout = PLAIN): string {
  const b = assessment.binding;
  const binding = b ? `binding check: ${checkTitle(b)}, slack ${slackText(c.units, b)}` : "no checks";
  return wrap(`${assessment.compliant ? paint(layout, "pass", "Compliant") : paint(layout, "fail", "NOT compliant")}${warningCount(assessment)}; ${binding}`, layout.width);
}

/** The caution, wrapped to the layout. */
export function cautionText(layout: Layout = PLAIN): string {
  return wrap(`Caution: ${CAUTION}`, layout.width);
}

export function routeReport(c: Case, routing: CaseRouting, assessment: Assessment, verbose: string[] = [], layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const lines = [
    wrap(`outfit route: ${c.name} (${c.units} units)`, layout.width),
    wrap(`Outlet: ${describeOutlet(routing.outlet, f)}`, layout.width),
    wrap(`Pond: bottom ${f.elevation(c.pond.bottom)}, top ${f.elevation(c.pond.top)}${c.pond.pool > c.pond.bottom ? `, permanent pool ${f.elevation(c.pond.pool)}` : ""}`, layout.width),
    ...hydrologyLines(c, layout),
    "",
    stormTable(c, routing, layout),
    ...storageLines(c, routing, layout),
    ...assessmentLines(c, assessment, verbose, layout),
  ];
  return lines.join("\n");
}

/** What every routed report ends with: the checks, the warnings, how the step was chosen (verbose), the verdict and the caution. */
export function assessmentLines(c: Case, assessment: Assessment, verbose: string[], layout: Layout): string[] {
  return [
    "",
    checksTable(c, assessment.checks, layout),
    "",
    ...wallSection(c, assessment, layout),
    warningsText(assessment, layout),
    ...(verbose.length ? ["", ...verbose.map((line) => wrap(line, layout.width))] : []),
    "",
    verdictText(c, assessment, layout),
    "",
    cautionText(layout),
  ];
}

/** How storms from rainfall were derived (the runoff and unit-hydrograph methods), when any are. */
export function hydrologyLines(c: Case, layout: Layout = PLAIN): string[] {
  return c.hydrologyMethods ? [wrap(`Storms from rainfall: ${c.hydrologyMethods} (outfit hydrograph shows each area)`, layout.width)] : [];
}

/** What the automatic step did for each storm (verbose output). */
export function routingNotes(c: Case, routing: CaseRouting): string[] {
  const f: Formatter = formatter(c.units);
  return routing.storms.map(({ storm, result }) => {
    const refined =
      (result.refinedSteps > 0 ? `; ${result.refinedSteps} steps shortened where the outflow changes fast relative to storage` : "") +
      (result.redoneSteps > 0 ? `; ${result.redoneSteps} steps done again shorter after landing far past a crest` : "");
    return `${storm.name}: ${result.steps} steps of ${stepText(result.smallestStep)} to ${stepText(result.largestStep)} over ${(result.duration / 3600).toFixed(1)} h${refined}; mass balance error ${significant(100 * result.massBalanceError)} %; rating table ${routing.table.stage.length} stages to ${f.elevation(routing.table.stage[routing.table.stage.length - 1])}`;
  });
}

function stepText(seconds: number): string {
  return seconds < 120 ? `${significant(seconds)} s` : `${significant(seconds / 60)} min`;
}
