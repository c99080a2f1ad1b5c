// Aligned console tables with a unit on every number.
import Table from "cli-table3";
import type { Case } from "../case/model.js";
import type { CaseRouting } from "../routing/routeCase.js";
import type { Assessment } from "../assess/assess.js";
import type { Check } from "../assess/checks.js";
import { formatter, quantityText, significant, type Formatter } from "../format.js";
import { ruleOf } from "../assess/rules/registry.js";
import { outletDetail } from "../hydraulics/outlet.js";
import { withinBand } from "./json.js";
import { CAUTION } from "./caution.js";
import { describeOutlet } from "./describe.js";

/** A borderless table: columns separated by two spaces. */
export function plainTable(head: string[], alignRight: boolean[] = []): Table.Table {
  return new Table({
    head,
    chars: {
      top: "", "top-mid": "", "top-left": "", "top-right": "",
      bottom: "", "bottom-mid": "", "bottom-left": "", "bottom-right": "",
      left: "", "left-mid": "", mid: "", "mid-mid": "",
      right: "", "right-mid": "", middle: "  ",
    },
    style: { head: [], border: [], "padding-left": 0, "padding-right": 0 },
    colAligns: head.map((_, i) => (alignRight[i] ? "right" : "left")),
  });
}

export function hours(h: number | null): string {
  return h === null ? "not drained" : `${h.toFixed(1)} h`;
}

export function percent(x: number, digits = 1): string {
  return `${(100 * x).toFixed(digits)} %`;
}

/** Per-storm table of a routed outlet. */
export function stormTable(c: Case, routing: CaseRouting): string {
  const f = formatter(c.units);
  const table = plainTable(
    ["Storm", "Return", "Peak in", "Peak out", "Target", "Out/target", "Max stage", "Freeboard left", "Drawdown", "At peak stage"],
    [false, true, true, true, true, true, true, true, true, false],
  );
  for (const { storm, result } of routing.storms) {
    const inBand = withinBand(c, result.peakOutflow, storm.target);
    const detail = outletDetail(routing.outlet, c.tailwater, result.maxStage);
    table.push([
      storm.name,
      `${storm.returnPeriod} yr`,
      f.flow(result.peakInflow),
      f.flow(result.peakOutflow),
      storm.target === null ? "none" : f.flow(storm.target),
      storm.target ? `${percent(result.peakOutflow / storm.target)}${inBand ? "" : " !"}` : "-",
      f.elevation(result.maxStage),
      f.length(c.pond.top - result.maxStage),
      hours(result.drawdownTime === null ? null : result.drawdownTime / 3600),
      detail.control,
    ]);
  }
  return [table.toString(), ...governingLimitLines(c)].join("\n");
}

export function checkValue(c: Case, check: Check, value: number | null): string {
  return quantityText(formatter(c.units), ruleOf(check).quantity, value);
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

export function checksTable(c: Case, checks: readonly Check[]): string {
  const table = plainTable(["Check", "Value", "Limit", "Slack", "Result"], [false, true, true, true, false]);
  for (const check of checks) {
    table.push([checkTitle(check), checkValue(c, check, check.value), `${limitWord(check)} ${checkValue(c, check, check.limit)}`, percent(check.slack), check.passed ? "pass" : "FAIL"]);
  }
  return table.toString();
}

function limitWord(check: Check): string {
  return ruleOf(check).comparison === "at least" ? ">=" : "<=";
}

export function warningsText(assessment: Assessment): string {
  if (assessment.warnings.length === 0) return "Warnings: none";
  return ["Warnings:", ...assessment.warnings.map((w) => `  - ${w.part}: ${w.reason}`)].join("\n");
}

export function verdictText(assessment: Assessment): string {
  const b = assessment.binding;
  const binding = b ? `binding check: ${checkTitle(b)} (slack ${percent(b.slack)})` : "no checks";
  return `${assessment.compliant ? "Compliant" : "NOT compliant"}; ${binding}`;
}

export function routeReport(c: Case, routing: CaseRouting, assessment: Assessment, verbose: string[] = []): string {
  const f = formatter(c.units);
  const lines = [
    `outfit route: ${c.name} (${c.units} units)`,
    `Outlet: ${describeOutlet(routing.outlet, f)}`,
    `Pond: bottom ${f.elevation(c.pond.bottom)}, top ${f.elevation(c.pond.top)}${c.pond.pool > c.pond.bottom ? `, permanent pool ${f.elevation(c.pond.pool)}` : ""}`,
    "",
    stormTable(c, routing),
    "",
    checksTable(c, assessment.checks),
    "",
    warningsText(assessment),
    ...(verbose.length ? ["", ...verbose] : []),
    "",
    verdictText(assessment),
    "",
    `Caution: ${CAUTION}`,
  ];
  return lines.join("\n");
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
