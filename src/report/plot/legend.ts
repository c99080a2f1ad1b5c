// The legend: one entry per series, group of points and band (reference lines are labelled where
// they are drawn), in rows above the plot area. Text widths are estimated (no font metrics here).
import { DASH_ARRAYS, INK, type LineStyle } from "./style.js";
import { element, escapeMarkup } from "./svg.js";
import { markerPath, isStrokeOnly } from "./markers.js";

export interface LegendEntry {
  label: string;
  /** A line sample (with its marker) or, for a band, a swatch. */
  sample: { kind: "line"; style: LineStyle; showLine: boolean } | { kind: "swatch"; colour: string; patternId: string };
}

export const LEGEND_FONT_SIZE = 11.5;
const CHARACTER_WIDTH = 6.4;
const SAMPLE_WIDTH = 30;
const ROW_HEIGHT = 18;
const GAP = 18;

/** Estimated width of a text at the legend's font size. */
export function textWidth(text: string, fontSize = LEGEND_FONT_SIZE): number {
  return text.length * CHARACTER_WIDTH * (fontSize / LEGEND_FONT_SIZE);
}

export interface LegendLayout {
  height: number;
  markup: string;
}

/** Places entries left to right, wrapping at `width`; returns the markup and the height used. */
export function legend(entries: readonly LegendEntry[], left: number, top: number, width: number): LegendLayout {
  if (entries.length === 0) return { height: 0, markup: "" };
  let x = 0;
  let row = 0;
  const parts: string[] = [];
  for (const entry of entries) {
    const w = SAMPLE_WIDTH + 6 + textWidth(entry.label);
    if (x > 0 && x + w > width) {
      x = 0;
      row++;
    }
    const cx = left + x;
    const cy = top + row * ROW_HEIGHT + ROW_HEIGHT / 2;
    parts.push(
      element("g", { "data-legend": entry.label }, sample(entry, cx, cy) +
        element("text", { x: cx + SAMPLE_WIDTH + 6, y: cy, dy: "0.35em", "font-size": LEGEND_FONT_SIZE, fill: INK }, escapeMarkup(entry.label))),
    );
    x += w + GAP;
  }
  return { height: (row + 1) * ROW_HEIGHT, markup: element("g", { class: "legend" }, parts.join("")) };
}

function sample(entry: LegendEntry, x: number, y: number): string {
  const s = entry.sample;
  if (s.kind === "swatch") {
    return element("rect", { x, y: y - 6, width: SAMPLE_WIDTH, height: 12, fill: `url(#${s.patternId})`, stroke: s.colour, "stroke-width": 1 });
  }
  const line = s.showLine
    ? element("line", {
        x1: x, y1: y, x2: x + SAMPLE_WIDTH, y2: y,
        stroke: s.style.colour, "stroke-width": s.style.width, "stroke-dasharray": DASH_ARRAYS[s.style.dash], "stroke-linecap": s.style.dash === "dotted" ? "round" : undefined,
      })
    : "";
  return line + markerElement(s.style, x + SAMPLE_WIDTH / 2, y);
}

/** One marker of a style at a point (empty for "none"). */
export function markerElement(style: LineStyle, x: number, y: number, size = 3.8): string {
  if (style.marker === "none") return "";
  const strokeOnly = isStrokeOnly(style.marker);
  return element("path", {
    d: markerPath(style.marker, x, y, size),
    fill: strokeOnly ? "none" : style.open ? "#ffffff" : style.colour,
    stroke: style.colour,
    "stroke-width": strokeOnly ? 1.8 : 1.2,
  });
}
