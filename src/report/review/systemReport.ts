// The review report of a system of ponds routed together: the case and its ponds, each pond's storage,
// outlet and rating (a link's flow by both ponds' stages), each storm's stages of every pond and flows
// through every outlet (back flow below zero) with a table per pond, the checks per pond and at the
// outfall, the methods and the caution.
import type { Case } from "../../model.js";
import type { Assessment } from "../../assess/assess.js";
import type { SystemRouting } from "../../routing/routeSystem.js";
import { pondCase, pondRoutings } from "../../assess/systemAssess.js";
import { targetBand } from "../../assess/rules/band.js";
import { hydrographVolume } from "../../hydrology/hydrograph.js";
import { formatter, significant, trimNumber } from "../../format.js";
import { baseLength } from "../../units.js";
import { CAUTION } from "../caution.js";
import { describeOutlet } from "../describe.js";
import { hours, percent, targetText } from "../console.js";
import { withinBand } from "../json.js";
import { chainWords, drainsTo } from "../systemReport.js";
import { linkRating, stagesOf } from "../linkRating.js";
import { niceStep } from "../rating.js";
import { chart, type Band, type Point, type ReferenceLine, type Series } from "../plot/chart.js";
import { cycleStyle, INK, PALETTE } from "../plot/style.js";
import { ratingChart, storageChart, until } from "./figures.js";
import { drawingInput } from "../drawing/input.js";
import { outletDrawing } from "../drawing/outletDrawing.js";
import { casePlan } from "../../assess/rules/walls.js";
import { defaultStageStep, stageStorageDischargeTable } from "./submittal.js";
import { projectFacts } from "./project.js";
import { methodsTable } from "./methods.js";
import { checksTable, partsTable, ratingTable, stormsTable, verdictNote, wallTable, warningsList } from "./tables.js";
import { FigureCounter, section, type Cell, type FactsBlock, type ReportDocument, type Section, type TableBlock } from "./model.js";
import type { ReportInputs } from "./caseReport.js";

/** Downstream stages drawn in a link's figure. */
const LINK_CURVES = 5;

function systemFacts(c: Case, routing: SystemRouting): FactsBlock {
  const f = formatter(c.units);
  const k = c.criteria;
  return {
    kind: "facts",
    rows: [
      ["Case", c.name],
      ["Units", c.units === "US" ? "US: ft, ft3, cfs; times in minutes and hours" : "SI: m, m3, m3/s; times in minutes and hours"],
      ["Ponds", `${routing.system.ponds.length}: ${chainWords(routing.system)}`],
      ["Targets", "at the outfall: the flow of the ponds that drain there, together"],
      ["Target band", `${percent(-k.under, 0)} to +${percent(k.over, 0)} of each storm's target`],
      ["Freeboard", `${f.length(k.freeboardDepth)} below each pond's top of embankment for the ${k.freeboardStorm} storm`],
      ["Drawdown", k.drawdownHours === null ? "no limit" : `each pond within ${trimNumber(k.drawdownHours, 2)} h of its peak stage, to ${f.length(k.drawdownDepth)} above its floor or permanent pool`],
      ["Spillway dry", `storms up to ${trimNumber(k.spillwayDryThrough, 2)} yr, each pond's spillway`],
    ],
  };
}

function pondsTable(c: Case, routing: SystemRouting): TableBlock {
  const f = formatter(c.units);
  return {
    kind: "table",
    caption: "The ponds and where each outlet drains",
    head: ["Pond", "Drains into", "Bottom", "Top of embankment", "Permanent pool", "Outlet"],
    numeric: [false, false, true, true, true, false],
    rows: routing.system.ponds.map((p, i) => [p.name, drainsTo(routing.system, i), f.elevation(p.pond.bottom), f.elevation(p.pond.top), p.pond.pool > p.pond.bottom ? f.elevation(p.pond.pool) : "none", describeOutlet(routing.outlets[i], f)]),
  };
}

/** A link's flow against its pond's stage, for a few stages of the pond downstream (back flow below zero). */
function linkChart(id: string, c: Case, routing: SystemRouting, index: number): string {
  const f = formatter(c.units);
  const u = f.raw;
  const system = routing.system;
  const p = system.ponds[index];
  const d = system.ponds[p.to].pond;
  const L = baseLength(c.units);
  const step = niceStep((p.pond.top - p.pond.bottom) / L) * L / 4;
  const downs = stagesOf(d.bottom, d.top, (d.top - d.bottom) / (LINK_CURVES - 1));
  const up = stagesOf(p.pond.bottom, p.pond.top, step);
  const series: Series[] = downs.map((y, k) => ({
    key: `down-${k + 1}`,
    label: `${system.ponds[p.to].name} at ${f.elevation(y)}`,
    points: up.map((x) => [u.flow(linkFlowAt(routing, index, x, y)), u.length(x)] as const),
    style: cycleStyle(k),
  }));
  return chart({
    id,
    key: "link",
    title: `${p.name} into ${system.ponds[p.to].name}: flow by both stages`,
    description: `Flow through the outlet of ${p.name} against its stage, one curve per stage of ${system.ponds[p.to].name}; negative flow runs back into ${p.name}.`,
    x: { label: "Flow into the pond downstream", unit: f.labels.flow },
    y: { label: `Stage of ${p.name}`, unit: f.labels.length, domain: [u.length(p.pond.bottom), u.length(p.pond.top)] },
    series,
    references: [{ key: "zero", axis: "x", value: 0, label: "no flow", style: { colour: INK, dash: "dotted", width: 1, marker: "none" } }],
  });
}

function linkFlowAt(routing: SystemRouting, index: number, up: number, down: number): number {
  return routing.ponds[index].link!.flow(up, down);
}

/** The link's table of flows at round stages of both ponds. */
function linkTable(c: Case, routing: SystemRouting, index: number): TableBlock {
  const f = formatter(c.units);
  const system = routing.system;
  const p = system.ponds[index];
  const d = system.ponds[p.to];
  const L = baseLength(c.units);
  const rating = linkRating(system, index, niceStep((p.pond.top - p.pond.bottom) / L) * L, (niceStep((d.pond.top - d.pond.bottom) / L) * L) * 4);
  return {
    kind: "table",
    caption: `Flow (${f.labels.flow}) from ${p.name} into ${d.name} by the stage of ${p.name} (rows) and of ${d.name} (columns); negative: back into ${p.name}. Direct evaluation of the parts (outfit rate --pond ${p.name} --wide gives every step)`,
    head: [`${p.name} (${f.labels.length})`, ...rating.down.map((y) => `${d.name} ${f.elevation(y)}`)],
    numeric: [true, ...rating.down.map(() => true)],
    rows: rating.up.map((x, i) => [f.raw.length(x).toFixed(c.units === "US" ? 2 : 3), ...rating.flows[i].map((q) => significant(f.raw.flow(q)))]),
  };
}

function pondSection(c: Case, routing: SystemRouting, index: number, figures: FigureCounter, inputs: ReportInputs): Section {
  const p = routing.system.ponds[index];
  const view = pondCase(c, routing.system, index);
  const outlet = routing.outlets[index];
  const f = formatter(c.units);
  const routed = pondRoutings(routing, index);
  const plan = casePlan(view, outlet, routed);
  const blocks = [
    figures.figure(`pond-${index + 1}-storage`, `${p.name}: stage-storage`, `Storage of ${p.name} above its bottom (${f.elevation(p.pond.bottom)}) against stage, up to its top of embankment (${f.elevation(p.pond.top)}).`, (id) => storageChart(id, view, outlet)),
    partsTable(view, outlet),
    ...(plan.openings.length ? [wallTable(view, outlet, plan)] : []),
    figures.figure(
      `pond-${index + 1}-outlet-drawing`,
      `${p.name}: outlet structure, elevation`,
      `The outlet of ${p.name} (draining into ${drainsTo(routing.system, index)}) drawn to one scale across and up: left, a section through the ${outlet.riser ? "riser" : "headwall"} with the pond floor, the barrel leaving its base, the top of embankment, the spillway crest and the freeboard line; right, the ${outlet.riser ? "riser's wall developed (its perimeter unrolled)" : "headwall"} seen from outside, with every opening at its elevation and at the place the wall table gives it; dashed: each storm's peak stage in ${p.name}.`,
      (id) => outletDrawing(id, drawingInput(view, outlet, routed, plan)),
    ),
    ...(p.to < 0
      ? [
          figures.figure(`pond-${index + 1}-rating`, `${p.name}: rating, part by part`, "Outflow of each part and the total (thick solid) against stage, under the case's tailwater. Diamonds: each storm's target at the outfall at this pond's maximum stage; dots: this pond's routed peak outflow.", (id) => ratingChart(id, view, outlet, routed.map((s, k) => ({ ...s, storm: { ...s.storm, target: c.storms[k].target } })))),
          ratingTable(view, outlet),
          stageStorageDischargeTable(view, outlet, inputs.stageStep ?? defaultStageStep(view)),
        ]
      : [
          figures.figure(`pond-${index + 1}-link`, `${p.name}: flow into ${drainsTo(routing.system, index)} by both stages`, `Flow through the outlet of ${p.name} against its stage, one curve per stage of ${drainsTo(routing.system, index)} (the router's table over both stages); where the pond downstream stands higher the flow runs back (negative).`, (id) => linkChart(id, c, routing, index)),
          linkTable(c, routing, index),
        ]),
  ];
  return section(`pond-${index + 1}`, `Pond ${p.name}`, blocks);
}

/** Points kept per plotted series: each run of points keeps its lowest and highest (so peaks stay), in time order. */
const PLOTTED_POINTS = 1200;

function thinned(points: readonly Point[]): Point[] {
  if (points.length <= PLOTTED_POINTS) return [...points];
  const runs = PLOTTED_POINTS / 2;
  const out: Point[] = [];
  for (let r = 0; r < runs; r++) {
    const from = Math.floor((r * points.length) / runs);
    const to = Math.floor(((r + 1) * points.length) / runs);
    let low = from;
    let high = from;
    for (let i = from; i < to; i++) {
      if (points[i][1] < points[low][1]) low = i;
      if (points[i][1] > points[high][1]) high = i;
    }
    for (const i of low === high ? [low] : [Math.min(low, high), Math.max(low, high)]) out.push(points[i]);
  }
  if (out[out.length - 1] !== points[points.length - 1]) out.push(points[points.length - 1]);
  return out;
}

/** Hours shown in a storm's stage plot: the whole simulation. */
function windowOf(routing: SystemRouting, k: number): [number, number] {
  const series = routing.storms[k].result.series!;
  return [series.time[0] / 3600, series.time[series.time.length - 1] / 3600];
}

/**
 * Hours shown in a storm's flow plot: the event, from a tenth of an hour before the ponds' inflow first
 * reaches EVENT_SHARE of its peak to a tenth of the event's length after every flow shown has last
 * fallen below that share of its own peak.
 */
function eventOf(routing: SystemRouting, k: number): [number, number] {
  const series = routing.storms[k].result.series!;
  const n = series.time.length;
  const ponds = routing.system.ponds;
  const total = series.time.map((_, j) => ponds.reduce((sum, _p, i) => sum + series.inflow[i][j], 0));
  const lines = [total, series.outfall, ...ponds.flatMap((p, i) => (p.to < 0 ? [] : [series.outflow[i]]))];
  let first = n - 1;
  let last = 0;
  for (const values of lines) {
    let peak = 0;
    for (const v of values) peak = Math.max(peak, Math.abs(v));
    if (!(peak > 0)) continue;
    for (let j = 0; j < n; j++) {
      if (Math.abs(values[j]) < EVENT_SHARE * peak) continue;
      if (values === total) first = Math.min(first, j);
      last = Math.max(last, j);
    }
  }
  if (last <= first) return windowOf(routing, k);
  const [start, end] = [series.time[first] / 3600, series.time[last] / 3600];
  return [Math.max(series.time[0] / 3600, start - 0.1 * (end - start) - 0.1), Math.min(series.time[n - 1] / 3600, end + 0.1 * (end - start) + 0.1)];
}
const EVENT_SHARE = 0.1;

/** A series between two times (hours), the values at the ends interpolated. */
function between(times: readonly number[], values: readonly number[], [start, end]: [number, number]): Point[] {
  const points = until(times, values, end);
  let i = 0;
  while (i < points.length - 1 && points[i + 1][0] <= start) i++;
  return thinned(points.slice(i));
}

function stagesChart(id: string, c: Case, routing: SystemRouting, k: number): string {
  const f = formatter(c.units);
  const u = f.raw;
  const series = routing.storms[k].result.series!;
  const window = windowOf(routing, k);
  const hoursOf = series.time.map((t) => t / 3600);
  const ponds = routing.system.ponds;
  const references: ReferenceLine[] = ponds.map((p, i) => ({ key: `top-${i + 1}`, axis: "y", value: u.length(p.pond.top), label: `top of ${p.name} ${f.elevation(p.pond.top)}`, style: { ...cycleStyle(i), width: 1, marker: "none", dash: "dash-dot" } }));
  return chart({
    id,
    key: "stages",
    title: `${routing.storms[k].storm.name}: stage of each pond`,
    description: `Stage of every pond over the whole simulation (${window[1].toFixed(1)} h), with each pond's top of embankment.`,
    x: { label: "Time from start of storm", unit: "h", domain: window },
    y: { label: "Stage", unit: f.labels.length },
    series: ponds.map((p, i): Series => ({ key: `stage-${i + 1}`, label: `${p.name}`, points: between(hoursOf, series.stage[i].map(u.length), window), style: { ...cycleStyle(i), width: 2 } })),
    references,
  });
}

function flowsChart(id: string, c: Case, routing: SystemRouting, k: number): string {
  const f = formatter(c.units);
  const u = f.raw;
  const { storm, result } = routing.storms[k];
  const series = result.series!;
  const window = eventOf(routing, k);
  const hoursOf = series.time.map((t) => t / 3600);
  const ponds = routing.system.ponds;
  const total = series.time.map((_, j) => ponds.reduce((sum, _p, i) => sum + series.inflow[i][j], 0));
  const bands: Band[] = [];
  const references: ReferenceLine[] = [{ key: "zero", axis: "y", value: 0, label: "", style: { colour: INK, dash: "dotted", width: 1, marker: "none" } }];
  if (storm.target !== null) {
    const [low, high] = targetBand(storm.target, c.criteria);
    bands.push({ key: "target-band", axis: "y", from: u.flow(low), to: u.flow(high), label: `target band ${series.bypass ? "at the point of analysis" : "at the outfall"} ${[low, high].map(f.flow).join(" to ")}`, colour: PALETTE.reddishPurple });
  }
  const links: Series[] = ponds.flatMap((p, i) => (p.to < 0 ? [] : [{ key: `link-${i + 1}`, label: `${p.name} into ${ponds[p.to].name} (below 0: back)`, points: between(hoursOf, series.outflow[i].map(u.flow), window), style: { ...cycleStyle(i + 2), width: 1.8 } }]));
  // With a bypass the target applies at the point of analysis: the flow reaching the outfall plus the bypass.
  const bypass = series.bypass;
  const atPoint: Series[] = bypass
    ? [
        { key: "bypass", label: "bypass", points: between(hoursOf, bypass.map(u.flow), window), style: { colour: PALETTE.bluishGreen, dash: "dotted", width: 2, marker: "triangle" } },
        { key: "at-point", label: "at the point of analysis (outfall + bypass)", points: between(hoursOf, series.outfall.map((q, j) => u.flow(q + bypass[j])), window), style: { colour: INK, dash: "solid", width: 2.4, marker: "none" } },
      ]
    : [];
  return chart({
    id,
    key: "flows",
    title: `${storm.name}: flows`,
    description: `The ponds' inflows together, the flow reaching the outfall${bypass ? ", the bypass and the flow at the point of analysis" : ""} and the flow through every link between ponds (negative where it runs back) from ${window[0].toFixed(1)} to ${window[1].toFixed(1)} h.`,
    x: { label: "Time from start of storm", unit: "h", domain: window },
    y: { label: "Flow", unit: f.labels.flow, includeZero: true },
    series: [
      { key: "inflow", label: "inflow, all ponds", points: between(hoursOf, total.map(u.flow), window), style: { colour: PALETTE.blue, dash: "solid", width: 2, marker: "none" } },
      { key: "outfall", label: "at the outfall", points: between(hoursOf, series.outfall.map(u.flow), window), style: { colour: PALETTE.vermillion, dash: "dashed", width: 2, marker: "square" } },
      ...atPoint,
      ...links,
    ],
    bands,
    references,
  });
}

/** Each pond's results in one storm. */
function pondResultsTable(c: Case, routing: SystemRouting, k: number): TableBlock {
  const f = formatter(c.units);
  const { storm, result } = routing.storms[k];
  return {
    kind: "table",
    caption: `${storm.name}: each pond (peak out: forward through its own outlet; peak back: through it from the pond downstream)`,
    head: ["Pond", "Max stage", "Freeboard left", "Peak out", "Peak back", "Volume back", "Drawdown", "Mass balance"],
    numeric: [false, true, true, true, true, true, true, true],
    rows: result.ponds.map((r, i) => {
      const p = routing.system.ponds[i];
      return [p.name, f.elevation(r.maxStage), f.length(p.pond.top - r.maxStage), f.flow(r.peakOutflow), f.flow(r.peakReverse), f.volume(r.volumeBack), hours(r.drawdownTime === null ? null : r.drawdownTime / 3600), `${significant(100 * r.massBalanceError)} %`];
    }),
  };
}

/** The flow reaching the outfall per storm, against its target (at the point of analysis where a storm has a bypass). */
function outfallTable(c: Case, routing: SystemRouting): TableBlock {
  const f = formatter(c.units);
  const atPoint = routing.storms.some(({ storm }) => storm.bypass);
  return {
    kind: "table",
    caption: atPoint
      ? "At the outfall: the ponds that drain there, together; at point: that flow plus the runoff bypassing the ponds, summed at each instant (the target applies there)"
      : "At the outfall: the ponds that drain there, together",
    head: ["Storm", "Inflow, all ponds", "Peak at the outfall", ...(atPoint ? ["Peak at point"] : []), "Target", atPoint ? "Point / target" : "Outflow / target", "Inflow volume", "Mass balance"],
    numeric: [false, true, true, ...(atPoint ? [true] : []), true, true, true, true],
    rows: routing.storms.map(({ storm, result }) => {
      const peak = result.peakAtPoint;
      const ratio: Cell = storm.target === null ? { text: "no target" } : { text: percent(peak / storm.target), tone: withinBand(c, peak, storm.target) ? "pass" : "fail" };
      return [storm.name, f.flow(result.peakInflow), f.flow(result.peakOutflow), ...(atPoint ? [storm.bypass ? f.flow(peak) : "-"] : []), storm.target === null ? "none" : targetText(c, storm), ratio, f.volume(result.volumeIn), `${significant(100 * result.massBalanceError)} %`];
    }),
  };
}

/** The system at a readable interval: inflow, every pond's stage and outlet flow, the outfall. */
function systemHydrographTable(c: Case, routing: SystemRouting, k: number, intervalMinutes?: number): TableBlock {
  const f = formatter(c.units);
  const u = f.raw;
  const { storm, result } = routing.storms[k];
  const series = result.series!;
  const [from, to] = eventOf(routing, k).map((h) => h * 3600);
  const interval = intervalMinutes ?? [5, 10, 15, 30, 60, 120].find((m) => (to - from) / 60 / m <= 60) ?? 120;
  const start = Math.floor(from / (interval * 60)) * interval * 60;
  const ponds = routing.system.ponds;
  const at = (values: readonly number[], t: number) => {
    let j = 0;
    while (j < series.time.length - 2 && series.time[j + 1] < t) j++;
    const w = Math.min(1, Math.max(0, (t - series.time[j]) / (series.time[j + 1] - series.time[j])));
    return values[j] + w * (values[j + 1] - values[j]);
  };
  const rows: string[][] = [];
  for (let t = start; t <= to + 1e-6; t += interval * 60) {
    rows.push([
      trimNumber(t / 60, 1),
      significant(u.flow(ponds.reduce((sum, _p, i) => sum + at(series.inflow[i], t), 0))),
      ...ponds.flatMap((p, i) => [u.length(at(series.stage[i], t)).toFixed(c.units === "US" ? 2 : 3), ...(p.to < 0 ? [] : [significant(u.flow(at(series.outflow[i], t)))])]),
      significant(u.flow(at(series.outfall, t))),
    ]);
  }
  const head = ["Time (min)", `Inflow (${f.labels.flow})`, ...ponds.flatMap((p) => [`${p.name} stage (${f.labels.length})`, ...(p.to < 0 ? [] : [`${p.name} out (${f.labels.flow})`])]), `Outfall (${f.labels.flow})`];
  return {
    kind: "table",
    caption: `${storm.name}: every ${interval} min from ${(start / 3600).toFixed(2)} to ${(to / 3600).toFixed(2)} h, the event (full series at every routing step: outfit route --csv-dir DIR)`,
    head,
    numeric: head.map(() => true),
    rows,
  };
}

/** The report of a system of ponds routed together. */
export function systemCaseReport(c: Case, routing: SystemRouting, assessment: Assessment, source: string, inputs: ReportInputs): ReportDocument {
  const figures = new FigureCounter();
  const system = routing.system;
  const ponds = section("ponds", "System of ponds", [
    pondsTable(c, routing),
    {
      kind: "text",
      text: "All ponds are routed together at every step. A pond's outlet that drains into another pond has that pond's stage as its downstream level, and carries water back when that level is higher, through the same parts with the two levels swapped. Targets apply to the flow reaching the outfall; every other check applies to each pond.",
    },
  ], system.ponds.map((_, i) => pondSection(c, routing, i, figures, inputs)));
  const stormSections = routing.storms.map((s, k) =>
    section(`storm-${k + 1}`, `${s.storm.name} storm (${s.storm.returnPeriod} yr)`, [
      { kind: "text", text: `Inflow of all ponds ${f(c).flow(s.result.peakInflow)} at its peak, ${f(c).volume(hydrographVolume(s.storm.inflow))} in all; at the outfall ${f(c).flow(s.result.peakOutflow)} at ${(s.result.timeOfPeakOutflow / 3600).toFixed(2)} h; system mass balance error ${significant(100 * s.result.massBalanceError)} %.` },
      figures.figure(`storm-${k + 1}-stages`, `${s.storm.name}: stage of each pond`, "Stage of every pond against time, each with its top of embankment (dash-dot, in its colour).", (id) => stagesChart(id, c, routing, k)),
      figures.figure(`storm-${k + 1}-flows`, `${s.storm.name}: flows`, "The ponds' inflows together (solid), the flow reaching the outfall (dashed, squares) with its target band, and the flow through each link between ponds: below zero it runs back into the pond upstream. The event only: from shortly before the inflow reaches 5 % of its peak until every flow shown has fallen below 5 % of its own.", (id) => flowsChart(id, c, routing, k)),
      pondResultsTable(c, routing, k),
      systemHydrographTable(c, routing, k, inputs.hydrographInterval),
    ]),
  );
  const storms = section("storms", "Storms routed", [outfallTable(c, routing)], stormSections);
  const checks = section("checks", "Checks", [verdictNote(c, assessment), checksTable(c, assessment), { kind: "text", text: "Warnings:" }, warningsList(assessment)]);
  return {
    title: `Review report: ${c.name}`,
    subtitle: `The system of ponds of case file ${source}, routed together and checked by outfit.`,
    verdict: verdictNote(c, assessment),
    project: projectFacts(inputs.project, inputs.run),
    caution: CAUTION,
    sections: [
      section("summary", "Case", [systemFacts(c, routing), stormsTable(c)]),
      ponds,
      storms,
      checks,
      section("methods", "Methods and sources", [methodsTable(c, routing.outlets, null, true)]),
      section("caution", "Caution", [{ kind: "note", tone: "caution", text: CAUTION }]),
    ],
  };
}

function f(c: Case) {
  return formatter(c.units);
}
