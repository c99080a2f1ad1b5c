// Blocked principal outlet: the spillway alone must pass the named storm with the freeboard. The
// check's limit and slack by hand (case-format contract: slack on depths above pond.bottom), and one
// routing through the variant checked against a closed form: below the spillway crest nothing leaves
// a vertical-walled pond, so its maximum depth is the inflow volume over the floor area.
import { describe, expect, it } from "vitest";
import { blockedOutlet, BLOCKED_VARIANT, spillwayAlone } from "../../src/assess/rules/blockedOutlet.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import type { Check } from "../../src/assess/rules/rule.js";
import type { Outlet } from "../../src/model.js";
import { parseCase } from "../../src/case/load.js";
import { routed, storm, testCase } from "./support.js";

const hundred = storm("100-yr", 100, null);

describe("blocked principal outlet", () => {
  const c = testCase([hundred], { blockedOutlet: { storm: "100-yr", freeboard: 0.5, label: "county ordinance 6.1" } });

  it("limit is the top less the freeboard; slack on depths above the floor, both signs and the edge", () => {
    for (const [stage, slack] of [
      [104.0, (5.5 - 4.0) / 5.5],
      [105.5, 0],
      [105.8, (5.5 - 5.8) / 5.5],
    ]) {
      const out: Check[] = [];
      blockedOutlet.evaluate({ case: c, outlet: { elements: [] } as unknown as Outlet, routings: { design: [], [BLOCKED_VARIANT]: [routed(hundred, 1, stage)] } }, out);
      expect(out[0].limit).toBe(105.5);
      expect(out[0].slack).toBeCloseTo(slack, 12);
      expect(out[0].passed).toBe(slack >= 0);
      expect(out[0].label).toBe("county ordinance 6.1");
      expect(out[0].key).toBe("blocked-outlet:100-yr");
    }
  });

  it("is absent when the case does not ask for it", () => {
    const out: Check[] = [];
    blockedOutlet.evaluate({ case: testCase([hundred]), outlet: { elements: [] } as unknown as Outlet, routings: { design: [] } }, out);
    expect(out).toEqual([]);
  });

  it("routes the spillway alone, once per evaluation, through the router it is given", () => {
    const outlet = {
      elements: [{ type: "orifice", shape: "circular", diameter: 0.1, count: 1, invert: 100, coefficient: 0.61, keep: false }],
      riser: { shape: "circular", diameter: 1.2, crest: 104, coefficient: 1.66, orificeCoefficient: 0.6, keep: false },
      barrel: { shape: "circular", diameter: 0.3, length: 20, inletInvert: 99.5, outletInvert: 99.2, manningN: 0.013, entrance: "concrete-square-headwall", keep: false },
      spillway: { crest: 105 },
    } as unknown as Outlet;
    expect(spillwayAlone(outlet)).toEqual({ elements: [], spillway: { crest: 105 } });
    // (A whole outlet: every rule judges it, the buildability rules its riser and barrel too.)
    const seen: Outlet[] = [];
    const checks = evaluateChecks(c, outlet, [routed(hundred, 1, 103)], (o) => {
      seen.push(o);
      return [routed(hundred, 2, 105.6)];
    });
    expect(seen).toEqual([{ elements: [], spillway: { crest: 105 } }]);
    expect(checks.find((k) => k.kind === "blocked-outlet")!.slack).toBeCloseTo((5.5 - 5.6) / 5.5, 12);
  });

  it("holds the whole inflow volume below the crest: depth = volume / floor area (closed form)", () => {
    // Triangle inflow 0 -> 0.1 m3/s at 60 min -> 0 at 120 min: volume 0.5 * 7200 s * 0.1 = 360 m3;
    // floor 50 m x 30 m, vertical walls: depth 360 / 1500 = 0.24 m, stage 100.24 (spillway crest 105).
    const loaded = parseCase({
      name: "blocked outlet pond (invented)",
      units: "SI",
      pond: { bottom: 100, top: 106, storage: { prismoid: { length: 50, width: 30, sideSlope: 0 } } },
      storms: [{ name: "100-yr", returnPeriod: 100, inflow: { series: [[0, 0], [60, 0.1], [120, 0]] } }],
      criteria: { blockedOutlet: { storm: "100-yr", freeboard: "0.5 m", source: "county ordinance 6.1" } },
      outlet: {
        elements: [{ type: "orifice", shape: "circular", diameter: "300 mm", invert: 100 }],
        spillway: { crest: 105, length: 5, sideSlope: 3 },
      },
    }).case;
    const checks = evaluateChecks(loaded, loaded.outlet!, []);
    const check = checks.find((k) => k.kind === "blocked-outlet")!;
    expect(check.value!).toBeCloseTo(100.24, 2); // contract: stage within 0.003 m
    expect(Math.abs(check.value! - 100.24)).toBeLessThan(0.003);
    expect(check.slack).toBeCloseTo((5.5 - 0.24) / 5.5, 3);
  });

  it("names an unknown storm as a case error", () => {
    expect(() =>
      parseCase({
        name: "x",
        units: "SI",
        pond: { bottom: 100, top: 106, storage: { prismoid: { length: 50, width: 30, sideSlope: 0 } } },
        storms: [{ name: "100-yr", returnPeriod: 100, inflow: { series: [[0, 0], [60, 0.1], [120, 0]] } }],
        criteria: { blockedOutlet: { storm: "500-yr" } },
      }),
    ).toThrow(/criteria\.blockedOutlet\.storm/);
  });
});
