// Each rule on hand-made routed results: the limit, the slack's sign and size (case-format contract:
// slack is a fraction of the limit, on flows for flow checks and on depths above pond.bottom for
// elevation checks, negative when failing), and band edges counting as inside.
import { describe, expect, it } from "vitest";
import { targetBand, withinTargetBand } from "../../src/assess/rules/band.js";
import { peakUpper } from "../../src/assess/rules/peakUpper.js";
import { peakLower } from "../../src/assess/rules/peakLower.js";
import { freeboard } from "../../src/assess/rules/freeboard.js";
import { spillwayDry } from "../../src/assess/rules/spillwayDry.js";
import { drawdown } from "../../src/assess/rules/drawdown.js";
import { overtopping } from "../../src/assess/rules/overtopping.js";
import { RULES, ruleOf, whyNothingComplies } from "../../src/assess/rules/registry.js";
import type { Check, Rule } from "../../src/assess/rules/rule.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import { withinBand } from "../../src/report/json.js";
import type { Case, Outlet } from "../../src/model.js";
import type { StormRouting } from "../../src/routing/routeCase.js";
import { NO_SPILLWAY, routed, storm, testCase } from "./support.js";

function run(rule: Rule, c: Case, storms: StormRouting[], outlet: Outlet = NO_SPILLWAY): Check[] {
  const out: Check[] = [];
  rule.evaluate({ case: c, outlet, routings: { design: storms } }, out);
  return out;
}

const two = storm("2-yr", 2, 1.0);
const hundred = storm("100-yr", 100, 4.0);

describe("target band", () => {
  it("is [target*(1-under), target*(1+over)] (design notes' definition)", () => {
    expect(targetBand(2, { over: 0.05, under: 0.1 })).toEqual([2 * 0.9, 2 * 1.05]);
  });

  it("counts its edges as inside, and the report agrees with the checks exactly there", () => {
    const tolerance = { over: 0.05, under: 0.1 };
    const c = testCase([two], tolerance);
    const [lower, upper] = targetBand(1, tolerance);
    for (const peak of [upper, lower, upper * (1 + 5e-10), lower * (1 - 5e-10), upper * (1 + 1e-6), lower * (1 - 1e-6)]) {
      const checks = evaluateChecks(c, NO_SPILLWAY, [routed(two, peak, 101)]).filter((k) => ruleOf(k).quantity === "flow");
      expect(withinBand(c, peak, 1)).toBe(checks.every((k) => k.passed));
      expect(withinTargetBand(peak, 1, tolerance)).toBe(checks.every((k) => k.passed));
    }
    expect(withinBand(c, upper, 1)).toBe(true);
    expect(withinBand(c, lower, 1)).toBe(true);
    // 5e-10 beyond the edge is a real exceedance: the check's slack is -5e-10, beyond the 1e-12 round-off.
    expect(withinBand(c, upper * (1 + 5e-10), 1)).toBe(false);
  });
});

describe("peak upper band", () => {
  const c = testCase([two, hundred], { over: 0.05 });
  it("limits the peak to target*(1+over); slack is the fraction of that limit left", () => {
    const [a, b] = run(peakUpper, c, [routed(two, 0.84, 101), routed(hundred, 4.41, 104)]);
    expect(a.limit).toBeCloseTo(1.05, 12);
    expect(a.slack).toBeCloseTo((1.05 - 0.84) / 1.05, 12);
    expect(a.passed).toBe(true);
    expect(b.slack).toBeCloseTo((4.2 - 4.41) / 4.2, 12);
    expect(b.slack).toBeLessThan(0);
    expect(b.passed).toBe(false);
    expect(a.key).toBe("peak-upper:2-yr");
  });
  it("skips storms without a target", () => {
    expect(run(peakUpper, testCase([storm("emergency", 500, null)]), [routed(storm("emergency", 500, null), 9, 105)])).toEqual([]);
  });
  it("aims the margin inside the edge: slack to keep = margin / (1 + over)", () => {
    const [a] = run(peakUpper, c, [routed(two, 0.9, 101)]);
    expect(peakUpper.aim(c, a, 0.02)).toBeCloseTo(0.02 / 1.05, 12);
  });
});

describe("peak lower band", () => {
  const c = testCase([two], { under: 0.1 });
  it("asks at least target*(1-under); an over-detained peak fails with negative slack", () => {
    const [ok] = run(peakLower, c, [routed(two, 0.95, 101)]);
    expect(ok.limit).toBeCloseTo(0.9, 12);
    expect(ok.slack).toBeCloseTo((0.95 - 0.9) / 0.9, 12);
    const [bad] = run(peakLower, c, [routed(two, 0.81, 101)]);
    expect(bad.slack).toBeCloseTo(-0.1, 12);
    expect(bad.passed).toBe(false);
    expect(ruleOf(bad).comparison).toBe("at least");
  });
  it("has no check when under = 1 (any over-detention accepted)", () => {
    expect(run(peakLower, testCase([two], { under: 1 }), [routed(two, 0.1, 101)])).toEqual([]);
  });
});

describe("elevation rules: slack on depths above pond.bottom", () => {
  const c = testCase([two, hundred], { freeboardDepth: 0.5 });
  it("freeboard: limit top - depth, on the freeboard storm only", () => {
    const checks = run(freeboard, c, [routed(two, 1, 103), routed(hundred, 4, 104.5)]);
    expect(checks).toHaveLength(1);
    expect(checks[0].limit).toBe(105.5);
    expect(checks[0].slack).toBeCloseTo((5.5 - 4.5) / 5.5, 12);
    const [bad] = run(freeboard, c, [routed(hundred, 4, 105.6)]);
    expect(bad.slack).toBeCloseTo(-0.1 / 5.5, 12);
    expect(bad.passed).toBe(false);
  });
  it("spillway dry: storms up to dryThrough stay below the crest; none without a spillway", () => {
    const outlet = { elements: [], spillway: { crest: 105 } } as unknown as Outlet;
    const d = testCase([two, hundred], { spillwayDryThrough: 10 });
    const checks = run(spillwayDry, d, [routed(two, 1, 105), routed(hundred, 4, 105.4)], outlet);
    expect(checks.map((k) => k.storm)).toEqual(["2-yr"]);
    expect(checks[0].slack).toBe(0);
    expect(checks[0].passed).toBe(true);
    expect(run(spillwayDry, d, [routed(two, 1, 105.2)])).toEqual([]);
  });
  it("overtopping: limit is pond.top for every storm", () => {
    const [a, b] = run(overtopping, c, [routed(two, 1, 103), routed(hundred, 4, 106.6)]);
    expect(a.slack).toBeCloseTo(3 / 6, 12);
    expect(b.slack).toBeCloseTo(-0.1, 12);
  });
});

describe("drawdown", () => {
  it("slack is (hours allowed - hours taken) / hours allowed; a pond that never drains fails at -1", () => {
    const c = testCase([two], { drawdownHours: 48 });
    const [a] = run(drawdown, c, [routed(two, 1, 101, 36)]);
    expect(a.slack).toBeCloseTo(0.25, 12);
    const [b] = run(drawdown, c, [routed(two, 1, 101, null)]);
    expect(b.value).toBeNull();
    expect(b.slack).toBe(-1);
    expect(run(drawdown, testCase([two]), [routed(two, 1, 101)])).toEqual([]);
  });
});

describe("registry", () => {
  it("lists one rule per kind, each with its words", () => {
    const kinds = RULES.map((r) => r.kind);
    expect(new Set(kinds).size).toBe(kinds.length);
    expect(kinds.sort()).toEqual(["barrel-capacity", "barrel-fit", "below-pre-hydrograph", "blocked-outlet", "drawdown", "exfiltration-drain", "extended-detention", "freeboard", "further-point-peak", "level-spacing", "minimum-opening", "minimum-opening-release", "notch-width", "opening-web", "overtopping", "peak-lower", "peak-upper", "rim-clearance", "spillway-dry", "surcharge"]);
    const c = testCase([two], { drawdownHours: 24 });
    for (const check of evaluateChecks(c, NO_SPILLWAY, [routed(two, 1, 101)])) {
      const rule = ruleOf(check);
      expect(rule.why(check)).toContain(check.storm);
      expect(rule.remedy(check).length).toBeGreaterThan(10);
      expect(check.key).toBe(`${check.kind}:${check.storm}`);
    }
  });
  it("lists flow checks storm by storm, then the other rules", () => {
    const c = testCase([two, hundred]);
    const kinds = evaluateChecks(c, NO_SPILLWAY, [routed(two, 1, 101), routed(hundred, 4, 104)]).map((k) => k.key);
    expect(kinds).toEqual(["peak-upper:2-yr", "peak-lower:2-yr", "peak-upper:100-yr", "peak-lower:100-yr", "freeboard:100-yr", "overtopping:2-yr", "overtopping:100-yr"]);
  });
});

describe("why nothing complies (each rule words its own cause)", () => {
  const c = testCase([two, hundred], { freeboardDepth: 0.5 });
  const failingRun = [routed(two, 1.5, 103), routed(hundred, 4, 106.2)];
  const betterRun = [routed(two, 1.2, 103), routed(hundred, 4, 105.8)];
  const checksOf = (storms: StormRouting[]) => evaluateChecks(c, NO_SPILLWAY, storms);
  const input = (firstLevelBound: boolean) => ({ case: c, closest: [failingRun, betterRun], firstLevelBound });

  it("speaks once for freeboard and overtopping, with the lowest stage the closest candidates reach", () => {
    const lines = whyNothingComplies(input(false), [checksOf(failingRun), checksOf(betterRun)]);
    const stage = lines.filter((l) => l.includes("below the top of embankment"));
    // Both candidates fail freeboard (limit 105.5 m) and the first overtops (106 m); one sentence, the better stage.
    expect(stage).toHaveLength(1);
    expect(stage[0]).toContain("The 100-yr storm cannot be kept 0.50 m below the top of embankment (106.000 m)");
    expect(stage[0]).toContain("still reaches 105.800 m");
    expect(lines.some((l) => l.startsWith("Some storms exceed their allowable peak"))).toBe(true);
  });

  it("leaves the peak's cause to the search when its first-level bound already gave it", () => {
    const lines = whyNothingComplies(input(true), [checksOf(failingRun)]);
    expect(lines.some((l) => l.includes("exceed their allowable peak"))).toBe(false);
    expect(lines).toHaveLength(1);
  });

  it("says nothing for rules that pass", () => {
    expect(whyNothingComplies(input(false), [checksOf([routed(two, 1, 101), routed(hundred, 4, 102)])])).toEqual([]);
  });

  it("every rule has a sentence for its failing checks (or leaves it to another, with null)", () => {
    const failing: Check = { key: "x:2-yr", name: "x", kind: "x", storm: "2-yr", label: null, condition: "design", point: null, passed: false, value: 2, limit: 1, slack: -1 };
    for (const rule of RULES) {
      const line = rule.whyNothingComplies({ case: c, failing: [{ ...failing, kind: rule.kind }], closest: [failingRun], firstLevelBound: false });
      expect(line, rule.kind).not.toBeNull();
      expect(line!.length, rule.kind).toBeGreaterThan(40);
    }
  });
});
