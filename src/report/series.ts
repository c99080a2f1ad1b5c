// Every storm's routed series (time, inflow, outflow, exfiltration where the pond has it, stage,
// storage and each part's flow) in the case's units, for `route --csv-dir` (one CSV per storm) and
// `route --json --series`.
import type { Case, Outlet } from "../model.js";
import type { StormRouting } from "../routing/routeCase.js";
import { outletDetail } from "../hydraulics/outlet.js";
import { storageCurve } from "../storage/curve.js";
import { toCaseUnits, unitLabels } from "../units.js";
import { partColumns, partFlows } from "./rating.js";

export interface SeriesTable {
  /** Column names with units, "inflow (cfs)". */
  head: string[];
  /** Rows of numbers in the case's units; time in minutes. */
  rows: number[][];
}

/** The recorded series of one routed storm (routed with `record: true`), with each part's flow. */
export function stormSeries(c: Case, outlet: Outlet, sr: StormRouting): SeriesTable {
  const series = sr.result.series;
  if (!series) throw new Error("the storm was routed without recording its series");
  const u = toCaseUnits(c.units);
  const L = unitLabels(c.units);
  const curve = storageCurve(c.pond);
  // An exfiltrating pond's series carry the water leaving into the ground beside the outflow; with a
  // bypass, the bypass and the flow at the point of analysis (outflow + bypass) at each time.
  const x = series.exfiltration;
  const bypass = series.bypass;
  const head = [
    "time (min)",
    `inflow (${L.flow})`,
    `outflow (${L.flow})`,
    ...(x ? [`exfiltration (${L.flow})`] : []),
    ...(bypass ? [`bypass (${L.flow})`, `at point (${L.flow})`] : []),
    `stage (${L.length})`,
    `storage (${L.volume})`,
    ...partColumns(outlet).map((n) => `${n} (${L.flow})`),
  ];
  const rows = series.time.map((t, i) => {
    const stage = series.stage[i];
    const detail = outletDetail(outlet, c.tailwater, stage);
    const atPoint = bypass ? [u.flow(bypass[i]), u.flow(series.outflow[i] + bypass[i])] : [];
    return [t / 60, u.flow(series.inflow[i]), u.flow(series.outflow[i]), ...(x ? [u.flow(x[i])] : []), ...atPoint, u.length(stage), u.volume(curve.volume(stage)), ...partFlows(outlet, detail).map(u.flow)];
  });
  return { head, rows };
}

/** Seven significant figures: enough that the series re-integrate to the routed volumes. */
function number(x: number): string {
  return x === 0 ? "0" : String(Number(x.toPrecision(7)));
}

export function seriesCsv(table: SeriesTable): string {
  const lines = [
    table.head.join(","),
    ...table.rows.map((row) => row.map(number).join(",")),
  ];
  return lines.join("\n") + "\n";
}

/** Series as columns for JSON, keyed by the CSV's column names (which carry the units). */
export function seriesJson(table: SeriesTable): Record<string, number[]> {
  const out: Record<string, number[]> = {};
  table.head.forEach((name, j) => {
    out[name] = table.rows.map((row) => Number(row[j].toPrecision(7)));
  });
  return out;
}
