// Where each opening sits on its wall: a station along the developed wall and the place a drafter reads
// (wall.ts: an angle around a round riser, a side and an offset on a box riser, an offset on a
// headwall), and its invert or crest. Every opening of every element cut in the wall is a hole: a
// rectangle on the developed wall, as wide as its outline (part.ts `outline`; a round riser's curved
// wall gives it the arc its chord subtends) and from its bottom to its top (a notch or weir reaches
// the top of its plate: the rim of a riser, or without a riser the highest stage routed). The
// barrel's hole sits on its centreline (station 0 of a round riser, the middle of a box's downstream
// side); a box's corners and a stated headwall's ends are holes of no width and no height limits, so
// that openings keep the web from them too. A device (a flow regulator) is mounted on the wall, not
// cut in it: it is placed after the holes where it overlaps none, and takes no part in the webs.
//
// The clear web between two holes is the distance between the rectangles on the developed wall (across,
// up, or diagonally between corners), negative by the smaller overlap when they overlap. outfit places
// the widest openings first, then again with all the others placed each that has less than enough web:
// twice the required one, less a twentieth of it. Each goes to the round station (a multiple of 5
// degrees on a round riser, of half the web from a side's middle on a box or from a headwall's middle)
// nearest the upstream face (facing the pond; a headwall's middle) where it has enough web, so
// openings gather on the upstream face, stacked where they are far enough apart in elevation. Where no
// station gives enough, it goes where its smallest web is largest: sought at the round stations and
// the middles of the free stretches between the others, taking among those within a twentieth of the
// web of the best a round one nearest the upstream face, else the nearest middle. Ties go to the
// smaller station (to the left seen from outside). On a headwall of unstated width the openings need
// only the web between them, and the headwall is as wide as they take with a web at each end.
import type { Outlet } from "../model.js";
import { partOf } from "./registry.js";
import { barrelOutline } from "./barrel.js";
import { isHole, outlineHeight, outlineWidth, type Outline } from "./outline.js";
import { barrelStation, chordArc, faceMiddles, placeAt, upstreamStation, wallCloses, wallEdges, wallLength, wallOf, type Wall, type WallPlace } from "./wall.js";

/** An opening of an element (or the barrel's hole, or a device) on its wall. */
export interface PlacedOpening {
  /** Index of the element in `outlet.elements` (-1: the barrel). */
  element: number;
  /** Which of the element's `count` openings (1 to count). */
  opening: number;
  count: number;
  /** Its centre along the developed wall from its left edge (m; wall.ts). */
  station: number;
  /** Where it sits, as a drafter reads it (wall.ts): an angle, a side and an offset, or an offset. */
  place: WallPlace;
  /** Invert (an orifice) or crest (a weir) (m). */
  bottom: number;
  /** Top of the opening, or of a notch's plate (m). */
  top: number;
  /** Width across the wall: a chord on a round riser (m). */
  width: number;
}

/** What a hole of the plan is: an opening (element index), the barrel, or a box's corner or a headwall's end. */
export type HoleRef = { kind: "opening"; element: number; opening: number } | { kind: "barrel" } | { kind: "edge" };

export interface WallPlan {
  wall: Wall;
  /** Length of the developed wall (m): a riser's perimeter, a headwall's stated width, or the width its openings take with a web at each end. */
  width: number;
  /** Every opening of every element cut in the wall, element by element. */
  openings: PlacedOpening[];
  /** Devices mounted on the wall (flow regulators), element by element: placed where they overlap no hole, not holes themselves. */
  devices: PlacedOpening[];
  /** The barrel's hole in a riser's wall (on its centreline), null without a riser or a barrel. */
  barrel: PlacedOpening | null;
  /** Smallest clear web between two holes, or a hole and a corner or end (m); null with fewer than two. */
  web: number | null;
  /** The two holes the smallest web is between. */
  closest: [HoleRef, HoleRef] | null;
  /**
   * Openings left off the wall: of an element with more openings than its wall can hold with a web
   * after each, those beyond one more than it holds (the extra one already shows the web lost); 0 as
   * a rule.
   */
  unplaced: number;
}

export interface PlacementLimits {
  /** Clear web the placement keeps on a headwall of unstated width (m). */
  web: number;
  /** Usable width of a headwall without a riser (m), null when not stated. */
  headwallWidth: number | null;
  /** Top of a notch's plate without a riser: the highest stage routed (m); null: at its crest. */
  highestStage: number | null;
}

interface Hole {
  ref: HoleRef;
  station: number;
  /** Along the wall (m): the arc of its chord on a round riser. */
  along: number;
  width: number;
  bottom: number;
  top: number;
  count: number;
  fixed: boolean;
}

/** A hole's extent on the developed wall (m). */
interface Extent {
  station: number;
  along: number;
  bottom: number;
  top: number;
}

/** Clear web between two holes on the developed wall (m); `perimeter` for a wall that closes on itself. */
export function clearWeb(a: Extent, b: Extent, perimeter: number | null): number {
  return webAt(a.station, a.along, a.bottom, a.top, b, perimeter);
}

/** The same, with the first hole's extent given by its numbers (the placement's inner loop allocates nothing). */
function webAt(station: number, along: number, bottom: number, top: number, b: Extent, perimeter: number | null): number {
  let d = Math.abs(station - b.station);
  if (perimeter !== null) {
    d %= perimeter;
    d = Math.min(d, perimeter - d);
  }
  const across = d - (along + b.along) / 2;
  const up = Math.max(b.bottom - top, bottom - b.top);
  if (across >= 0 && up >= 0) return Math.sqrt(across * across + up * up);
  return Math.max(across, up);
}

const plans = new WeakMap<Outlet, { limits: PlacementLimits; plan: WallPlan }>();

/** Every opening of the outlet placed on its wall (kept per outlet object with the last limits: the rules and the output ask again). */
export function placeOpenings(outlet: Outlet, limits: PlacementLimits): WallPlan {
  const known = plans.get(outlet);
  if (known && known.limits.web === limits.web && known.limits.headwallWidth === limits.headwallWidth && known.limits.highestStage === limits.highestStage) return known.plan;
  const plan = place(outlet, limits);
  plans.set(outlet, { limits, plan });
  return plan;
}

/** The top of a notch's plate: a riser's rim, or without one the highest stage routed (at least the crest). */
export function plateTop(outlet: Outlet, highestStage: number | null, bottom: number): number {
  const top = outlet.riser ? outlet.riser.crest : (highestStage ?? bottom);
  return Math.max(top, bottom);
}

/** The hole an outline cut at `bottom` makes on the wall: its width (a notch's at the top of its plate), along the wall, and up to its top or the plate's. */
function holeOf(outline: Outline, bottom: number, plate: number, along: (chord: number) => number): Pick<Hole, "along" | "width" | "bottom" | "top"> {
  const height = outlineHeight(outline);
  const width = outlineWidth(outline, plate - bottom);
  return { along: along(width), width, bottom, top: height === null ? plate : bottom + height };
}

function place(outlet: Outlet, limits: PlacementLimits): WallPlan {
  const wall = wallOf(outlet, limits.headwallWidth);
  const length = wallLength(wall);
  const closes = wallCloses(wall);
  const perimeter = closes ? length : null;
  const along = (chord: number) => (wall.kind === "round riser" ? chordArc(wall.diameter, chord) : chord);
  const holes: Hole[] = [];
  const devices: Hole[] = [];
  let unplaced = 0;
  outlet.elements.forEach((e, element) => {
    const kind = partOf(e);
    const outline = kind.outline(e);
    const bottom = kind.bottom(e);
    const shape = holeOf(outline, bottom, plateTop(outlet, limits.highestStage, bottom), along);
    const count = kind.count(e);
    const placeable = Math.min(count, holdable(length, shape.along, limits.web));
    unplaced += count - placeable;
    const into = isHole(outline) ? holes : devices;
    for (let k = 1; k <= placeable; k++) into.push({ ref: { kind: "opening", element, opening: k }, station: 0, count, fixed: false, ...shape });
  });
  const b = outlet.barrel;
  const barrelAt = barrelStation(wall);
  if (b && barrelAt !== null) {
    holes.push({ ref: { kind: "barrel" }, station: barrelAt, count: 1, fixed: true, ...holeOf(barrelOutline(b), b.inletInvert, b.inletInvert, along) });
  }
  for (const station of wallEdges(wall)) holes.push({ ref: { kind: "edge" }, station, along: 0, width: 0, bottom: -Infinity, top: Infinity, count: 1, fixed: true });

  const preferred = upstreamStation(wall);
  // Enough web: twice the required (a headwall of unstated width needs only the web itself).
  const cap = length === null ? limits.web : ENOUGH_WEBS * limits.web;
  const grid = nearestRoundStations(wall, limits.web, preferred, perimeter);
  const movable = holes.filter((h) => !h.fixed).sort((x, y) => y.along - x.along || x.bottom - y.bottom);
  const placed: Hole[] = holes.filter((h) => h.fixed);
  const settle = (h: Hole, others: readonly Hole[]) => bestStation(h, others, { perimeter, preferred, cap, web: limits.web, grid });
  for (const h of movable) {
    h.station = settle(h, placed);
    placed.push(h);
  }
  // Again with all the others placed, each opening that has less than enough web (one with enough
  // keeps its place: moving could not widen its web).
  for (let pass = 0; pass < 2; pass++) {
    for (const h of movable) {
      const others = placed.filter((x) => x !== h);
      if (smallestWeb(h, others, perimeter) >= cap - AS_GOOD * limits.web) continue;
      h.station = settle(h, others);
    }
  }
  // Devices where they overlap no hole (nor each other).
  const taken = [...placed];
  for (const d of devices) {
    d.station = settle(d, taken);
    taken.push(d);
  }
  const onWall = [...holes, ...devices];
  let width: number;
  if (length !== null) {
    width = length;
    if (perimeter !== null && Number.isFinite(perimeter)) for (const h of onWall) h.station = ((h.station % perimeter) + perimeter) % perimeter;
  } else {
    // A headwall as wide as its openings take with a web at each end, its stations from its left end.
    const left = onWall.length ? Math.min(...onWall.map((h) => h.station - h.along / 2)) : 0;
    const right = onWall.length ? Math.max(...onWall.map((h) => h.station + h.along / 2)) : 0;
    for (const h of onWall) h.station += limits.web - left;
    width = right - left + 2 * limits.web;
  }

  // An element's openings numbered left to right along the wall (they are alike: a drafter counts them so).
  const numbered = holes.filter((h) => h.ref.kind === "opening").concat(devices).sort((x, y) => elementOf(x) - elementOf(y) || x.station - y.station);
  numbered.forEach((h, i) => {
    if (h.ref.kind === "opening") h.ref.opening = i > 0 && elementOf(numbered[i - 1]) === h.ref.element ? (numbered[i - 1].ref as { opening: number }).opening + 1 : 1;
  });

  let web: number | null = null;
  let closest: [HoleRef, HoleRef] | null = null;
  for (let i = 0; i < holes.length; i++) {
    for (let j = i + 1; j < holes.length; j++) {
      if (holes[i].ref.kind === "edge" && holes[j].ref.kind === "edge") continue;
      const w = clearWeb(holes[i], holes[j], perimeter);
      if (web === null || w < web) {
        web = w;
        closest = [holes[i].ref, holes[j].ref];
      }
    }
  }
  const placedOpening = (h: Hole): PlacedOpening => ({
    element: h.ref.kind === "opening" ? h.ref.element : -1,
    opening: h.ref.kind === "opening" ? h.ref.opening : 1,
    count: h.count,
    station: h.station,
    place: placeAt(wall, h.station),
    bottom: h.bottom,
    top: h.top,
    width: h.width,
  });
  const inOrder = (list: Hole[]) => list.filter((h) => h.ref.kind === "opening").map(placedOpening).sort((x, y) => x.element - y.element || x.opening - y.opening);
  const barrelHole = holes.find((h) => h.ref.kind === "barrel");
  return { wall, width, openings: inOrder(holes), devices: inOrder(devices), barrel: barrelHole ? placedOpening(barrelHole) : null, web, closest, unplaced };
}

/** The element a hole belongs to (-1: the barrel or an edge). */
function elementOf(h: Hole): number {
  return h.ref.kind === "opening" ? h.ref.element : -1;
}

/** Most openings of one element placed on a wall of unstated length (a headwall as wide as they need). */
const MOST_OPENINGS = 64;

/**
 * How many openings of one element the placement places: all that a wall of `length` holds with a web
 * after each and one more (which already shows the web lost), at most MOST_OPENINGS; so that an absurd
 * count (a mistyped case) costs no more than a full wall.
 */
function holdable(length: number | null, along: number, web: number): number {
  if (length === null || !Number.isFinite(length)) return MOST_OPENINGS;
  return Math.max(1, Math.min(MOST_OPENINGS, Math.floor(length / (along + web)) + 1));
}

/** Most round stations each way from a side's middle. */
const ROUND_STEPS = 100;

/** A web this many times the required one is enough: the placement seeks no more. */
const ENOUGH_WEBS = 2;
/** Stations whose smallest web is within this share of the required web of the best count as as good. */
const AS_GOOD = 0.05;

/**
 * Round stations of a wall: every 5 degrees of a round riser; every half web from each side's middle
 * of a box, or from a headwall's middle (to 50 webs each way when its width is not stated), at most
 * ROUND_STEPS each way (a wider step on a side of more than ROUND_STEPS half webs).
 */
function roundStations(wall: Wall, web: number): number[] {
  if (wall.kind === "round riser") return Array.from({ length: 72 }, (_, i) => (Math.PI * wall.diameter * i) / 72);
  const out: number[] = [];
  const faces = wall.kind === "headwall" && wall.width === null ? [{ middle: 0, half: 50 * web }] : faceMiddles(wall);
  for (const { middle, half } of faces) {
    const step = Math.max(web / 2, half / ROUND_STEPS);
    if (!(step > 0) || !Number.isFinite(step)) {
      out.push(middle);
      continue;
    }
    for (let k = 0; k * step <= half; k++) out.push(middle + k * step, ...(k > 0 ? [middle - k * step] : []));
  }
  return out;
}

/** Stations ordered by their distance from `preferred` (the shorter way round a closed wall; equal within round-off), then by station. */
function byNearness(stations: number[], preferred: number, perimeter: number | null): number[] {
  const distance = (s: number) => {
    const d = Math.abs(s - preferred);
    return perimeter === null ? d : Math.min(d % perimeter, perimeter - (d % perimeter));
  };
  const near = stations.map((s) => ({ s, d: distance(s) }));
  near.sort((a, b) => (Math.abs(a.d - b.d) > 1e-9 ? a.d - b.d : a.s - b.s));
  return near.map((x) => x.s);
}

/** Round stations by nearness, per wall and web (a few walls per search: kept, the oldest dropped past 64). */
const gridsKept = new Map<string, number[]>();

function nearestRoundStations(wall: Wall, web: number, preferred: number, perimeter: number | null): number[] {
  const key = `${wall.kind === "round riser" ? wall.diameter : wall.kind === "box riser" ? `${wall.length} ${wall.width}` : `headwall ${wall.width}`} ${web}`;
  let grid = gridsKept.get(key);
  if (!grid) {
    grid = byNearness(roundStations(wall, web), preferred, perimeter);
    if (gridsKept.size >= 64) gridsKept.delete(gridsKept.keys().next().value!);
    gridsKept.set(key, grid);
  }
  return grid;
}

interface Setting {
  /** A closed wall's length, null for a headwall. */
  perimeter: number | null;
  /** The upstream face's station (a headwall's middle). */
  preferred: number;
  /** The web that is enough. */
  cap: number;
  web: number;
  /** Round stations, nearest the preferred first. */
  grid: readonly number[];
}

/** The smallest web of `h` at its station to `others` (Infinity without any). */
function smallestWeb(h: Hole, others: readonly Hole[], perimeter: number | null): number {
  let least = Infinity;
  for (const o of others) least = Math.min(least, webAt(h.station, h.along, h.bottom, h.top, o, perimeter));
  return least;
}

/**
 * The station of `h` on the wall among `others`: the round station nearest the preferred with enough
 * web (`cap`, less a twentieth of the web); failing that, of the stations within a twentieth of the
 * web of the best (among the round ones and the middles of the free stretches between the others), a
 * round one nearest the preferred, else the nearest such middle (the larger web, then the smaller
 * station, breaking ties).
 */
function bestStation(h: Hole, others: readonly Hole[], { perimeter, preferred, cap, web, grid }: Setting): number {
  const scoreAt = (s: number) => {
    let score = cap;
    for (const o of others) {
      const w = webAt(s, h.along, h.bottom, h.top, o, perimeter);
      if (w < score) score = w;
    }
    return score;
  };
  const enough = cap - AS_GOOD * web;
  const gridScores = new Float64Array(grid.length);
  let top = -Infinity;
  for (let k = 0; k < grid.length; k++) {
    const score = scoreAt(grid[k]);
    if (score >= enough) return grid[k];
    gridScores[k] = score;
    if (score > top) top = score;
  }
  const exact: number[] = [preferred];
  for (const o of others) {
    exact.push(o.station);
    if (perimeter === null) exact.push(o.station - (o.along + h.along) / 2 - web, o.station + (o.along + h.along) / 2 + web);
  }
  // The middle of the free stretch between any two others (along the wall, from the first's edge to the
  // second's; on a closed wall also all the way round from one's edge to its other edge).
  for (const a of others) {
    for (const b of others) {
      if (a === b && perimeter === null) continue;
      const from = a.station + a.along / 2;
      const to = b.station - b.along / 2;
      if (perimeter !== null) {
        const gap = (((to - from) % perimeter) + perimeter) % perimeter;
        exact.push(from + gap / 2);
      } else if (to > from) exact.push((from + to) / 2);
    }
  }
  const scores = exact.map(scoreAt);
  for (const score of scores) if (score > top) top = score;
  const good = top - AS_GOOD * web;
  for (let k = 0; k < grid.length; k++) if (gridScores[k] >= good) return grid[k];
  let best = -1;
  let bestDistance = Infinity;
  for (let k = 0; k < exact.length; k++) {
    if (scores[k] < good) continue;
    let distance = Math.abs(exact[k] - preferred);
    if (perimeter !== null) {
      distance %= perimeter;
      distance = Math.min(distance, perimeter - distance);
    }
    const better = best < 0 || distance < bestDistance - 1e-12 || (distance < bestDistance + 1e-12 && (scores[k] > scores[best] + 1e-12 || (scores[k] > scores[best] - 1e-12 && exact[k] < exact[best])));
    if (better) {
      best = k;
      bestDistance = distance;
    }
  }
  return exact[best];
}
