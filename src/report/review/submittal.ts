// Tables a plan reviewer checks by hand: the stage-storage-discharge table at a fine step with a row
// at every control elevation, each storm's inflow and outflow hydrographs at a readable interval,
// and the pre- against post-development comparison. Units are in the headings.
import { routedInflow } from "../../routing/durations.js";
import type { Case, Hydrograph, Outlet } from "../../model.js";
import type { StormRouting } from "../../routing/routeCase.js";
import { hydrographVolume } from "../../hydrology/hydrograph.js";
import { outletDetail } from "../../hydraulics/outlet.js";
import { storageCurve } from "../../storage/curve.js";
import { formatter, significant, trimNumber } from "../../format.js";
import { baseLength } from "../../units.js";
import { limitingPart } from "../limiting.js";
import { elementName } from "../rating.js";
import { partOf } from "../../parts/registry.js";
import { eventWindow } from "./window.js";
import type { TableBlock } from "./model.js";

/** Default stage step of the stage-storage-discharge table: 0.1 ft (US) or 0.02 m (SI). */
export function defaultStageStep(c: Case): number {
  return c.units === "US" ? 0.1 * baseLength("US") : 0.02;
}

export interface ControlLevel {
  stage: number;
  label: string;
}

/** Every control elevation between the pond bottom and the top, labelled; levels that coincide share a row. */
export function controlLevels(c: Case, outlet: Outlet): ControlLevel[] {
  const levels: ControlLevel[] = [{ stage: c.pond.bottom, label: "pond bottom" }];
  if (c.pond.pool > c.pond.bottom) levels.push({ stage: c.pond.pool, label: "permanent pool" });
  outlet.elements.forEach((e, i) => {
    const kind = partOf(e);
    levels.push({ stage: kind.bottom(e), label: `${elementName(e, i)} ${kind.bottomField}` });
  });
  if (outlet.riser) levels.push({ stage: outlet.riser.crest, label: "riser rim" });
  if (outlet.spillway) levels.push({ stage: outlet.spillway.crest, label: "spillway crest" });
  levels.push({ stage: c.pond.top - c.criteria.freeboardDepth, label: "freeboard line" });
  levels.push({ stage: c.pond.top, label: "top of embankment" });
  const merged: ControlLevel[] = [];
  for (const level of levels.filter((l) => l.stage >= c.pond.bottom - 1e-9 && l.stage <= c.pond.top + 1e-9).sort((a, b) => a.stage - b.stage)) {
    const last = merged[merged.length - 1];
    if (last && Math.abs(last.stage - level.stage) < 1e-6) last.label += `, ${level.label}`;
    else merged.push({ ...level });
  }
  return merged;
}

/** The stage-storage-discharge table from the bottom to the top at `step` (m), plus every control elevation. */
export function stageStorageDischargeTable(c: Case, outlet: Outlet, step: number): TableBlock {
  const f = formatter(c.units);
  const L = f.labels;
  const u = f.raw;
  const curve = storageCurve(c.pond);
  const controls = controlLevels(c, outlet);
  const stages = new Map<number, string>();
  const n = Math.round((c.pond.top - c.pond.bottom) / step);
  // Stages on the step's lattice in case units, so that rows read 100.00, 100.10, ...
  const origin = Math.ceil(u.length(c.pond.bottom) / u.length(step) - 1e-9) * u.length(step);
  for (let i = 0; i <= n + 1; i++) {
    const z = (origin + i * u.length(step)) / u.length(1);
    if (z > c.pond.top + 1e-9) break;
    stages.set(Number(z.toFixed(9)), "");
  }
  for (const level of controls) {
    const existing = [...stages.keys()].find((z) => Math.abs(z - level.stage) < 1e-6);
    if (existing !== undefined) stages.delete(existing);
    stages.set(level.stage, level.label);
  }
  const ordered = [...stages.entries()].sort((a, b) => a[0] - b[0]);
  const digits = c.units === "US" ? 2 : 3;
  let previous = 0;
  const rows = ordered.map(([z, label]) => {
    const d = outletDetail(outlet, c.tailwater, z);
    const volume = curve.volume(z);
    const increment = volume - previous;
    previous = volume;
    const openings = d.elements.reduce((a, b) => a + b, 0);
    return [
      u.length(z).toFixed(digits),
      label,
      Math.round(u.area(curve.area(z))).toLocaleString("en-US"),
      Math.round(u.volume(increment)).toLocaleString("en-US"),
      Math.round(u.volume(volume)).toLocaleString("en-US"),
      ...(outlet.elements.length ? [significant(u.flow(openings))] : []),
      ...(outlet.riser ? [significant(u.flow(d.rim))] : []),
      ...(outlet.spillway ? [significant(u.flow(d.spillway))] : []),
      significant(u.flow(d.total)),
      limitingPart(outlet, d),
    ];
  });
  const head = [
    `Stage (${L.length})`,
    "Control level",
    `Area (${L.area})`,
    `Incremental volume (${L.volume})`,
    `Storage (${L.volume})`,
    ...(outlet.elements.length ? [`Openings (${L.flow})`] : []),
    ...(outlet.riser ? [`Rim (${L.flow})`] : []),
    ...(outlet.spillway ? [`Spillway (${L.flow})`] : []),
    `Total outflow (${L.flow})`,
    "Limited by",
  ];
  return {
    kind: "table",
    caption: `Stage-storage-discharge at ${trimNumber(u.length(step), 3)} ${L.length} intervals, with a row at every control elevation (storage above the pond bottom; incremental volume since the row above)`,
    head,
    numeric: head.map((h) => h !== "Control level" && h !== "Limited by"),
    nowrap: head.map((h) => h === "Limited by"),
    rows,
  };
}

/** Intervals (minutes) the hydrograph tables may use; the shortest that keeps a table within MAX_ROWS. */
const INTERVALS = [1, 2, 5, 10, 15, 30, 60, 120];
const MAX_ROWS = 60;
/** A table over a window longer than this (hours) gives its times in hours. */
const HOURS_ABOVE = 6;

export function hydrographInterval(sr: StormRouting): number {
  const w = eventWindow(sr);
  const minutes = (w.end - w.start) * 60;
  return INTERVALS.find((m) => minutes / m <= MAX_ROWS) ?? INTERVALS[INTERVALS.length - 1];
}

/** Linear interpolation of a recorded series at time t (s). */
function at(times: readonly number[], values: readonly number[], t: number): number {
  if (t <= times[0]) return values[0];
  if (t >= times[times.length - 1]) return values[values.length - 1];
  let lo = 0;
  let hi = times.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (times[mid] <= t) lo = mid;
    else hi = mid;
  }
  const w = (t - times[lo]) / (times[hi] - times[lo]);
  return values[lo] + w * (values[hi] - values[lo]);
}

/**
 * One storm's inflow, outflow, stage and storage at a readable interval over the event (from the rise
 * of the inflow to the recession of the outflow; times in hours when it is long), with the peaks'
 * own rows; with a bypass, also the bypass and the flow at the point of analysis.
 */
export function hydrographTable(c: Case, sr: StormRouting, intervalMinutes?: number): TableBlock {
  const f = formatter(c.units);
  const L = f.labels;
  const u = f.raw;
  const series = sr.result.series!;
  const curve = storageCurve(c.pond);
  const interval = intervalMinutes ?? hydrographInterval(sr);
  const window = eventWindow(sr);
  const start = window.start * 3600;
  const end = window.end * 3600;
  const inHours = window.end - window.start > HOURS_ABOVE;
  const times = new Map<number, string>();
  for (let t = Math.ceil(start / (interval * 60) - 1e-9) * interval * 60; t <= end + 1e-6; t += interval * 60) times.set(Math.round(t * 1000) / 1000, "");
  const mark = (t: number, note: string) => {
    if (t > end + 1e-6 || t < start - 1e-6) return;
    const key = Math.round(t * 1000) / 1000;
    const before = times.get(key);
    times.set(key, before ? `${before}, ${note}` : note);
  };
  const bypass = series.bypass;
  mark(peakOf(routedInflow(sr.storm, sr.result)).time, "peak inflow");
  mark(sr.result.timeOfPeakOutflow, "peak outflow");
  if (bypass) mark(sr.result.timeOfPeakAtPoint, "peak at the point");
  mark(sr.result.timeOfMaxStage, "maximum stage");
  const digits = c.units === "US" ? 2 : 3;
  const rows = [...times.entries()].sort((a, b) => a[0] - b[0]).map(([t, note]) => {
    const stage = at(series.time, series.stage, t);
    const outflow = at(series.time, series.outflow, t);
    const b = bypass ? at(series.time, bypass, t) : 0;
    return [
      inHours ? trimNumber(t / 3600, 3) : trimNumber(t / 60, 1),
      significant(u.flow(at(series.time, series.inflow, t))),
      significant(u.flow(outflow)),
      ...(bypass ? [significant(u.flow(b)), significant(u.flow(outflow + b))] : []),
      u.length(stage).toFixed(digits),
      Math.round(u.volume(curve.volume(stage))).toLocaleString("en-US"),
      note,
    ];
  });
  const head = [
    inHours ? "Time (h)" : "Time (min)",
    `Inflow (${L.flow})`,
    `Outflow (${L.flow})`,
    ...(bypass ? [`Bypass (${L.flow})`, `At point (${L.flow})`] : []),
    `Stage (${L.length})`,
    `Storage (${L.volume})`,
    "Note",
  ];
  const span = inHours ? `${window.start.toFixed(2)} h to ${window.end.toFixed(2)} h` : `${trimNumber(window.start * 60, 1)} min to ${trimNumber(window.end * 60, 1)} min`;
  return {
    kind: "table",
    caption: `${sr.storm.name}: inflow and outflow${bypass ? ", bypass and the flow at the point of analysis" : ""} every ${interval} min from ${span} (the event: from the rise of the inflow to the recession of the outflow), with rows at the peaks (full series at every routing step: outfit route --csv-dir DIR)`,
    head,
    numeric: head.map((h) => h !== "Note"),
    rows,
  };
}

function peakOf(h: Hydrograph): { peak: number; time: number } {
  let best = 0;
  for (let i = 1; i < h.flows.length; i++) if (h.flows[i] > h.flows[best]) best = i;
  return { peak: h.flows[best], time: h.times[best] };
}

/** Peaks and volumes before development, after development (the inflow) and routed (the outflow). */
export function prePostTable(c: Case, sr: StormRouting, pre: Hydrograph | null): TableBlock {
  const f = formatter(c.units);
  const L = f.labels;
  const u = f.raw;
  const r = sr.result;
  const hours = (s: number) => (s / 3600).toFixed(2);
  const post = peakOf(routedInflow(sr.storm, sr.result));
  const rows: string[][] = [];
  if (pre) {
    const p = peakOf(pre);
    rows.push(["pre-development runoff", significant(u.flow(p.peak)), hours(p.time), Math.round(u.volume(hydrographVolume(pre))).toLocaleString("en-US")]);
  }
  rows.push(["post-development inflow", significant(u.flow(post.peak)), hours(post.time), Math.round(u.volume(r.volumeIn)).toLocaleString("en-US")]);
  rows.push(["routed outflow", significant(u.flow(r.peakOutflow)), hours(r.timeOfPeakOutflow), Math.round(u.volume(r.volumeOut)).toLocaleString("en-US")]);
  if (sr.storm.bypass) {
    const b = peakOf(sr.storm.bypass);
    rows.push(["bypass (joins at the point of analysis)", significant(u.flow(b.peak)), hours(b.time), Math.round(u.volume(hydrographVolume(sr.storm.bypass))).toLocaleString("en-US")]);
    rows.push(["at the point of analysis (outflow + bypass)", significant(u.flow(r.peakAtPoint)), hours(r.timeOfPeakAtPoint), "-"]);
  }
  if (sr.storm.target !== null) rows.push(["allowable release (target)", significant(u.flow(sr.storm.target)), "-", "-"]);
  return {
    kind: "table",
    caption: pre
      ? `${sr.storm.name}: pre- against post-development (routed outflow volume over the whole simulation)`
      : `${sr.storm.name}: post-development inflow against the routed outflow and the allowable release (the case gives no pre-development hydrograph; its target is a number)`,
    head: ["Hydrograph", `Peak (${L.flow})`, "Time of peak (h)", `Volume (${L.volume})`],
    numeric: [false, true, true, true],
    rows,
  };
}
