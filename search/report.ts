// What `outfit design` prints and writes: a ranked table, explanations, the contract's JSON, and one
// ready-to-route case file per reported candidate.
import { relative, resolve, dirname, isAbsolute } from "node:path";
import type { SearchProblem } from "./problem.js";
import type { SearchRun } from "./run.js";
import type { Candidate } from "./candidate.js";
import { stormJson, checkJson } from "../src/report/json.js";
import { plainTable, percent, checkValue, governingLimitLines } from "../src/report/console.js";
import { CAUTION } from "../src/report/caution.js";
import { formatter } from "../src/format.js";

export function candidateCaseName(rank: number): string {
  return `candidate-${String(rank).padStart(2, "0")}.json`;
}

export function candidateJson(p: SearchProblem, c: Candidate, rank: number) {
  const binding = c.assessment.binding;
  return {
    rank,
    description: c.description,
    outlet: c.file,
    storms: c.routing.storms.map((s) => stormJson(p.case, s)),
    checks: c.assessment.checks.map((check) => checkJson(p.case, check)),
    warnings: c.assessment.warnings,
    compliant: c.assessment.compliant,
    cost: c.cost,
    error: c.error,
    pareto: c.pareto,
    binding: binding ? { ...checkJson(p.case, binding), why: c.explanation[1]?.replace(/^why: /, "") ?? "" } : null,
    explanation: c.explanation,
    caseFile: candidateCaseName(rank),
  };
}

export function designJson(p: SearchProblem, run: SearchRun, top: number) {
  return {
    tool: "outfit",
    command: "design",
    case: p.case.name,
    units: p.case.units,
    caution: CAUTION,
    caseFile: p.case.file,
    search: {
      success: run.success,
      stoppedBecause: run.stoppedBecause,
      layouts: run.layoutsFitted,
      layoutsPlanned: run.layoutsPlanned,
      layoutsFitted: run.layoutsFitted,
      layoutsSkippedByCost: run.layoutsSkipped,
      candidatesRouted: run.candidatesRouted,
      routings: run.routings,
      evaluations: run.evaluations,
      seconds: run.seconds,
      secondsToFirstCompliant: run.secondsToFirstCompliant,
      seed: run.seed,
      budget: run.budget,
      margin: p.options.margin,
    },
    infeasible: run.infeasible,
    candidates: run.candidates.slice(0, top).map((c, i) => candidateJson(p, c, i + 1)),
  };
}

/** The input case with the candidate's outlet, inflow files pointing back at the originals. */
export function candidateCase(p: SearchProblem, json: unknown, c: Candidate, outDir: string): unknown {
  const copy = JSON.parse(JSON.stringify(json)) as Record<string, unknown>;
  copy.outlet = c.file;
  const caseDir = p.case.file ? dirname(p.case.file) : process.cwd();
  const storms = copy.storms as { inflow?: { file?: string } }[];
  for (const storm of storms ?? []) {
    const file = storm.inflow?.file;
    if (file && !isAbsolute(file)) storm.inflow!.file = relative(resolve(outDir), resolve(caseDir, file)).split("\\").join("/");
  }
  return copy;
}

export function designText(p: SearchProblem, run: SearchRun, top: number): string {
  const f = formatter(p.case.units);
  const governing = governingLimitLines(p.case);
  const lines: string[] = [`outfit design: ${p.case.name} (${p.case.units} units)`, ...governing, ""];
  const shown = run.candidates.slice(0, top);
  const stormNames = p.targeted.map((s) => s.name);
  const freeboardStorm = p.case.criteria.freeboardStorm;
  const table = plainTable(
    ["#", "Outlet", ...stormNames.map((n) => `${n} out/target`), `Max stage (${freeboardStorm})`, "Freeboard left", "Cost", "Binding check", "Status"],
    [true, false, ...stormNames.map(() => true), true, true, true, false, false],
  );
  shown.forEach((c, i) => {
    const storms = new Map(c.routing.storms.map((s) => [s.storm.name, s]));
    const fb = storms.get(freeboardStorm);
    const status = c.assessment.compliant ? (c.assessment.warnings.length ? "compliant, flagged" : "compliant") : "not compliant";
    table.push([
      String(i + 1),
      wrap(c.description, 58),
      ...stormNames.map((n) => {
        const s = storms.get(n)!;
        return percent(s.result.peakOutflow / s.storm.target!);
      }),
      fb ? f.elevation(fb.result.maxStage) : "-",
      fb ? f.length(p.case.pond.top - fb.result.maxStage) : "-",
      `${c.cost.toFixed(1)} units${c.pareto ? " *" : ""}`,
      c.assessment.binding ? `${c.assessment.binding.name} (${percent(c.assessment.binding.slack)})` : "-",
      status,
    ]);
  });
  lines.push(table.toString(), "", "* on the non-dominated front of cost against error among compliant candidates; cost is a relative proxy, not money.");
  shown.forEach((c, i) => {
    lines.push("", `Candidate ${i + 1}: ${c.description}`);
    for (const check of c.assessment.checks.filter((k) => !k.passed)) lines.push(`  fails: ${check.name}: ${checkValue(p.case, check, check.value)} (limit ${checkValue(p.case, check, check.limit)})`);
    for (const w of c.assessment.warnings) lines.push(`  flag: ${w.part}: ${w.reason}`);
    for (const line of c.explanation) lines.push(`  ${line}`);
  });
  if (!run.success) {
    lines.push("", "No compliant design was found. Why:");
    for (const reason of run.infeasible) lines.push(`  - ${reason}`);
  }
  const rate = run.seconds > 0 ? Math.round(run.routings / run.seconds) : run.routings;
  lines.push(
    "",
    `Search: ${run.success ? "compliant designs found" : "no compliant design"}; stopped because ${run.stoppedBecause}.`,
    `        ${run.layoutsFitted} layouts fitted of ${run.layoutsPlanned} planned (${run.layoutsSkipped} skipped: they cost more than the ranking's head), ${run.candidatesRouted} candidates routed, ${run.routings} routings (${rate} per s) in ${run.seconds.toFixed(2)} s` +
      (run.secondsToFirstCompliant !== null ? `; first compliant after ${run.secondsToFirstCompliant.toFixed(2)} s` : "") +
      `; seed "${run.seed}", budget ${run.budget} routings.`,
    "",
    `Caution: ${CAUTION}`,
  );
  return lines.join("\n");
}

function wrap(text: string, width: number): string {
  const parts = text.split("; ");
  const lines: string[] = [];
  let line = "";
  for (const part of parts) {
    const next = line ? `${line}; ${part}` : part;
    if (next.length > width && line) {
      lines.push(line + ";");
      line = part;
    } else line = next;
  }
  if (line) lines.push(line);
  return lines.join("\n");
}
