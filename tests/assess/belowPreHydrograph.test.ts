// The outflow never above the pre-development hydrograph. Hand checks from the rule's own statement:
// against a constant ceiling C the closest approach is C - (peak outflow), so the slack is
// (C - peak) / C; a level pool's outflow exceeds its inflow on the recession (storage-indication
// routing: the outflow peak lies where it crosses the falling inflow), so the inflow itself as the
// ceiling must fail; the rule's slack is the margin over the ceiling's peak, both signs.
import { describe, expect, it } from "vitest";
import { belowPreHydrograph } from "../../src/assess/rules/belowPreHydrograph.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import { parseCase } from "../../src/case/load.js";
import type { Check } from "../../src/assess/rules/rule.js";
import { routeCase } from "../../src/routing/routeCase.js";
import type { RouteResult } from "../../src/routing/router.js";
import { storm, testCase, NO_SPILLWAY } from "./support.js";

function pond(limit: Record<string, unknown>) {
  return parseCase({
    name: "hydrograph ceiling pond (invented)",
    units: "SI",
    pond: { bottom: 100, top: 106, storage: { prismoid: { length: 50, width: 30, sideSlope: 0 } } },
    storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [60, 0.5], [120, 0]] }, releaseLimits: [{ belowPreHydrograph: true, source: "county ordinance 4.4", ...limit }] }],
    outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "300 mm", invert: 100 }] },
  }).case;
}

describe("outflow below the pre-development hydrograph", () => {
  it("against a constant ceiling the closest approach is at the peak outflow", () => {
    const c = pond({ preHydrograph: { series: [[0, 0.3], [3000, 0.3]] } });
    const routing = routeCase(c, c.outlet!);
    const r = routing.storms[0].result;
    const checks = evaluateChecks(c, c.outlet!, routing.storms).filter((k) => k.kind === "below-pre-hydrograph");
    expect(checks).toHaveLength(1);
    expect(checks[0].limit).toBeCloseTo(0.3, 12);
    expect(checks[0].value).toBeCloseTo(r.peakOutflow, 12);
    expect(checks[0].slack).toBeCloseTo((0.3 - r.peakOutflow) / 0.3, 12);
    expect(checks[0].passed).toBe(0.3 >= r.peakOutflow);
    expect(checks[0].label).toBe("county ordinance 4.4");
  });

  it("fails against the inflow itself: the outflow is above it on the recession", () => {
    const c = pond({ preHydrograph: { series: [[0, 0], [60, 0.5], [120, 0], [600, 0]] } });
    const routing = routeCase(c, c.outlet!);
    const [check] = evaluateChecks(c, c.outlet!, routing.storms).filter((k) => k.kind === "below-pre-hydrograph");
    expect(check.passed).toBe(false);
    expect(check.value!).toBeGreaterThan(check.limit);
    expect(check.slack).toBeCloseTo((check.limit - check.value!) / 0.5, 12);
  });

  it("slack is the margin over the ceiling's peak; the edge passes", () => {
    const s = { ...storm("10-yr", 10, null), ceiling: { hydrograph: { times: Float64Array.of(0, 3600), flows: Float64Array.of(0, 2) }, statement: "under the given pre-development hydrograph", label: null } };
    for (const [margin, slack] of [[0.5, 0.25], [0, 0], [-0.2, -0.1]]) {
      const out: Check[] = [];
      const result = { ceiling: { margin, outflow: 1 - margin, limit: 1, time: 1800 } } as RouteResult;
      belowPreHydrograph.evaluate({ case: testCase([s]), outlet: NO_SPILLWAY, routings: { design: [{ storm: s, result }] } }, out);
      expect(out[0].slack).toBeCloseTo(slack, 12);
      expect(out[0].passed).toBe(slack >= 0);
    }
  });

  it("without a given hydrograph needs the hydrology section (case error naming the field)", () => {
    expect(() => pond({})).toThrow(/storms\[0\]\.releaseLimits\[0\]\.preHydrograph/);
  });
});
