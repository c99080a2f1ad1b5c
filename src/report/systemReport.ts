// A routed system of ponds in the console and in JSON (case-format contract, "Systems of ponds"): the
// flow reaching the outfall per storm with its target, each pond's stages and flows (forward through
// its outlet, and back), the checks named with their pond.
import type { Case, PondSystem } from "../model.js";
import type { Assessment } from "../assess/assess.js";
import type { SystemRouting } from "../routing/routeSystem.js";
import type { PondRouteResult } from "../routing/systemRouter.js";
import type { StormRouting } from "../routing/routeCase.js";
import { outfallRoutings } from "../assess/systemAssess.js";
import { outletDetail } from "../hydraulics/outlet.js";
import { formatter, significant, trimNumber } from "../format.js";
import { storageCurve } from "../storage/curve.js";
import { toCaseUnits, unitLabels } from "../units.js";
import { stormJson, verdictJson, withinBand } from "./json.js";
import { outletToFile } from "./outletFile.js";
import { wallJson } from "./wall.js";
import { describeOutlet } from "./describe.js";
import { jsonHead } from "./caution.js";
import { assessmentLines, governingLimitLines, pointLines } from "./console.js";
import { renderTable, wrap, PLAIN, type Column, type Layout, type Row } from "./terminal.js";
import type { SeriesTable } from "./series.js";

/** Where a pond's outlet drains, in words. */
export function drainsTo(system: PondSystem, index: number): string {
  const to = system.ponds[index].to;
  return to < 0 ? "the outfall" : system.ponds[to].name;
}

/** The system's chains in words: "upper -> lower -> outfall". */
export function chainWords(system: PondSystem): string {
  const heads = system.ponds.map((_, i) => i).filter((i) => !system.ponds.some((p) => p.to === i));
  return heads
    .map((i) => {
      const names = [system.ponds[i].name];
      for (let j = system.ponds[i].to; j >= 0; j = system.ponds[j].to) names.push(system.ponds[j].name);
      return [...names, "outfall"].join(" -> ");
    })
    .join("; ");
}

/** One pond's results in the case's units (the contract's fields first). */
export function pondJson(c: Case, result: PondRouteResult, target: number | null) {
  const u = toCaseUnits(c.units);
  return {
    name: result.name,
    maxStage: u.length(result.maxStage),
    peakOutflow: u.flow(result.peakOutflow),
    peakReverse: u.flow(result.peakReverse),
    massBalanceError: result.massBalanceError,
    timeOfMaxStage: result.timeOfMaxStage / 60,
    maxStorage: u.volume(result.maxStorage),
    timeOfPeakOutflow: result.timeOfPeakOutflow / 60,
    timeOfPeakReverse: result.timeOfPeakReverse / 60,
    peakInflow: u.flow(result.peakInflow),
    peakTotalInflow: u.flow(result.peakTotalInflow),
    volumeIn: u.volume(result.volumeIn),
    volumeOut: u.volume(result.volumeOut),
    volumeBack: u.volume(result.volumeBack),
    drawdownHours: result.drawdownTime === null ? null : result.drawdownTime / 3600,
    ...(target === null ? {} : { target: u.flow(target), ratio: result.peakOutflow / target }),
  };
}

/** `route --json` of a system: the flow at the outfall per storm (the single pond's fields), each pond's results, the checks. */
export function systemRouteJson(c: Case, routing: SystemRouting, assessment: Assessment) {
  const system = routing.system;
  const main = system.ponds.findIndex((p) => p.to < 0);
  const outfall = outfallRoutings(routing);
  return {
    ...jsonHead("route", c),
    ponds: system.ponds.map((p, i) => ({ name: p.name, to: p.to < 0 ? "outfall" : system.ponds[p.to].name, outlet: outletToFile(routing.outlets[i], c.units), wall: wallJson(c, routing.outlets[i], assessment.walls[i].plan) })),
    storms: routing.storms.map((s, k) => ({
      ...stormJson(c, outfall[k]),
      controlAtPeak: outletDetail(routing.outlets[main], c.tailwater, s.result.ponds[main].maxStage).control,
      ponds: s.result.ponds.map((p, i) => pondJson(c, p, s.storm.pondTargets?.[i] ?? null)),
    })),
    ...verdictJson(c, assessment),
  };
}

/** The `ponds` field a single pond written as a `ponds` list of one adds to each storm of `route --json`. */
export function singlePondJson(c: Case, s: StormRouting) {
  const r = s.result;
  const name = c.system!.ponds[0].name;
  return [pondJson(c, { ...r, name, peakReverse: 0, timeOfPeakReverse: 0, volumeBack: 0, peakTotalInflow: r.peakInflow }, null)];
}

/** The storms at the outfall: peak, target and ratio (at the point of analysis with a bypass), the system's inflow. */
function outfallTable(c: Case, routing: SystemRouting, layout: Layout): string {
  const f = formatter(c.units);
  const L = f.labels;
  // With a bypass the target applies at the point of analysis: the flow reaching the outfall plus the bypass.
  const atPoint = routing.storms.some(({ storm }) => storm.bypass);
  const columns: Column[] = [
    { head: "Storm" },
    { head: `Peak out\n(${L.flow})`, align: "right" },
    ...(atPoint ? [{ head: `At point\n(${L.flow})`, align: "right" as const }] : []),
    { head: `Target\n(${L.flow})`, align: "right" },
    { head: atPoint ? "Point/target\n(%)" : "Out/target\n(%)", align: "right" },
    { head: "Peak at\n(min)", align: "right" },
    { head: "Return\n(yr)", align: "right", narrow: "detail" },
    { head: `Peak in\n(${L.flow})`, align: "right", narrow: "detail", label: "peak inflow, all ponds" },
  ];
  const rows: Row[] = routing.storms.map(({ storm, result }) => {
    const inBand = withinBand(c, result.peakAtPoint, storm.target);
    return [
      storm.name,
      significant(f.raw.flow(result.peakOutflow)),
      ...(atPoint ? [storm.bypass ? significant(f.raw.flow(result.peakAtPoint)) : "-"] : []),
      storm.target === null ? "none" : significant(f.raw.flow(storm.target)),
      storm.target ? { text: `${((100 * result.peakAtPoint) / storm.target).toFixed(1)}${inBand ? "" : " !"}`, tone: inBand ? "pass" : "fail" } : "-",
      (result.timeOfPeakOutflow / 60).toFixed(0),
      trimNumber(storm.returnPeriod, 2),
      significant(f.raw.flow(result.peakInflow)),
    ];
  });
  const marks = routing.storms.some(({ storm, result }) => storm.target !== null && !withinBand(c, result.peakAtPoint, storm.target)) ? "\n! outside the target band" : "";
  return [renderTable(layout, columns, rows).text + marks, ...pointLines(c, outfallRoutings(routing), layout)].join("\n");
}

/** One pond's storms: stage, flows through its outlet both ways, what flowed back, drawdown. */
function pondTable(c: Case, routing: SystemRouting, index: number, layout: Layout): string {
  const f = formatter(c.units);
  const L = f.labels;
  const p = routing.system.ponds[index];
  const columns: Column[] = [
    { head: "Storm" },
    { head: `Max stage\n(${L.length})`, align: "right" },
    { head: `Peak out\n(${L.flow})`, align: "right" },
    { head: `Peak back\n(${L.flow})`, align: "right" },
    { head: "Drawdown\n(h)", align: "right" },
    { head: `Back\n(${L.volume})`, align: "right", narrow: "detail", label: "volume back" },
    { head: `Freeboard left\n(${L.length})`, align: "right", narrow: "detail" },
    { head: `Peak in\n(${L.flow})`, align: "right", narrow: "detail", label: "peak inflow, own" },
    { head: "Mass balance\n(%)", align: "right", narrow: "detail", unit: "%" },
  ];
  const rows: Row[] = routing.storms.map(({ storm, result }) => {
    const r = result.ponds[index];
    return [
      storm.name,
      f.raw.length(r.maxStage).toFixed(c.units === "US" ? 2 : 3),
      significant(f.raw.flow(r.peakOutflow)),
      significant(f.raw.flow(r.peakReverse)),
      r.drawdownTime === null ? "not drained" : (r.drawdownTime / 3600).toFixed(1),
      Math.round(f.raw.volume(r.volumeBack)).toLocaleString("en-US"),
      f.raw.length(p.pond.top - r.maxStage).toFixed(2),
      significant(f.raw.flow(r.peakInflow)),
      significant(100 * r.massBalanceError),
    ];
  });
  return renderTable(layout, columns, rows).text;
}

/** The pond's line: geometry and where its outlet drains, through what. */
function pondLines(c: Case, routing: SystemRouting, index: number, layout: Layout): string[] {
  const f = formatter(c.units);
  const p = routing.system.ponds[index];
  const pool = p.pond.pool > p.pond.bottom ? `, permanent pool ${f.elevation(p.pond.pool)}` : "";
  return [
    wrap(`Pond ${p.name}: bottom ${f.elevation(p.pond.bottom)}, top ${f.elevation(p.pond.top)}${pool}; drains into ${drainsTo(routing.system, index)} through: ${describeOutlet(routing.outlets[index], f)}`, layout.width),
  ];
}

/** `route` on a system: the outfall table, a table per pond, the checks, warnings, verdict and caution. */
export function systemRouteReport(c: Case, routing: SystemRouting, assessment: Assessment, verbose: string[] = [], layout: Layout = PLAIN): string {
  const system = routing.system;
  const lines = [
    wrap(`outfit route: ${c.name} (${c.units} units), a system of ${system.ponds.length} ponds: ${chainWords(system)}`, layout.width),
    ...system.ponds.flatMap((_, i) => pondLines(c, routing, i, layout)),
    "",
    "At the outfall (the ponds that drain there together):",
    outfallTable(c, routing, layout),
    ...governingLimitLines(c),
    ...system.ponds.flatMap((p, i) => ["", wrap(p.to < 0 ? `Pond ${p.name} (drains to the outfall):` : `Pond ${p.name} (peak out: into ${drainsTo(system, i)} through its outlet; peak back: from ${drainsTo(system, i)} through it):`, layout.width), pondTable(c, routing, i, layout)]),
    ...assessmentLines(c, assessment, verbose, layout),
  ];
  return lines.join("\n");
}

/** What the automatic step did for each storm (verbose output). */
export function systemRoutingNotes(routing: SystemRouting): string[] {
  return routing.storms.map(({ storm, result }) => {
    const step = (s: number) => (s < 120 ? `${significant(s)} s` : `${significant(s / 60)} min`);
    const tables = routing.ponds.map((p) => (p.link ? `${p.name}'s link ${p.link.up.length} x ${p.link.down.length} stages and ${p.link.difference.length} differences` : `${p.name}'s rating ${p.stage.length} stages`)).join(", ");
    return `${storm.name}: ${result.steps} steps of ${step(result.smallestStep)} to ${step(result.largestStep)} over ${(result.duration / 3600).toFixed(1)} h (${result.refinedSteps} shortened, ${result.redoneSteps} done again shorter); ${result.iterations} Newton iterations; system mass balance error ${significant(100 * result.massBalanceError)} %; ${tables}`;
  });
}

/** Every storm's routed series of a system (routed with `record`): the outfall's flow and each pond's inflow, stage, storage and flow through its outlet. */
export function systemSeries(c: Case, routing: SystemRouting, k: number): SeriesTable {
  const series = routing.storms[k].result.series;
  if (!series) throw new Error("the storm was routed without recording its series");
  const u = toCaseUnits(c.units);
  const L = unitLabels(c.units);
  const ponds = routing.system.ponds;
  const curves = ponds.map((p) => storageCurve(p.pond));
  // With a bypass, the bypass and the flow at the point of analysis (outfall + bypass) at each time.
  const bypass = series.bypass;
  const head = [
    "time (min)",
    `outfall (${L.flow})`,
    ...(bypass ? [`bypass (${L.flow})`, `at point (${L.flow})`] : []),
    ...ponds.flatMap((p) => [`${p.name} inflow (${L.flow})`, `${p.name} stage (${L.length})`, `${p.name} storage (${L.volume})`, `${p.name} outflow (${L.flow})`]),
  ];
  const rows = series.time.map((t, j) => [
    t / 60,
    u.flow(series.outfall[j]),
    ...(bypass ? [u.flow(bypass[j]), u.flow(series.outfall[j] + bypass[j])] : []),
    ...ponds.flatMap((_, i) => [u.flow(series.inflow[i][j]), u.length(series.stage[i][j]), u.volume(curves[i].volume(series.stage[i][j])), u.flow(series.outflow[i][j])]),
  ]);
  return { head, rows };
}
