// The change list between two outlets: which parts are removed, added, resized and moved, with
// units, and the change measure (1 per part added or removed, 0.5 per resize, 0.25 per move, plus
// 0.1 x the total move / pond depth), checked by hand on invented outlets.
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { changeList } from "../../search/engine/changes.js";
import { designOutlet } from "../../search/engine/layout.js";
import type { OutletFile } from "../../src/case/schema.js";

const base = {
  name: "Change list, invented pond",
  units: "US",
  pond: { bottom: 100, top: 106, storage: { prismoid: { length: 100, width: 50, sideSlope: 3 } } },
  storms: [{ name: "10-yr", returnPeriod: 10, target: 5, inflow: { series: [[0, 0], [30, 10], [90, 0]] } }],
  outlet: {
    elements: [
      { type: "orifice", shape: "circular", diameter: "6 in", count: 1, invert: 100 },
      { type: "orifice", shape: "circular", diameter: "8 in", count: 2, invert: 101 },
      { type: "weir", shape: "rectangular", length: 2, crest: 103.5, endContractions: 2 },
    ],
    riser: { shape: "circular", diameter: 4, crest: 104.5 },
    barrel: { shape: "circular", diameter: "18 in", length: 60, inletInvert: 99.5, outletInvert: 99, manningN: 0.013, entrance: "concrete-square-headwall" },
  },
  catalogue: { orifice: { diameters: ["6 in", "8 in", "10 in"], maxCount: 2 }, riser: { diameters: [4, 5] }, barrel: { diameters: ["18 in", "24 in"] }, maxStages: 3, elevationStep: 0.05 },
};
const loaded = parseCase(base);
const p = buildProblem(loaded.case, loaded.data);
const existing = p.existing!.outlet;
const changed = (file: OutletFile) => changeList(p, existing, designOutlet(p, file));

describe("change list against the existing outlet", () => {
  it("is empty, measure 0, for the existing outlet itself", () => {
    const list = changed(base.outlet as OutletFile);
    expect(list.changes).toEqual([]);
    expect(list.score).toBe(0);
  });

  it("names a resize with from -> to and a move with its distance, and measures them", () => {
    const file = structuredClone(base.outlet) as OutletFile;
    file.elements![1] = { type: "orifice", shape: "circular", diameter: "10 in", count: 1, invert: 101.25 };
    file.riser = { shape: "circular", diameter: 5, crest: 104.2 };
    file.barrel = { ...base.outlet.barrel, diameter: "24 in" } as OutletFile["barrel"];
    const list = changed(file);
    expect(list.changes.map((c) => c.text)).toEqual([
      "resized: orifices at 101.00 ft: 2 x 8 in -> 1 x 10 in",
      "moved: 1 x 10 in orifice: invert 101.00 ft -> 101.25 ft (+0.25 ft)",
      "resized: riser: 4.00 ft -> 5.00 ft",
      "moved: 5.00 ft riser: rim 104.50 ft -> 104.20 ft (-0.30 ft)",
      "resized: barrel: 18 in -> 24 in",
    ]);
    expect(list.changes[1].by).toBeCloseTo(0.25, 9);
    expect(list.changes[3].by).toBeCloseTo(-0.3, 9);
    // 3 resizes x 0.5 + 2 moves x 0.25 + 0.1 x (0.25 + 0.30) / 6 ft of depth.
    expect(list.score).toBeCloseTo(1.5 + 0.5 + (0.1 * 0.55) / 6, 9);
  });

  it("counts a part of another kind as one removed and one added, and pairs parts to the smallest change", () => {
    const file = structuredClone(base.outlet) as OutletFile;
    // The 2 x 8 in orifices become a v-notch: another kind of part, so one removed and one added.
    file.elements = [
      { type: "orifice", shape: "circular", diameter: "6 in", count: 1, invert: 100 },
      { type: "weir", shape: "v-notch", angle: 60, crest: 101.5 },
      { type: "weir", shape: "rectangular", length: 2, crest: 103.5, endContractions: 2 },
    ];
    const list = changed(file);
    expect(list.changes.map((c) => c.text)).toEqual(["removed: 2 x 8 in orifices at 101.00 ft", "added: 60 deg v-notch at 101.50 ft"]);
    expect(list.score).toBe(2);
  });

  it("pairs parts by the least change, not by their order in the list", () => {
    const file = structuredClone(base.outlet) as OutletFile;
    file.elements = [
      { type: "weir", shape: "rectangular", length: 2, crest: 103.5, endContractions: 2 },
      { type: "orifice", shape: "circular", diameter: "8 in", count: 2, invert: 101.2 },
      { type: "orifice", shape: "circular", diameter: "6 in", count: 1, invert: 100 },
    ];
    const list = changed(file);
    expect(list.changes.map((c) => c.text)).toEqual(["moved: 2 x 8 in orifices: invert 101.00 ft -> 101.20 ft (+0.20 ft)"]);
    expect(list.score).toBeCloseTo(0.25 + (0.1 * 0.2) / 6, 9);
  });

  it("reports a riser removed and an opening added with their sizes and elevations", () => {
    const file = structuredClone(base.outlet) as OutletFile;
    delete file.riser;
    file.elements = [...file.elements!, { type: "orifice", shape: "circular", diameter: "6 in", count: 2, invert: 102.4 }];
    const list = changed(file);
    expect(list.changes.map((c) => c.text)).toEqual(["added: 2 x 6 in orifices at 102.40 ft", "removed: 4.00 ft riser with rim at 104.50 ft"]);
  });
});
