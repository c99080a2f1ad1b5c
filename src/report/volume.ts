// `outfit volume` output: every storm's storage estimates side by side, as a table or JSON.
import type { Case } from "../case/model.js";
import { formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { plainTable } from "./console.js";
import { CAUTION } from "./caution.js";
import { availableStorage, freeboardLevel, METHOD_SOURCES, type StormEstimate } from "../storage/stormEstimates.js";

export function volumeText(c: Case, estimates: readonly StormEstimate[], pondNote: string | null): string {
  const f = formatter(c.units);
  const table = plainTable(["Storm", "Target", "Peak in", "Method", "Volume", "Stage reached", "Below freeboard level", "Note"], [false, true, true, false, true, true, false, false]);
  for (const e of estimates) {
    e.methods.forEach((m, i) => {
      table.push([
        i === 0 ? e.storm.name : "",
        i === 0 ? (e.storm.target === null ? "none" : f.flow(e.storm.target)) : "",
        i === 0 ? f.flow(e.peakInflow) : "",
        METHOD_SOURCES[m.method].label,
        m.volume === null ? "-" : f.volume(m.volume),
        m.stage === null ? "-" : f.elevation(m.stage),
        m.fits === null ? "-" : m.fits ? "yes" : "NO",
        m.method === "modified-rational" && e.criticalDuration !== null ? `critical duration ${(e.criticalDuration / 60).toFixed(0)} min` : (m.note ?? ""),
      ]);
    });
  }
  const lines = [
    `outfit volume: ${c.name} (${c.units} units)`,
    `Pond: ${pondNote ?? `bottom ${f.elevation(c.pond.bottom)}, top ${f.elevation(c.pond.top)}`}; freeboard level ${f.elevation(freeboardLevel(c))} (top less ${f.length(c.criteria.freeboardDepth)}); it holds ${f.volume(availableStorage(c))} above the ${c.pond.pool > c.pond.bottom ? "permanent pool" : "floor"} below that level`,
    "",
    table.toString(),
    "",
    "Volumes are storage above the permanent pool (or the floor) before any outlet exists: estimates to size a pond, not routed results.",
    "Methods:",
    ...Object.values(METHOD_SOURCES).map((m) => `  ${m.label}: ${m.source}`),
    "",
    `Caution: ${CAUTION}`,
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
