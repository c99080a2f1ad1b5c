// Physically implausible input gets a warning naming the part, the value and why (issue 11).
// Scenarios are the invented valid base case with one thing made implausible.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { assess } from "../../src/assess/assess.js";

const FILE = join(process.cwd(), "tests/case/valid-base.json");
const base = JSON.parse(readFileSync(FILE, "utf8")) as Record<string, any>;

function warningsOf(change: (c: Record<string, any>) => void, step?: number): string[] {
  const json = structuredClone(base);
  change(json);
  const c = parseCase(json, { file: FILE }).case;
  const routing = routeCase(c, c.outlet!, { step });
  return assess(c, routing).warnings.map((w) => `${w.part}: ${w.reason}`);
}

describe("implausible input warnings", () => {
  it("the unchanged base has none of them (the control)", () => {
    expect(warningsOf(() => {})).toEqual([]);
  });
  it("an opening above the top of embankment", () => {
    expect(warningsOf((c) => c.outlet.elements.push({ type: "weir", shape: "rectangular", length: 2, crest: 107 })).join("\n")).toMatch(/crest 107\.00 ft is above the top of embankment 106\.00 ft/);
  });
  it("an invert below the pond floor", () => {
    expect(warningsOf((c) => (c.outlet.elements[0].invert = 99)).join("\n")).toMatch(/elements\[0\].*invert 99\.00 ft is below the pond floor 100\.00 ft/);
  });
  it("an orifice wider than the riser, and taller than the pond is deep", () => {
    const w = warningsOf((c) => {
      c.outlet.riser = { shape: "circular", diameter: 2, crest: 105 };
      c.outlet.elements[0] = { type: "orifice", shape: "rectangular", width: 3, height: 7, invert: 100 };
    }).join("\n");
    expect(w).toMatch(/opening 3\.00 ft wide is wider than the riser \(2\.00 ft\)/);
    expect(w).toMatch(/opening 7\.00 ft high is taller than the pond is deep \(6\.00 ft\)/);
  });
  it("a riser smaller than its barrel", () => {
    const w = warningsOf((c) => {
      c.outlet.riser = { shape: "circular", diameter: "12 in", crest: 105 };
      c.outlet.barrel = { shape: "circular", diameter: "24 in", length: 50, inletInvert: 99.5, outletInvert: 99, manningN: 0.013, entrance: "concrete-square-headwall" };
    }).join("\n");
    expect(w).toMatch(/outlet\.riser: riser 1\.00 ft across is smaller than the barrel it drains into \(2\.00 ft high\)/);
  });
  it("zero storage: peak out = peak in is said, not 'Warnings: none'", () => {
    const w = warningsOf((c) => (c.pond.storage = { stageStorage: [[100, 0], [106, 0]] })).join("\n");
    expect(w).toContain("pond.storage: the pond stores nothing up to its top");
  });
  it("an inflow whose last point is far from zero", () => {
    const w = warningsOf((c) => (c.storms[0].inflow.series = [[0, 0], [30, 6], [60, 14], [120, 9]])).join("\n");
    expect(w).toMatch(/storms\[0\]\.inflow \(2-yr\): the inflow ends at 9\.000 cfs, 64 % of its peak/);
  });
  it("a fixed step whose mass balance error exceeds 0.01 % (the issue saw 0.34 % with --step 7)", () => {
    const w = warningsOf(() => {}, 7 * 60 + 13);
    expect(w.join("\n")).toMatch(/routing \(\S+\): mass balance error -?\d+\.\d{3} % exceeds 0\.01 %/);
  });
});
