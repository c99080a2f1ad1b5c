// Where each opening sits on its wall, for a drafter: in words (one line per element) and in the
// JSON's `wall` object, in the case's units. Stations run clockwise in plan from the datum (a riser's
// barrel centreline, or its downstream face; a headwall's middle line, positive to the right looking
// downstream); see parts/wall.ts and parts/placement.ts.
import type { Case, Outlet } from "../model.js";
import { formatter, trimNumber, type Formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { partOf } from "../parts/registry.js";
import { barrelSizeWords } from "../parts/barrel.js";
import { riserWords } from "../parts/riser.js";
import { wallLength } from "../parts/wall.js";
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
  /** Along the wall from its datum, clockwise in plan (a headwall's: to the right looking downstream). */
  station: number;
  /** Round riser: degrees clockwise in plan from the barrel's centreline. */
  angle?: number;
  /** Box riser: "downstream", "right", "upstream" or "left". */
  side?: string;
  /** Box riser: the centre's offset from its side's middle, clockwise positive; headwall: from its middle line. */
  offset?: number;
  /** Invert of an orifice or the barrel, crest of a weir. */
  invert: number;
  /** Top of the opening, or of a notch's plate. */
  top: number;
  /** Width across the wall (a chord of a round riser). */
  width: number;
}

/** The wall in the JSON; `length` is left out for a headwall of unstated width, `web` and `closest` with fewer than two holes, `barrel` without one. */
export interface WallJson {
  /** "round riser", "box riser" or "headwall". */
  kind: string;
  /** Length of the wall along its stations: a riser's perimeter, a headwall's stated width. */
  length?: number;
  /** Smallest clear web between two holes, or a hole and a corner or end. */
  web?: number;
  /** The holes the smallest web is between ("E1", "barrel", "corner", "end"). */
  closest?: [string, string];
  openings: WallHoleJson[];
  barrel?: WallHoleJson;
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
    ...(o.angle === null ? {} : { angle: o.angle }),
    ...(o.side === null ? {} : { side: o.side }),
    ...(o.offset === null ? {} : { offset: u.length(o.offset) }),
    invert: u.length(o.bottom),
    top: u.length(o.top),
    width: u.length(o.width),
  });
  const length = wallLength(plan.wall);
  return {
    kind: plan.wall.kind,
    ...(length === null ? {} : { length: u.length(length) }),
    ...(plan.web === null || plan.closest === null ? {} : { web: u.length(plan.web), closest: [refLabel(plan.closest[0], outlet), refLabel(plan.closest[1], outlet)] as [string, string] }),
    openings: plan.openings.map((o) => {
      const e = outlet.elements[o.element];
      return hole(o, `E${o.element + 1}`, partOf(e).label(e, f), o.element);
    }),
    ...(plan.barrel && outlet.barrel ? { barrel: hole(plan.barrel, "barrel", `${barrelSizeWords(outlet.barrel, f)} barrel`, null) } : {}),
    ...(plan.unplaced > 0 ? { unplaced: plan.unplaced } : {}),
  };
}

/** Where an opening is, in words: "180 deg", "upstream side, 0.40 ft clockwise of its middle", "0.75 ft right of the middle". */
function position(o: PlacedOpening, f: Formatter): string {
  if (o.angle !== null) return `${trimNumber(o.angle, 1)} deg`;
  const off = o.offset ?? 0;
  const at = Math.abs(off) < 0.0005 ? null : f.length(Math.abs(off));
  if (o.side !== null) return at === null ? `${o.side} side, middle` : `${o.side} side, ${at} ${off > 0 ? "clockwise" : "anticlockwise"} of its middle`;
  return at === null ? "middle" : `${at} ${off > 0 ? "right" : "left"} of the middle`;
}

/** A place in words for a table cell: "180 deg", "upstream side, middle", "0.75 ft right of the middle". */
export function placeWords(o: PlacedOpening, f: Formatter): string {
  return position(o, f);
}

/** "a, b and c". */
function listed(items: string[]): string {
  return items.length <= 1 ? items.join("") : `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** The wall's heading: its kind and size, and how the places are measured. */
export function wallHeading(outlet: Outlet, plan: WallPlan, f: Formatter): string {
  const wall = plan.wall;
  return wall.kind === "round riser"
    ? `${riserWords(outlet.riser!, f)}; angles clockwise in plan from ${outlet.barrel ? "the barrel's centreline" : "the downstream face"}`
    : wall.kind === "box riser"
      ? `${riserWords(outlet.riser!, f)}; offsets clockwise in plan from each side's middle`
      : `headwall${wall.width === null ? "" : ` ${f.length(wall.width)} wide`}; offsets from its middle, looking downstream`;
}

/** The wall in words: a heading, one line per element cut in it (its openings' places and its invert or crest), the barrel and the smallest web. */
export function wallLines(c: Case, outlet: Outlet, plan: WallPlan): string[] {
  const f = formatter(c.units);
  if (plan.openings.length === 0) return [];
  const wall = plan.wall;
  const lines = [`Openings on the wall (${wallHeading(outlet, plan, f)}):`];
  const byElement = new Map<number, PlacedOpening[]>();
  for (const o of plan.openings) byElement.set(o.element, [...(byElement.get(o.element) ?? []), o]);
  for (const [index, openings] of byElement) {
    const e = outlet.elements[index];
    const kind = partOf(e);
    const first = openings[0];
    const notch = kind.opening(e) === null;
    const size = notch ? `, ${f.length(first.width)} wide at ${f.elevation(first.top)}` : "";
    lines.push(`  E${index + 1} ${kind.label(e, f)}: ${listed(openings.map((o) => position(o, f)))}; ${kind.bottomField} ${f.elevation(first.bottom)}${size}`);
  }
  if (plan.unplaced > 0) lines.push(`  ${plan.unplaced} more opening${plan.unplaced > 1 ? "s" : ""}: no room left on the wall`);
  if (plan.barrel) lines.push(`  barrel: ${position(plan.barrel, f)}; invert ${f.elevation(plan.barrel.bottom)}, crown ${f.elevation(plan.barrel.top)}`);
  if (plan.web !== null && plan.closest && wallLength(wall) !== null) {
    lines.push(`  smallest clear web ${f.size(plan.web)} (${refLabel(plan.closest[0], outlet)} and ${refLabel(plan.closest[1], outlet)})`);
  }
  return lines;
}
