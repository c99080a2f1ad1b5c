// The outlet's stage-discharge table for `outfit rate`: every part's flow, storage and the control.
import type { Case, Element, Outlet } from "../model.js";
import { outletDetail, type OutletDetail } from "../hydraulics/outlet.js";
import { storageCurve } from "../storage/curve.js";
import { formatter, significant } from "../format.js";
import { toCaseUnits } from "../units.js";
import { limitingPart, NOTICEABLE_REDUCTION, throttling } from "./limiting.js";
import { PLAIN, renderTable, wrap, type Column, type Layout } from "./terminal.js";
import { CAUTION, jsonHead } from "./caution.js";
import { describeOutlet } from "./describe.js";
import { barrelRise } from "../parts/barrel.js";
import { partOf } from "../parts/registry.js";

export interface RatingRow {
  detail: OutletDetail;
  storage: number;
}

/** A display step of about 24 rows over the pond's depth, rounded to 1, 2 or 5 times a power of ten. */
export function niceStep(depthInCaseUnits: number): number {
  const raw = depthInCaseUnits / 24;
  const power = Math.pow(10, Math.floor(Math.log10(raw)));
  // A depth a rounding error off a round number (6.000000000000015 ft) still gives its round step.
  const scaled = raw / power - 1e-9;
  return (scaled <= 1 ? 1 : scaled <= 2 ? 2 : scaled <= 2.5 ? 2.5 : scaled <= 5 ? 5 : 10) * power;
}

/** Rows from pond.bottom to pond.top at `step` (m). */
export function ratingRows(c: Case, outlet: Outlet, step: number): RatingRow[] {
  const curve = storageCurve(c.pond);
  const rows: RatingRow[] = [];
  const n = Math.round((c.pond.top - c.pond.bottom) / step);
  for (let i = 0; i <= n + 1e-9; i++) {
    let stage = Math.min(c.pond.bottom + i * step, c.pond.top);
    // A stage a rounding error short of the top is the top (so the top is not listed twice).
    if (c.pond.top - stage < 1e-9 * step) stage = c.pond.top;
    rows.push({ detail: outletDetail(outlet, c.tailwater, stage), storage: curve.volume(stage) });
    if (stage >= c.pond.top) break;
  }
  if (rows[rows.length - 1].detail.stage < c.pond.top) {
    rows.push({ detail: outletDetail(outlet, c.tailwater, c.pond.top), storage: curve.volume(c.pond.top) });
  }
  return rows;
}

/** An element by its number and kind's short name: "E2 v-notch". */
export function elementName(e: Element, index: number): string {
  return `E${index + 1} ${partOf(e).column}`;
}

/** One name per part, in the order of `partFlows`: "E1 orifice", ..., "rim", "barrel", "spillway". */
export function partColumns(outlet: Outlet): string[] {
  const names = outlet.elements.map(elementName);
  if (outlet.riser) names.push("rim");
  if (outlet.barrel) names.push("barrel");
  if (outlet.spillway) names.push("spillway");
  return names;
}

export function partFlows(outlet: Outlet, d: OutletDetail): number[] {
  const flows = [...d.elements];
  if (outlet.riser) flows.push(d.rim);
  if (outlet.barrel) flows.push(d.barrel ?? 0);
  if (outlet.spillway) flows.push(d.spillway);
  return flows;
}

/** Chamber level above the barrel's inlet invert over the barrel's rise. */
function headwaterRatio(outlet: Outlet, d: OutletDetail): number {
  return (d.chamber! - outlet.barrel!.inletInvert) / barrelRise(outlet.barrel!);
}

/**
 * The rating as a table grouped by what the parts are: each opening (dropped when narrow), the
 * openings together, the rim, the barrel, the spillway, the total, the chamber and the limiting
 * part. Bare numbers; units in the headings.
 */
export function ratingGrid(c: Case, outlet: Outlet, rows: readonly RatingRow[]): { columns: Column[]; rows: string[][] } {
  const f = formatter(c.units);
  const L = f.labels;
  const q = (x: number) => significant(f.raw.flow(x));
  const columns: Column[] = [
    { head: `Stage\n(${L.length})`, align: "right" },
    { head: `Storage\n(${L.volume})`, align: "right" },
    ...outlet.elements.map((e, i): Column => ({ head: `${elementName(e, i)}\n(${L.flow})`, align: "right", narrow: "drop" })),
    ...(outlet.elements.length ? [{ head: `Openings\n(${L.flow})`, align: "right" } as Column] : []),
    ...(outlet.riser ? [{ head: `Rim\n(${L.flow})`, align: "right" } as Column] : []),
    ...(outlet.barrel ? [{ head: `Barrel\n(${L.flow})`, align: "right", narrow: "drop" } as Column] : []),
    ...(outlet.spillway ? [{ head: `Spillway\n(${L.flow})`, align: "right" } as Column] : []),
    { head: `Total\n(${L.flow})`, align: "right" },
    ...(outlet.barrel ? [{ head: `Chamber\n(${L.length})`, align: "right", narrow: "drop" } as Column, { head: "Barrel\nHW/D", align: "right", narrow: "drop" } as Column] : []),
    { head: "Limited by" },
  ];
  const body = rows.map(({ detail: d, storage }) => [
    f.raw.length(d.stage).toFixed(c.units === "US" ? 2 : 3),
    Math.round(f.raw.volume(storage)).toLocaleString("en-US"),
    ...d.elements.map(q),
    ...(outlet.elements.length ? [q(d.elements.reduce((a, b) => a + b, 0))] : []),
    ...(outlet.riser ? [q(d.rim)] : []),
    ...(outlet.barrel ? [q(d.barrel ?? 0)] : []),
    ...(outlet.spillway ? [q(d.spillway)] : []),
    q(d.total),
    ...(outlet.barrel ? [d.chamber === null ? "-" : f.raw.length(d.chamber).toFixed(c.units === "US" ? 2 : 3), d.chamber === null ? "-" : headwaterRatio(outlet, d).toFixed(2)] : []),
    limitingPart(outlet, d),
  ]);
  return { columns, rows: body };
}

/** Whether some stage of the table has the chamber cutting the openings' flow noticeably. */
export function chamberThrottles(outlet: Outlet, rows: readonly RatingRow[]): boolean {
  return outlet.barrel !== undefined && rows.some((r) => throttling(outlet, r.detail) > NOTICEABLE_REDUCTION);
}

export function ratingText(c: Case, outlet: Outlet, rows: RatingRow[], layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const grid = ratingGrid(c, outlet, rows);
  const table = renderTable(layout, grid.columns, grid.rows);
  const lines = [wrap(`outfit rate: ${c.name} (${c.units} units)`, layout.width), wrap(`Parts: ${describeOutlet(outlet, f)}`, layout.width), "", table.text];
  if (table.dropped.length) lines.push("", wrap(`Not shown at this width: ${table.dropped.join(", ")} (--wide shows them; --csv lists them).`, layout.width));
  lines.push("", wrap(`Limited by: the part that sets the total at that stage; the barrel (or tailwater) is named only where it cuts the openings' own flow by more than ${100 * NOTICEABLE_REDUCTION} %.`, layout.width));
  const bypassed = c.storms.filter((s) => s.bypass).map((s) => s.name);
  if (bypassed.length > 0) {
    // The rating is the pond's alone; where a bypass joins it, the target is judged on the sum.
    lines.push("", wrap(`The ${bypassed.join(", ")} storm${bypassed.length > 1 ? "s have" : " has"} a bypass: the target applies at the point of analysis, this total plus the bypass at each instant (outfit route shows the sum).`, layout.width));
  }
  lines.push("", wrap(`Caution: ${CAUTION}`, layout.width));
  return lines.join("\n");
}

export function ratingCsv(c: Case, outlet: Outlet, rows: RatingRow[]): string {
  const u = toCaseUnits(c.units);
  const L = formatter(c.units).labels;
  const names = partColumns(outlet).map((n) => `${n} (${L.flow})`);
  const head = [
    `stage (${L.length})`,
    `storage (${L.volume})`,
    ...names,
    `total (${L.flow})`,
    ...(outlet.barrel ? [`chamber (${L.length})`, "barrel HW/D", "barrel control"] : []),
    "control",
  ];
  const lines = [head.join(",")];
  for (const { detail, storage } of rows) {
    lines.push(
      [
        u.length(detail.stage).toFixed(4),
        u.volume(storage).toFixed(2),
        ...partFlows(outlet, detail).map((q) => significant(u.flow(q))),
        significant(u.flow(detail.total)),
        ...(outlet.barrel
          ? [detail.chamber === null ? "" : u.length(detail.chamber).toFixed(4), detail.chamber === null ? "" : headwaterRatio(outlet, detail).toFixed(4), detail.barrelControl ?? ""]
          : []),
        detail.control,
      ].join(","),
    );
  }
  return lines.join("\n") + "\n";
}

export function ratingJson(c: Case, outlet: Outlet, rows: RatingRow[]) {
  const u = toCaseUnits(c.units);
  return {
    ...jsonHead("rate", c),
    parts: partColumns(outlet),
    rows: rows.map(({ detail, storage }) => ({
      stage: u.length(detail.stage),
      storage: u.volume(storage),
      elements: detail.elements.map((q) => u.flow(q)),
      rim: u.flow(detail.rim),
      // The barrel's, chamber's and tailwater's keys only where they have a value (no null where a number belongs).
      ...(detail.barrel !== null ? { barrel: u.flow(detail.barrel) } : {}),
      spillway: u.flow(detail.spillway),
      total: u.flow(detail.total),
      ...(detail.chamber !== null ? { chamber: u.length(detail.chamber) } : {}),
      ...(detail.chamber !== null && outlet.barrel ? { barrelHeadwaterRatio: headwaterRatio(outlet, detail) } : {}),
      ...(detail.barrelControl !== null ? { barrelControl: detail.barrelControl } : {}),
      ...(detail.tailwater !== null ? { tailwater: u.length(detail.tailwater) } : {}),
      control: detail.control,
    })),
  };
}
