// What the outlet's elevation drawing draws, as plain data in SI: the structure (a riser, whose wall is
// drawn developed, or a headwall), each opening's outline, elevation and place on its wall, the barrel,
// the spillway, the pond's levels and each storm's peak stage. The drawing (outletDrawing.ts) asks
// nothing else of the outlet, and nothing here asks what kind a part is: each part gives its own
// outline and count (`outline`, `count` of src/parts/part.ts), the riser its wall and section
// (`riserWall`, `riserSection`), the barrel its opening (`barrelOutline`).
import type { Case, Outlet } from "../../model.js";
import type { StormRouting } from "../../routing/routeCase.js";
import { formatter } from "../../format.js";
import { partOf } from "../../parts/registry.js";
import { outlineWidth, type Outline } from "../../parts/outline.js";
import { alongWall, headwallWall, type DevelopedWall, type WallPlace } from "../../parts/wall.js";
import { riserSection, riserWall, riserWords } from "../../parts/riser.js";
import { barrelOutline, barrelRise, barrelSizeWords } from "../../parts/barrel.js";
import { spillwayWords } from "../../parts/spillway.js";

export type { Outline } from "../../parts/outline.js";
export type { WallPlace } from "../../parts/wall.js";

export interface DrawnOpening {
  /** "E1", "E2", ... as in the report's tables. */
  key: string;
  /** The element in words, with its elevation. */
  words: string;
  outline: Outline;
  /** Its bottom: an orifice's invert, a weir's crest (m); the invert of each of its places. */
  bottom: number;
  /** Identical openings side by side. */
  count: number;
  /**
   * Where each of its `count` openings sits on the wall (an angle around a round riser, a side and an
   * offset on a box or a headwall), when the outlet's design gives it; left out, the openings of each
   * level are spaced evenly around the wall (`placeOpenings`).
   */
  places?: readonly WallPlace[];
}

export interface DrawingInput {
  units: Case["units"];
  pond: { bottom: number; top: number; pool: number | null; freeboardLine: number };
  /** A riser (its wall developed: the perimeter unrolled) or, without one, a headwall as wide as its openings need. */
  structure:
    | { kind: "riser"; across: number; wall: DevelopedWall; rim: number; base: number; words: string }
    | { kind: "headwall"; wall: DevelopedWall; top: number; base: number; words: string };
  openings: DrawnOpening[];
  barrel: { outline: Outline; rise: number; inletInvert: number; outletInvert: number; length: number; words: string } | null;
  spillway: { crest: number; words: string } | null;
  /** Each storm's peak stage (m). */
  stages: { name: string; stage: number }[];
}

/** A clear web between openings on a headwall: a diameter, at least 1 ft / 0.3 m (common practice). */
const WEB = 0.3;

/** The drawing's input for an outlet routed through a case (the storms give the peak stages). */
export function drawingInput(c: Case, outlet: Outlet, storms: readonly StormRouting[]): DrawingInput {
  const f = formatter(c.units);
  const base = outlet.barrel ? Math.min(outlet.barrel.inletInvert, c.pond.bottom) : c.pond.bottom;
  const openings: DrawnOpening[] = outlet.elements.map((e, i) => {
    const part = partOf(e);
    return { key: `E${i + 1}`, words: part.describe(e, f), outline: part.outline(e), bottom: part.bottom(e), count: part.count(e) };
  });
  const riser = outlet.riser;
  const top = riser ? riser.crest : Math.max(c.pond.top - c.criteria.freeboardDepth, ...openings.map((o) => o.bottom + WEB));
  let structure: DrawingInput["structure"];
  if (riser) {
    structure = { kind: "riser", across: riserSection(riser), wall: riserWall(riser), rim: riser.crest, base, words: riserWords(riser, f) };
  } else {
    // A headwall as wide as its widest level of openings with a clear web between them.
    const levels = new Map<number, number>();
    for (const o of openings) {
      const w = outlineWidth(o.outline, top - o.bottom);
      levels.set(o.bottom, (levels.get(o.bottom) ?? 0) + o.count * (w + Math.max(WEB, w)));
    }
    structure = { kind: "headwall", wall: headwallWall(Math.max(1, ...levels.values()) + WEB), top, base, words: "headwall" };
  }
  const b = outlet.barrel;
  return {
    units: c.units,
    pond: { bottom: c.pond.bottom, top: c.pond.top, pool: c.pond.pool > c.pond.bottom ? c.pond.pool : null, freeboardLine: c.pond.top - c.criteria.freeboardDepth },
    structure,
    openings,
    barrel: b
      ? { outline: barrelOutline(b), rise: barrelRise(b), inletInvert: b.inletInvert, outletInvert: b.outletInvert, length: b.length, words: `${barrelSizeWords(b, f)} barrel, ${f.length(b.length, 1)} long` }
      : null,
    spillway: outlet.spillway ? { crest: outlet.spillway.crest, words: spillwayWords(outlet.spillway, f) } : null,
    stages: storms.map((s) => ({ name: s.storm.name, stage: s.result.maxStage })),
  };
}

/**
 * The centre of every opening along the unrolled wall (m from its left edge): the places the input
 * gives, else spaced evenly: the openings of one level (one bottom elevation) without places share the
 * wall, the j-th of m centred at (j + 1/2) / m of its width (around a riser: of its developed perimeter).
 */
export function placeOpenings(input: DrawingInput): number[][] {
  const wall = input.structure.wall;
  const levels = new Map<number, { opening: number; copy: number }[]>();
  input.openings.forEach((o, i) => {
    if (o.places) return;
    const key = Math.round(o.bottom * 1e6);
    const list = levels.get(key) ?? [];
    for (let k = 0; k < o.count; k++) list.push({ opening: i, copy: k });
    levels.set(key, list);
  });
  const places = input.openings.map((o) => {
    if (!o.places) return new Array<number>(o.count).fill(NaN);
    if (o.places.length !== o.count) throw new Error(`${o.key}: ${o.places.length} places for ${o.count} opening(s)`);
    return o.places.map((p) => alongWall(wall, p));
  });
  for (const list of levels.values()) {
    list.forEach(({ opening, copy }, j) => {
      places[opening][copy] = (wall.width * (j + 0.5)) / list.length;
    });
  }
  return places;
}
