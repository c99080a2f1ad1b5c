// Where each opening sits on its wall, for a drafter: in words (one line per element) and in the
// JSON's `wall` object, in the case's units, as the placement gives it (parts/placement.ts) and in the
// wall's one vocabulary (parts/wall.ts): an angle around a round riser from the barrel's centreline,
// counterclockwise seen from above; a side named looking downstream and the offset from its left end;
// a headwall's offset from its left end; the wall read left to right seen from outside throughout.
import type { Case, Outlet } from "../model.js";
import { formatter, trimNumber, type Formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { partOf } from "../parts/registry.js";
import { barrelSizeWords } from "../parts/barrel.js";
import { riserWords } from "../parts/riser.js";
import type { WallPlace } from "../parts/wall.js";
import { isHole, outlineHeight } from "../parts/outline.js";
import type { HoleRef, PlacedOpening, WallPlan } from "../parts/placement.js";

/**
 * One hole of the wall in the JSON (lengths and elevations in the case's units). Fields that do not
 * apply to the wall are left out (no nulls): `angle` on a round riser, `side` and `offset` on a box
 * riser, `offset` on a headwall; `element` for an opening (not the barrel).
 */
export interface WallHoleJson {
  /** "E1", ... (the element's place in `outlet.elements`, from 1), or "barrel". */
  label: string;
  /** Index of the element in `outlet.elements` (from 0). */
  element?: number;
  /** Which of the element's `count` openings (from 1). */
  opening: number;
  count: number;
  /** The part in words. */
  part: string;
  /** Its centre along the developed wall from its left edge, seen from outside (a round riser's from the barrel's centreline). */
  station: number;
  /** Round riser: degrees from the barrel's centreline, counterclockwise seen from above (left to right seen from outside). */
  angle?: number;
  /** Box riser: "downstream", "left", "upstream" or "right" (named looking downstream). */
  side?: string;
  /** Box riser: the centre's offset from its side's left end seen from outside; headwall: from its left end seen from the pond. */
  offset?: number;
  /** Invert of an orifice or the barrel, crest of a weir. */
  invert: number;
  /** Top of the opening, or of a notch's plate. */
  top: number;
  /** Width across the wall (a chord of a round riser). */
  width: number;
}

/** The wall in the JSON; `web` and `closest` are left out with fewer than two holes, `barrel` without one, `devices` and `unplaced` without any. */
export interface WallJson {
  /** "round riser", "box riser" or "headwall". */
  kind: string;
  /** Length of the developed wall: a riser's perimeter, a headwall's stated width or the width its openings take with a web at each end. */
  length: number;
  /** A headwall whose width the case states (limiting the openings); left out for a riser. */
  stated?: boolean;
  /** Smallest clear web between two holes, or a hole and a corner or end. */
  web?: number;
  /** The holes the smallest web is between ("E1", "barrel", "corner", "end"). */
  closest?: [string, string];
  openings: WallHoleJson[];
  barrel?: WallHoleJson;
  /** Devices mounted on the wall (flow regulators): where each sits; not holes of the web. */
  devices?: WallHoleJson[];
  /** Openings left off the wall (more of one element than it holds with a web after each); left out when none. */
  unplaced?: number;
}

function refLabel(ref: HoleRef, outlet: Outlet): string {
  return ref.kind === "opening" ? `E${ref.element + 1}` : ref.kind === "barrel" ? "barrel" : outlet.riser ? "corner" : "end";
}

export function wallJson(c: Case, outlet: Outlet, plan: WallPlan): WallJson {
  const u = toCaseUnits(c.units);
  const f = formatter(c.units);
  const hole = (o: PlacedOpening, label: string, part: string, element: number | null): WallHoleJson => ({
    label,
    ...(element === null ? {} : { element }),
    opening: o.opening,
    count: o.count,
    part,
    station: u.length(o.station),
    ...("angle" in o.place ? { angle: o.place.angle } : { ...("side" in o.place ? { side: o.place.side } : {}), offset: u.length(o.place.offset) }),
    invert: u.length(o.bottom),
    top: u.length(o.top),
    width: u.length(o.width),
  });
  const element = (o: PlacedOpening) => {
    const e = outlet.elements[o.element];
    return hole(o, `E${o.element + 1}`, partOf(e).label(e, f), o.element);
  };
  return {
    kind: plan.wall.kind,
    length: u.length(plan.width),
    ...(plan.wall.kind === "headwall" ? { stated: plan.wall.width !== null } : {}),
    ...(plan.web === null || plan.closest === null ? {} : { web: u.length(plan.web), closest: [refLabel(plan.closest[0], outlet), refLabel(plan.closest[1], outlet)] as [string, string] }),
    openings: plan.openings.map(element),
    ...(plan.barrel && outlet.barrel ? { barrel: hole(plan.barrel, "barrel", `${barrelSizeWords(outlet.barrel, f)} barrel`, null) } : {}),
    ...(plan.devices.length > 0 ? { devices: plan.devices.map(element) } : {}),
    ...(plan.unplaced > 0 ? { unplaced: plan.unplaced } : {}),
  };
}

/** An offset along the wall in the case's units: to 0.01 ft or 1 mm. */
function offsetText(m: number, f: Formatter): string {
  return f.length(Math.abs(m) < 0.0005 ? 0 : m, f.units === "US" ? 2 : 3);
}

/** A place in words: "180 deg", "upstream side, 0.40 ft from its left end", "2.25 ft from its left end". */
export function placeText(place: WallPlace, f: Formatter): string {
  return placesText([place], f);
}

/**
 * Places in words, those on one face sharing theirs: "120 and 180 deg", "upstream side, 0.75 and 2.25
 * ft from its left end, and left side, 2.00 ft from its left end", "1.00, 2.50 and 4.00 ft from its left end".
 */
export function placesText(places: readonly WallPlace[], f: Formatter): string {
  const faces: WallPlace[][] = [];
  const face = (p: WallPlace) => ("angle" in p ? "" : "side" in p ? p.side : "headwall");
  for (const p of places) {
    const last = faces[faces.length - 1];
    if (last && face(last[0]) === face(p)) last.push(p);
    else faces.push([p]);
  }
  const words = faces.map((run) => {
    const first = run[0];
    if ("angle" in first) return `${listed(run.map((p) => trimNumber((p as { angle: number }).angle, 1)))} deg`;
    const offsets = run.map((p) => offsetText((p as { offset: number }).offset, f));
    // The unit once, after the last offset.
    const numbers = offsets.map((o, i) => (i < offsets.length - 1 ? o.replace(` ${f.labels.length}`, "") : o));
    const at = `${listed(numbers)} from its left end`;
    return "side" in first ? `${first.side} side, ${at}` : at;
  });
  return faces.length > 1 ? `${words.slice(0, -1).join(", ")}, and ${words[words.length - 1]}` : words[0];
}

/** Where an opening is, in words (a table cell). */
export function placeWords(o: PlacedOpening, f: Formatter): string {
  return placeText(o.place, f);
}

/** "a, b and c". */
function listed(items: string[]): string {
  return items.length <= 1 ? items.join("") : `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** The wall's heading: its kind and size, and how the places are read. */
export function wallHeading(outlet: Outlet, plan: WallPlan, f: Formatter): string {
  const wall = plan.wall;
  return wall.kind === "round riser"
    ? `${riserWords(outlet.riser!, f)}; angles from ${outlet.barrel ? "the barrel's centreline" : "the downstream face"}, counterclockwise seen from above`
    : wall.kind === "box riser"
      ? `${riserWords(outlet.riser!, f)}; sides named looking downstream, offsets from each side's left end seen from outside`
      : `headwall ${f.length(plan.width)} wide${wall.width === null ? " (as its openings need)" : ""}; offsets from its left end seen from the pond`;
}

/** The wall in words: a heading (naming the pond of a system's), one line per element on it (its openings' places and its invert or crest), the barrel and the smallest web. */
export function wallLines(c: Case, outlet: Outlet, plan: WallPlan, pond: string | null = null): string[] {
  const f = formatter(c.units);
  if (plan.openings.length === 0 && plan.devices.length === 0) return [];
  const lines = [`Openings on the wall${pond === null ? "" : ` of ${pond}`} (${wallHeading(outlet, plan, f)}):`];
  const byElement = new Map<number, PlacedOpening[]>();
  for (const o of [...plan.openings, ...plan.devices].sort((x, y) => x.element - y.element || x.opening - y.opening)) byElement.set(o.element, [...(byElement.get(o.element) ?? []), o]);
  for (const [index, openings] of byElement) {
    const e = outlet.elements[index];
    const kind = partOf(e);
    const first = openings[0];
    const outline = kind.outline(e);
    const size = outlineHeight(outline) === null ? `, ${f.length(first.width)} wide at ${f.elevation(first.top)}` : "";
    const mounted = isHole(outline) ? "" : " (mounted on the wall)";
    lines.push(`  E${index + 1} ${kind.label(e, f)}${mounted}: ${placesText(openings.map((o) => o.place), f)}; ${kind.bottomField} ${f.elevation(first.bottom)}${size}`);
  }
  if (plan.unplaced > 0) lines.push(`  ${plan.unplaced} more opening${plan.unplaced > 1 ? "s" : ""}: no room left on the wall`);
  if (plan.barrel) lines.push(`  barrel: ${placeWords(plan.barrel, f)}; invert ${f.elevation(plan.barrel.bottom)}, crown ${f.elevation(plan.barrel.top)}`);
  // On a headwall of unstated width the openings are set a web apart by construction: no web to judge.
  const limited = plan.wall.kind !== "headwall" || plan.wall.width !== null;
  if (plan.web !== null && plan.closest && limited) {
    lines.push(`  smallest clear web ${f.size(plan.web)} (${refLabel(plan.closest[0], outlet)} and ${refLabel(plan.closest[1], outlet)})`);
  }
  return lines;
}
