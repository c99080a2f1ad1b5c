// The outlet's elevation drawing: every opening, level and the rim at its elevation through the
// drawing's own scale (read back from the markup), each opening on the developed wall at the place
// the placement gives it (the same as route's --json `wall`): around a round riser its angle from the
// barrel's centreline as that share of the perimeter from the wall's left edge, on a box riser its side
// and offset from the side's left end, a notch cut to the rim (a Cipolletti's sides at 1 H : 4 V), a
// box riser's corners and barrel, a headwall as wide as the placement makes it, and `outfit drawing`
// writing it alone as a standalone SVG.
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { loadCase, parseCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { drawingInput } from "../../src/report/drawing/input.js";
import { assess, outletWall } from "../../src/assess/assess.js";
import type { Case } from "../../src/model.js";
import { partOf } from "../../src/parts/registry.js";
import { outletDrawing } from "../../src/report/drawing/outletDrawing.js";
import { DEMO, outfit } from "./support.js";

/** The value of `name` on the first element matching `selector` (a data attribute's name and value). */
function attribute(svg: string, tag: RegExp, name: string): string {
  const m = tag.exec(svg);
  if (!m) throw new Error(`no element ${tag}`);
  const a = new RegExp(`${name}="([^"]*)"`).exec(m[0]);
  if (!a) throw new Error(`no ${name} on ${m[0].slice(0, 80)}`);
  return a[1];
}

/** The drawing's input of a case's own outlet, its openings placed as route places them. */
function drawn(k: Case) {
  const routed = routeCase(k, k.outlet!);
  return drawingInput(k, k.outlet!, routed.storms, outletWall(assess(k, routed)));
}

describe("outlet elevation drawing", () => {
  const { case: c } = loadCase(DEMO);
  const routing = routeCase(c, c.outlet!);
  const plan = outletWall(assess(c, routing));
  const input = drawingInput(c, c.outlet!, routing.storms, plan);
  const svg = outletDrawing("t", input);
  const scale = Number(attribute(svg, /<svg [^>]*>/, "data-scale"));
  const elevationTop = Number(attribute(svg, /<svg [^>]*>/, "data-elevation-top"));
  const yTop = Number(attribute(svg, /<svg [^>]*>/, "data-y-top"));
  const yOf = (z: number) => yTop + (elevationTop - z) * scale;

  it("draws every opening at its invert or crest, with the case's elevations in its data", () => {
    c.outlet!.elements.forEach((e, i) => {
      const group = new RegExp(`<g data-opening="E${i + 1}" data-bottom="([^"]*)" data-top="([^"]*)">(.*?)</g>`).exec(svg)!;
      const bottom = partOf(e).bottom(e);
      expect(Number(group[1])).toBeCloseTo(bottom / 0.3048, 9);
      // The shape's lowest point sits on the drawn elevation: a circle's centre one radius above it.
      const shape = group[3];
      if (e.type === "orifice" && e.shape === "circular") {
        const cy = Number(/cy="([^"]*)"/.exec(shape)![1]);
        const r = Number(/ r="([^"]*)"/.exec(shape)![1]);
        expect(cy + r).toBeCloseTo(yOf(bottom / 0.3048), 1);
        // To scale: the drawn diameter is the orifice's.
        expect(2 * r).toBeCloseTo((e.diameter / 0.3048) * scale, 1);
      }
      if (e.type === "weir" && e.shape === "rectangular") {
        // A notch from its crest up to the rim, as wide as the weir.
        const d = /d="M([\d.]+) ([\d.]+) L([\d.]+) ([\d.]+) H([\d.]+)/.exec(shape)!;
        expect(Number(d[2])).toBeCloseTo(yOf(c.outlet!.riser!.crest / 0.3048), 1);
        expect(Number(d[4])).toBeCloseTo(yOf(e.crest / 0.3048), 1);
        expect(Number(d[5]) - Number(d[3])).toBeCloseTo((e.length / 0.3048) * scale, 1);
      }
    });
  });

  it("draws the rim, the top of embankment, the spillway crest and each storm's peak stage at their elevations", () => {
    const rim = c.outlet!.riser!.crest / 0.3048;
    expect(Number(attribute(svg, /<rect [^>]*data-wall=""[^>]*>/, "data-top"))).toBeCloseTo(rim, 9);
    expect(Number(attribute(svg, /<rect [^>]*data-wall=""[^>]*>/, "y"))).toBeCloseTo(yOf(rim), 1);
    for (const [key, z] of [["top", c.pond.top], ["spillway", c.outlet!.spillway!.crest], ["floor", c.pond.bottom]] as const) {
      expect(Number(attribute(svg, new RegExp(`<[^>]*data-level="${key}"[^>]*>`), "data-value"))).toBeCloseTo(z / 0.3048, 9);
    }
    for (const { storm, result } of routing.storms) {
      const g = new RegExp(`<g data-level="stage" data-storm="${storm.name}" data-value="([^"]*)"[^>]*><line x1="[^"]*" y1="([^"]*)"`).exec(svg)!;
      expect(Number(g[1])).toBeCloseTo(result.maxStage / 0.3048, 9);
      expect(Number(g[2])).toBeCloseTo(yOf(result.maxStage / 0.3048), 1);
    }
    // The developed wall of a circular riser is its perimeter, to the same scale.
    const riser = c.outlet!.riser!;
    expect(riser.shape).toBe("circular");
    const perimeter = Math.PI * (riser as { diameter: number }).diameter;
    expect(Number(attribute(svg, /<rect [^>]*data-wall=""[^>]*>/, "width"))).toBeCloseTo((perimeter / 0.3048) * scale, 1);
  });

  it("names every storm's peak stage in the key, also one whose label finds no room on its line (as the demo's 100-yr, just above the freeboard line, may not)", () => {
    const keyText = [...svg.matchAll(/<g class="key"[^>]*>(.*?)<\/g>/g)].map((m) => m[1]).join("");
    const line = /<text [^>]*>(Peak stages \(dashed\): [^<]*)<\/text>/.exec(keyText)![1];
    for (const { storm, result } of routing.storms) expect(line).toContain(`${storm.name} ${(result.maxStage / 0.3048).toFixed(2)} ft`);
  });

  it("draws each opening at the station the placement gives it, the one route --json prints in its wall", () => {
    const run = outfit("route", DEMO, "--json");
    expect(run.status, run.stderr).toBe(0);
    const wall = (JSON.parse(run.stdout) as { wall: { length: number; openings: { element: number; station: number; angle: number }[] } }).wall;
    const wallX = Number(attribute(svg, /<rect [^>]*data-wall=""[^>]*>/, "x"));
    expect(Number(attribute(svg, /<rect [^>]*data-wall=""[^>]*>/, "data-width"))).toBeCloseTo(wall.length, 9);
    expect(wall.openings.length).toBe(c.outlet!.elements.length);
    for (const o of wall.openings) {
      const group = new RegExp(`<g data-opening="E${o.element + 1}"[^>]*>(.*?)</g>`).exec(svg)![1];
      // The shape's place in the markup, and its centre across: a circle's cx, a notch's crest's middle.
      expect(Number(/data-place="([^"]*)"/.exec(group)![1])).toBeCloseTo(o.station, 9);
      const circle = / cx="([^"]*)"/.exec(group);
      const notch = /d="M[\d.]+ [\d.]+ L([\d.]+) [\d.]+ H([\d.]+)/.exec(group);
      const cx = circle ? Number(circle[1]) : (Number(notch![1]) + Number(notch![2])) / 2;
      expect(cx - wallX).toBeCloseTo(o.station * scale, 1);
    }
  });

  it("develops a round riser from the barrel's centreline, seen from outside: an opening at an angle sits that share of the perimeter from the left edge, the barrel's hole at both edges, the angles marked along the foot", () => {
    const riser = c.outlet!.riser as { diameter: number };
    const perimeter = Math.PI * riser.diameter;
    const wallX = Number(attribute(svg, /<rect [^>]*data-wall=""[^>]*>/, "x"));
    for (const o of plan.openings) {
      const angle = (o.place as { angle: number }).angle;
      expect(o.station).toBeCloseTo((angle / 360) * perimeter, 9);
      const group = new RegExp(`<g data-opening="E${o.element + 1}"[^>]*>(.*?)</g>`).exec(svg)![1];
      expect(Number(/data-place="([^"]*)"/.exec(group)![1])).toBeCloseTo(((angle / 360) * perimeter) / 0.3048, 9);
    }
    // The barrel leaves at 0 degrees: its hole centred on the left edge, and again on the right (the same line of the riser).
    const barrel = /<circle [^>]*data-barrel-opening=""[^>]*>/.exec(svg)![0];
    expect(Number(attribute(barrel, /<circle [^>]*>/, "cx"))).toBeCloseTo(wallX, 1);
    const seam = /<circle [^>]*data-seam=""[^>]*>/.exec(svg)![0];
    expect(Number(attribute(seam, /<circle [^>]*>/, "cx"))).toBeCloseTo(wallX + (perimeter / 0.3048) * scale, 1);
    expect(svg).toContain(`clip-path="url(#t-wall)"`);
    expect([...svg.matchAll(/data-mark="([^"]*)"/g)].map((m) => m[1])).toEqual(["0 deg", "90 deg", "180 deg", "270 deg"]);
  });

  it("draws a box riser's wall as its four sides (corners marked, sides named), each opening at its side and offset from the side's left end, and a box barrel's opening as a rectangle on the downstream side", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    json.outlet.riser = { shape: "box", length: 5, width: 3, crest: 104.5 };
    json.outlet.barrel = { shape: "box", span: 2, rise: 1.5, length: 60, inletInvert: 99.5, outletInvert: 99.0, manningN: 0.013, entrance: "box-wingwall-30-75" };
    const k = parseCase(json, { file: DEMO }).case;
    const routed = routeCase(k, k.outlet!);
    const boxPlan = outletWall(assess(k, routed));
    const d = drawingInput(k, k.outlet!, routed.storms, boxPlan);
    const ft = 0.3048;
    // Left to right seen from outside: downstream (the barrel's, 3 ft), left (5 ft), upstream (3 ft), right (5 ft).
    expect(d.structure.wall.corners.map((x) => x / ft)).toEqual([3, 8, 11].map((x) => expect.closeTo(x, 9)));
    expect(d.structure.wall.width / ft).toBeCloseTo(16, 9);
    expect(d.barrel!.station! / ft).toBeCloseTo(1.5, 9);
    const start: Record<string, number> = { downstream: 0, left: 3, upstream: 8, right: 11 };
    for (const o of boxPlan.openings) {
      const { side, offset } = o.place as { side: string; offset: number };
      expect(o.station / ft).toBeCloseTo(start[side] + offset / ft, 9);
      expect(d.openings[o.element].stations).toContain(o.station);
    }
    const svg3 = outletDrawing("b", d);
    const s3 = Number(attribute(svg3, /<svg [^>]*>/, "data-scale"));
    expect([...svg3.matchAll(/data-corner="([^"]*)"/g)].map((m) => Number(m[1]))).toEqual([3, 8, 11].map((x) => expect.closeTo(x, 9)));
    expect([...svg3.matchAll(/data-mark="([^"]*)"/g)].map((m) => m[1])).toEqual(["downstream", "left", "upstream", "right"]);
    const barrel = /<rect [^>]*data-barrel-opening=""[^>]*>/.exec(svg3)![0];
    expect(Number(attribute(barrel, /<rect [^>]*>/, "width"))).toBeCloseTo(2 * s3, 1);
    expect(Number(attribute(barrel, /<rect [^>]*>/, "height"))).toBeCloseTo(1.5 * s3, 1);
    const wallX = Number(attribute(svg3, /<rect [^>]*data-wall=""[^>]*>/, "x"));
    expect(Number(attribute(barrel, /<rect [^>]*>/, "x")) + s3 - wallX).toBeCloseTo(1.5 * s3, 1);
    // Within the wall: nothing crosses a box's ends, so nothing is drawn twice.
    expect(svg3).not.toContain("data-seam");
  });

  it("draws a Cipolletti weir as a trapezoidal notch from its crest to the rim, its sides at 1 H : 4 V (USBR Water Measurement Manual ch. 7 sec. 12)", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    json.outlet.elements[2] = { type: "weir", shape: "cipolletti", length: 3, crest: 103.0 };
    const k = parseCase(json, { file: DEMO }).case;
    const d = drawn(k);
    expect(d.openings[2].outline).toEqual({ kind: "notch", bottomWidth: expect.closeTo(3 * 0.3048, 9), spreadPerHeight: 0.25 });
    const svg4 = outletDrawing("c", d);
    const s4 = Number(attribute(svg4, /<svg [^>]*>/, "data-scale"));
    const top4 = Number(attribute(svg4, /<svg [^>]*>/, "data-elevation-top"));
    const y4 = (z: number) => yTop + (top4 - z) * s4;
    const path = /<g data-opening="E3"[^>]*><path d="M([\d.]+) ([\d.]+) L([\d.]+) ([\d.]+) H([\d.]+) L([\d.]+) ([\d.]+)"/.exec(svg4)!;
    const [x0, yRim, x1, yCrest, x2, x3] = [1, 2, 3, 4, 5, 6].map((i) => Number(path[i]));
    expect(yRim).toBeCloseTo(y4(104.5), 1);
    expect(yCrest).toBeCloseTo(y4(103.0), 1);
    // The crest as long as the weir; each side runs out 1 for every 4 up (1.5 ft of wall: 0.375 ft each side).
    expect(x2 - x1).toBeCloseTo(3 * s4, 1);
    expect((x1 - x0) / (yCrest - yRim)).toBeCloseTo(0.25, 3);
    expect((x3 - x2) / (yCrest - yRim)).toBeCloseTo(0.25, 3);
    expect(x3 - x0).toBeCloseTo((3 + 2 * 0.25 * 1.5) * s4, 1);
  });

  it("draws a headwall as wide as the placement makes it when there is no riser, its openings where it puts them", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    delete json.outlet.riser;
    json.outlet.elements = [{ type: "orifice", shape: "circular", diameter: "12 in", count: 3, invert: 100 }];
    const k = parseCase(json, { file: DEMO }).case;
    const d = drawn(k);
    expect(d.structure.kind).toBe("headwall");
    // Three 1 ft openings, a 6 in web between them and at each end (common practice): 3 + 2 x 0.5 + 2 x 0.5 = 5 ft.
    expect(d.structure.wall.width / 0.3048).toBeCloseTo(5, 9);
    const drawing = outletDrawing("h", d);
    expect(drawing).toContain("Headwall (5.00 ft wide)");
    expect(drawing).toContain("the headwall seen from the pond");
    const places = [...drawing.matchAll(/<circle [^>]*data-place="([^"]*)"/g)].map((m) => Number(m[1])).sort((a, b) => a - b);
    expect(places).toEqual([1, 2.5, 4].map((x) => expect.closeTo(x, 9)));
  });

  it("`outfit drawing` writes the drawing alone as a standalone SVG file", () => {
    const out = join(mkdtempSync(join(tmpdir(), "outfit-drawing-")), "outlet.svg");
    const run = outfit("drawing", DEMO, "--out", out);
    expect(run.status, run.stderr).toBe(0);
    const text = readFileSync(out, "utf8");
    expect(text).toMatch(/^<\?xml version="1.0" encoding="UTF-8"\?>\n<svg xmlns="http:\/\/www.w3.org\/2000\/svg" /);
    expect(text).toContain('data-drawing="outlet"');
    expect(text).toContain('data-opening="E1"');
  });
});
