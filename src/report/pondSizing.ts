// `outfit pond` output: the pond chosen from the site limits (depth and footprint), the trade-off of
// the depths compared, and the estimates in the chosen pond; as text or JSON.
import type { Case } from "../model.js";
import { formatter, trimNumber, type Formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { cautionText } from "./console.js";
import { CAUTION } from "./caution.js";
import { PLAIN, renderTable, wrap, type Column, type Layout, type Row } from "./terminal.js";
import { pondFile } from "./pondFile.js";
import { caseLimitLevel, METHOD_SOURCES, type EstimateMethod, type StormEstimate } from "../sizing/stormEstimates.js";
import { CATALOGUE_ALLOWANCE, type Blocked, type DepthOption, type FloorLimit, type PondChoice } from "../sizing/pondChoice.js";
import type { SizedPond } from "../storage/sizing.js";
import { storageBelow } from "../storage/limitLevel.js";
import { estimatesJson, estimatesTable, limitWords, methodLines } from "./volume.js";

export function pondWords(c: Case, p: SizedPond): string {
  const f = formatter(c.units);
  const s = p.pond.storage;
  const depth = `floor ${f.elevation(p.pond.bottom)}, top of embankment ${f.elevation(p.pond.top)}`;
  if (s.kind === "prismoid") return `prismoid, floor ${f.length(s.length, 1)} x ${f.length(s.width, 1)}, side slopes ${trimNumber(s.sideSlope, 2)} H : 1 V; ${depth}`;
  return `the site's shape scaled by ${trimNumber(p.size, 3)} in plan; ${depth}`;
}

function area(f: Formatter, m2: number): string {
  return `${Math.round(f.raw.area(m2)).toLocaleString("en-US")} ${f.labels.length}2`;
}

function floorWords(f: Formatter, limit: FloorLimit, c: Case): string {
  const site = c.site!;
  if (limit.by === "groundwater") return `${f.elevation(limit.level)}: seasonal high groundwater ${f.elevation(site.groundwater!.seasonalHigh)} + ${f.length(site.groundwater!.separation)} separation`;
  if (limit.by === "outfall") return `${f.elevation(limit.level)}: outfall invert ${f.elevation(site.outfallInvert!)}${site.outfallFall > 0 ? ` + ${f.length(site.outfallFall)} fall` : ""} (drains through the barrel)`;
  return `${f.elevation(limit.level)}: the lowest floor allowed`;
}

/** Why a depth cannot be built, in words with units. */
export function blockedWords(c: Case, b: Blocked): string {
  const f = formatter(c.units);
  switch (b.kind) {
    case "floor above grade":
      return `the lowest floor (${floorWords(f, b.floor, c)}) stands above the existing grade ${f.elevation(b.grade)}`;
    case "embankment":
      return `needs a ${f.length(b.height)} embankment, more than the ${f.length(b.max)} allowed${b.floor ? `: the floor cannot go below ${floorWords(f, b.floor, c)}` : ""}`;
    case "spillway":
      return `top ${f.elevation(b.top)} below the spillway crest ${f.elevation(b.crest)} plus the freeboard (${f.elevation(b.lowest)})`;
    case "no storage":
      return "no storage between the pool and the freeboard level";
    case "site limits":
      return `beyond ${b.limit}: the largest pond within the site limits holds ${f.volume(b.shortfall)} too little`;
  }
}

/** A depth row's result, short: the long reason goes to its own column. */
function resultWords(o: DepthOption, chosen: DepthOption | null): string {
  return o.blocked ? "not possible" : o === chosen ? "chosen" : "holds";
}

/** Why a depth is not possible, or what holds its floor up. */
function whyWords(c: Case, o: DepthOption): string {
  if (o.blocked) return blockedWords(c, o.blocked);
  if (o === null || !o.floorAt) return "";
  return `floor held at ${floorWords(formatter(c.units), o.floorAt, c)}`;
}

/**
 * The depths compared: floor, top, the pond's top size, cut, fill, land and the cost proxy, the result
 * and why. Narrow: the depth, the cost and the result stay on the row, the rest below it.
 */
export function tradeOffTable(c: Case, choice: PondChoice, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const L = f.labels;
  const grade = c.site?.existingGrade !== null && c.site?.existingGrade !== undefined;
  const columns: Column[] = [
    { head: `Depth\n(${L.length})`, align: "right" },
    { head: `Floor\n(${L.length})`, align: "right", narrow: "detail", rank: 1 },
    { head: `Top\n(${L.length})`, align: "right", narrow: "detail", rank: 2 },
    { head: `Top size\n(${L.length})`, align: "right", narrow: "detail", rank: 3, label: "top size", unit: L.length },
    { head: `${grade ? "Cut" : "Excavation"}\n(${L.volume})`, align: "right", narrow: "detail", rank: 4 },
    ...(grade ? [{ head: `Fill\n(${L.volume})`, align: "right" as const, narrow: "detail" as const, rank: 5 }] : []),
    { head: `Land\n(${L.length}2)`, align: "right", narrow: "detail", rank: 6 },
    { head: "Cost\n(units)", align: "right" },
    { head: "Result" },
    { head: "Why", narrow: "detail", rank: 7, label: "why" },
  ];
  const rows: Row[] = choice.options.map((o) => {
    const s = o.sized;
    const size = s && s.topLength !== null ? `${f.raw.length(s.topLength).toFixed(1)} x ${f.raw.length(s.topWidth!).toFixed(1)}` : s ? `${Math.round(f.raw.area(s.topArea)).toLocaleString("en-US")} ${L.length}2` : "-";
    return [
      f.raw.length(o.depth).toFixed(2),
      o.levels ? f.raw.length(o.levels.floor).toFixed(2) : "-",
      o.levels ? f.raw.length(o.levels.top).toFixed(2) : "-",
      size,
      s ? Math.round(f.raw.volume(s.cut)).toLocaleString("en-US") : "-",
      ...(grade ? [s ? Math.round(f.raw.volume(s.fill)).toLocaleString("en-US") : "-"] : []),
      s ? Math.round(f.raw.area(s.land)).toLocaleString("en-US") : "-",
      o.cost ? o.cost.total.toFixed(1) : "-",
      { text: resultWords(o, choice.chosen), tone: o.blocked ? "muted" : o === choice.chosen ? "strong" : undefined },
      whyWords(c, o) || "-",
    ];
  });
  return renderTable(layout, columns, rows).text;
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

/** The chosen pond, or the one used when nothing fits: the chosen option's, else the deepest with a largest pond. */
function usedOption(choice: PondChoice): { option: DepthOption; pond: SizedPond } | null {
  if (choice.chosen) return { option: choice.chosen, pond: choice.chosen.sized! };
  for (const o of choice.options) if (o.blocked?.kind === "site limits" && o.blocked.largest) return { option: o, pond: o.blocked.largest };
  return null;
}

/** The chosen pond: what it is sized to, its dimensions, storage below each limit level, earthwork and cost; the trade-off; the estimates in it. */
export function sizingText(c: Case, choice: PondChoice, estimates: readonly StormEstimate[], layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const rows: [string, string][] = [];
  const used = usedOption(choice);
  const g = used?.option.governing ?? null;
  if (g) {
    const limit = caseLimitLevel(c, c.storms.find((s) => s.name === g.storm)!, used!.pond.pond);
    rows.push(["Sized to", `${f.volume(g.volume * (1 + CATALOGUE_ALLOWANCE))}: the ${g.storm} storm's routed estimate (${METHOD_SOURCES[`routed-${g.kind}` as EstimateMethod].label}, not a lower bound) of ${f.volume(g.volume)} and ${Math.round(100 * CATALOGUE_ALLOWANCE)} % more for catalogue sizes, below its limit level ${limitWords(c, limit)}`]);
  }
  if (used) {
    const p = used.pond;
    rows.push(["Depth", `${f.length(used.option.depth)} (site.maxDepth ${f.length(c.site!.maxDepth)} is a limit; the depth costing least was chosen)`]);
    rows.push(["Pond", pondWords(c, p)]);
    if (p.pond.pool > p.pond.bottom) rows.push(["Permanent pool", f.elevation(p.pond.pool)]);
    const below = c.storms
      .filter((s) => s.target !== null)
      .map((s) => {
        const limit = caseLimitLevel(c, s, p.pond);
        return `${s.name}: ${f.volume(storageBelow(p.pond, limit.level))} below ${limitWords(c, limit)}`;
      });
    rows.push(["Storage below the limit levels", below.join("; ")]);
    const plan = p.topLength !== null ? `${f.length(p.topLength, 1)} x ${f.length(p.topWidth!, 1)}, ` : "";
    rows.push(["Footprint at the top of embankment", `${plan}${area(f, p.topArea)}`]);
    rows.push(["Land taken", area(f, p.land)]);
    if (c.site!.existingGrade !== null) {
      rows.push(["Excavation below the existing grade", f.volume(p.cut)]);
      rows.push(["Embankment fill", `${f.volume(p.fill)}${p.embankment > 0 ? ` (${f.length(p.embankment)} above the grade ${f.elevation(c.site!.existingGrade)})` : ""}`]);
    } else rows.push(["Excavation below the top of embankment", f.volume(p.cut)]);
    if (used.option.cost) {
      const k = used.option.cost;
      rows.push(["Cost proxy", `${k.total.toFixed(1)} units (excavation ${k.excavation.toFixed(1)}, fill ${k.fill.toFixed(1)}, land ${k.land.toFixed(1)})`]);
    }
  }
  const columns: Column[] = [{ head: "" }, { head: "Value" }];
  const table = renderTable(layout, columns, fittedRows(layout, columns.map((col) => col.head), rows));
  const blocked = used?.option.blocked;
  const verdict = choice.chosen
    ? "The pond holds every storm's routed estimate below its limit level within the site limits (the cheapest depth; the smallest footprint on the size step at that depth)."
    : blocked?.kind === "site limits"
      ? `NO pond within the site limits holds the routed estimates: the largest (${f.length(used!.option.depth)} deep) holds ${f.volume(blocked.shortfall)} too little.`
      : "NO pond of any depth compared can be built within the site limits (see the depths compared).";
  return [
    wrap(`outfit pond: ${c.name} (${c.units} units)`, layout.width),
    "",
    table.text,
    "",
    wrap(verdict, layout.width),
    "",
    wrap("Depths compared (the pond at each depth is the smallest holding every storm's routed estimate; cost proxy: excavation, fill and land, invented weights):", layout.width),
    tradeOffTable(c, choice, layout),
    "",
    ...(estimates.length ? [wrap("Estimates in the chosen pond:", layout.width), estimatesTable(c, estimates, layout), ""] : []),
    wrap("The routed estimates come before any real outlet; `outfit design --size-pond` sizes pond and outlet together by routing every storm through catalogue outlets.", layout.width),
    ...methodLines(layout),
    "",
    cautionText(layout),
  ].join("\n");
}

export function sizingJson(c: Case, choice: PondChoice, estimates: readonly StormEstimate[]) {
  const u = toCaseUnits(c.units);
  const used = usedOption(choice);
  const g = used?.option.governing ?? null;
  const pondJson = (p: SizedPond) => ({
    pond: pondFile(p.pond, c.units),
    footprint: { ...(p.topLength !== null ? { length: u.length(p.topLength), width: u.length(p.topWidth!) } : {}), area: u.area(p.topArea) },
    land: u.area(p.land),
    excavation: u.volume(p.cut),
    fill: u.volume(p.fill),
    embankment: u.length(p.embankment),
  });
  return {
    name: c.name,
    units: c.units,
    withinLimits: choice.chosen !== null,
    ...(g ? { sizedTo: { storm: g.storm, method: `routed-${g.kind}`, estimate: u.volume(g.volume), allowance: CATALOGUE_ALLOWANCE, volume: u.volume(g.volume * (1 + CATALOGUE_ALLOWANCE)), limitLevel: u.length(g.level) } } : {}),
    ...(used
      ? {
          depth: u.length(used.option.depth),
          ...pondJson(used.pond),
          provided: c.storms
            .filter((s) => s.target !== null)
            .map((s) => {
              const limit = caseLimitLevel(c, s, used.pond.pond);
              return { storm: s.name, limitLevel: u.length(limit.level), by: limit.by, storage: u.volume(storageBelow(used.pond.pond, limit.level)) };
            }),
          ...(used.option.cost ? { cost: used.option.cost } : {}),
        }
      : {}),
    ...(used?.option.blocked?.kind === "site limits" ? { shortfall: u.volume(used.option.blocked.shortfall) } : {}),
    tradeOff: choice.options.map((o) => ({
      depth: u.length(o.depth),
      possible: o.blocked === null,
      chosen: o === choice.chosen,
      ...(o.levels ? { floor: u.length(o.levels.floor), top: u.length(o.levels.top) } : {}),
      ...(o.blocked ? { why: blockedWords(c, o.blocked), blocked: o.blocked.kind } : {}),
      ...(o.sized ? pondJson(o.sized) : {}),
      ...(o.cost ? { cost: o.cost.total } : {}),
    })),
    estimates: estimatesJson(c, estimates),
    caution: CAUTION,
  };
}
