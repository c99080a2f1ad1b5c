// The plots' look: the Okabe-Ito colour-blind-safe palette (Okabe & Ito 2008, "Color Universal
// Design"), dash patterns and marker shapes so that every series stays distinct in black and white.

export const INK = "#22262e";
export const GRID = "#e3e0d8";
export const FRAME = "#8d9199";
export const PAPER = "#ffffff";
export const FONT = "system-ui, 'Segoe UI', 'DejaVu Sans', Helvetica, Arial, sans-serif";

/** Okabe-Ito colours without yellow (too faint on white paper). */
export const PALETTE = {
  black: "#000000",
  orange: "#E69F00",
  skyBlue: "#56B4E9",
  bluishGreen: "#009E73",
  blue: "#0072B2",
  vermillion: "#D55E00",
  reddishPurple: "#CC79A7",
} as const;

export type Dash = "solid" | "dashed" | "dotted" | "dash-dot" | "long-dash";
export type MarkerShape = "circle" | "square" | "triangle" | "diamond" | "cross" | "plus" | "none";

export interface LineStyle {
  colour: string;
  width: number;
  dash: Dash;
  marker: MarkerShape;
  /** Open markers are drawn white inside. */
  open?: boolean;
}

export const DASH_ARRAYS: Readonly<Record<Dash, string | undefined>> = {
  solid: undefined,
  dashed: "7 4",
  dotted: "1.5 3.5",
  "dash-dot": "9 3 2 3",
  "long-dash": "14 5",
};

const CYCLE_COLOURS = [PALETTE.blue, PALETTE.vermillion, PALETTE.bluishGreen, PALETTE.reddishPurple, PALETTE.orange, PALETTE.skyBlue];
const CYCLE_DASHES: Dash[] = ["dashed", "dotted", "dash-dot", "long-dash", "solid"];
const CYCLE_MARKERS: MarkerShape[] = ["circle", "square", "triangle", "diamond", "cross", "plus"];

/** The i-th style of a family of related series: colour, dash and marker all change together. */
export function cycleStyle(i: number): LineStyle {
  return {
    colour: CYCLE_COLOURS[i % CYCLE_COLOURS.length],
    width: 1.8,
    dash: CYCLE_DASHES[i % CYCLE_DASHES.length],
    marker: CYCLE_MARKERS[i % CYCLE_MARKERS.length],
  };
}
