// What the outlet's elevation drawing draws, as plain data in SI: the structure (a riser, whose wall is
// drawn developed, or a headwall), each opening's outline, elevation and places on its wall, the
// barrel, the spillway, the pond's levels and each storm's peak stage. The places are the placement's
// (parts/placement.ts, the `WallPlan` the rules judge and the tables and JSON print): the drawing
// shows each opening where outfit put it and computes no place of its own. Nothing here asks what kind
// a part is: each part gives its own outline and count (`outline`, `count` of src/parts/part.ts), the
// riser its section and words (`riserSection`, `riserWords`), the barrel its opening (`barrelOutline`).
import type { Case, Outlet } from "../../model.js";
import type { StormRouting } from "../../routing/routeCase.js";
import { formatter, type Formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { outlineWidth, type Outline } from "../../parts/outline.js";
import type { WallPlan } from "../../parts/placement.js";
import { BOX_SIDES, boxSides, wallEdges } from "../../parts/wall.js";
import { riserSection, riserWords } from "../../parts/riser.js";
import { barrelOutline, barrelRise, barrelSizeWords } from "../../parts/barrel.js";
import { spillwayWords } from "../../parts/spillway.js";
import { placeText } from "../wall.js";

export type { Outline } from "../../parts/outline.js";

export interface DrawnOpening {
  /** "E1", "E2", ... as in the report's tables. */
  key: string;
  /** The element in words, with its elevation. */
  words: string;
  outline: Outline;
  /** Its bottom: an orifice's invert, a weir's crest (m). */
  bottom: number;
  /** Identical openings side by side. */
  count: number;
  /** The centre of each of its openings on the wall, along the developed wall from its left edge (m): the placement's stations. */
  stations: number[];
}

/** The wall developed (unrolled), seen from outside, as the placement lays it out (parts/wall.ts). */
export interface DrawnWall {
  /** Its length unrolled (m): a riser's perimeter, a headwall's width. */
  width: number;
  /** It closes on itself (a riser): a hole across its left or right edge shows at both. */
  closes: boolean;
  /** Stations where one face meets the next (a box riser's corners). */
  corners: number[];
  /** Marks along its foot, in the places' words: the angles around a round riser (every 90 degrees), the sides of a box. */
  marks: { at: number; text: string }[];
}

export interface DrawingInput {
  units: Case["units"];
  pond: { bottom: number; top: number; pool: number | null; freeboardLine: number };
  /** A riser (its wall developed: the perimeter unrolled) or, without one, a headwall as wide as its openings need. */
  structure:
    | { kind: "riser"; across: number; wall: DrawnWall; rim: number; base: number; words: string }
    | { kind: "headwall"; wall: DrawnWall; top: number; base: number; words: string };
  openings: DrawnOpening[];
  /** The barrel, and where its centreline meets the developed wall (m; null where it leaves below a headwall). */
  barrel: { outline: Outline; rise: number; inletInvert: number; outletInvert: number; length: number; words: string; station: number | null } | null;
  spillway: { crest: number; words: string } | null;
  /** Each storm's peak stage (m). */
  stages: { name: string; stage: number }[];
}

/** The developed wall of a plan: its width, corners and the marks along its foot. */
function drawnWall(plan: WallPlan, f: Formatter): DrawnWall {
  const w = plan.wall;
  let marks: DrawnWall["marks"] = [];
  if (w.kind === "round riser") marks = [0, 90, 180, 270].map((degrees) => ({ at: (plan.width * degrees) / 360, text: placeText({ angle: degrees }, f) }));
  if (w.kind === "box riser") {
    let start = 0;
    marks = boxSides(w.length, w.width).map((side, i) => {
      const mark = { at: start + side / 2, text: BOX_SIDES[i] };
      start += side;
      return mark;
    });
  }
  return { width: plan.width, closes: w.kind !== "headwall", corners: w.kind === "box riser" ? wallEdges(w).slice(1) : [], marks };
}

/** The drawing's input for an outlet routed through a case (the storms give the peak stages), its openings at the places `plan` gives them. */
export function drawingInput(c: Case, outlet: Outlet, storms: readonly StormRouting[], plan: WallPlan): DrawingInput {
  const f = formatter(c.units);
  const base = outlet.barrel ? Math.min(outlet.barrel.inletInvert, c.pond.bottom) : c.pond.bottom;
  const placed = [...plan.openings, ...plan.devices];
  const openings: DrawnOpening[] = outlet.elements.map((e, i) => {
    const part = partOf(e);
    const stations = placed.filter((o) => o.element === i).map((o) => o.station);
    return { key: `E${i + 1}`, words: part.describe(e, f), outline: part.outline(e), bottom: part.bottom(e), count: part.count(e), stations };
  });
  const riser = outlet.riser;
  const wall = drawnWall(plan, f);
  const freeboardLine = c.pond.top - c.criteria.freeboardDepth;
  let structure: DrawingInput["structure"];
  // A barrel alone (an equaliser pipe between two ponds): an endwall around the pipe's inlet, a web
  // above its crown, the pipe's opening through it.
  const pipe = !riser && openings.length === 0 && outlet.barrel ? outlet.barrel : null;
  let pipeStation: number | null = null;
  if (pipe) {
    const web = c.criteria.buildability.web;
    const width = outlineWidth(barrelOutline(pipe), barrelRise(pipe)) + 2 * web;
    pipeStation = width / 2;
    structure = { kind: "headwall", wall: { width, closes: false, corners: [], marks: [] }, top: pipe.inletInvert + barrelRise(pipe) + web, base, words: "endwall at the pipe's inlet" };
  } else if (riser) {
    structure = { kind: "riser", across: riserSection(riser), wall, rim: riser.crest, base, words: riserWords(riser, f) };
  } else {
    // A headwall to the freeboard line, or a web above its highest opening.
    const top = Math.max(freeboardLine, ...placed.map((o) => o.top + c.criteria.buildability.web));
    structure = { kind: "headwall", wall, top, base, words: "headwall" };
  }
  const b = outlet.barrel;
  return {
    units: c.units,
    pond: { bottom: c.pond.bottom, top: c.pond.top, pool: c.pond.pool > c.pond.bottom ? c.pond.pool : null, freeboardLine },
    structure,
    openings,
    barrel: b
      ? { outline: barrelOutline(b), rise: barrelRise(b), inletInvert: b.inletInvert, outletInvert: b.outletInvert, length: b.length, words: `${barrelSizeWords(b, f)} barrel, ${f.length(b.length, 1)} long`, station: plan.barrel?.station ?? pipeStation }
      : null,
    spillway: outlet.spillway ? { crest: outlet.spillway.crest, words: spillwayWords(outlet.spillway, f) } : null,
    stages: storms.map((s) => ({ name: s.storm.name, stage: s.result.maxStage })),
  };
}
