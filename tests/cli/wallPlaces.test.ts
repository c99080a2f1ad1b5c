// Where each opening sits on its wall, as route and design print it: one line per element in the
// wall's own words (an angle from the barrel's centreline around a round riser, a side named looking
// downstream and the offset from its left end on a box riser, the offset from its left end on a
// headwall), the same places as --json's `wall`, and each station the sum of the side's start along
// the developed wall and the offset (by hand: downstream, left, upstream and right, left to right seen
// from outside).
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { outfit, ROOT } from "./run.js";

interface Hole {
  label: string;
  element: number;
  station: number;
  angle?: number;
  side?: string;
  offset?: number;
  invert: number;
}
interface Wall {
  kind: string;
  length: number;
  stated?: boolean;
  openings: Hole[];
  barrel?: Hole;
}

/** The printed place lines of the wall section: element label -> the text after its part's words. */
function placeLines(text: string): Map<string, string> {
  const section = text.slice(text.indexOf("Openings on the wall ("));
  const lines = new Map<string, string>();
  for (const line of section.split("\n").slice(1)) {
    const m = /^\s+(E\d+|barrel)\b[^:]*: (.*)$/.exec(line);
    if (!m) break;
    lines.set(m[1], m[2]);
  }
  return lines;
}

/** A copy of the demo case (with its inflow files) whose outlet is changed by `edit`. */
function demoWith(edit: (json: { outlet: Record<string, unknown> }) => void): string {
  const dir = mkdtempSync(join(tmpdir(), "outfit-wall-"));
  cpSync(join(ROOT, "cases", "demo"), dir, { recursive: true });
  const file = join(dir, "case.json");
  const json = JSON.parse(readFileSync(file, "utf8"));
  delete json.$schema;
  edit(json);
  writeFileSync(file, JSON.stringify(json));
  return file;
}

function routed(file: string): { text: string; wall: Wall } {
  const text = outfit("route", file);
  const json = outfit("route", file, "--json");
  expect(text.status, text.stderr).toBeLessThan(2);
  expect(json.status, json.stderr).toBeLessThan(2);
  return { text: text.stdout, wall: (JSON.parse(json.stdout) as { wall: Wall }).wall };
}

describe("route prints each opening's place on its wall", () => {
  it("a round riser: the angle from the barrel's centreline, as --json gives it, a quarter of the perimeter along at 90 degrees", () => {
    const { text, wall } = routed(join(ROOT, "cases", "demo", "case.json"));
    expect(text).toContain("Openings on the wall (4.00 ft riser; angles from the barrel's centreline, counterclockwise seen from above):");
    const lines = placeLines(text);
    for (const o of wall.openings) {
      expect(lines.get(o.label)).toMatch(new RegExp(`^${o.angle} deg; (invert|crest) ${o.invert.toFixed(2)} ft`));
      // 4 ft riser: perimeter 4 pi ft, the station that share of it.
      expect(o.station).toBeCloseTo((o.angle! / 360) * 4 * Math.PI, 9);
    }
    expect(lines.get("barrel")).toMatch(/^0 deg; invert 99\.50 ft, crown 101\.00 ft$/);
    expect(wall.barrel!.station).toBe(0);
  });

  it("a box riser: the side and the offset from its left end; the station the side's start plus the offset", () => {
    const file = demoWith((json) => {
      json.outlet.riser = { shape: "box", length: 5, width: 3, crest: 104.5 };
    });
    const { text, wall } = routed(file);
    expect(wall.kind).toBe("box riser");
    expect(wall.length).toBeCloseTo(16, 9);
    expect(text).toContain("sides named looking downstream, offsets from each side's left end seen from outside");
    const start: Record<string, number> = { downstream: 0, left: 3, upstream: 8, right: 11 };
    const lines = placeLines(text);
    for (const o of wall.openings) {
      expect(o.station).toBeCloseTo(start[o.side!] + o.offset!, 9);
      expect(o.offset!).toBeGreaterThanOrEqual(0);
      expect(o.offset!).toBeLessThanOrEqual(o.side === "downstream" || o.side === "upstream" ? 3 : 5);
      expect(lines.get(o.label)).toContain(`${o.side} side, ${o.offset!.toFixed(2)} ft from its left end`);
    }
    // The barrel leaves through the downstream side's middle.
    expect(wall.barrel).toMatchObject({ side: "downstream", offset: expect.closeTo(1.5, 9), station: expect.closeTo(1.5, 9) });
  });

  it("a headwall: three orifices of one element numbered left to right, their offsets in one line, the headwall as wide as they take", () => {
    const file = demoWith((json) => {
      delete json.outlet.riser;
      json.outlet.elements = [{ type: "orifice", shape: "circular", diameter: "12 in", count: 3, invert: 100 }];
    });
    const { text, wall } = routed(file);
    // 3 x 1 ft, a 6 in web between them and at each end (common practice): 5 ft, centres at 1, 2.5 and 4 ft.
    expect(wall).toMatchObject({ kind: "headwall", length: expect.closeTo(5, 9), stated: false });
    expect(wall.openings.map((o) => o.offset)).toEqual([1, 2.5, 4].map((x) => expect.closeTo(x, 9)));
    expect(text).toContain("headwall 5.00 ft wide (as its openings need); offsets from its left end seen from the pond");
    expect(placeLines(text).get("E1")).toBe("1.00, 2.50 and 4.00 ft from its left end; invert 100.00 ft");
  });
});

describe("design prints each candidate's places", () => {
  it("every candidate's wall section lists each element's places, as its --json wall", { timeout: 300_000 }, () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-wall-design-"));
    const run = outfit("design", "cases/demo/case.json", "--budget", "600", "--top", "2", "--quiet", "--out", dir);
    expect(run.status, run.stderr).toBeLessThan(2);
    const results = JSON.parse(readFileSync(join(dir, "results.json"), "utf8")) as { candidates: { rank: number; wall: Wall }[] };
    const summary = readFileSync(join(dir, "summary.txt"), "utf8");
    for (const text of [run.stdout, summary]) {
      const sections = text.split("Openings on the wall (").slice(1);
      // The existing outlet's and each candidate's.
      expect(sections.length).toBe(results.candidates.length + 1);
      results.candidates.forEach((c, i) => {
        const lines = placeLines(`Openings on the wall (${sections[i + 1]}`);
        for (const o of c.wall.openings) expect(lines.get(o.label), `candidate ${c.rank} ${o.label}`).toMatch(new RegExp(`(^|[ ,])${o.angle}( and [\\d., and]+)? deg`));
      });
    }
  });
});
