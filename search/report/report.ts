// What `outfit design` prints and writes: a ranked table, explanations, the contract's JSON, and one
// ready-to-route case file per reported candidate.
import { dirname } from "node:path";
import { rebaseCase } from "../../src/case/rebase.js";
import type { SearchProblem } from "../engine/problem.js";
import { leftToGather, type SearchRun } from "../engine/run.js";
import type { Candidate, RoutedOutlet } from "../engine/candidate.js";
import { stormJson, checkJson } from "../../src/report/json.js";
import { wallJson, wallLines } from "../../src/report/wall.js";
import { outletWall } from "../../src/assess/assess.js";
import { checkValue, complianceWords, governingLimitLines, hydrologyLines, slackText } from "../../src/report/console.js";
import { PLAIN, renderTable, STORM_NAME_WIDTH, wrap, type Column, type Layout, type Row } from "../../src/report/terminal.js";
import { storageSummary } from "../../src/report/storageNotes.js";
import { CAUTION, jsonHead } from "../../src/report/caution.js";
import { formatter } from "../../src/format.js";
import { pondJson } from "../../src/report/systemReport.js";
import type { OutletFile } from "../../src/case/schema.js";
import { baselineVerdict, describeSaving, saving, type Baseline } from "../engine/baseline.js";
import { CHANGE_WEIGHTS } from "../engine/changes.js";
import { spreadJson, spreadLine } from "../../src/report/spread.js";

/** What the run's time bought: when the best design was found, and whether the rest found anything better. */
export function bestFoundWords(after: number, routings: number): string {
  const share = Math.round((100 * after) / routings);
  const late = after > routings / 2;
  return `The first-ranked design was found after ${after} of ${routings} routings (${share} %): ${late ? "late in the run, so a longer budget may find a better one" : "the rest of the run found nothing better"}.`;
}

export function candidateCaseName(rank: number): string {
  return `candidate-${String(rank).padStart(2, "0")}.json`;
}

/**
 * Every pond's outlet of a system (the contract's `ponds` of a design: name and outlet, ready to paste
 * back into the case), or a pond written as a `ponds` list of one with its outlet.
 */
function pondsJson(p: SearchProblem, c: RoutedOutlet): { ponds: { name: string; outlet: OutletFile }[] } | Record<string, never> {
  if (c.system) return { ponds: p.case.system!.ponds.map((q, i) => ({ name: q.name, outlet: c.system!.files[i], wall: wallJson(p.case, c.system!.outlets[i], c.assessment.walls[i].plan) })) };
  if (p.listedPond !== undefined) return { ponds: [{ name: p.listedPond, outlet: c.file }] };
  return {};
}

/** An outlet routed and explained (a candidate or the existing outlet) in the contract's JSON. */
function routedJson(p: SearchProblem, c: RoutedOutlet, explanation: string[]) {
  const binding = c.assessment.binding;
  return {
    description: c.description,
    // A system's outlets are its ponds' (`ponds`); the storms' results are the flow reaching the outfall's, and each pond's.
    ...(c.system ? {} : { outlet: c.file }),
    ...pondsJson(p, c),
    storms: c.routing.storms.map((s, k) => ({
      ...stormJson(p.case, s),
      ...(c.system ? { ponds: c.system.routing.storms[k].result.ponds.map((r, i) => pondJson(p.case, r, s.storm.pondTargets?.[i] ?? null)) } : {}),
    })),
    checks: c.assessment.checks.map((check) => checkJson(p.case, check)),
    warnings: c.assessment.warnings,
    compliant: c.assessment.compliant,
    cost: c.cost,
    error: c.error,
    binding: binding ? { ...checkJson(p.case, binding), why: explanation[1]?.replace(/^why: /, "") ?? "" } : null,
    // A system's walls are its ponds' (`ponds[i].wall`).
    ...(c.system ? {} : { wall: wallJson(p.case, c.outlet, outletWall(c.assessment)) }),
    explanation,
    ...(c.spread ? { spread: spreadJson(p.case, c.spread) } : {}),
  };
}

export function candidateJson(p: SearchProblem, c: Candidate, rank: number, baseline: Baseline | null = null) {
  const saved = baseline ? saving(baseline, c) : null;
  return {
    rank,
    ...routedJson(p, c, c.explanation),
    pareto: c.pareto,
    ...(c.variantOf !== null ? { variantOf: c.variantOf } : {}),
    caseFile: candidateCaseName(rank),
    ...(baseline && c.changes
      ? { saving: { cost: saved!.cost, ...(saved!.fraction === null ? {} : { percent: 100 * saved!.fraction }) }, changes: c.changes.changes, changeScore: c.changes.score }
      : {}),
  };
}

/** The existing outlet in the JSON: its outlet as given, results, checks, cost and binding check. */
export function baselineJson(p: SearchProblem, b: Baseline, run: SearchRun) {
  return {
    ...routedJson(p, b, b.explanation),
    verdict: baselineVerdict(b, run.candidates, run.stoppedBecause),
    rankedBy: p.limits.rankBy,
    limits: { vary: p.limits.vary, keepRiser: p.limits.keepRiser, keepBarrel: p.limits.keepBarrel },
  };
}

export function designJson(p: SearchProblem, run: SearchRun, top: number) {
  return {
    ...jsonHead("design", p.case),
    caseFile: p.case.file,
    ...(p.case.hydrologyMethods ? { hydrologyMethods: p.case.hydrologyMethods } : {}),
    search: {
      success: run.success,
      stoppedBecause: run.stoppedBecause,
      interrupted: run.interrupted,
      layouts: run.layoutsFitted,
      layoutsPlanned: run.layoutsPlanned,
      layoutsFitted: run.layoutsFitted,
      layoutsSkippedByCost: run.layoutsSkipped,
      candidatesRouted: run.candidatesRouted,
      routings: run.routings,
      evaluations: run.evaluations,
      seconds: run.seconds,
      // Keys without a value are left out (no null where a number belongs).
      ...(run.secondsToFirstCompliant !== null ? { secondsToFirstCompliant: run.secondsToFirstCompliant } : {}),
      seed: run.seed,
      ...(run.budget !== Infinity ? { budget: run.budget } : {}),
      ...(run.timeBudget !== null ? { timeBudget: run.timeBudget } : {}),
      workers: run.workers,
      ...(run.shard ? { shard: `${run.shard.index}/${run.shard.count}`, leftToGather: leftToGather(p, run) } : {}),
      layoutsFromJournal: run.layoutsFromJournal,
      routingsFromJournal: run.routingsFromJournal,
      ...(run.bestFoundAfter !== null ? { bestFoundAfter: run.bestFoundAfter } : {}),
      parts: run.parts,
      partsRun: run.partsRun,
      margin: p.options.margin,
    },
    infeasible: run.infeasible,
    ...(run.baseline ? { baseline: baselineJson(p, run.baseline, run) } : {}),
    candidates: run.candidates.slice(0, top).map((c, i) => candidateJson(p, c, i + 1, run.baseline)),
  };
}

/** The input case with the candidate's outlet, its inflow files and "$schema" pointing back at the originals. */
export function candidateCase(p: SearchProblem, json: unknown, c: Candidate, outDir: string): unknown {
  const copy = JSON.parse(JSON.stringify(json)) as Record<string, unknown>;
  const ponds = copy.ponds as { outlet: unknown }[] | undefined;
  // A system's (or a pond listed alone): each pond's outlet in its place in `ponds`.
  if (c.system) c.system.files.forEach((file, i) => (ponds![i].outlet = file));
  else if (p.listedPond !== undefined) ponds![0].outlet = c.file;
  else copy.outlet = c.file;
  rebaseCase(copy, p.case.file ? dirname(p.case.file) : process.cwd(), outDir);
  return copy;
}

/** The narrowest the status becomes in a narrowed table: "compliant, 2 warnings" stays on one line
 * (longer ones, "not compliant, 2 warnings, variant of #3", wrap) before other columns get room. */
const STATUS_WIDTH = "compliant, 2 warnings".length;

export function designText(p: SearchProblem, run: SearchRun, top: number, layout: Layout = PLAIN): string {
  const f = formatter(p.case.units);
  const w = (text: string, indent = 4) => wrap(text, layout.width, indent);
  const lines: string[] = [w(`outfit design: ${p.case.name} (${p.case.units} units)`), ...hydrologyLines(p.case, layout), ...governingLimitLines(p.case).map((line) => w(line, 4)), ""];
  if (run.shard) lines.push(w(shardWords(p, run.shard), 2), "");
  const shown = run.candidates.slice(0, top);
  const stormNames = p.targeted.map((s) => s.name);
  const freeboardStorm = p.case.criteria.freeboardStorm;
  const baseline = run.baseline;
  const columns: Column[] = [
    { head: "#", align: "right" },
    { head: "Outlet", narrow: "detail" },
    // With a bypass the target applies at the point of analysis (pond outflow plus bypass).
    ...p.targeted.map((s): Column => ({ head: `${s.name}\n${s.bypass ? "pt" : "out"}/target %`, align: "right", wrap: STORM_NAME_WIDTH })),
    { head: `Max stage\n${freeboardStorm} (${f.labels.length})`, align: "right", narrow: "detail", unit: f.labels.length },
    { head: `Freeboard left\n(${f.labels.length})`, align: "right", narrow: "detail", unit: f.labels.length },
    { head: "Cost\n(units)", align: "right" },
    ...(baseline ? [{ head: "Saving\n(units, %)", align: "right", narrow: "detail" } as Column] : []),
    { head: "Binding check", narrow: "detail" },
    { head: "Status", wrap: STATUS_WIDTH },
  ];
  /** The freeboard storm's stage and the freeboard left: a system's pond with the least left (named). */
  const freeboardOf = (c: RoutedOutlet): [string, string] => {
    if (c.system) {
      const k = c.system.routing.storms.findIndex((s) => s.storm.name === freeboardStorm);
      if (k < 0) return ["-", "-"];
      const ponds = c.system.routing.system.ponds;
      const results = c.system.routing.storms[k].result.ponds;
      const least = results.reduce((a, r, i) => (ponds[i].pond.top - r.maxStage < ponds[a].pond.top - results[a].maxStage ? i : a), 0);
      // The pond named, its unit written out (the cell is no bare number).
      return [`${f.raw.length(results[least].maxStage).toFixed(p.case.units === "US" ? 2 : 3)}`, `${f.length(ponds[least].pond.top - results[least].maxStage)} at ${ponds[least].name}`];
    }
    const fb = c.routing.storms.find((s) => s.storm.name === freeboardStorm);
    return fb ? [f.raw.length(fb.result.maxStage).toFixed(p.case.units === "US" ? 2 : 3), f.raw.length(p.case.pond.top - fb.result.maxStage).toFixed(2)] : ["-", "-"];
  };
  const row = (c: RoutedOutlet, label: string, pareto: boolean, variantOf: number | null): Row => {
    const storms = new Map(c.routing.storms.map((s) => [s.storm.name, s]));
    const status = complianceWords(c.assessment) + (variantOf !== null ? `, variant of #${variantOf}` : "");
    return [
      label,
      wrapParts(c.description, 58),
      ...stormNames.map((n) => {
        const s = storms.get(n)!;
        return (100 * s.result.peakAtPoint / s.storm.target!).toFixed(1);
      }),
      ...freeboardOf(c),
      `${c.cost.toFixed(1)}${pareto ? " *" : ""}`,
      ...(baseline ? [label === "0" ? "-" : savingCell(saving(baseline, c))] : []),
      c.assessment.binding ? `${c.assessment.binding.name}, slack ${slackText(p.case.units, c.assessment.binding)}` : "-",
      { text: status, tone: c.assessment.compliant ? "pass" : "fail" },
    ];
  };
  const rows: Row[] = [...(baseline ? [row(baseline, "0", false, null)] : []), ...shown.map((c, i) => row(c, String(i + 1), c.pareto, c.variantOf))];
  if (rows.length > 0) {
    if (!run.success && shown.length > 0) lines.push(w("No compliant design was found; the closest candidates, with the checks they fail:"), "");
    lines.push(renderTable(layout, columns, rows).text, "", w("* on the non-dominated front of cost against error among compliant candidates; cost is a relative proxy, not money.", 2));
    if (p.targeted.some((s) => s.bypass)) {
      lines.push(w("pt/target: the peak at the point of analysis, the pond's outflow (spillway included) plus the runoff bypassing the pond at each instant, over the target; the search designs to it.", 2));
    }
  }
  if (shown.length === 0) lines.push(w("No candidate kept every geometric rule; nothing to show."));
  if (baseline) {
    const system = baseline.system !== undefined;
    lines.push(
      w(system ? "Row 0 is the existing system (every pond's outlet as the case gives it), routed together and assessed as given; Saving is its cost less the alternative's." : "Row 0 is the existing outlet (the case's outlet), routed and assessed as given; Saving is its cost less the alternative's.", 2),
      "",
      w(`${system ? "Existing system" : "Existing outlet"}: ${baseline.description}`),
    );
    for (const check of baseline.assessment.checks.filter((k) => !k.passed)) lines.push(w(`  fails: ${check.name}: ${checkValue(p.case, check, check.value)} (limit ${checkValue(p.case, check, check.limit)})`));
    for (const warning of baseline.assessment.warnings) lines.push(w(`  flag: ${warning.part}: ${warning.reason}`));
    for (const line of baseline.explanation) lines.push(w(`  ${line}`));
    for (const wall of baseline.assessment.walls) for (const line of wallLines(p.case, wall.outlet, wall.plan, wall.pond)) lines.push(w(`  ${line}`, 6));
    lines.push(w(`  ${baselineVerdict(baseline, run.candidates, run.stoppedBecause)}`));
    if (p.limits.rankBy === "change") {
      lines.push(w(`  Ranked by the change measure, smallest first: ${CHANGE_WEIGHTS.addedOrRemoved} per part added or removed, ${CHANGE_WEIGHTS.resized} per part resized, ${CHANGE_WEIGHTS.moved} per part moved, plus ${CHANGE_WEIGHTS.distance} x the total move / pond depth.`));
    }
  }
  shown.forEach((c, i) => {
    lines.push("", w(`Candidate ${i + 1}: ${c.description}${c.variantOf !== null ? ` (a variant of candidate ${c.variantOf}: the same openings)` : ""}`));
    if (baseline && c.changes) {
      const existing = c.system ? "system" : "outlet";
      lines.push(w(`  against the existing ${existing}: ${describeSaving(saving(baseline, c))}; change measure ${c.changes.score.toFixed(2)}`));
      if (c.changes.changes.length === 0) lines.push(w(`  change: none (the existing ${existing} itself)`));
      for (const change of c.changes.changes) lines.push(w(`  change: ${change.text}`));
    }
    for (const check of c.assessment.checks.filter((k) => !k.passed)) lines.push(w(`  fails: ${check.name}: ${checkValue(p.case, check, check.value)} (limit ${checkValue(p.case, check, check.limit)})`));
    for (const warning of c.assessment.warnings) lines.push(w(`  flag: ${warning.part}: ${warning.reason}`));
    if (!c.system) for (const line of storageSummary(p.case, c.routing)) lines.push(w(`  ${line}`));
    for (const line of c.explanation) lines.push(w(`  ${line}`));
    if (c.spread) lines.push(w(`  ${spreadLine(p.case, c.spread)}`));
    for (const wall of c.assessment.walls) for (const line of wallLines(p.case, wall.outlet, wall.plan, wall.pond)) lines.push(w(`  ${line}`, 6));
  });
  if (!run.success) {
    lines.push("", w("No compliant design was found. Why:"));
    for (const reason of run.infeasible) lines.push(w(`  - ${reason}`));
  }
  // The rate of this run's own work (routings replayed from a journal took no time).
  const own = run.routings - run.routingsFromJournal;
  const rate = run.seconds > 0 ? Math.round(own / run.seconds) : own;
  const replayed = run.routingsFromJournal > 0 ? ` (${run.routingsFromJournal} of them replayed from the journal)` : "";
  const budget = run.timeBudget !== null ? `time budget ${run.timeBudget} s` : `budget ${run.budget} routings`;
  lines.push(
    "",
    w(`Search: ${run.success ? "compliant designs found" : "no compliant design"}; stopped because ${run.stoppedBecause}${run.interrupted ? " (a partial run: --resume goes on from its journal)" : ""}.`, 8),
    w(`        ${run.layoutsFitted} layouts fitted of ${run.layoutsPlanned} planned (${run.layoutsFromJournal} from the journal, ${run.layoutsSkipped} skipped: they cost more than their part's head) in ${run.parts} part${run.parts > 1 ? "s" : ""}${run.shard ? ` (${run.partsRun} of them in this shard)` : ""}, ${run.candidatesRouted} candidates routed, ${run.routings} routings${replayed} (${rate} per s) in ${run.seconds.toFixed(2)} s on ${run.workers} worker${run.workers > 1 ? "s" : ""}` +
      (run.secondsToFirstCompliant !== null ? `; first compliant after ${run.secondsToFirstCompliant.toFixed(2)} s` : "") +
      `; seed "${run.seed}", ${budget}${run.shard ? `, shard ${run.shard.index}/${run.shard.count}` : ""}.`, 8),
    ...(run.bestFoundAfter !== null && run.routings > 0 ? [w(`        ${bestFoundWords(run.bestFoundAfter, run.routings)}`, 8)] : []),
    "",
    w(`Caution: ${CAUTION}`, 2),
  );
  return lines.join("\n");
}

/** What a shard's output is, and what it leaves to the gather (`leftToGather`). */
export function shardWords(p: SearchProblem, shard: { index: number; count: number }): string {
  const existing = p.existing ? `the existing ${p.system ? "system" : "outlet"} routed and assessed (row 0), ` : "";
  return (
    `Shard ${shard.index}/${shard.count} of a divided search: an intermediate result, ranked among this shard's parts alone. ` +
    `outfit gather with every shard's output directory gives the ranking of one run and adds what a shard leaves out: ${existing}the moves that relax each candidate's binding check, and each one's spread.`
  );
}

/** "2.4 (12.0 %)", negative when the alternative costs more. */
function savingCell(s: ReturnType<typeof saving>): string {
  return `${s.cost.toFixed(1)}${s.fraction === null ? "" : ` (${(100 * s.fraction).toFixed(1)} %)`}`;
}

function wrapParts(text: string, width: number): string {
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
