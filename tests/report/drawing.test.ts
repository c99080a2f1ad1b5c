// The outlet's elevation drawing: every opening, level and the rim at its elevation through the
// drawing's own scale (read back from the markup), openings of one level spaced evenly around the
// riser's developed wall when the input gives no places and at their places (an angle, a side) when it
// does, a notch cut to the rim (a Cipolletti's sides at 1 H : 4 V), a box riser's corners and barrel,
// a headwall wide enough for its openings, and `outfit drawing` writing it alone as a standalone SVG.
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { loadCase, parseCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { drawingInput, placeOpenings } from "../../src/report/drawing/input.js";
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

describe("outlet elevation drawing", () => {
  const { case: c } = loadCase(DEMO);
  const routing = routeCase(c, c.outlet!);
  const input = drawingInput(c, c.outlet!, routing.storms);
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

  it("spaces the openings of one level evenly around the wall when the input gives no places", () => {
    const two = { ...input, openings: [{ ...input.openings[0], count: 2 }, { ...input.openings[1], bottom: input.openings[0].bottom }] };
    expect(two.openings.every((o) => o.places === undefined)).toBe(true);
    const places = placeOpenings(two);
    const width = input.structure.wall.width;
    // Three openings at one level: centres at 1/6, 3/6 and 5/6 of the wall.
    expect(places[0][0]).toBeCloseTo(width / 6, 9);
    expect(places[0][1]).toBeCloseTo(width / 2, 9);
    expect(places[1][0]).toBeCloseTo((5 * width) / 6, 9);
  });

  it("puts openings at the places the input gives: angles from the barrel around a round riser, the rest of their level still spaced evenly", () => {
    const two = { ...input, openings: [{ ...input.openings[0], count: 2 }, { ...input.openings[1], bottom: input.openings[0].bottom }] };
    const width = input.structure.wall.width;
    // The round wall is unrolled from the point opposite the barrel: the barrel's axis (0 deg) in the middle,
    // 90 deg counterclockwise (seen from above) three quarters along, 270 deg a quarter along.
    const given = placeOpenings({ ...two, openings: [{ ...two.openings[0], places: [{ angle: 0 }, { angle: 90 }] }, two.openings[1]] });
    expect(given[0][0]).toBeCloseTo(width / 2, 9);
    expect(given[0][1]).toBeCloseTo((3 * width) / 4, 9);
    // The opening without places is alone in its level's even spacing: the middle of the wall.
    expect(given[1][0]).toBeCloseTo(width / 2, 9);
    expect(placeOpenings({ ...two, openings: [{ ...two.openings[0], places: [{ angle: 270 }, { angle: -90 }] }, two.openings[1]] })[0]).toEqual([width / 4, width / 4]);
    // A place per opening, and a side only on a flat wall.
    expect(() => placeOpenings({ ...two, openings: [{ ...two.openings[0], places: [{ angle: 0 }] }, two.openings[1]] })).toThrow(/1 places for 2/);
    expect(() => placeOpenings({ ...two, openings: [{ ...two.openings[0], places: [{ side: 1, offset: 0.2 }, { angle: 0 }] }, two.openings[1]] })).toThrow(/round/);
    // Drawn there: the circle's centre at its place along the wall.
    const svg2 = outletDrawing("p", { ...input, openings: [{ ...input.openings[0], places: [{ angle: 90 }] }, ...input.openings.slice(1)] });
    const wallX = Number(attribute(svg2, /<rect [^>]*data-wall=""[^>]*>/, "x"));
    const cx = Number(attribute(svg2, /<g data-opening="E1"[^>]*><circle [^>]*>/, "cx"));
    expect(cx - wallX).toBeCloseTo(((3 * width) / 4 / 0.3048) * scale, 1);
  });

  it("draws a box riser's wall as its four sides (corners marked), places by side and offset, and a box barrel's opening as a rectangle on side 1", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    json.outlet.riser = { shape: "box", length: 5, width: 3, crest: 104.5 };
    json.outlet.barrel = { shape: "box", span: 2, rise: 1.5, length: 60, inletInvert: 99.5, outletInvert: 99.0, manningN: 0.013, entrance: "box-wingwall-30-75" };
    const k = parseCase(json, { file: DEMO }).case;
    const d = drawingInput(k, k.outlet!, routeCase(k, k.outlet!).storms);
    const ft = 0.3048;
    // Sides 1 to 4 counterclockwise seen from above, side 1 (the barrel's) and 3 the box's width, 2 and 4 its length.
    expect(d.structure.wall.sides!.map((x) => x / ft)).toEqual([3, 5, 3, 5].map((x) => expect.closeTo(x, 9)));
    expect(d.structure.wall.width / ft).toBeCloseTo(16, 9);
    expect(d.structure.wall.barrelAt! / ft).toBeCloseTo(1.5, 9);
    const placed = placeOpenings({ ...d, openings: [{ ...d.openings[0], places: [{ side: 3, offset: 1 * ft }] }, ...d.openings.slice(1)] });
    expect(placed[0][0] / ft).toBeCloseTo(3 + 5 + 1, 9);
    expect(() => placeOpenings({ ...d, openings: [{ ...d.openings[0], places: [{ side: 5, offset: 0 }] }, ...d.openings.slice(1)] })).toThrow(/sides 1 to 4/);
    expect(() => placeOpenings({ ...d, openings: [{ ...d.openings[0], places: [{ side: 1, offset: 4 * ft }] }, ...d.openings.slice(1)] })).toThrow(/long/);
    expect(() => placeOpenings({ ...d, openings: [{ ...d.openings[0], places: [{ angle: 0 }] }, ...d.openings.slice(1)] })).toThrow(/round riser only/);
    const svg3 = outletDrawing("b", d);
    const s3 = Number(attribute(svg3, /<svg [^>]*>/, "data-scale"));
    expect([...svg3.matchAll(/data-corner="([^"]*)"/g)].map((m) => Number(m[1]))).toEqual([3, 8, 11].map((x) => expect.closeTo(x, 9)));
    const barrel = /<rect [^>]*data-barrel-opening=""[^>]*>/.exec(svg3)![0];
    expect(Number(attribute(barrel, /<rect [^>]*>/, "width"))).toBeCloseTo(2 * s3, 1);
    expect(Number(attribute(barrel, /<rect [^>]*>/, "height"))).toBeCloseTo(1.5 * s3, 1);
    const wallX = Number(attribute(svg3, /<rect [^>]*data-wall=""[^>]*>/, "x"));
    expect(Number(attribute(barrel, /<rect [^>]*>/, "x")) + s3 - wallX).toBeCloseTo(1.5 * s3, 1);
  });

  it("draws a Cipolletti weir as a trapezoidal notch from its crest to the rim, its sides at 1 H : 4 V (USBR Water Measurement Manual ch. 7 sec. 12)", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    json.outlet.elements[2] = { type: "weir", shape: "cipolletti", length: 3, crest: 103.0 };
    const k = parseCase(json, { file: DEMO }).case;
    const d = drawingInput(k, k.outlet!, routeCase(k, k.outlet!).storms);
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

  it("draws a headwall wide enough for its widest level of openings when there is no riser", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    delete json.outlet.riser;
    json.outlet.elements = [{ type: "orifice", shape: "circular", diameter: "12 in", count: 3, invert: 100 }];
    const k = parseCase(json, { file: DEMO }).case;
    const d = drawingInput(k, k.outlet!, routeCase(k, k.outlet!).storms);
    expect(d.structure.kind).toBe("headwall");
    // Three 1-ft openings with a 1-ft web each, and a margin: wider than 3 ft.
    expect(d.structure.wall.width).toBeGreaterThan(3 * 0.3048);
    const drawn = outletDrawing("h", d);
    expect(drawn).toContain("Headwall (");
    expect((drawn.match(/<circle [^>]*data-place=/g) ?? []).length).toBe(3);
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
