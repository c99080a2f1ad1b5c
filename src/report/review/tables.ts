// The report's tables and summaries, every number with its unit, in the case's units.
import type { Case, Outlet } from "../../model.js";
import type { CaseRouting } from "../../routing/routeCase.js";
import type { Assessment } from "../../assess/assess.js";
import { hydrographVolume } from "../../hydrology/hydrograph.js";
import { storageCurve } from "../../storage/curve.js";
import { formatter, trimNumber, type Formatter } from "../../format.js";
import { checkTitle, checkValue, hours, percent, slackText, targetText, warningCount } from "../console.js";
import { hydrographPeak, withinBand } from "../json.js";
import { furtherPointPeak } from "../../assess/rules/furtherPointPeak.js";
import { targetBand } from "../../assess/rules/band.js";
import { ruleOf } from "../../assess/rules/registry.js";
import { describeOutlet } from "../describe.js";
import { niceStep, ratingGrid, ratingRows } from "../rating.js";
import { baseLength } from "../../units.js";
import { partOf } from "../../parts/registry.js";
import { riserRow } from "../../parts/riser.js";
import { barrelRow, barrelSizeWords } from "../../parts/barrel.js";
import type { PlacedOpening, WallPlan } from "../../parts/placement.js";
import { placeWords, wallHeading } from "../wall.js";
import { spillwayRow } from "../../parts/spillway.js";
import type { Cell, FactsBlock, ListBlock, NoteBlock, TableBlock } from "./model.js";

const hoursText = (seconds: number) => `${(seconds / 3600).toFixed(2)} h`;

function storageText(c: Case, f: Formatter): string {
  const s = c.pond.storage;
  switch (s.kind) {
    case "prismoid":
      return `prismoid: ${f.length(s.length, 1)} x ${f.length(s.width, 1)} floor, side slopes ${trimNumber(s.sideSlope, 3)} H : 1 V`;
    case "stageArea":
      return `stage-area table, ${s.elevations.length} rows (conic between rows)`;
    case "stageStorage":
      return `stage-storage table, ${s.elevations.length} rows (linear between rows)`;
    case "underground": {
      const u = s.units;
      const units = u.kind === "pipeGallery"
        ? `${u.gallery.count} pipes of ${f.length(u.gallery.diameter, 2)} diameter, ${f.length(u.gallery.length, 1)} long, slope ${trimNumber(u.gallery.slope, 4)}`
        : `${u.chambers.count} chambers (stage-area table of ${u.chambers.heights.length} rows per unit)`;
      return s.stone ? `${units}, in a stone bed ${f.length(s.stone.length, 1)} x ${f.length(s.stone.width, 1)}, void ratio ${trimNumber(s.stone.voidRatio, 3)}` : units;
    }
  }
}

function tailwaterText(c: Case, f: Formatter): string {
  const t = c.tailwater;
  switch (t.kind) {
    case "free":
      return "free outfall";
    case "elevation":
      return `constant at ${f.elevation(t.elevation)}`;
    case "rating":
      return `downstream rating, ${t.flows.length} rows, ${f.elevation(t.elevations[0])} to ${f.elevation(t.elevations[t.elevations.length - 1])}`;
  }
}

/** The pond, the tailwater and the criteria. */
export function caseFacts(c: Case): FactsBlock {
  const f = formatter(c.units);
  const k = c.criteria;
  const dry = c.pond.pool <= c.pond.bottom;
  const rows: [string, string][] = [
    ["Case", c.name],
    ["Units", c.units === "US" ? "US: ft, ft3, cfs; times in minutes and hours" : "SI: m, m3, m3/s; times in minutes and hours"],
    ["Pond", `bottom ${f.elevation(c.pond.bottom)}, top of embankment ${f.elevation(c.pond.top)} (depth ${f.length(c.pond.top - c.pond.bottom)})`],
    ["Permanent pool", dry ? "none (dry pond)" : f.elevation(c.pond.pool)],
    ["Storage", storageText(c, f)],
    ["Storage at top of embankment", f.volume(storageCurve(c.pond).volume(c.pond.top))],
    ["Tailwater", tailwaterText(c, f)],
    ["Target band", `${percent(-k.under, 0)} to +${percent(k.over, 0)} of each storm's target`],
    ["Freeboard", `${f.length(k.freeboardDepth)} below the top of embankment for the ${k.freeboardStorm} storm`],
    ["Drawdown", k.drawdownHours === null ? "no limit" : `within ${trimNumber(k.drawdownHours, 2)} h of the peak stage, to ${f.length(k.drawdownDepth)} above ${dry ? "the pond bottom" : "the permanent pool"}`],
    ["Spillway dry", `storms up to ${trimNumber(k.spillwayDryThrough, 2)} yr`],
  ];
  return { kind: "facts", rows };
}

/** The storms as given: return period, target, band and inflow. */
export function stormsTable(c: Case): TableBlock {
  const f = formatter(c.units);
  // With a bypass the target applies at the point of analysis, where the bypass joins the outflow.
  const bypass = c.storms.some((s) => s.bypass);
  return {
    kind: "table",
    caption: bypass ? "Design storms (the target of a storm with a bypass applies at the point of analysis)" : "Design storms",
    head: ["Storm", "Return period", "Target", "Target band", "Peak inflow", "Inflow volume", "Inflow ends", ...(bypass ? ["Bypass peak", "Bypass volume"] : [])],
    numeric: [false, true, true, true, true, true, true, ...(bypass ? [true, true] : [])],
    rows: c.storms.map((s) => [
      s.name,
      `${trimNumber(s.returnPeriod, 2)} yr`,
      targetText(c, s),
      s.target === null ? "none" : targetBand(s.target, c.criteria).map(f.flow).join(" to "),
      f.flow(hydrographPeak(s.inflow)),
      f.volume(hydrographVolume(s.inflow)),
      hoursText(s.inflow.times[s.inflow.times.length - 1]),
      ...(bypass ? (s.bypass ? [f.flow(hydrographPeak(s.bypass)), f.volume(hydrographVolume(s.bypass))] : ["none", "-"]) : []),
    ]),
  };
}

/** Every part of the outlet with its size, elevation and coefficient. */
export function partsTable(c: Case, outlet: Outlet): TableBlock {
  const f = formatter(c.units);
  const rows = outlet.elements.map((e, i) => [`E${i + 1}`, ...partOf(e).row(e, f)]);
  if (outlet.riser) rows.push(["rim", ...riserRow(outlet.riser, f)]);
  if (outlet.barrel) rows.push(["barrel", ...barrelRow(outlet.barrel, f)]);
  if (outlet.spillway) rows.push(["spillway", ...spillwayRow(outlet.spillway, f)]);
  return { kind: "table", caption: `Outlet: ${describeOutlet(outlet, f)}`, head: ["Part", "Kind", "Size", "Elevation", "Coefficient"], numeric: [false, false, false, true, false], rows };
}

/** Where each opening sits on its wall (and the barrel's hole): one row per opening, for the drafter. */
export function wallTable(c: Case, outlet: Outlet, plan: WallPlan): TableBlock {
  const f = formatter(c.units);
  const L = f.labels.length;
  const row = (label: string, part: string, o: PlacedOpening, bottom: string) => [label, part, `${o.opening} of ${o.count}`, placeWords(o, f), f.raw.length(o.station).toFixed(2), `${bottom} ${f.elevation(o.bottom)}`, f.raw.length(o.top).toFixed(c.units === "US" ? 2 : 3), f.raw.length(o.width).toFixed(c.units === "US" ? 2 : 3)];
  const rows = plan.openings.map((o) => {
    const e = outlet.elements[o.element];
    return row(`E${o.element + 1}`, partOf(e).label(e, f), o, partOf(e).bottomField);
  });
  if (plan.barrel && outlet.barrel) rows.push(row("barrel", `${barrelSizeWords(outlet.barrel, f)} barrel`, plan.barrel, "invert"));
  const web = plan.web !== null && plan.closest ? `; the smallest clear web is ${f.size(plan.web)}` : "";
  return {
    kind: "table",
    caption: `Openings on the wall (${wallHeading(outlet, plan, f)})${web}. Station: along the developed wall from its left edge, seen from outside, as the outlet drawing shows it.`,
    head: ["Part", "Kind", "Opening", "Place", `Station (${L})`, "Invert or crest", `Top (${L})`, `Width (${L})`],
    numeric: [false, false, false, false, true, true, true, true],
    rows,
  };
}

/** The outlet's rating, grouped by part (as `outfit rate --wide`), at a round stage step; units in the headings. */
export function ratingTable(c: Case, outlet: Outlet): TableBlock {
  const f = formatter(c.units);
  const L = baseLength(c.units);
  const step = niceStep((c.pond.top - c.pond.bottom) / L) * L;
  const grid = ratingGrid(c, outlet, ratingRows(c, outlet, step));
  const head = grid.columns.map((col) => col.head.replace("\n", " "));
  return {
    kind: "table",
    caption: `Rating at ${f.length(step)} intervals: flow of each opening, the openings together, the rim, barrel and spillway, the total and the part that limits it`,
    head,
    numeric: grid.columns.map((col) => col.align === "right"),
    nowrap: grid.columns.map((col) => col.head === "Limited by"),
    rows: grid.rows,
  };
}

/** Where a peak lies against its target band, in words. */
export function bandWords(c: Case, peak: number, target: number): string {
  if (withinBand(c, peak, target)) return "in band";
  return peak > target ? "above band" : "below band";
}

/** The routed results of every storm. */
export function resultsTable(c: Case, routing: CaseRouting): TableBlock {
  const f = formatter(c.units);
  // With a bypass the target applies at the point of analysis: the pond's outflow plus the bypass.
  const atPoint = routing.storms.some(({ storm }) => storm.bypass);
  return {
    kind: "table",
    caption: atPoint ? "Routed results (at point: the pond's outflow plus the runoff bypassing the pond, summed at each instant; the target applies there)" : "Routed results",
    head: ["Storm", "Peak inflow", "Peak outflow", ...(atPoint ? ["Peak at point"] : []), "Target", atPoint ? "At point / target" : "Outflow / target", "Max stage", "Freeboard left", "Drawdown"],
    numeric: [false, true, true, ...(atPoint ? [true] : []), true, true, true, true, true],
    rows: routing.storms.map(({ storm, result }) => {
      const peak = result.peakAtPoint;
      const ratio: Cell = storm.target === null
        ? { text: "no target" }
        : { text: `${percent(peak / storm.target)}, ${bandWords(c, peak, storm.target)}`, tone: withinBand(c, peak, storm.target) ? "pass" : "fail" };
      return [
        storm.name,
        f.flow(result.peakInflow),
        f.flow(result.peakOutflow),
        ...(atPoint ? [storm.bypass ? f.flow(peak) : "-"] : []),
        storm.target === null ? "none" : f.flow(storm.target),
        ratio,
        f.elevation(result.maxStage),
        f.length(c.pond.top - result.maxStage),
        hours(result.drawdownTime === null ? null : result.drawdownTime / 3600),
      ];
    }),
  };
}

/** One storm's routing in a sentence: peaks, stage, storage, drawdown and the mass balance. */
export function stormSummary(c: Case, sr: CaseRouting["storms"][number]): string {
  const f = formatter(c.units);
  const r = sr.result;
  const target = sr.storm.target;
  const bypass = sr.storm.bypass;
  const ratio = target === null ? "no target" : `${percent(r.peakAtPoint / target)} of the target ${f.flow(target)}, ${bandWords(c, r.peakAtPoint, target)}`;
  const drawdown = r.drawdownTime === null ? "not drained within the simulation" : `drained ${hours(r.drawdownTime / 3600)} after the peak stage`;
  const peaks = bypass
    ? `peak outflow ${f.flow(r.peakOutflow)} at ${hoursText(r.timeOfPeakOutflow)}; at the point of analysis (the outflow plus the bypass, whose own peak is ${f.flow(hydrographPeak(bypass))}) ${f.flow(r.peakAtPoint)} at ${hoursText(r.timeOfPeakAtPoint)}, of it ${f.flow(r.bypassAtPeak)} bypass (${ratio})`
    : `peak outflow ${f.flow(r.peakOutflow)} at ${hoursText(r.timeOfPeakOutflow)} (${ratio})`;
  const further = sr.storm.points.map((p) => {
    const peak = furtherPointPeak(sr.storm, p, r);
    return ` At ${p.name}: ${f.flow(peak)}${p.target === null ? "" : ` (${percent(peak / p.target)} of its target ${f.flow(p.target)})`}, ${p.pond ? "the pond's outflow plus the runoff joining there" : "runoff not passing through the pond"}.`;
  });
  return `Peak inflow ${f.flow(r.peakInflow)}; ${peaks}; maximum stage ${f.elevation(r.maxStage)} at ${hoursText(r.timeOfMaxStage)}, ${f.length(c.pond.top - r.maxStage)} below the top of embankment, storing ${f.volume(r.maxStorage)}; ${drawdown}; mass balance error ${percent(r.massBalanceError, 3)}.${further.join("")}`;
}

/** Every check with value, limit and slack; the binding check marked. */
export function checksTable(c: Case, assessment: Assessment): TableBlock {
  return {
    kind: "table",
    caption: "Checks (slack: how far from failing, as a fraction of the limit; the binding check has the least)",
    head: ["Check", "Value", "Limit", "Slack", "Result"],
    numeric: [false, true, true, true, false],
    rows: assessment.checks.map((check) => {
      const binding = check === assessment.binding;
      return [
        binding ? { text: `${checkTitle(check)} (binding)`, tone: "binding" } : checkTitle(check),
        checkValue(c, check, check.value),
        `${ruleOf(check).comparison} ${checkValue(c, check, check.limit)}`,
        { text: slackText(c.units, check), tone: check.passed ? "pass" : "fail" },
        { text: check.passed ? "pass" : "FAIL", tone: check.passed ? "pass" : "fail" },
      ];
    }),
  };
}

export function warningsList(assessment: Assessment): ListBlock | NoteBlock {
  if (assessment.warnings.length === 0) return { kind: "note", tone: "pass", text: "No warnings: every part is used within the range of its formula." };
  return { kind: "list", items: assessment.warnings.map((w) => `${w.part}: ${w.reason}`) };
}

/** The verdict, with the warnings beside it (a compliant outlet with parts outside their formulas' range says so in the banner). */
export function verdictNote(c: Case, assessment: Assessment): NoteBlock {
  const b = assessment.binding;
  const binding = b ? `binding check: ${b.name}, slack ${slackText(c.units, b)}` : "no checks apply";
  const warned = assessment.warnings.length === 0 ? "" : ` (see the warnings: ${assessment.warnings.map((w) => w.part).join("; ")})`;
  return assessment.compliant
    ? { kind: "note", tone: "pass", text: `Compliant${warningCount(assessment)}: every check passes${warned}; ${binding}.` }
    : { kind: "note", tone: "fail", text: `Not compliant${warningCount(assessment)}: ${assessment.checks.filter((k) => !k.passed).length} of ${assessment.checks.length} checks fail${warned}; ${binding}.` };
}
