// A chart with linear axes, ticks, grid, units and a legend, as an SVG string. Reference lines are
// labelled where they are drawn; series, point groups and bands are named in the legend. The plotted data can be
// read back from the markup: the root carries each axis's domain and drawing range (`data-x-domain`,
// `data-x-range`, ...), every series is one path (`data-series`) whose coordinates invert through
// those scales, and every marked point carries its data values (`data-x`, `data-y`).
import { linearScale, type LinearScale } from "./scale.js";
import { niceAxis, tickLabel, tickStep, tickValues, type Axis } from "./ticks.js";
import { attributes, coordinate, element, escapeMarkup, pathData, simplify } from "./svg.js";
import { DASH_ARRAYS, FONT, FRAME, GRID, INK, PAPER, type LineStyle } from "./style.js";
import { legend, markerElement, type LegendEntry } from "./legend.js";
import { label, LabelPlacer } from "./labels.js";

export type Point = readonly [number, number];

export interface Series {
  /** Machine name, unique in the chart (`data-series`). */
  key: string;
  label: string;
  points: readonly Point[];
  style: LineStyle;
}

/** A horizontal (axis "y": constant y) or vertical (axis "x": constant x) line across the plot. */
export interface ReferenceLine {
  key: string;
  axis: "x" | "y";
  value: number;
  label: string;
  style: LineStyle;
}

/** A shaded interval of one axis across the plot. */
export interface Band {
  key: string;
  axis: "x" | "y";
  from: number;
  to: number;
  /** The legend's words (bands drawn alike share one entry). */
  label: string;
  colour: string;
  /** Text drawn at the band's top inside the plot (bands along x), e.g. the storm it belongs to. */
  name?: string;
}

export interface PointMark {
  x: number;
  y: number;
  /** Text beside the point (also its `data-label`). */
  label?: string;
  /** False: the label is data only, not drawn (default true). */
  showLabel?: boolean;
  /** A horizontal interval drawn through the point (e.g. a target band). */
  xRange?: readonly [number, number];
}

export interface PointGroup {
  key: string;
  label: string;
  style: LineStyle;
  points: readonly PointMark[];
}

export interface AxisSpec {
  /** Quantity, e.g. "Stage". */
  label: string;
  /** Unit, e.g. "ft"; shown as "Stage (ft)". */
  unit: string;
  /** Fixed domain; otherwise the data's extent widened to round ticks. */
  domain?: readonly [number, number];
  /** Widen the data's extent to include zero. */
  includeZero?: boolean;
}

export interface ChartSpec {
  /** Unique in the document (used for ids inside the SVG). */
  id: string;
  /** Machine name of the plot (`data-plot`). */
  key: string;
  title: string;
  description: string;
  x: AxisSpec;
  y: AxisSpec;
  series: readonly Series[];
  references?: readonly ReferenceLine[];
  bands?: readonly Band[];
  points?: readonly PointGroup[];
  width?: number;
  /** Height of the plot area alone. */
  plotHeight?: number;
}

const MARGIN = { left: 70, right: 36, bottom: 48, legendGap: 10 };
const TICK_FONT = 11;
const MARKERS_PER_SERIES = 6;

export function chart(spec: ChartSpec): string {
  const width = spec.width ?? 720;
  const plotHeight = spec.plotHeight ?? 260;
  const references = spec.references ?? [];
  const bands = spec.bands ?? [];
  const groups = spec.points ?? [];
  const hatch = (band: Band) => `${spec.id}-hatch-${bands.indexOf(band) + 1}`;

  const listed: LegendEntry[] = [
    ...spec.series.map((s): LegendEntry => ({ label: s.label, sample: { kind: "line", style: s.style, showLine: true } })),
    ...groups.map((g): LegendEntry => ({ label: g.label, sample: { kind: "line", style: g.style, showLine: false } })),
    ...bands.map((b): LegendEntry => ({ label: b.label, sample: { kind: "swatch", colour: b.colour, patternId: hatch(b) } })),
  ];
  // Items drawn alike under one name (e.g. a band per storm) share one legend entry.
  const entries = listed.filter((entry, i) => listed.findIndex((other) => other.label === entry.label) === i);
  const plotWidth = width - MARGIN.left - MARGIN.right;
  const key = legend(entries, MARGIN.left, 8, plotWidth);
  const top = 8 + key.height + MARGIN.legendGap;
  const height = top + plotHeight + MARGIN.bottom;
  const x0 = MARGIN.left;
  const x1 = width - MARGIN.right;
  const y0 = top;
  const y1 = top + plotHeight;

  const xAxis = axisFor(spec.x, extent("x", spec.series, references, bands, groups));
  const yAxis = axisFor(spec.y, extent("y", spec.series, references, bands, groups));
  const sx = linearScale(xAxis.domain, [x0, x1]);
  const sy = linearScale(yAxis.domain, [y1, y0]);

  const parts: string[] = [];
  parts.push(element("title", { id: `${spec.id}-title` }, escapeMarkup(spec.title)));
  parts.push(element("desc", {}, escapeMarkup(spec.description)));
  parts.push(
    element("defs", {},
      element("clipPath", { id: `${spec.id}-clip` }, element("rect", { x: x0 - 4, y: y0 - 4, width: x1 - x0 + 8, height: y1 - y0 + 8 })) +
      bands.map((b) => element("pattern", { id: hatch(b), width: 6, height: 6, patternUnits: "userSpaceOnUse", patternTransform: "rotate(45)" },
        element("rect", { width: 6, height: 6, fill: b.colour, "fill-opacity": 0.12 }) +
        element("line", { x1: 0, y1: 0, x2: 0, y2: 6, stroke: b.colour, "stroke-width": 1.2, "stroke-opacity": 0.55 }))).join("")),
  );
  parts.push(element("rect", { x: 0, y: 0, width, height, fill: PAPER }));
  parts.push(key.markup);
  parts.push(grid(xAxis, yAxis, sx, sy, x0, x1, y0, y1));
  // Labels inside the plot never overlap: every marker is taken first, then labels as they are placed.
  const placer = new LabelPlacer({ left: x0, right: x1, top: y0, bottom: y1 });
  for (const g of groups) for (const p of g.points) placer.take({ left: sx(p.x) - 5, right: sx(p.x) + 5, top: sy(p.y) - 5, bottom: sy(p.y) + 5 });
  const referenceMarkup = referenceLines(references, sx, sy, x0, x1, y0, y1, placer);
  const bandLabels = bands.filter((b) => b.name !== undefined && b.axis === "x").map((b) => bandName(b, sx, y0, y1, placer)).join("");
  parts.push(element("g", { "clip-path": `url(#${spec.id}-clip)` },
    bands.map((b) => bandElement(b, sx, sy, x0, x1, y0, y1, hatch(b))).join("") +
    referenceMarkup +
    spec.series.map((s, i) => seriesElement(s, i, spec.series.length, sx, sy)).join("") +
    groups.map((g) => pointGroupElement(g, sx, sy, placer)).join("") +
    bandLabels));
  parts.push(element("rect", { x: x0, y: y0, width: x1 - x0, height: y1 - y0, fill: "none", stroke: FRAME, "stroke-width": 1 }));
  parts.push(axes(spec, xAxis, yAxis, sx, sy, x0, x1, y0, y1));

  return `<svg${attributes({
    viewBox: `0 0 ${width} ${coordinate(height)}`,
    width,
    height,
    role: "img",
    "aria-labelledby": `${spec.id}-title`,
    class: "plot",
    "font-family": FONT,
    "data-plot": spec.key,
    "data-x-domain": `${xAxis.domain[0]} ${xAxis.domain[1]}`,
    "data-x-range": `${x0} ${x1}`,
    "data-y-domain": `${yAxis.domain[0]} ${yAxis.domain[1]}`,
    "data-y-range": `${y1} ${y0}`,
    "data-x-unit": spec.x.unit,
    "data-y-unit": spec.y.unit,
  })}>${parts.join("")}</svg>`;
}

/** The data's [min, max] along one axis, over everything drawn. */
function extent(
  axis: "x" | "y",
  series: readonly Series[],
  references: readonly ReferenceLine[],
  bands: readonly Band[],
  groups: readonly PointGroup[],
): [number, number] {
  let min = Infinity;
  let max = -Infinity;
  const add = (v: number) => {
    if (!Number.isFinite(v)) return;
    if (v < min) min = v;
    if (v > max) max = v;
  };
  const i = axis === "x" ? 0 : 1;
  for (const s of series) for (const p of s.points) add(p[i]);
  for (const r of references) if (r.axis === axis) add(r.value);
  for (const b of bands) if (b.axis === axis) {
    add(b.from);
    add(b.to);
  }
  for (const g of groups) for (const p of g.points) {
    add(axis === "x" ? p.x : p.y);
    if (axis === "x" && p.xRange) {
      add(p.xRange[0]);
      add(p.xRange[1]);
    }
  }
  if (min > max) return [0, 1];
  return [min, max];
}

function axisFor(spec: AxisSpec, [min, max]: [number, number]): Axis {
  if (spec.domain) {
    const [a, b] = spec.domain;
    const step = tickStep(b - a, 6);
    return { domain: [a, b], ticks: tickValues(a, b, step), step };
  }
  return niceAxis(spec.includeZero ? Math.min(0, min) : min, spec.includeZero ? Math.max(0, max) : max);
}

function grid(xAxis: Axis, yAxis: Axis, sx: LinearScale, sy: LinearScale, x0: number, x1: number, y0: number, y1: number): string {
  const lines = [
    ...xAxis.ticks.map((t) => element("line", { x1: sx(t), y1: y0, x2: sx(t), y2: y1 })),
    ...yAxis.ticks.map((t) => element("line", { x1: x0, y1: sy(t), x2: x1, y2: sy(t) })),
  ];
  return element("g", { class: "grid", stroke: GRID, "stroke-width": 1 }, lines.join(""));
}

function axes(spec: ChartSpec, xAxis: Axis, yAxis: Axis, sx: LinearScale, sy: LinearScale, x0: number, x1: number, y0: number, y1: number): string {
  const xTicks = xAxis.ticks.map((t) =>
    element("line", { x1: sx(t), y1, x2: sx(t), y2: y1 + 5 }) +
    element("text", { x: sx(t), y: y1 + 17, "text-anchor": "middle", stroke: "none", fill: INK }, tickLabel(t, xAxis.step)),
  );
  const yTicks = yAxis.ticks.map((t) =>
    element("line", { x1: x0 - 5, y1: sy(t), x2: x0, y2: sy(t) }) +
    element("text", { x: x0 - 8, y: sy(t), dy: "0.35em", "text-anchor": "end", stroke: "none", fill: INK }, tickLabel(t, yAxis.step)),
  );
  const xTitle = element("text", { x: (x0 + x1) / 2, y: y1 + 38, "text-anchor": "middle", "font-size": 12.5, stroke: "none", fill: INK, "data-axis-title": "x" }, escapeMarkup(`${spec.x.label} (${spec.x.unit})`));
  const yTitle = element("text", {
    x: 0, y: 0, transform: `translate(16 ${coordinate((y0 + y1) / 2)}) rotate(-90)`, "text-anchor": "middle", "font-size": 12.5, stroke: "none", fill: INK, "data-axis-title": "y",
  }, escapeMarkup(`${spec.y.label} (${spec.y.unit})`));
  return element("g", { class: "axes", stroke: INK, "stroke-width": 1, "font-size": TICK_FONT },
    element("line", { x1: x0, y1, x2: x1, y2: y1 }) + element("line", { x1: x0, y1: y0, x2: x0, y2: y1 }) + xTicks.join("") + yTicks.join("") + xTitle + yTitle);
}

function strokeAttributes(style: LineStyle) {
  return {
    fill: "none",
    stroke: style.colour,
    "stroke-width": style.width,
    "stroke-dasharray": DASH_ARRAYS[style.dash],
    "stroke-linecap": style.dash === "dotted" ? "round" : "butt",
    "stroke-linejoin": "round",
  };
}

/** Vertices closer than this (drawing units, a tenth of a pixel) to the line drawn without them are left out. */
const SIMPLIFY_TOLERANCE = 0.1;

function seriesElement(s: Series, index: number, count: number, sx: LinearScale, sy: LinearScale): string {
  const pixels = s.points.map(([x, y]) => [sx(x), sy(y)] as const);
  const path = element("path", { "data-series": s.key, "data-label": s.label, d: pathData(simplify(pixels, SIMPLIFY_TOLERANCE)), ...strokeAttributes(s.style) });
  const markers = markerPositions(pixels, (index + 1) / (count + 1)).map(([x, y]) => markerElement(s.style, x, y));
  return path + (markers.length ? element("g", { "data-markers-of": s.key }, markers.join("")) : "");
}

/** Points spread evenly along a polyline's drawn length, offset by `phase` (0..1) of one spacing. */
export function markerPositions(pixels: readonly Point[], phase: number): Point[] {
  if (pixels.length < 2) return [];
  const cumulative = [0];
  for (let i = 1; i < pixels.length; i++) {
    cumulative.push(cumulative[i - 1] + Math.hypot(pixels[i][0] - pixels[i - 1][0], pixels[i][1] - pixels[i - 1][1]));
  }
  const total = cumulative[cumulative.length - 1];
  if (!(total > 0)) return [];
  const out: Point[] = [];
  let j = 1;
  for (let k = 0; k < MARKERS_PER_SERIES; k++) {
    const at = ((k + phase) / MARKERS_PER_SERIES) * total;
    while (j < pixels.length - 1 && cumulative[j] < at) j++;
    const span = cumulative[j] - cumulative[j - 1];
    const u = span > 0 ? (at - cumulative[j - 1]) / span : 0;
    out.push([pixels[j - 1][0] + u * (pixels[j][0] - pixels[j - 1][0]), pixels[j - 1][1] + u * (pixels[j][1] - pixels[j - 1][1])]);
  }
  return out;
}

function referenceLines(references: readonly ReferenceLine[], sx: LinearScale, sy: LinearScale, x0: number, x1: number, y0: number, y1: number, placer: LabelPlacer): string {
  const out: string[] = [];
  const ordered = [...references].sort((a, b) => (a.axis === b.axis ? (a.axis === "y" ? sy(a.value) - sy(b.value) : sx(a.value) - sx(b.value)) : a.axis === "y" ? -1 : 1));
  for (const r of ordered) {
    const attrs = { "data-reference": r.key, "data-axis": r.axis, "data-value": String(r.value), ...strokeAttributes(r.style) };
    if (r.axis === "y") {
      const y = sy(r.value);
      out.push(element("line", { x1: x0, y1: y, x2: x1, y2: y, ...attrs }));
      // Labels sit at the right end above their line, moved left (then below it) when they would
      // overlap another. A line with an empty label shares the label of another drawn at the same level.
      if (r.label === "") continue;
      const candidates: [number, number, "end"][] = [];
      for (let x = x1 - 6; x > x0 + 40; x -= 24) candidates.push([x, y - 4, "end"], [x, y + 12, "end"]);
      const at = placer.place(r.label, candidates);
      if (at) out.push(label(r.label, at.x, at.y, at.anchor, r.style.colour));
    } else {
      const x = sx(r.value);
      out.push(element("line", { x1: x, y1: y0, x2: x, y2: y1, ...attrs }));
      const candidates: [number, number, "start" | "end"][] = [];
      for (let y = y0 + 12; y < y1 - 4; y += 14) candidates.push([x + 4, y, "start"], [x - 4, y, "end"]);
      const at = placer.place(r.label, candidates);
      if (at) out.push(label(r.label, at.x, at.y, at.anchor, r.style.colour));
    }
  }
  return element("g", { class: "references" }, out.join(""));
}


/** A band's name at its top, centred over it, where no other label is. */
function bandName(b: Band, sx: LinearScale, y0: number, y1: number, placer: LabelPlacer): string {
  const x = (sx(b.from) + sx(b.to)) / 2;
  const spots: [number, number, "middle"][] = [];
  for (let y = y0 + 13; y < y1 - 4; y += 13) spots.push([x, y, "middle"]);
  const at = placer.place(b.name!, spots);
  return at ? element("g", { "data-band-name": b.key }, label(b.name!, at.x, at.y, "middle", b.colour)) : "";
}

function bandElement(b: Band, sx: LinearScale, sy: LinearScale, x0: number, x1: number, y0: number, y1: number, patternId: string): string {
  const attrs = { "data-band": b.key, "data-label": b.label, "data-from": String(b.from), "data-to": String(b.to), fill: `url(#${patternId})`, stroke: b.colour, "stroke-width": 0.8, "stroke-opacity": 0.7 };
  if (b.axis === "y") {
    const top = sy(Math.max(b.from, b.to));
    const bottom = sy(Math.min(b.from, b.to));
    return element("rect", { x: x0, y: top, width: x1 - x0, height: Math.max(bottom - top, 1), ...attrs });
  }
  const left = sx(Math.min(b.from, b.to));
  const right = sx(Math.max(b.from, b.to));
  return element("rect", { x: left, y: y0, width: Math.max(right - left, 1), height: y1 - y0, ...attrs });
}

/** Where a point's label may go, in order: right above, right below, left above, left below, then further out. */
function labelSpots(x: number, y: number): [number, number, "start" | "end"][] {
  const spots: [number, number, "start" | "end"][] = [];
  for (const dy of [0, 12, 24]) {
    spots.push([x + 8, y - 7 - dy, "start"], [x + 8, y + 15 + dy, "start"], [x - 8, y - 7 - dy, "end"], [x - 8, y + 15 + dy, "end"]);
  }
  return spots;
}

function pointGroupElement(g: PointGroup, sx: LinearScale, sy: LinearScale, placer: LabelPlacer): string {
  const marks = g.points.map((p) => {
    const x = sx(p.x);
    const y = sy(p.y);
    let range = "";
    if (p.xRange) {
      const a = sx(p.xRange[0]);
      const b = sx(p.xRange[1]);
      range = element("path", { d: `M${coordinate(a)} ${coordinate(y)} H${coordinate(b)} M${coordinate(a)} ${coordinate(y - 5)} V${coordinate(y + 5)} M${coordinate(b)} ${coordinate(y - 5)} V${coordinate(y + 5)}`, fill: "none", stroke: g.style.colour, "stroke-width": 1.6 });
    }
    const at = p.label === undefined || p.showLabel === false ? null : placer.place(p.label, labelSpots(x, y));
    const text = at ? label(p.label!, at.x, at.y, at.anchor, g.style.colour) : "";
    return element("g", {
      "data-x": String(p.x),
      "data-y": String(p.y),
      "data-label": p.label,
      "data-x-low": p.xRange ? String(p.xRange[0]) : undefined,
      "data-x-high": p.xRange ? String(p.xRange[1]) : undefined,
    }, range + markerElement(g.style, x, y, 4.6) + text);
  });
  return element("g", { "data-points": g.key, "data-label": g.label }, marks.join(""));
}
