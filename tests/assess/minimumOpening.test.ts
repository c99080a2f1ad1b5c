// Minimum opening as a rule: the smallest orifice against the permitted size (slack a fraction of the
// limit, both signs, the edge), and the check that says a target is out of reach because of it: the
// smallest permitted orifice alone at the lowest level must release no more than the upper band.
import { describe, expect, it } from "vitest";
import { minimumOpening, smallestOpening } from "../../src/assess/rules/minimumOpening.js";
import { minimumOpeningRelease, SMALLEST_VARIANT } from "../../src/assess/rules/minimumOpeningRelease.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import type { Check } from "../../src/assess/rules/rule.js";
import type { Outlet } from "../../src/model.js";
import { routed, storm, testCase } from "./support.js";

const INCH = 0.0254;
const orifices = (sizes: [number, number?][]) =>
  ({ elements: sizes.map(([a, b]) => (b === undefined ? { type: "orifice", shape: "circular", diameter: a, invert: 100, coefficient: 0.61 } : { type: "orifice", shape: "rectangular", width: a, height: b, invert: 100, coefficient: 0.61 })) }) as unknown as Outlet;

describe("minimum opening", () => {
  const two = storm("2-yr", 2, 0.1);
  const c = testCase([two], { minimumOpening: { size: 4 * INCH, label: "county ordinance 5.5" } });

  it("takes a circular diameter or a rectangle's smaller side", () => {
    expect(smallestOpening(orifices([[6 * INCH], [0.3, 0.08]]), 4 * INCH)).toEqual({ size: 0.08, index: 1 });
    expect(smallestOpening({ elements: [] } as unknown as Outlet, 4 * INCH)).toBeNull();
  });

  it("slack (size - minimum) / minimum: 3 in fails by 25 %, 4 in is the edge, 6 in passes by 50 %", () => {
    for (const [inches, slack] of [[3, -0.25], [4, 0], [6, 0.5]]) {
      const out: Check[] = [];
      minimumOpening.evaluate({ case: c, outlet: orifices([[inches * INCH]]), routings: { design: [] } }, out);
      expect(out[0].slack).toBeCloseTo(slack, 12);
      expect(out[0].passed).toBe(slack >= 0);
      expect(out[0].label).toBe("county ordinance 5.5");
    }
  });

  it("routes the smallest permitted orifice alone at the lowest level and compares with the upper band", () => {
    const seen: Outlet[] = [];
    // Band: over 0, so the upper edge is the target 0.1; a peak of 0.12 through the 4 in orifice alone fails by 20 %.
    const checks = evaluateChecks(c, orifices([[6 * INCH]]), [routed(two, 0.1, 101)], (o) => {
      seen.push(o);
      return [routed(two, 0.12, 101)];
    });
    expect(seen[0].elements).toEqual([{ type: "orifice", shape: "circular", diameter: 4 * INCH, count: 1, invert: 100, coefficient: 0.61, keep: false }]);
    const check = checks.find((k) => k.key === "minimum-opening-release:2-yr")!;
    expect(check.slack).toBeCloseTo((0.1 - 0.12) / 0.1, 12);
    expect(check.passed).toBe(false);
    expect(minimumOpeningRelease.why(check)).toMatch(/cannot be met with openings of that size/);
  });

  it("is absent without the rule", () => {
    const out: Check[] = [];
    minimumOpeningRelease.evaluate({ case: testCase([two]), outlet: orifices([[6 * INCH]]), routings: { design: [], [SMALLEST_VARIANT]: [routed(two, 1, 101)] } }, out);
    expect(out).toEqual([]);
  });
});
