// No proposal ranked compliant breaks a buildability rule, on every bundled case and on the invented
// case whose catalogue invites each loophole (cases/loophole-catalogue: notch angles to 150 degrees,
// thirteen orifice sizes, a 0.01 ft elevation step, a 3 in minimum opening, barrels wider than its
// risers, an existing outlet with levels 0.05 ft apart). Before these rules the search ranked compliant
// on it, among its first 30 at the default budget, a Cipolletti weir and v-notches wider at the rim than
// their riser less a web at each end, weir crests 0.01 ft under the rim, an orifice reaching the rim and
// a 30 in barrel in a 3 ft riser. Each candidate of `design --json` is judged
// here again from its written outlet and its `wall` by plane geometry of the test's own (not outfit's
// rule code): level gaps, crests and tops under the rim, notch widths at the rim against the diameter
// less a web each side, the webs between the listed places, the minimum opening per kind, the barrel
// in its riser; and every opening of every element in the wall is listed with its place.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { outfit, ROOT } from "../cli/run.js";

const LENGTH: Record<string, number> = { ft: 1, in: 1 / 12, m: 1, mm: 0.001 };

/** A length of the file in the case's base unit (ft or m). */
function len(value: number | string): number {
  if (typeof value === "number") return value;
  const m = /^\s*([-\d.e]+)\s*([a-z]+)\s*$/.exec(value)!;
  return Number(m[1]) * LENGTH[m[2]];
}

interface Element {
  type: string;
  shape?: string;
  diameter?: string | number;
  width?: number;
  height?: number;
  length?: number;
  angle?: number;
  count?: number;
  invert?: number;
  crest?: number;
}
interface Hole {
  element?: number;
  station: number;
  angle?: number;
  side?: string;
  offset?: number;
  invert: number;
  top: number;
  width: number;
}
interface Candidate {
  rank: number;
  compliant: boolean;
  /** A system of ponds: each pond's outlet and wall (then `outlet` and `wall` are left out). */
  ponds?: { name: string; outlet: Candidate["outlet"]; wall: Candidate["wall"] }[];
  outlet: { elements: Element[]; riser?: { shape: string; diameter?: number; length?: number; width?: number; crest: number }; barrel?: { shape: string; diameter?: string | number; span?: number; rise?: number; inletInvert: number } };
  storms: { maxStage: number }[];
  checks: { kind: string; passed: boolean; pond?: string }[];
  wall: { kind: string; length: number; stated?: boolean; openings: Hole[]; barrel?: Hole };
}

/** The case's limits in its base unit (the defaults of common practice unless it states them). */
function limitsOf(json: { units: string; criteria?: { buildability?: Record<string, number | string>; minimumOpening?: { size: number | string } } }) {
  const us = json.units === "US";
  const b = json.criteria?.buildability ?? {};
  const given = (key: string, fallback: number) => (b[key] === undefined ? fallback : len(b[key]));
  return {
    web: given("web", us ? 0.5 : 0.15),
    spacing: given("levelSpacing", us ? 0.25 : 0.075),
    clearance: given("rimClearance", us ? 0.25 : 0.075),
    headwall: b.headwallWidth === undefined ? null : len(b.headwallWidth),
    minimum: json.criteria?.minimumOpening ? len(json.criteria.minimumOpening.size) : null,
  };
}

const TOL = 1e-6;
const rad = (degrees: number) => (degrees * Math.PI) / 180;
const bottom = (e: Element) => e.invert ?? e.crest!;
const inWall = (e: Element) => e.type !== "regulator";
/** An orifice's height above its invert; null for a notch or weir (open to the top of its plate). */
const height = (e: Element) => (e.type !== "orifice" ? null : e.shape === "circular" ? len(e.diameter!) : e.height!);
/** A notch's or weir's width at a height h above its crest. */
const notchWidth = (e: Element, h: number) => (e.shape === "v-notch" ? 2 * h * Math.tan(rad(e.angle!) / 2) : e.shape === "cipolletti" ? e.length! + h / 2 : e.length!);

/** Every buildability rule the candidate breaks, judged here from its outlet and its wall. */
function broken(c: Candidate, limits: ReturnType<typeof limitsOf>): string[] {
  const out: string[] = [];
  const { elements, riser, barrel } = c.outlet;
  const levels = [...new Set(elements.filter(inWall).map((e) => Math.round(bottom(e) * 1e6) / 1e6))].sort((a, b) => a - b);
  for (let i = 1; i < levels.length; i++) if (levels[i] - levels[i - 1] < limits.spacing - TOL) out.push(`levels ${levels[i - 1]} and ${levels[i]}`);
  const highest = Math.max(...c.storms.map((s) => s.maxStage));
  const plateTop = (e: Element) => Math.max(riser ? riser.crest : highest, bottom(e));
  const across = riser ? (riser.shape === "circular" ? riser.diameter! : Math.max(riser.length!, riser.width!)) : limits.headwall;
  for (const [i, e] of elements.entries()) {
    if (!inWall(e)) continue;
    const h = height(e);
    const top = h === null ? bottom(e) : bottom(e) + h;
    if (riser && riser.crest - top < limits.clearance - TOL) out.push(`E${i + 1} ${(riser.crest - top).toFixed(3)} below the rim`);
    if (h === null && across !== null && notchWidth(e, plateTop(e) - bottom(e)) > across - 2 * limits.web + TOL) out.push(`E${i + 1} wider than its wall`);
    if (limits.minimum !== null) {
      const size = e.type === "orifice" ? (e.shape === "circular" ? len(e.diameter!) : Math.min(e.width!, e.height!)) : e.shape === "v-notch" ? notchWidth(e, limits.minimum) : e.length!;
      if (size < limits.minimum - TOL) out.push(`E${i + 1} smaller than the minimum opening`);
    }
    const places = c.wall.openings.filter((o) => o.element === i);
    if (places.length !== (e.count ?? 1)) out.push(`E${i + 1} has ${places.length} places for ${e.count ?? 1} openings`);
  }
  if (riser && barrel) {
    const width = barrel.shape === "circular" ? len(barrel.diameter!) : barrel.span!;
    const crown = barrel.inletInvert + (barrel.shape === "circular" ? len(barrel.diameter!) : barrel.rise!);
    const side = riser.shape === "circular" ? riser.diameter! : riser.width!;
    if (width > side - 2 * limits.web + TOL) out.push("barrel wider than its riser's wall");
    if (riser.crest - crown < limits.clearance - TOL) out.push("barrel crown under the rim");
    if (!c.checks.some((k) => k.kind === "barrel-capacity" && k.passed)) out.push("barrel capacity not shown to pass");
  }
  // The webs between the listed places: on a round riser the arc between the centres (the shorter
  // way) less half of each hole's arc D asin(w / D), the centre's arc from the barrel's (D/2) x angle;
  // on a box or headwall the stations' distance less half of each width; up, the vertical gap; both
  // apart, Pythagoras. A box's corners (its sides' left ends along its developed wall: downstream,
  // left, upstream, right) and a stated headwall's ends (0 and its length) keep the web too. A headwall
  // of unstated width is as wide as its openings need: no web is judged there.
  if (c.wall.kind !== "headwall" || c.wall.stated) {
    const round = c.wall.kind === "round riser";
    const d = round ? riser!.diameter! : 0;
    const along = (w: number) => (round ? (w >= d ? (Math.PI * d) / 2 : d * Math.asin(w / d)) : w);
    const holes = [...c.wall.openings, ...(c.wall.barrel ? [c.wall.barrel] : [])].map((o) => ({ s: round ? (d / 2) * rad(o.angle!) : o.station, a: along(o.width), bottom: o.invert, top: o.top }));
    const perimeter = c.wall.kind === "headwall" ? null : c.wall.length!;
    const apart = (x: number, y: number) => {
      const gap = Math.abs(x - y);
      return perimeter === null ? gap : Math.min(gap % perimeter, perimeter - (gap % perimeter));
    };
    for (let i = 0; i < holes.length; i++) {
      for (let j = i + 1; j < holes.length; j++) {
        const p = holes[i];
        const q = holes[j];
        const x = apart(p.s, q.s) - (p.a + q.a) / 2;
        const y = Math.max(q.bottom - p.top, p.bottom - q.top);
        const web = x >= 0 && y >= 0 ? Math.hypot(x, y) : Math.max(x, y);
        if (web < limits.web - TOL) out.push(`holes ${i} and ${j} ${web} apart`);
      }
    }
    const edges = c.wall.kind === "box riser" ? [0, riser!.width!, riser!.width! + riser!.length!, 2 * riser!.width! + riser!.length!] : c.wall.kind === "headwall" ? [0, limits.headwall!] : [];
    for (const h of holes) for (const e of edges) if (apart(h.s, e) - h.a / 2 < limits.web - TOL) out.push(`a hole ${apart(h.s, e) - h.a / 2} from a corner or end`);
  }
  return out;
}

/** A candidate judged as built: a system's pond by pond (its outlet, its wall, its own checks). */
function pondByPond(c: Candidate): [string, Candidate][] {
  if (!c.ponds) return [["", c]];
  return c.ponds.map((p) => [`, pond ${p.name}`, { ...c, outlet: p.outlet, wall: p.wall, checks: c.checks.filter((k) => k.pond === p.name) }]);
}

function designed(name: string, budget: string, top = "10"): { json: { units: string; criteria?: object }; candidates: Candidate[]; existing: Candidate | null } {
  const file = join("cases", name, "case.json");
  const run = outfit("design", file, "--budget", budget, "--top", top, "--json", "--quiet");
  expect(run.status, run.stderr).toBeLessThan(2);
  const results = JSON.parse(run.stdout) as { candidates: Candidate[]; baseline?: Candidate };
  return { json: JSON.parse(readFileSync(join(ROOT, file), "utf8")), candidates: results.candidates, existing: results.baseline ?? null };
}

describe("buildable proposals", () => {
  it("the invented loophole catalogue: every proposal ranked compliant is buildable and lists each opening's place", { timeout: 300_000 }, () => {
    const { json, candidates, existing } = designed("loophole-catalogue", "8000", "30");
    const limits = limitsOf(json as Parameters<typeof limitsOf>[0]);
    // The existing outlet's two levels 0.05 ft apart are caught, by the rule and by the judge here.
    expect(existing!.compliant).toBe(false);
    expect(existing!.checks.find((k) => k.kind === "level-spacing")!.passed).toBe(false);
    expect(broken(existing!, limits).some((b) => b.startsWith("levels"))).toBe(true);
    const compliant = candidates.filter((c) => c.compliant);
    expect(compliant.length).toBeGreaterThan(0);
    for (const c of compliant) expect(broken(c, limits), `candidate ${c.rank}`).toEqual([]);
    for (const c of candidates) expect(c.wall.openings.length).toBeGreaterThan(0);
  });

  it("every bundled case: every proposal ranked compliant is buildable and lists each opening's place", { timeout: 900_000 }, () => {
    for (const name of readdirSync(join(ROOT, "cases")).sort()) {
      if (name === "loophole-catalogue") continue;
      // Only a case with a catalogue is designed.
      if (!(JSON.parse(readFileSync(join(ROOT, "cases", name, "case.json"), "utf8")) as { catalogue?: unknown }).catalogue) continue;
      const { json, candidates } = designed(name, "4000");
      const limits = limitsOf(json as Parameters<typeof limitsOf>[0]);
      for (const c of candidates.filter((k) => k.compliant)) for (const [pond, judged] of pondByPond(c)) expect(broken(judged, limits), `${name} candidate ${c.rank}${pond}`).toEqual([]);
    }
  });
});

describe("the judge above catches what the rules catch", () => {
  // A control for the test's own geometry: outfit's wall and outlet of a route, tampered with.
  const route = outfit("route", "cases/demo/case.json", "--json");
  const json = JSON.parse(readFileSync(join(ROOT, "cases/demo/case.json"), "utf8")) as Parameters<typeof limitsOf>[0];
  const base = JSON.parse(route.stdout) as Candidate;
  const limits = limitsOf(json);
  it("the demo's own outlet is buildable", () => {
    expect(broken(base, limits)).toEqual([]);
  });
  it("two openings moved onto one another, a weir crest lifted to the rim, an extra level 0.05 ft above another", () => {
    const overlap = structuredClone(base);
    overlap.wall.openings[1].angle = overlap.wall.openings[0].angle;
    overlap.wall.openings[1].invert = overlap.wall.openings[0].invert;
    overlap.wall.openings[1].top = overlap.wall.openings[0].top;
    expect(broken(overlap, limits).some((b) => b.startsWith("holes"))).toBe(true);
    const high = structuredClone(base);
    high.outlet.elements[2].crest = high.outlet.riser!.crest - 0.05;
    expect(broken(high, limits)).toEqual(["E3 0.050 below the rim"]);
    const close = structuredClone(base);
    close.outlet.elements[1].invert = close.outlet.elements[0].invert! + 0.05;
    expect(broken(close, limits).some((b) => b.startsWith("levels"))).toBe(true);
  });
});
