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

  it("a bare-number orifice diameter larger than its barrel says which unit was assumed", () => {
    const w = warningsOf((c) => {
      c.outlet.elements[0].diameter = 6;
      c.outlet.barrel = { shape: "circular", diameter: "18 in", length: 60, inletInvert: 99.5, outletInvert: 99, manningN: 0.013, entrance: "concrete-square-headwall" };
    }).join("\n");
    expect(w).toMatch(/outlet\.elements\[0\]\.diameter: 6 is a bare number, read as 6 ft .*a 72 in orifice is larger than the 18 in barrel it drains into\. If 6 in was meant, write "6 in"/);
  });
  it("a bare-number diameter over 10 ft in a US case (no barrel); none for the same size written with its unit (the control)", () => {
    expect(warningsOf((c) => (c.outlet.elements[0].diameter = 12)).join("\n")).toMatch(/diameter: 12 is a bare number, read as 12 ft.*12\.00 ft orifice is implausibly large \(over 10\.00 ft\)/);
    expect(warningsOf((c) => (c.outlet.elements[0].diameter = "12 ft")).join("\n")).not.toMatch(/bare number/);
    expect(warningsOf((c) => (c.outlet.elements[0].diameter = 0.5)).join("\n")).not.toMatch(/bare number/);
  });
  it("a bare-number diameter over 3 m in an SI case", () => {
    const w = warningsOf((c) => {
      c.units = "SI";
      c.outlet.elements[0].diameter = 150;
    }).join("\n");
    expect(w).toMatch(/diameter: 150 is a bare number, read as 150 m \(a length without a unit is in the case's unit, m\).*If 150 mm was meant, write "150 mm"/);
  });
  it("a catalogue's bare orifice diameter larger than its largest barrel is a loader note", () => {
    const json = structuredClone(base);
    json.catalogue = { orifice: { diameters: ["4 in", 8] }, barrel: { diameters: ["18 in", "24 in"] } };
    const notices = parseCase(json, { file: FILE }).notices.join("\n");
    expect(notices).toMatch(/catalogue\.orifice\.diameters\[1\]: plausibility warning: 8 is a bare number, read as 8 ft.*96 in orifice is larger than the largest 24 in barrel/);
    expect(notices).not.toMatch(/diameters\[0\]/);
  });
});
