// The outlet's stage-discharge table for `outfit rate`: every part's flow, storage and the control.
import type { Case, Outlet } from "../case/model.js";
import { outletDetail, type OutletDetail } from "../hydraulics/outlet.js";
import { storageCurve } from "../storage/curve.js";
import { formatter, significant } from "../format.js";
import { toCaseUnits } from "../units.js";
import { plainTable } from "./console.js";
import { CAUTION } from "./caution.js";
import { describeOutlet } from "./describe.js";
import { barrelRise } from "../hydraulics/barrel.js";

export interface RatingRow {
  detail: OutletDetail;
  storage: number;
}

/** A display step of about 24 rows over the pond's depth, rounded to 1, 2 or 5 times a power of ten. */
export function niceStep(depthInCaseUnits: number): number {
  const raw = depthInCaseUnits / 24;
  const power = Math.pow(10, Math.floor(Math.log10(raw)));
  const scaled = raw / power;
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

function columnNames(outlet: Outlet): string[] {
  const names = outlet.elements.map((e, i) => `E${i + 1} ${e.type === "weir" ? (e.shape === "v-notch" ? "v-notch" : "weir") : e.type}`);
  if (outlet.riser) names.push("rim");
  if (outlet.barrel) names.push("barrel");
  if (outlet.spillway) names.push("spillway");
  return names;
}

function partFlows(outlet: Outlet, d: OutletDetail): number[] {
  const flows = [...d.elements];
  if (outlet.riser) flows.push(d.rim);
  if (outlet.barrel) flows.push(d.barrel ?? 0);
  if (outlet.spillway) flows.push(d.spillway);
  return flows;
}

/** The barrel's headwater over its rise, and the control it is under at its flow ("1.35 inlet"). */
function barrelColumn(outlet: Outlet, d: OutletDetail): string {
  if (!outlet.barrel || d.chamber === null || d.barrelControl === null) return "-";
  return `${headwaterRatio(outlet, d).toFixed(2)} ${d.barrelControl}`;
}

/** Chamber level above the barrel's inlet invert over the barrel's rise. */
function headwaterRatio(outlet: Outlet, d: OutletDetail): number {
  return (d.chamber! - outlet.barrel!.inletInvert) / barrelRise(outlet.barrel!);
}

export function ratingText(c: Case, outlet: Outlet, rows: RatingRow[]): string {
  const f = formatter(c.units);
  const names = columnNames(outlet);
  const head = ["Stage", "Storage", ...names, "Total", ...(outlet.barrel ? ["Chamber", "Barrel HW/D"] : []), "Control"];
  const table = plainTable(head, head.map((h) => h !== "Control"));
  for (const { detail, storage } of rows) {
    table.push([
      f.elevation(detail.stage),
      f.volume(storage),
      ...partFlows(outlet, detail).map((q) => f.flow(q)),
      f.flow(detail.total),
      ...(outlet.barrel ? [detail.chamber === null ? "-" : f.elevation(detail.chamber), barrelColumn(outlet, detail)] : []),
      detail.control,
    ]);
  }
  const legend = `Parts: ${describeOutlet(outlet, f)}`;
  return [`outfit rate: ${c.name} (${c.units} units)`, legend, "", table.toString(), "", `Caution: ${CAUTION}`].join("\n");
}

export function ratingCsv(c: Case, outlet: Outlet, rows: RatingRow[]): string {
  const u = toCaseUnits(c.units);
  const L = formatter(c.units).labels;
  const names = columnNames(outlet).map((n) => `${n} (${L.flow})`);
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
    tool: "outfit",
    command: "rate",
    case: c.name,
    units: c.units,
    caution: CAUTION,
    parts: columnNames(outlet),
    rows: rows.map(({ detail, storage }) => ({
      stage: u.length(detail.stage),
      storage: u.volume(storage),
      elements: detail.elements.map((q) => u.flow(q)),
      rim: u.flow(detail.rim),
      barrel: detail.barrel === null ? null : u.flow(detail.barrel),
      spillway: u.flow(detail.spillway),
      total: u.flow(detail.total),
      chamber: detail.chamber === null ? null : u.length(detail.chamber),
      barrelHeadwaterRatio: detail.chamber === null || !outlet.barrel ? null : headwaterRatio(outlet, detail),
      barrelControl: detail.barrelControl,
      tailwater: detail.tailwater === null ? null : u.length(detail.tailwater),
      control: detail.control,
    })),
  };
}
