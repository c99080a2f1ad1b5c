// `outfit volume` output: every storm's storage estimates side by side, as a table or JSON.
import type { Case } from "../model.js";
import { formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { cautionText } from "./console.js";
import { CAUTION } from "./caution.js";
import { PLAIN, renderTable, STORM_NAME_WIDTH, wrap, type Column, type Layout, type Row } from "./terminal.js";
import { availableStorage, freeboardLevel, METHOD_SOURCES, type StormEstimate } from "../storage/stormEstimates.js";

/**
 * Every storm's estimates, one row per method. Narrow: the storm, the method and its volume stay in
 * the compact row, then the stage and the fit as room allows; the storm's target and peak inflow and
 * the notes go below the row.
 */
export function volumeText(c: Case, estimates: readonly StormEstimate[], pondNote: string | null, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const columns: Column[] = [
    { head: "Storm", wrap: STORM_NAME_WIDTH },
    { head: "Target", align: "right", narrow: "detail", rank: 3 },
    { head: "Peak in", align: "right", narrow: "detail", rank: 4 },
    { head: "Method" },
    { head: "Volume", align: "right" },
    { head: "Stage reached", align: "right", narrow: "detail", rank: 1 },
    { head: "Below freeboard level", narrow: "detail", rank: 2 },
    { head: "Note", narrow: "detail", rank: 5 },
  ];
  const rows: Row[] = estimates.flatMap((e) =>
    e.methods.map((m, i) => [
      i === 0 ? e.storm.name : "",
      i === 0 ? (e.storm.target === null ? "none" : f.flow(e.storm.target)) : "",
      i === 0 ? f.flow(e.peakInflow) : "",
      METHOD_SOURCES[m.method].label,
      m.volume === null ? "-" : f.volume(m.volume),
      m.stage === null ? "-" : f.elevation(m.stage),
      m.fits === null ? "-" : m.fits ? "yes" : "NO",
      m.method === "modified-rational" && e.criticalDuration !== null ? `critical duration ${(e.criticalDuration / 60).toFixed(0)} min` : (m.note ?? ""),
    ]),
  );
  const lines = [
    wrap(`outfit volume: ${c.name} (${c.units} units)`, layout.width),
    wrap(`Pond: ${pondNote ?? `bottom ${f.elevation(c.pond.bottom)}, top ${f.elevation(c.pond.top)}`}; freeboard level ${f.elevation(freeboardLevel(c))} (top less ${f.length(c.criteria.freeboardDepth)}); it holds ${f.volume(availableStorage(c))} above the ${c.pond.pool > c.pond.bottom ? "permanent pool" : "floor"} below that level`, layout.width),
    "",
    renderTable(layout, columns, rows).text,
    "",
    wrap("Volumes are storage above the permanent pool (or the floor) before any outlet exists: estimates to size a pond, not routed results.", layout.width),
    "Methods:",
    ...Object.values(METHOD_SOURCES).map((m) => wrap(`  ${m.label}: ${m.source}`, layout.width, 4)),
    "",
    cautionText(layout),
  ];
  return lines.join("\n");
}

export function volumeJson(c: Case, estimates: readonly StormEstimate[]) {
  const u = toCaseUnits(c.units);
  return {
    name: c.name,
    units: c.units,
    freeboardLevel: u.length(freeboardLevel(c)),
    availableStorage: u.volume(availableStorage(c)),
    storms: estimates.map((e) => ({
      name: e.storm.name,
      target: e.storm.target === null ? null : u.flow(e.storm.target),
      peakInflow: u.flow(e.peakInflow),
      volumeIn: u.volume(e.inflowVolume),
      criticalDurationMinutes: e.criticalDuration === null ? null : e.criticalDuration / 60,
      largest: e.largest === null ? null : u.volume(e.largest),
      methods: e.methods.map((m) => ({
        method: m.method,
        source: METHOD_SOURCES[m.method].source,
        volume: m.volume === null ? null : u.volume(m.volume),
        stage: m.stage === null ? null : u.length(m.stage),
        fitsBelowFreeboard: m.fits,
        note: m.note,
      })),
    })),
    caution: CAUTION,
  };
}
