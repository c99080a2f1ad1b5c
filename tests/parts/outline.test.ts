// Each part kind's outline on its wall (`outline`, `count`: what the outlet drawing draws) against the
// kind's own width of the water surface across its openings (`widthAt`, the geometry its flow uses):
// the shape drawn, placed on the wall and judged by the wall rules is the hydraulic one. A new kind must add its sample here.
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { ELEMENT_PARTS, partOf } from "../../src/parts/registry.js";
import { isHole, outlineHeight, outlineWidth } from "../../src/parts/outline.js";

/** One element of every kind, in a US case (ft). */
const SAMPLES = [
  { type: "orifice", shape: "circular", diameter: "8 in", count: 3, invert: 100 },
  { type: "orifice", shape: "rectangular", width: "12 in", height: "6 in", count: 2, invert: 100.5 },
  { type: "weir", shape: "rectangular", length: 2.5, crest: 103, endContractions: 2 },
  { type: "weir", shape: "v-notch", angle: 60, crest: 102 },
  { type: "weir", shape: "cipolletti", length: 3, crest: 102.5 },
  { type: "regulator", invert: 100, rating: [[0, 0], [1, 0.5], [3, 1.2]] },
];

const elements = parseCase({
  name: "Outline samples (invented)",
  units: "US",
  pond: { bottom: 100, top: 106, storage: { prismoid: { length: 100, width: 50, sideSlope: 3 } } },
  storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [60, 20], [180, 0]] } }],
  outlet: { elements: SAMPLES },
}).case.outlet!.elements;

describe("part outlines", () => {
  it("has a sample of every kind in the registry", () => {
    expect(new Set(elements.map(partOf))).toEqual(new Set(ELEMENT_PARTS));
  });

  it.each(elements.map((e) => [partOf(e).name, e] as const))("%s: its outline, times its count, is as wide as its openings' water surface at every height", (_, e) => {
    const part = partOf(e);
    const outline = part.outline(e);
    const height = outlineHeight(outline);
    if (!isHole(outline)) {
      // A device not cut in the wall (a regulator): drawn as a box, with no water surface across the wall.
      expect(outline.kind).toBe("device");
      expect(part.widthAt(e, part.bottom(e) + 0.1)).toBe(0);
      return;
    }
    if (height === null) {
      // A notch, open to the top: its width at each head is the weir's top width.
      for (const up of [0.01, 0.2, 0.5, 1.3]) expect(part.count(e) * outlineWidth(outline, up)).toBeCloseTo(part.widthAt(e, part.bottom(e) + up), 12);
      expect(part.top(e)).toBe(part.bottom(e));
    } else {
      // A closed opening: its top where the kind's is, and at mid-height (a circle's widest) as wide as the openings.
      expect(part.bottom(e) + height).toBeCloseTo(part.top(e), 12);
      expect(part.count(e) * outlineWidth(outline, height / 2)).toBeCloseTo(part.widthAt(e, part.bottom(e) + height / 2), 12);
    }
  });

  it("counts each kind's openings side by side: an orifice's count, one notch or device", () => {
    expect(elements.map((e) => partOf(e).count(e))).toEqual([3, 2, 1, 1, 1, 1]);
  });
});
