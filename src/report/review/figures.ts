// The report's plots, in the case's units: stage-storage, the outlet's rating with each storm's
// target and routed peak, each storm's hydrographs and stage, and the candidates of a design run.
import type { Case, Hydrograph, Outlet } from "../../model.js";
import type { StormRouting } from "../../routing/routeCase.js";
import { ratingBreaks, stageGrid } from "../../routing/ratingTable.js";
import { outletDetail } from "../../hydraulics/outlet.js";
import { formatter } from "../../format.js";
import { targetBand, type Tolerance } from "../../assess/rules/band.js";
import { describeElement } from "../describe.js";
import { niceAxis } from "../plot/ticks.js";
import { chart, type Band, type Point, type PointGroup, type ReferenceLine, type Series } from "../plot/chart.js";
import { cycleStyle, PALETTE, INK, type LineStyle } from "../plot/style.js";
import type { TimeWindow } from "./window.js";

/** A storm's target band converted for a plot axis. */
function bandIn(convert: (q: number) => number, target: number, tolerance: Tolerance): readonly [number, number] {
  const [low, high] = targetBand(target, tolerance);
  return [convert(low), convert(high)] as const;
}

/** Rating and storage curves are drawn with about this many intervals over the pond's depth. */
const CURVE_INTERVALS = 240;

const line = (colour: string, dash: LineStyle["dash"], width = 1.6): LineStyle => ({ colour, dash, width, marker: "none" });
const TOP_STYLE = line(INK, "solid", 1.8);
const FREEBOARD_STYLE = line(INK, "dash-dot");
const SPILLWAY_STYLE = line(PALETTE.orange, "dashed", 1.8);
const POOL_STYLE = line(PALETTE.skyBlue, "long-dash");
const TARGET_COLOUR = PALETTE.reddishPurple;

/** Stages from pond.bottom to pond.top with every kink of the outlet's rating as a node. */
function curveStages(c: Case, outlet: Outlet): Float64Array {
  const breaks = ratingBreaks(c.pond, outlet);
  const grid = stageGrid(c.pond, breaks, (c.pond.top - c.pond.bottom) / CURVE_INTERVALS);
  return grid.stage.filter((z) => z <= c.pond.top + 1e-9);
}

function pondReferences(c: Case, outlet: Outlet | undefined, withFreeboard: boolean): ReferenceLine[] {
  const f = formatter(c.units);
  const u = f.raw;
  const refs: ReferenceLine[] = [
    { key: "top", axis: "y", value: u.length(c.pond.top), label: `top of embankment ${f.elevation(c.pond.top)}`, style: TOP_STYLE },
  ];
  const freeboardLine = c.pond.top - c.criteria.freeboardDepth;
  // Levels that coincide share one label (two labels at one height would be drawn over each other).
  const together = withFreeboard && outlet?.spillway !== undefined && Math.abs(outlet.spillway.crest - freeboardLine) < 1e-6;
  if (withFreeboard) {
    refs.push({ key: "freeboard", axis: "y", value: u.length(freeboardLine), label: together ? "" : `freeboard line ${f.elevation(freeboardLine)} (${f.length(c.criteria.freeboardDepth)} below top)`, style: FREEBOARD_STYLE });
  }
  if (outlet?.spillway) {
    const crest = f.elevation(outlet.spillway.crest);
    const label = together ? `spillway crest = freeboard line ${crest} (${f.length(c.criteria.freeboardDepth)} below top)` : `spillway crest ${crest}`;
    refs.push({ key: "spillway", axis: "y", value: u.length(outlet.spillway.crest), label, style: SPILLWAY_STYLE });
  }
  if (c.pond.pool > c.pond.bottom) {
    refs.push({ key: "pool", axis: "y", value: u.length(c.pond.pool), label: `permanent pool ${f.elevation(c.pond.pool)}`, style: POOL_STYLE });
  }
  return refs;
}

export function storageChart(id: string, c: Case, outlet: Outlet | undefined): string {
  const f = formatter(c.units);
  const u = f.raw;
  const grid = stageGrid(c.pond, outlet ? ratingBreaks(c.pond, outlet) : [c.pond.top], (c.pond.top - c.pond.bottom) / CURVE_INTERVALS);
  const points: Point[] = [];
  grid.stage.forEach((z, i) => {
    if (z <= c.pond.top + 1e-9) points.push([u.volume(grid.storage[i]), u.length(z)]);
  });
  return chart({
    id,
    key: "stage-storage",
    title: `Stage-storage of ${c.name}`,
    description: `Storage above the pond bottom against stage, from ${f.elevation(c.pond.bottom)} to ${f.elevation(c.pond.top)}.`,
    x: { label: "Storage above pond bottom", unit: f.labels.volume, includeZero: true },
    y: { label: "Stage", unit: f.labels.length, domain: stageDomain(c) },
    series: [{ key: "storage", label: "storage", points, style: { colour: PALETTE.bluishGreen, dash: "solid", width: 2.2, marker: "none" } }],
    references: pondReferences(c, outlet, false),
  });
}

/** One series per part of the outlet (elements, rim, barrel, spillway) and the total. */
export function ratingSeries(c: Case, outlet: Outlet): Series[] {
  const f = formatter(c.units);
  const u = f.raw;
  const details = Array.from(curveStages(c, outlet), (z) => outletDetail(outlet, c.tailwater, z));
  const along = (flow: (d: (typeof details)[number]) => number): Point[] => details.map((d) => [u.flow(flow(d)), u.length(d.stage)]);
  const parts: Omit<Series, "style">[] = outlet.elements.map((e, i) => ({ key: `element-${i + 1}`, label: `E${i + 1}: ${describeElement(e, f)}`, points: along((d) => d.elements[i]) }));
  if (outlet.riser) parts.push({ key: "rim", label: `riser rim at ${f.elevation(outlet.riser.crest)}`, points: along((d) => d.rim) });
  if (outlet.barrel) parts.push({ key: "barrel", label: "barrel (all openings and rim)", points: along((d) => d.barrel ?? 0) });
  if (outlet.spillway) parts.push({ key: "spillway", label: `spillway at ${f.elevation(outlet.spillway.crest)}`, points: along((d) => d.spillway) });
  return [
    ...parts.map((p, i) => ({ ...p, points: fromLastZero(p.points), style: cycleStyle(i) })),
    { key: "total", label: "total outflow", points: along((d) => d.total), style: { colour: INK, dash: "solid", width: 2.6, marker: "none" } },
  ];
}

/** A part's curve from the last stage where it is still dry (its invert or crest) upward. */
function fromLastZero(points: readonly Point[]): readonly Point[] {
  const first = points.findIndex(([q]) => q > 0);
  return first > 0 ? points.slice(first - 1) : points;
}

/** Each storm's target at its maximum stage with the target band, and its routed peak. */
function stormPoints(c: Case, storms: readonly StormRouting[]): PointGroup[] {
  const u = formatter(c.units).raw;
  const targets = storms.filter((s) => s.storm.target !== null);
  return [
    {
      key: "targets",
      label: "target at the storm's max stage, with its band",
      style: { colour: TARGET_COLOUR, dash: "solid", width: 1.6, marker: "diamond", open: true },
      points: targets.map((s) => ({
        x: u.flow(s.storm.target!),
        y: u.length(s.result.maxStage),
        label: s.storm.name,
        xRange: bandIn(u.flow, s.storm.target!, c.criteria),
      })),
    },
    {
      key: "peaks",
      label: "routed peak outflow at max stage",
      style: { colour: INK, dash: "solid", width: 1.6, marker: "circle" },
      points: storms.map((s) => ({ x: u.flow(s.result.peakOutflow), y: u.length(s.result.maxStage) })),
    },
  ];
}

/**
 * The rating plot's flow axis (case units): up to twice the largest target band edge or routed peak,
 * so that the storms' points stay readable, and no further than the total at the top of embankment.
 * Flows beyond run off the right edge (the rating table lists them).
 */
export function ratingFlowLimit(c: Case, storms: readonly StormRouting[], totalAtTop: number): number {
  const u = formatter(c.units).raw;
  let largest = 0;
  for (const s of storms) {
    largest = Math.max(largest, u.flow(s.result.peakOutflow), s.storm.target === null ? 0 : u.flow(targetBand(s.storm.target, c.criteria)[1]));
  }
  return niceAxis(0, largest > 0 ? Math.min(totalAtTop, 2 * largest) : totalAtTop).domain[1];
}

export function ratingChart(id: string, c: Case, outlet: Outlet, storms: readonly StormRouting[]): string {
  const f = formatter(c.units);
  const series = ratingSeries(c, outlet);
  const total = series[series.length - 1].points;
  const limit = ratingFlowLimit(c, storms, total[total.length - 1][0]);
  return chart({
    id,
    key: "rating",
    title: `Rating of the outlet of ${c.name}`,
    description: "Outflow of each part of the outlet and the total against pond stage, with each storm's target band and routed peak at its maximum stage.",
    x: { label: "Outflow", unit: f.labels.flow, domain: [0, limit] },
    y: { label: "Stage", unit: f.labels.length, domain: stageDomain(c) },
    series,
    references: pondReferences(c, undefined, false),
    points: stormPoints(c, storms),
  });
}

/** Pond bottom to a little above the top of embankment, in case units. */
function stageDomain(c: Case): [number, number] {
  const u = formatter(c.units).raw;
  const bottom = u.length(c.pond.bottom);
  const top = u.length(c.pond.top);
  return [bottom, top + 0.04 * (top - bottom)];
}

/** A series cut at time `end` (hours), with the value at `end` interpolated. */
export function until(times: readonly number[], values: readonly number[], end: number): Point[] {
  const out: Point[] = [];
  for (let i = 0; i < times.length; i++) {
    if (times[i] <= end) out.push([times[i], values[i]]);
    else {
      if (i > 0 && times[i - 1] < end) {
        const w = (end - times[i - 1]) / (times[i] - times[i - 1]);
        out.push([end, values[i - 1] + w * (values[i] - values[i - 1])]);
      }
      break;
    }
  }
  return out;
}

/**
 * A storm's inflow and outflow over a time window (hours): the event, or its peak detail (`key`
 * "hydrograph-peak"). With a bypass, also the bypass and the flow at the point of analysis, to which
 * the target applies; `detail`, when given, is shaded on the event plot.
 */
export function hydrographChart(id: string, c: Case, sr: StormRouting, window: TimeWindow, key = "hydrograph", detail: TimeWindow | null = null): string {
  const f = formatter(c.units);
  const u = f.raw;
  const series = sr.result.series!;
  const hours = series.time.map((t) => t / 3600);
  const bands: Band[] = [];
  const references: ReferenceLine[] = [];
  const target = sr.storm.target;
  const bypass = series.bypass;
  if (target !== null) {
    const [from, to] = bandIn(u.flow, target, c.criteria);
    bands.push({ key: "target-band", axis: "y", from, to, label: `target band ${targetBand(target, c.criteria).map(f.flow).join(" to ")}${bypass ? " (at the point)" : ""}`, colour: TARGET_COLOUR });
    references.push({ key: "target", axis: "y", value: u.flow(target), label: `target ${f.flow(target)}`, style: line(TARGET_COLOUR, "dotted", 1.8) });
  }
  if (detail) bands.push({ key: "peak-detail", axis: "x", from: detail.start, to: detail.end, label: "shown in detail in the next figure", colour: PALETTE.skyBlue });
  const within = (values: readonly number[]) => until(hours, values, window.end).filter(([t]) => t >= window.start);
  const inWindow = (t: number) => t / 3600 >= window.start && t / 3600 <= window.end;
  const r = sr.result;
  const marks: PointGroup[] = [{
    key: "peak-outflow",
    label: "peak outflow",
    style: { colour: PALETTE.vermillion, dash: "solid", width: 1.6, marker: "circle", open: true },
    points: inWindow(r.timeOfPeakOutflow) ? [{ x: r.timeOfPeakOutflow / 3600, y: u.flow(r.peakOutflow), label: `${f.flow(r.peakOutflow)} at ${(r.timeOfPeakOutflow / 3600).toFixed(2)} h` }] : [],
  }];
  if (bypass) {
    marks.push({
      key: "peak-at-point",
      label: "peak at the point of analysis",
      style: { colour: INK, dash: "solid", width: 1.6, marker: "diamond" },
      points: inWindow(r.timeOfPeakAtPoint) ? [{ x: r.timeOfPeakAtPoint / 3600, y: u.flow(r.peakAtPoint), label: `${f.flow(r.peakAtPoint)} at the point, ${(r.timeOfPeakAtPoint / 3600).toFixed(2)} h` }] : [],
    });
  }
  return chart({
    id,
    key,
    title: `${sr.storm.name}: inflow and outflow${key === "hydrograph-peak" ? ", peak detail" : ""}`,
    description: `Inflow and routed outflow${bypass ? ", the bypass and the flow at the point of analysis" : ""} of the ${sr.storm.name} storm from ${window.start.toFixed(2)} h to ${window.end.toFixed(2)} h.`,
    x: { label: "Time from start of storm", unit: "h", domain: [window.start, window.end] },
    y: { label: "Flow", unit: f.labels.flow, includeZero: true },
    series: [
      { key: "inflow", label: "inflow", points: within(series.inflow.map(u.flow)), style: { colour: PALETTE.blue, dash: "solid", width: 2, marker: "none" } },
      { key: "outflow", label: "outflow (total)", points: within(series.outflow.map(u.flow)), style: { colour: PALETTE.vermillion, dash: "dashed", width: 2, marker: "square" } },
      ...(bypass
        ? [
            { key: "bypass", label: "bypass", points: within(bypass.map(u.flow)), style: { colour: PALETTE.bluishGreen, dash: "dotted", width: 2, marker: "triangle" } } as Series,
            { key: "at-point", label: "at the point of analysis (outflow + bypass)", points: within(series.outflow.map((q, i) => u.flow(q + bypass[i]))), style: { colour: INK, dash: "solid", width: 2.4, marker: "none" } } as Series,
          ]
        : []),
    ],
    references,
    bands,
    points: marks,
  });
}

export function stageChart(id: string, c: Case, outlet: Outlet, sr: StormRouting): string {
  const f = formatter(c.units);
  const u = f.raw;
  const series = sr.result.series!;
  const hours = series.time.map((t) => t / 3600);
  return chart({
    id,
    key: "stage",
    title: `${sr.storm.name}: stage over time`,
    description: `Pond stage during the ${sr.storm.name} storm until the pond has drained, with the top of embankment, the freeboard line and the spillway crest.`,
    x: { label: "Time from start of storm", unit: "h", includeZero: true },
    y: { label: "Stage", unit: f.labels.length, domain: stageDomain(c) },
    series: [{ key: "stage", label: "stage", points: hours.map((t, i) => [t, u.length(series.stage[i])] as const), style: { colour: PALETTE.bluishGreen, dash: "solid", width: 2.2, marker: "none" } }],
    references: pondReferences(c, outlet, true),
    points: [{
      key: "max-stage",
      label: "maximum stage",
      style: { colour: PALETTE.bluishGreen, dash: "solid", width: 1.6, marker: "triangle" },
      points: [{ x: sr.result.timeOfMaxStage / 3600, y: u.length(sr.result.maxStage), label: `${f.elevation(sr.result.maxStage)} at ${(sr.result.timeOfMaxStage / 3600).toFixed(2)} h` }],
    }],
  });
}

export interface ComparedCandidate {
  rank: number;
  outlet: Outlet;
  storms: readonly StormRouting[];
}

/** Every candidate's total rating, the storms' target bands and each candidate's routed peaks. */
export function candidatesChart(id: string, c: Case, candidates: readonly ComparedCandidate[]): string {
  const f = formatter(c.units);
  const u = f.raw;
  const styles = candidates.map((_, i) => ({ ...cycleStyle(i), width: 2.2 }));
  const series = candidates.map((k, i) => {
    return {
      key: `candidate-${k.rank}`,
      label: `candidate ${k.rank}`,
      points: Array.from(curveStages(c, k.outlet), (z) => [u.flow(outletDetail(k.outlet, c.tailwater, z).total), u.length(z)] as const),
      style: styles[i],
    };
  });
  const limit = Math.max(...candidates.map((k, i) => ratingFlowLimit(c, k.storms, series[i].points[series[i].points.length - 1][0])));
  return chart({
    id,
    key: "candidates",
    title: "Candidates compared",
    description: "Total rating of each candidate with the storms' target bands and each candidate's routed peaks.",
    x: { label: "Outflow", unit: f.labels.flow, domain: [0, limit] },
    y: { label: "Stage", unit: f.labels.length, domain: stageDomain(c) },
    series,
    // Each storm is named once, over its band; the candidates' peaks beside it are told apart by marker.
    bands: c.storms.filter((s) => s.target !== null).map((s, i) => ({
      key: `band-${i + 1}`, axis: "x" as const, from: bandIn(u.flow, s.target!, c.criteria)[0], to: bandIn(u.flow, s.target!, c.criteria)[1], label: "target band of each storm (named above it)", colour: TARGET_COLOUR, name: s.name,
    })),
    points: candidates.map((k, i) => ({
      key: `peaks-${k.rank}`,
      label: `candidate ${k.rank}: routed peaks`,
      style: { ...styles[i], open: true },
      points: k.storms.map((s) => ({ x: u.flow(s.result.peakAtPoint), y: u.length(s.result.maxStage), label: s.storm.name, showLabel: false })),
    })),
  });
}

/** Pre-development runoff, post-development inflow and routed outflow of one storm on one plot. */
export function prePostChart(id: string, c: Case, sr: StormRouting, pre: Hydrograph): string {
  const f = formatter(c.units);
  const u = f.raw;
  const series = sr.result.series!;
  const hours = series.time.map((t) => t / 3600);
  const preHours = Array.from(pre.times, (t) => t / 3600);
  const preFlows = Array.from(pre.flows, u.flow);
  const inflow = series.inflow.map(u.flow);
  const outflow = series.outflow.map(u.flow);
  // The window around the event: from shortly before the inflow or runoff rises above 1 % of its
  // peak to shortly after the outflow has fallen below 10 % of its peak and the runoff below 1 %.
  const peak = (v: readonly number[]) => v.reduce((a, b) => Math.max(a, b), 0);
  const first = (t: readonly number[], v: readonly number[], share: number) => t[Math.max(0, v.findIndex((q) => q > share * peak(v)))];
  const last = (t: readonly number[], v: readonly number[], share: number) => {
    for (let i = v.length - 1; i >= 0; i--) if (v[i] > share * peak(v)) return t[i];
    return t[t.length - 1];
  };
  const simulated = hours[hours.length - 1];
  const start = Math.max(0, Math.floor(Math.min(first(hours, inflow, 0.01), first(preHours, preFlows, 0.01)) - 0.5));
  const end = Math.min(simulated, Math.ceil(Math.max(last(hours, outflow, 0.1), last(preHours, preFlows, 0.01), last(hours, inflow, 0.01)) + 0.5));
  const within = (t: readonly number[], v: readonly number[]) => until(t, v, end).filter(([x]) => x >= start);
  const top = niceAxis(0, Math.max(peak(inflow), peak(preFlows), peak(outflow))).domain[1];
  return chart({
    id,
    key: "pre-post",
    title: `${sr.storm.name}: before and after development`,
    description: `Pre-development runoff, post-development inflow and routed outflow of the ${sr.storm.name} storm.`,
    x: { label: "Time from start of storm", unit: "h", domain: [start, end] },
    y: { label: "Flow", unit: f.labels.flow, domain: [0, top] },
    series: [
      { key: "pre", label: "pre-development runoff", points: within(preHours, preFlows), style: { colour: PALETTE.bluishGreen, dash: "dotted", width: 2.2, marker: "triangle" } },
      { key: "inflow", label: "post-development inflow", points: within(hours, inflow), style: { colour: PALETTE.blue, dash: "solid", width: 2, marker: "none" } },
      { key: "outflow", label: "routed outflow", points: within(hours, outflow), style: { colour: PALETTE.vermillion, dash: "dashed", width: 2, marker: "square" } },
    ],
  });
}
