// `outfit volume` output: every storm's storage estimates side by side, as a table or JSON.
import type { Case } from "../model.js";
import { formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { cautionText } from "./console.js";
import { CAUTION } from "./caution.js";
import { PLAIN, renderTable, STORM_NAME_WIDTH, wrap, type Column, type Layout, type Row } from "./terminal.js";
import { availableStorage, lowestLimitLevel, METHOD_SOURCES, sizingEstimate, type MethodEstimate, type StormEstimate } from "../sizing/stormEstimates.js";
import type { LimitLevel } from "../storage/limitLevel.js";
import { CATALOGUE_ALLOWANCE } from "../sizing/pondChoice.js";

/** The limit level in words: "23.20 ft (spillway crest)". */
export function limitWords(c: Case, limit: LimitLevel): string {
  return `${formatter(c.units).elevation(limit.level)} (${limit.by})`;
}

/** A method's note with its governing duration. */
function noteOf(m: MethodEstimate): string {
  const parts = [m.note, m.governingDuration === null ? null : `governing duration ${(m.governingDuration / 60).toFixed(0)} min`].filter((x): x is string => x !== null);
  return parts.join("; ");
}

/** The stage a method reaches, in words (beyond the storage when it holds less). */
export function stageText(c: Case, stage: number | null): string {
  if (stage === null) return "-";
  return Number.isFinite(stage) ? formatter(c.units).elevation(stage) : "beyond the storage";
}

/**
 * Every storm's estimates, one row per method. Narrow: the storm, the method and its volume stay in
 * the compact row, then the stage and the fit as room allows; the storm's target and peak inflow and
 * the notes go below the row.
 */
export function estimatesTable(c: Case, estimates: readonly StormEstimate[], layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const columns: Column[] = [
    { head: "Storm", wrap: STORM_NAME_WIDTH },
    { head: "Target", align: "right", narrow: "detail", rank: 3 },
    { head: "Peak in", align: "right", narrow: "detail", rank: 4 },
    { head: "Method" },
    { head: "Volume", align: "right" },
    { head: "Stage reached", align: "right", narrow: "detail", rank: 1 },
    { head: "Below limit level", narrow: "detail", rank: 2 },
    { head: "Note", narrow: "detail", rank: 5 },
  ];
  const rows: Row[] = estimates.flatMap((e) =>
    e.methods.map((m, i) => [
      i === 0 ? e.storm.name : "",
      i === 0 ? (e.storm.target === null ? "none" : f.flow(e.storm.target)) : "",
      i === 0 ? f.flow(e.peakInflow) : "",
      METHOD_SOURCES[m.method].label,
      m.volume === null ? "-" : f.volume(m.volume),
      stageText(c, m.stage),
      m.fits === null ? "-" : m.fits ? "yes" : "NO",
      noteOf(m),
    ]),
  );
  return renderTable(layout, columns, rows).text;
}

/** Each storm's limit level and the storage below it, in words. */
export function limitLines(c: Case, estimates: readonly StormEstimate[]): string {
  const f = formatter(c.units);
  const limits = estimates.filter((e) => e.limit !== null && e.storm.target !== null);
  return `Limit levels (the lower of the freeboard level and, for a storm that must keep the spillway dry, the spillway crest${c.pond.storage.kind === "underground" ? "; the system's top" : ""}): ${limits.map((e) => `${e.storm.name} ${limitWords(c, e.limit!)}, ${f.volume(e.available!)} below it`).join("; ")}`;
}

/** The methods and their sources, one line each. */
export function methodLines(layout: Layout): string[] {
  return ["Methods:", ...Object.values(METHOD_SOURCES).map((m) => wrap(`  ${m.label}: ${m.source}`, layout.width, 4))];
}

/** Every storm's estimates as a table with the limit levels, what `pond` sizes to and the methods. */
export function volumeText(c: Case, estimates: readonly StormEstimate[], pondNote: string | null, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const sizing = sizingEstimate(estimates);
  const lines = [
    wrap(`outfit volume: ${c.name} (${c.units} units)`, layout.width),
    wrap(`Pond: ${pondNote ?? `bottom ${f.elevation(c.pond.bottom)}, top ${f.elevation(c.pond.top)}`}; freeboard level ${f.elevation(c.pond.top - c.criteria.freeboardDepth)} (top less ${f.length(c.criteria.freeboardDepth)})`, layout.width),
    wrap(limitLines(c, estimates), layout.width),
    "",
    estimatesTable(c, estimates, layout),
    "",
    wrap("Volumes are storage above the permanent pool (or the floor) before any outlet exists: estimates to size a pond, not a routed design. The hydrograph differences are lower bounds; the routed estimates are what outlets of those kinds use.", layout.width),
    wrap(sizing ? `outfit pond sizes to the largest routed estimate, ${f.volume(sizing.volume)} (${sizing.storm}, ${METHOD_SOURCES[sizing.method].label}), and ${Math.round(100 * CATALOGUE_ALLOWANCE)} % more for catalogue sizes; the pond holds ${f.volume(availableStorage(c))} below the lowest limit level, ${f.elevation(lowestLimitLevel(c).level)}.` : "No storm has a target: nothing to size.", layout.width),
    ...methodLines(layout),
    "",
    cautionText(layout),
  ];
  return lines.join("\n");
}

/** A method in JSON: keys present only where they apply (no null where a number belongs). */
function methodJson(c: Case, m: MethodEstimate) {
  const u = toCaseUnits(c.units);
  return {
    method: m.method,
    label: METHOD_SOURCES[m.method].label,
    source: METHOD_SOURCES[m.method].source,
    lowerBound: METHOD_SOURCES[m.method].lowerBound,
    applies: m.volume !== null,
    ...(m.volume !== null ? { volume: u.volume(m.volume) } : {}),
    ...(m.stage !== null && Number.isFinite(m.stage) ? { stage: u.length(m.stage) } : {}),
    ...(m.fits !== null ? { belowLimitLevel: m.fits } : {}),
    ...(m.method === "tr55" && m.volume !== null ? { outsideRange: m.outsideRange } : {}),
    ...(m.governingDuration !== null ? { governingDurationMinutes: m.governingDuration / 60 } : {}),
    ...(m.notional ? { peak: u.flow(m.notional.peak), aim: u.flow(m.notional.aim) } : {}),
    note: noteOf(m),
  };
}

/** Each storm's estimates in JSON (keys only where they apply). */
export function estimatesJson(c: Case, estimates: readonly StormEstimate[]) {
  const u = toCaseUnits(c.units);
  return estimates.map((e) => ({
    name: e.storm.name,
    hasTarget: e.storm.target !== null,
    ...(e.storm.target !== null ? { target: u.flow(e.storm.target) } : {}),
    peakInflow: u.flow(e.peakInflow),
    volumeIn: u.volume(e.inflowVolume),
    ...(e.criticalDuration !== null ? { criticalDurationMinutes: e.criticalDuration / 60 } : {}),
    ...(e.limit ? { limitLevel: { level: u.length(e.limit.level), by: e.limit.by }, available: u.volume(e.available!) } : {}),
    methods: e.methods.map((m) => methodJson(c, m)),
  }));
}

export function volumeJson(c: Case, estimates: readonly StormEstimate[]) {
  const u = toCaseUnits(c.units);
  const sizing = sizingEstimate(estimates);
  return {
    name: c.name,
    units: c.units,
    freeboardLevel: u.length(c.pond.top - c.criteria.freeboardDepth),
    limitLevel: u.length(lowestLimitLevel(c).level),
    availableStorage: u.volume(availableStorage(c)),
    ...(sizing ? { sizesTo: { storm: sizing.storm, method: sizing.method, volume: u.volume(sizing.volume) } } : {}),
    storms: estimatesJson(c, estimates),
    caution: CAUTION,
  };
}
