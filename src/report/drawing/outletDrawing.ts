// The outlet structure as an elevation drawing, to scale (one scale across and up), as an SVG string:
// on the left a section through the riser (or headwall) with the pond floor, the barrel leaving its
// base through the embankment, the top of embankment, the spillway crest and the water levels; on the
// right the riser's wall developed (its perimeter unrolled, seen from outside: parts/wall.ts) with
// every opening at its elevation and at the station the placement gave it, the wall's angles or sides
// marked along its foot. Levels are labelled on their lines and openings tagged E1, E2, ... beside them, each label
// where no other is (plot/labels.ts); a key below the drawing names each opening, the barrel and the
// spillway in full, and every storm's peak stage (whether or not its label found room on its line).
// The markup carries the scale and each feature's elevation in the case's units (`data-*`), so tests
// read the drawing back.
import { formatter, trimNumber } from "../../format.js";
import { toCaseUnits } from "../../units.js";
import { attributes, coordinate, element, escapeMarkup } from "../plot/svg.js";
import { FONT, INK, PALETTE, PAPER, cycleStyle } from "../plot/style.js";
import { niceAxis } from "../plot/ticks.js";
import { label, LabelPlacer, LABEL_FONT } from "../plot/labels.js";
import { outlineHeight, outlineWidth, type Outline } from "../../parts/outline.js";
import type { DrawingInput } from "./input.js";

const WIDTH = 720;
const LEFT = 62;
const TOP = 32;
const GAP = 26;
/** Room right of the wall for labels that find no place on their lines (px). */
const RIGHT = 90;
/** Lines of the key below the drawing (px). */
const KEY_STEP = 15;
/** Height the drawing's elevation range may take at most (px). */
const MAX_HEIGHT = 380;

const STRUCTURE = INK;
const WATER = PALETTE.blue;
const EARTH = "#8a7a5c";
const SPILLWAY = PALETTE.orange;

/** A short zigzag across a line end: the drawing is cut there (the barrel goes on). */
function breakMark(x: number, y0: number, y1: number): string {
  const mid = (y0 + y1) / 2;
  return `M${coordinate(x)} ${coordinate(y0 - 4)} L${coordinate(x)} ${coordinate(mid - 4)} L${coordinate(x + 5)} ${coordinate(mid - 1)} L${coordinate(x - 5)} ${coordinate(mid + 1)} L${coordinate(x)} ${coordinate(mid + 4)} L${coordinate(x)} ${coordinate(y1 + 4)}`;
}

/** A round length (case units) for the scale bar, about a sixth of `span`. */
function scaleBarLength(span: number): number {
  const raw = span / 6;
  const power = 10 ** Math.floor(Math.log10(raw));
  return [1, 2, 5, 10].map((m) => m * power).find((v) => v >= raw) ?? raw;
}

/** An outline drawn with its bottom at `by` and centred at `cx` (px), `scale` px per m; a notch is cut up to `rimY`. */
function outlineShape(o: Outline, cx: number, by: number, scale: number, rimY: number, attrs: Record<string, string | number | undefined>): string {
  if (o.kind === "circle") return element("circle", { cx, cy: by - (o.diameter * scale) / 2, r: (o.diameter * scale) / 2, ...attrs });
  if (o.kind === "notch") {
    const half0 = (o.bottomWidth * scale) / 2;
    const half = (outlineWidth(o, (by - rimY) / scale) * scale) / 2;
    return element("path", { d: `M${coordinate(cx - half)} ${coordinate(rimY)} L${coordinate(cx - half0)} ${coordinate(by)} H${coordinate(cx + half0)} L${coordinate(cx + half)} ${coordinate(rimY)}`, ...attrs });
  }
  return element("rect", { x: cx - (o.width * scale) / 2, y: by - o.height * scale, width: o.width * scale, height: o.height * scale, ...attrs });
}

/** The elevation drawing of an outlet (see the file's head); `id` keeps its ids unique in a document. */
export function outletDrawing(id: string, input: DrawingInput): string {
  const f = formatter(input.units);
  const u = toCaseUnits(input.units);
  const s0 = input.structure;
  const riser = s0.kind === "riser" ? s0 : null;
  const wallTop = riser ? riser.rim : s0.kind === "headwall" ? s0.top : 0;
  const base = s0.base;
  const b = input.barrel;
  const depth = input.pond.top - input.pond.bottom;

  // Elevations shown: from below the lowest invert to above the top of embankment and the highest stage.
  const lows = [input.pond.bottom, base, ...(b ? [b.inletInvert, b.outletInvert] : [])];
  const highs = [input.pond.top, wallTop, ...input.stages.map((s) => s.stage), ...(input.spillway ? [input.spillway.crest] : [])];
  const range = Math.max(...highs) - Math.min(...lows);
  const zLow = Math.min(...lows) - 0.08 * range;
  const zHigh = Math.max(...highs) + 0.06 * range;

  // The key below the drawing: each opening, the barrel and the spillway in full.
  const key = [
    ...input.openings.map((o) => `${o.key}: ${o.words}`),
    ...(b ? [`Barrel: ${b.words}, inlet ${f.elevation(b.inletInvert)}, outlet ${f.elevation(b.outletInvert)}`] : []),
    ...(input.spillway ? [`Spillway: ${input.spillway.words} (beside the ${riser ? "riser" : "headwall"}, shown as its crest)`] : []),
    // Named here too: a stage's label is left off the drawing where its line has no free room.
    ...(input.stages.length > 0 ? [`Peak stages (dashed): ${input.stages.map((st) => `${st.name} ${f.elevation(st.stage)}`).join(", ")}`] : []),
  ];

  // One scale across and up (px per m), the smaller of what the height and the width allow.
  const across = riser ? riser.across : 0.3;
  const stub = Math.max(0.35 * depth, 0.6 * across);
  const barrelShown = b ? Math.min(b.length, Math.max(1.2 * across, 0.35 * depth)) : 0.6 * across;
  const metresAcross = stub + across + barrelShown + s0.wall.width;
  const pxAcross = WIDTH - LEFT - 12 - GAP - RIGHT;
  const scale = Math.min(MAX_HEIGHT / (zHigh - zLow), pxAcross / metresAcross);
  const plotHeight = (zHigh - zLow) * scale;
  const keyTop = TOP + plotHeight + 48;
  const height = keyTop + key.length * KEY_STEP + 8;
  const y = (z: number) => TOP + (zHigh - z) * scale;

  // Section panel: stub of pond, the structure, the barrel; the wall panel after a gap.
  const sx0 = LEFT + 12;
  const riserLeft = sx0 + stub * scale;
  const riserRight = riserLeft + across * scale;
  const sectionRight = riserRight + barrelShown * scale;
  const wx0 = sectionRight + GAP;
  const wx1 = wx0 + s0.wall.width * scale;
  const right = wx1 + 8;

  const parts: string[] = [];
  // Labels go where no other label or shape is, inside the drawing's area.
  const placer = new LabelPlacer({ left: LEFT + 4, right: WIDTH - 4, top: TOP - 12, bottom: TOP + plotHeight + 12 });
  const texts: string[] = [];
  const labelAt = (text: string, colour: string, spots: readonly (readonly [number, number, "start" | "end" | "middle"])[], data: Record<string, string>) => {
    texts.push(text);
    const at = placer.place(text, spots);
    if (at) parts.push(element("g", Object.fromEntries(Object.entries(data).map(([k, v]) => [`data-${k}`, v])), label(text, at.x, at.y, at.anchor, colour)));
  };
  /** Spots for a level's label: above its line, right end first, moving left; then below it. */
  const levelSpots = (x0: number, x1: number, ly: number): [number, number, "end"][] => {
    const spots: [number, number, "end"][] = [];
    for (let x = x1; x > x0 + 40; x -= 18) spots.push([x, ly - 3, "end"], [x, ly + 12, "end"]);
    return spots;
  };
  const line = (x1: number, y1: number, x2: number, y2: number, attrs: Record<string, string | number | undefined>) => element("line", { x1, y1, x2, y2, ...attrs });

  // Elevation axis (case units), ticks at round values.
  const axis = niceAxis(u.length(zLow), u.length(zHigh));
  const ticks = axis.ticks.filter((t) => t >= u.length(zLow) - 1e-9 && t <= u.length(zHigh) + 1e-9);
  parts.push(element("g", { class: "axes", stroke: INK, "stroke-width": 1, "font-size": 11 },
    line(LEFT, TOP, LEFT, TOP + plotHeight, {}) +
    ticks.map((t) => {
      const ty = y(t / u.length(1));
      return line(LEFT - 5, ty, LEFT, ty, {}) + element("text", { x: LEFT - 8, y: ty, dy: "0.35em", "text-anchor": "end", stroke: "none", fill: INK }, trimNumber(t, 2));
    }).join("") +
    element("text", { x: 0, y: 0, transform: `translate(14 ${coordinate(TOP + plotHeight / 2)}) rotate(-90)`, "text-anchor": "middle", "font-size": 12, stroke: "none", fill: INK }, escapeMarkup(`Elevation (${f.labels.length})`))));

  // Panel titles.
  const title = (x: number, text: string) => element("text", { x, y: 16, "font-size": 11.5, "font-weight": 600, fill: INK }, escapeMarkup(text));
  parts.push(title(sx0, "Section"));
  parts.push(title(wx0, riser ? `${riser.words[0].toUpperCase()}${riser.words.slice(1)}: wall unrolled, ${f.length(s0.wall.width)}` : `Headwall (${f.length(s0.wall.width)} wide)`));

  // Water in the pond stub up to the largest peak stage.
  const floorY = y(input.pond.bottom);
  const highest = Math.max(...input.stages.map((st) => st.stage), input.pond.pool ?? -Infinity);
  if (Number.isFinite(highest) && highest > input.pond.bottom) {
    parts.push(element("rect", { x: sx0, y: y(highest), width: riserLeft - sx0, height: floorY - y(highest), fill: WATER, "fill-opacity": 0.08, stroke: "none" }));
  }
  // Ground: the pond floor up to the structure, hatched below.
  parts.push(element("path", { d: `M${coordinate(sx0)} ${coordinate(floorY)} H${coordinate(riserLeft)}`, stroke: EARTH, "stroke-width": 2, fill: "none", "data-level": "floor", "data-value": String(u.length(input.pond.bottom)) }));
  for (let x = sx0 + 4; x < riserLeft - 2; x += 8) parts.push(line(x, floorY, x - 6, floorY + 6, { stroke: EARTH, "stroke-width": 1 }));

  // The structure in section: two walls from its base to its rim (a headwall: one solid wall), open at the rim.
  const baseY = y(base);
  const rimY = y(wallTop);
  parts.push(element("path", {
    d: riser
      ? `M${coordinate(riserLeft)} ${coordinate(rimY)} V${coordinate(baseY)} H${coordinate(riserRight)} V${coordinate(rimY)}`
      : `M${coordinate(riserLeft)} ${coordinate(rimY)} V${coordinate(baseY)} H${coordinate(riserRight)} V${coordinate(rimY)} Z`,
    fill: riser ? "none" : "#e9e6df", stroke: STRUCTURE, "stroke-width": 2.4, "data-level": riser ? "rim" : "headwall-top", "data-value": String(u.length(wallTop)),
  }));

  // The barrel: from the structure's base through the embankment, at its slope, cut where the section ends.
  const topY = y(input.pond.top);
  const embankmentLeft = riserRight + 0.15 * barrelShown * scale;
  if (b) {
    const slope = (b.outletInvert - b.inletInvert) / b.length;
    const inv0 = y(b.inletInvert);
    const inv1 = y(b.inletInvert + slope * barrelShown);
    const rise = b.rise * scale;
    parts.push(element("g", { "data-barrel": "", "data-inlet": String(u.length(b.inletInvert)), "data-rise": String(u.length(b.rise)), fill: "none", stroke: STRUCTURE, "stroke-width": 1.6 },
      element("path", { d: `M${coordinate(riserRight)} ${coordinate(inv0)} L${coordinate(sectionRight)} ${coordinate(inv1)} M${coordinate(riserRight)} ${coordinate(inv0 - rise)} L${coordinate(sectionRight)} ${coordinate(inv1 - rise)}` }) +
      (barrelShown < b.length ? element("path", { d: breakMark(sectionRight, inv1 - rise, inv1), "stroke-width": 1.2 }) : "")));
    // The embankment over it, hatched between its top and the barrel's crown.
    for (let x = embankmentLeft + 6; x < sectionRight - 2; x += 10) parts.push(line(x, topY, x - 8, topY + 8, { stroke: EARTH, "stroke-width": 0.8 }));
  }
  parts.push(element("path", { d: `M${coordinate(embankmentLeft)} ${coordinate(topY)} H${coordinate(sectionRight)}`, stroke: EARTH, "stroke-width": 2, fill: "none", "data-level": "top", "data-value": String(u.length(input.pond.top)) }));

  // The wall, developed: its outline, then every opening at its elevation and place.
  parts.push(element("rect", { x: wx0, y: rimY, width: wx1 - wx0, height: baseY - rimY, fill: "#f3f1ec", stroke: STRUCTURE, "stroke-width": 2, "data-wall": "", "data-width": String(u.length(s0.wall.width)), "data-base": String(u.length(base)), "data-top": String(u.length(wallTop)) }));
  // Everything on the wall is clipped to it: a hole across the seam of a riser's wall (its left and
  // right edges are one line of the riser) shows part at each edge.
  const clip = `${id}-wall`;
  parts.push(element("clipPath", { id: clip }, element("rect", { x: wx0, y: TOP - 20, width: wx1 - wx0, height: plotHeight + 40 })));
  const onWall: string[] = [];
  /** The stations a hole centred at `station`, `half` wide each side, is drawn at: itself, and across the seam of a wall that closes. */
  const drawnAt = (station: number, half: number): { station: number; seam: boolean }[] => {
    const at = [{ station, seam: false }];
    if (!s0.wall.closes) return at;
    if (station - half < 0) at.push({ station: station + s0.wall.width, seam: true });
    if (station + half > s0.wall.width) at.push({ station: station - s0.wall.width, seam: true });
    return at;
  };
  // A box's corners: where one side ends and the next begins.
  for (const at of s0.wall.corners) {
    parts.push(line(wx0 + at * scale, rimY, wx0 + at * scale, baseY, { stroke: STRUCTURE, "stroke-width": 0.8, "stroke-dasharray": "2 3", "data-corner": String(u.length(at)) }));
  }
  if (b && b.station !== null) {
    // The barrel leaves the riser at its base: its opening, behind the wall, on its centreline.
    const half = outlineWidth(b.outline, 0) / 2;
    for (const at of drawnAt(b.station, half)) {
      onWall.push(outlineShape(b.outline, wx0 + at.station * scale, y(b.inletInvert), scale, rimY, { fill: "none", stroke: STRUCTURE, "stroke-width": 1.2, "stroke-dasharray": "4 3", ...(at.seam ? { "data-seam": "" } : { "data-barrel-opening": "", "data-place": String(u.length(at.station)) }) }));
    }
  }
  const tags: { text: string; colour: string; box: { left: number; right: number; top: number; bottom: number }; key: string }[] = [];
  input.openings.forEach((o, i) => {
    const colour = cycleStyle(i).colour;
    const by = y(o.bottom);
    const height = outlineHeight(o.outline);
    const top = height === null ? wallTop : o.bottom + height;
    const ol = o.outline;
    const half = outlineWidth(ol, Math.max(wallTop - o.bottom, 0)) / 2;
    let left = Infinity;
    let rightmost = -Infinity;
    const shapes = o.stations.flatMap((station) => {
      // Its tag goes beside the part of it within the wall.
      left = Math.min(left, wx0 + Math.max(station - half, 0) * scale);
      rightmost = Math.max(rightmost, wx0 + Math.min(station + half, s0.wall.width) * scale);
      return drawnAt(station, half).map((at) =>
        outlineShape(ol, wx0 + at.station * scale, by, scale, rimY, { fill: PAPER, stroke: colour, "stroke-width": 1.8, ...(at.seam ? { "data-seam": "" } : { "data-place": String(u.length(at.station)) }), ...(ol.kind === "device" ? { "stroke-dasharray": "3 2" } : {}) }));
    });
    onWall.push(element("g", { "data-opening": o.key, "data-bottom": String(u.length(o.bottom)), "data-top": String(u.length(top)) }, shapes.join("")));
    // The section shows each opening as a gap in the riser's left wall.
    parts.push(line(riserLeft, y(top), riserLeft, by, { stroke: colour, "stroke-width": 4 }));
    if (o.stations.length > 0) tags.push({ text: o.key, colour, box: { left, right: rightmost, top: y(top), bottom: by }, key: o.key });
  });
  parts.push(element("g", { "clip-path": `url(#${clip})` }, onWall.join("")));
  // How the places read, along the wall's foot: its angles, or its sides (before any other label).
  for (const mark of s0.wall.marks) {
    const mx = wx0 + mark.at * scale;
    parts.push(line(mx, baseY, mx, baseY + 4, { stroke: STRUCTURE, "stroke-width": 1 }));
    const anchor = mark.at <= 0 ? "start" : mark.at >= s0.wall.width ? "end" : "middle";
    // Below the foot, or a line lower where a neighbour's mark takes the room.
    const at = placer.place(mark.text, [[mx, baseY + 13, anchor], [mx, baseY + 25, anchor]]);
    if (at) parts.push(element("g", { "data-mark": mark.text }, label(mark.text, at.x, at.y, at.anchor, STRUCTURE)));
  }
  // The openings and the wall's outline are taken before any label is placed.
  for (const t of tags) placer.take(t.box);

  // Levels across the drawing, labelled on their lines: top of embankment, spillway crest, rim,
  // freeboard line, pool, floor, each storm's peak stage.
  /** A level across the pond stub (`x0`..`x1`), and across the wall too when `wall`, labelled on its line. */
  const level = (key: string, z: number, text: string, colour: string, dash: string | undefined, x0: number, x1: number, wall = false) => {
    const ly = y(z);
    const attrs = { stroke: colour, "stroke-width": 1.3, "stroke-dasharray": dash };
    parts.push(element("g", { "data-level": key, "data-value": String(u.length(z)) }, line(x0, ly, x1, ly, attrs) + (wall ? line(wx0 - 6, ly, wx1 + 6, ly, attrs) : "")));
    labelAt(text, colour, [...(wall ? levelSpots(wx0, wx1, ly) : []), ...levelSpots(x0, Math.min(x1 + 2, WIDTH - 4), ly), [right, ly + 4, "start"]], { label: key });
  };
  labelAt(`top of embankment ${f.elevation(input.pond.top)}`, EARTH, levelSpots(embankmentLeft, sectionRight, topY), { label: "top" });
  labelAt(`${riser ? "rim" : "top of headwall"} ${f.elevation(wallTop)}`, STRUCTURE, [[wx0 + 4, rimY - 4, "start"], [riserLeft - 4, rimY - 4, "end"], [wx1, rimY - 4, "end"]], { label: "rim" });
  if (input.spillway) level("spillway", input.spillway.crest, `spillway crest ${f.elevation(input.spillway.crest)}`, SPILLWAY, "7 4", embankmentLeft, sectionRight);
  level("freeboard", input.pond.freeboardLine, `freeboard line ${f.elevation(input.pond.freeboardLine)}`, INK, "9 3 2 3", sx0, riserLeft, true);
  if (input.pond.pool !== null) level("pool", input.pond.pool, `permanent pool ${f.elevation(input.pond.pool)}`, PALETTE.skyBlue, undefined, sx0, riserLeft, true);
  labelAt(`floor ${f.elevation(input.pond.bottom)}`, EARTH, [[sx0 + 2, floorY + 14, "start"], [riserLeft - 2, floorY + 14, "end"], [sx0 + 2, floorY - 4, "start"]], { label: "floor" });
  input.stages.forEach((st, i) => {
    const colour = cycleStyle(i).colour;
    const sy = y(st.stage);
    // Across the pond stub and the wall (which openings it reaches).
    parts.push(element("g", { "data-level": "stage", "data-storm": st.name, "data-value": String(u.length(st.stage)), stroke: colour, "stroke-width": 1.4, "stroke-dasharray": "5 3" },
      line(sx0, sy, riserLeft, sy, {}) + line(wx0 - 6, sy, wx1 + 6, sy, {})));
    labelAt(`${st.name} ${f.elevation(st.stage)}`, colour, [...levelSpots(wx0, wx1, sy), [right, sy + 4, "start"], [sx0 + 2, sy - 3, "start"]], { label: "stage", storm: st.name });
  });
  // The openings' tags beside them (the key below names them in full).
  for (const t of tags) {
    const cy = (t.box.top + t.box.bottom) / 2;
    labelAt(t.text, t.colour, [[t.box.right + 4, cy + 4, "start"], [t.box.left - 4, cy + 4, "end"], [(t.box.left + t.box.right) / 2, t.box.top - 4, "middle"], [(t.box.left + t.box.right) / 2, t.box.bottom + 13, "middle"], [right, cy + 4, "start"]], { label: "opening", opening: t.key });
  }

  // Scale bar: the drawing's one scale, across and up alike.
  const bar = scaleBarLength(u.length(s0.wall.width + across));
  const barPx = (bar / u.length(1)) * scale;
  const barY = TOP + plotHeight + 26;
  parts.push(element("g", { "data-scale-bar": String(bar), stroke: INK, "font-size": 10.5 },
    line(sx0, barY, sx0 + barPx, barY, { "stroke-width": 2 }) + line(sx0, barY - 4, sx0, barY + 4, {}) + line(sx0 + barPx, barY - 4, sx0 + barPx, barY + 4, {}) +
    element("text", { x: sx0 + barPx + 8, y: barY, dy: "0.35em", stroke: "none", fill: INK }, escapeMarkup(`${trimNumber(bar, 3)} ${f.labels.length}; drawn to one scale across and up${riser ? "; the wall unrolled and seen from outside" : "; the headwall seen from the pond"}${b && barrelShown < b.length ? "; the barrel cut short" : ""}`))));
  // The key.
  parts.push(element("g", { class: "key", "font-size": LABEL_FONT, fill: INK },
    key.map((k, i) => element("text", { x: sx0, y: keyTop + i * KEY_STEP, fill: i < input.openings.length ? cycleStyle(i).colour : INK }, escapeMarkup(k))).join("")));

  return `<svg${attributes({
    viewBox: `0 0 ${WIDTH} ${coordinate(height)}`,
    width: WIDTH,
    height: coordinate(height),
    role: "img",
    "aria-labelledby": `${id}-title`,
    class: "drawing",
    "font-family": FONT,
    "data-drawing": "outlet",
    // px per case length unit, and the elevation at the drawing's top edge of the plot area (y = TOP).
    "data-scale": String(scale / u.length(1)),
    "data-elevation-top": String(u.length(zHigh)),
    "data-y-top": String(TOP),
    "data-unit": f.labels.length,
  })}>${element("title", { id: `${id}-title` }, escapeMarkup("Outlet structure, elevation"))}${element("desc", {}, escapeMarkup(`The outlet drawn to scale: ${[...texts, ...key].join("; ")}.`))}${element("rect", { x: 0, y: 0, width: WIDTH, height, fill: PAPER })}${parts.join("")}</svg>`;
}
