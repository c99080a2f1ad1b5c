// Output of `design --size-pond`: the sizes tried, the chosen pond and outlet, and the size one step
// smaller that failed; as text and JSON, and the case file of the proposal.
import { formatter, trimNumber } from "../../src/format.js";
import { toCaseUnits } from "../../src/units.js";
import { stormTable, checksTable, verdictText, cautionText, wallSection, warningsText, warningCount, storageLines } from "../../src/report/console.js";
import { PLAIN, renderTable, wrap, type Column, type Layout, type Row } from "../../src/report/terminal.js";
import { routeJson } from "../../src/report/json.js";
import { jsonHead } from "../../src/report/caution.js";
import { pondFile } from "../../src/report/pondFile.js";
import { shortfallLines } from "../../src/report/shortfall.js";
import { storageShortfall } from "../../src/assess/storageShortfall.js";
import type { Case } from "../../src/model.js";
import type { SizedPond } from "../../src/storage/sizing.js";
import { candidateCase } from "./report.js";
import { pondCost, pondCostWeights } from "../../src/sizing/pondCost.js";
import { availableStorage } from "../../src/sizing/stormEstimates.js";
import { blockedWords, tradeOffTable } from "../../src/report/pondSizing.js";
import type { PondDesign, SizeTrial } from "../pond/pondDesign.js";

function sizeWords(c: Case, p: SizedPond): string {
  const f = formatter(c.units);
  const s = p.pond.storage;
  return s.kind === "prismoid" ? `${f.length(s.length, 1)} x ${f.length(s.width, 1)} floor` : `shape x ${trimNumber(p.size, 3)}`;
}

function outcome(t: SizeTrial): string {
  if (t.best) return t.how === "routed again" ? `compliant${warningCount(t.best.assessment)} (outlet of the size above, routed again)` : `compliant outlet found${warningCount(t.best.assessment)}`;
  return "no compliant outlet";
}

/** The sizes tried, narrowed to the layout: the step, the pond, its storage, the outlet's cost and
 * the result stay on the row; footprint, excavation and pond cost go below it when narrow. Every
 * cell carries its unit. */
function sizesTable(c: Case, d: PondDesign, layout: Layout): string {
  const f = formatter(c.units);
  const w = pondCostWeights(c.units, c.costs);
  const columns: Column[] = [
    { head: "Steps", align: "right" },
    { head: "Pond" },
    { head: "Storage below\nlimit level", align: "right", unit: "", label: "storage below limit level" },
    { head: "Footprint", align: "right", narrow: "detail" },
    { head: "Earthwork", align: "right", narrow: "detail", label: "earthwork (cut + fill)" },
    { head: "Pond cost", align: "right", narrow: "detail" },
    { head: "Outlet", align: "right", narrow: "detail", rank: 0, label: "outlet cost" },
    { head: "Result" },
  ];
  const rows = (mark: string): Row[] =>
    [...d.trials]
      .sort((a, b) => a.steps - b.steps)
      .map((t) => [
        String(t.steps),
        sizeWords(c, t.sized),
        f.volume(availableStorage(t.problem.case)),
        `${Math.round(f.raw.area(t.sized.topArea)).toLocaleString("en-US")} ${f.labels.length}2`,
        f.volume(t.sized.cut + t.sized.fill),
        `${pondCost(t.sized, w).toFixed(1)} units`,
        t.best ? `${t.best.cost.toFixed(1)} units` : "-",
        outcome(t) + (t === d.chosen ? mark : ""),
      ]);
  // The chosen size's mark follows its result; under it when the table had to be narrowed.
  const whole = renderTable(layout, columns, rows("  <- chosen"));
  return (whole.compact ? renderTable(layout, columns, rows("\n<- chosen")) : whole).text;
}

export function pondDesignText(c: Case, d: PondDesign, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const w = pondCostWeights(c.units, c.costs);
  const p = (text: string) => wrap(text, layout.width);
  const depth = d.choice.chosen ?? d.choice.options.find((o) => o.blocked?.kind === "site limits") ?? null;
  const lines = [
    p(`outfit design --size-pond: ${c.name} (${c.units} units)`),
    "",
    p("Depths compared for the routed estimates (the pond at each depth the smallest holding every storm's routed estimate; cost proxy: excavation, fill and land):"),
    tradeOffTable(c, d.choice, layout),
    "",
    p(depth ? `Depth: ${f.length(depth.depth)}${d.choice.chosen ? ", the cheapest" : ""}; the footprint is then found by routing catalogue outlets.` : "No depth compared can be built within the site limits."),
    "",
    p("Pond sizes tried at that depth (from the routed estimate, grown until an outlet complies, then trimmed):"),
    sizesTable(c, d, layout),
    "",
  ];
  if (d.chosen) {
    const best = d.chosen.best!;
    lines.push(
      p(`Chosen: the smallest compliant pond found: ${sizeWords(c, d.chosen.sized)}, bottom ${f.elevation(d.chosen.sized.pond.bottom)}, top ${f.elevation(d.chosen.sized.pond.top)}; total cost proxy ${d.chosen.totalCost!.toFixed(1)} units (outlet ${best.cost.toFixed(1)} + pond ${pondCost(d.chosen.sized, w).toFixed(1)}).`),
      p(d.smaller ? `One step smaller (${sizeWords(c, d.smaller.sized)}): no compliant outlet was found${d.smaller.run ? ` (${d.smaller.run.layoutsFitted} layouts fitted, ${d.smaller.run.routings} routings)` : ""}.` : "The smallest size step is compliant."),
      "",
      p(`Outlet: ${best.description}`),
      "",
      stormTable(d.chosen.problem.case, best.routing, layout),
      ...storageLines(d.chosen.problem.case, best.routing, layout),
      "",
      checksTable(d.chosen.problem.case, best.assessment.checks, layout),
      "",
      ...wallSection(d.chosen.problem.case, best.assessment, layout),
      warningsText(best.assessment, layout),
      "",
      verdictText(d.chosen.problem.case, best.assessment, layout),
    );
  } else {
    lines.push(p(`No compliant pond and outlet: ${d.stoppedBecause}.`));
    const last = [...d.trials].sort((a, b) => b.steps - a.steps)[0];
    const closest = last?.run?.candidates[0];
    if (last) {
      lines.push(...shortfallLines(last.problem.case, storageShortfall(last.problem.case, closest?.routing.storms ?? null)).map(p));
    }
  }
  lines.push("", cautionText(layout));
  return lines.join("\n");
}

export function pondDesignJson(c: Case, d: PondDesign) {
  const u = toCaseUnits(c.units);
  const w = pondCostWeights(c.units, c.costs);
  const trial = (t: SizeTrial) => ({
    steps: t.steps,
    pond: pondFile(t.sized.pond, c.units),
    provided: u.volume(availableStorage(t.problem.case)),
    footprint: u.area(t.sized.topArea),
    excavation: u.volume(t.sized.cut),
    fill: u.volume(t.sized.fill),
    land: u.area(t.sized.land),
    pondCost: pondCost(t.sized, w),
    how: t.how,
    compliant: t.best !== null,
    // Present only with a compliant outlet (no null where a number belongs).
    ...(t.best ? { outlet: t.best.file, outletCost: t.best.cost, totalCost: t.totalCost! } : {}),
  });
  return {
    ...jsonHead("design --size-pond", c),
    stoppedBecause: d.stoppedBecause,
    tradeOff: d.choice.options.map((o) => ({
      depth: u.length(o.depth),
      possible: o.blocked === null,
      chosen: o === d.choice.chosen,
      ...(o.levels ? { floor: u.length(o.levels.floor), top: u.length(o.levels.top) } : {}),
      ...(o.blocked ? { why: blockedWords(c, o.blocked) } : {}),
      ...(o.cost ? { cost: o.cost.total } : {}),
    })),
    sizes: d.trials.map(trial),
    found: d.chosen !== null,
    ...(d.chosen ? { chosen: { ...trial(d.chosen), routing: routeJson(d.chosen.problem.case, d.chosen.best!.routing, d.chosen.best!.assessment) } } : {}),
    ...(d.smaller ? { smaller: trial(d.smaller) } : {}),
  };
}

/** The case file of the proposal: the chosen pond and outlet, ready to route. */
export function pondDesignCase(d: PondDesign, outDir: string): unknown {
  const t = d.chosen!;
  return candidateCase(t.problem, t.json, t.best!, outDir);
}
