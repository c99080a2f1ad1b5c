// `outfit pond` output: the pond sized from the site limits, as a table or JSON.
import type { Case } from "../model.js";
import { formatter, trimNumber } from "../format.js";
import { toCaseUnits } from "../units.js";
import { cautionText } from "./console.js";
import { CAUTION } from "./caution.js";
import { PLAIN, renderTable, wrap, type Column, type Layout } from "./terminal.js";
import { pondFile } from "./pondFile.js";
import { METHOD_SOURCES } from "../storage/stormEstimates.js";
import type { SiteSizing } from "../case/site.js";
import type { SizedPond } from "../storage/sizing.js";

function pondWords(c: Case, p: SizedPond): string {
  const f = formatter(c.units);
  const s = p.pond.storage;
  const depth = `floor ${f.elevation(p.pond.bottom)}, top of embankment ${f.elevation(p.pond.top)}`;
  if (s.kind === "prismoid") return `prismoid, floor ${f.length(s.length, 1)} x ${f.length(s.width, 1)}, side slopes ${trimNumber(s.sideSlope, 2)} H : 1 V; ${depth}`;
  return `the site's shape scaled by ${trimNumber(p.size, 3)} in plan; ${depth}`;
}

/** Share of a narrow line the labels may take; the values wrap in the rest. */
const LABEL_SHARE = 0.4;

/**
 * The label-and-value rows, whole when they fit the layout; otherwise the labels wrap within their
 * share of the line (continued two spaces in) and the values in the room the labels leave (a word
 * longer than that stays whole).
 */
function fittedRows(layout: Layout, head: readonly string[], rows: readonly [string, string][]): [string, string][] {
  const width = layout.width;
  const longest = (texts: readonly string[]) => Math.max(...texts.flatMap((t) => t.split("\n").map((line) => line.length)));
  const gap = 2;
  if (layout.wide || width === null || longest([head[0], ...rows.map((r) => r[0])]) + gap + longest([head[1], ...rows.map((r) => r[1])]) <= width) return [...rows];
  const labels = rows.map(([label]) => wrap(label, Math.floor((width - gap) * LABEL_SHARE), 2));
  const room = width - gap - longest([head[0], ...labels]);
  return rows.map(([, value], i) => [labels[i], wrap(value, room, "")]);
}

/** The sized pond: required and provided storage, dimensions, footprint and excavation. */
export function sizingText(c: Case, sizing: SiteSizing, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const rows: [string, string][] = [];
  const chosen = sizing.pond ?? sizing.largest;
  rows.push(["Required storage", `${f.volume(sizing.required)} (largest estimate: ${sizing.storm}, ${METHOD_SOURCES[sizing.method].label})`]);
  if (chosen) {
    rows.push(["Pond", pondWords(c, chosen)]);
    if (chosen.pond.pool > chosen.pond.bottom) rows.push(["Permanent pool", f.elevation(chosen.pond.pool)]);
    rows.push(["Provided below the freeboard level", `${f.volume(chosen.provided)} (above the ${chosen.pond.pool > chosen.pond.bottom ? "pool" : "floor"}, below ${f.elevation(chosen.pond.top - c.criteria.freeboardDepth)})`]);
    const plan = chosen.topLength !== null ? `${f.length(chosen.topLength, 1)} x ${f.length(chosen.topWidth!, 1)}, ` : "";
    rows.push(["Footprint at the top of embankment", `${plan}${Math.round(f.raw.area(chosen.topArea)).toLocaleString("en-US")} ${f.labels.length}2`]);
    rows.push(["Excavation below the top of embankment", f.volume(chosen.excavation)]);
  }
  const columns: Column[] = [{ head: "" }, { head: "Value" }];
  const table = renderTable(layout, columns, fittedRows(layout, columns.map((col) => col.head), rows));
  const verdict = sizing.pond
    ? "The pond holds the required storage within the site limits (the smallest on the size step that does)."
    : chosen
      ? `NO pond within the site limits holds it: the largest within them holds ${f.volume(chosen.provided)}, ${f.volume(sizing.required - chosen.provided)} short of the required storage.`
      : "NO pond of one size step fits the site limits.";
  return [
    wrap(`outfit pond: ${c.name} (${c.units} units)`, layout.width),
    "",
    table.text,
    "",
    wrap(verdict, layout.width),
    wrap("The required storage is an estimate before routing; `outfit design --size-pond` sizes pond and outlet together by routing every storm.", layout.width),
    "",
    cautionText(layout),
  ].join("\n");
}

export function sizingJson(c: Case, sizing: SiteSizing) {
  const u = toCaseUnits(c.units);
  const chosen = sizing.pond ?? sizing.largest;
  return {
    name: c.name,
    units: c.units,
    required: u.volume(sizing.required),
    governing: { storm: sizing.storm, method: sizing.method },
    withinLimits: sizing.pond !== null,
    pond: chosen ? pondFile(chosen.pond, c.units) : null,
    provided: chosen ? u.volume(chosen.provided) : null,
    shortfall: sizing.pond ? 0 : u.volume(sizing.required - (chosen?.provided ?? 0)),
    footprint: chosen ? { length: chosen.topLength === null ? null : u.length(chosen.topLength), width: chosen.topWidth === null ? null : u.length(chosen.topWidth), area: u.area(chosen.topArea) } : null,
    excavation: chosen ? u.volume(chosen.excavation) : null,
    caution: CAUTION,
  };
}
