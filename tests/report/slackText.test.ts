// A check's slack in words: elevation checks give the distance to their limit in ft or m beside the
// percentage of the depth (the contract's slack), so "100-yr freeboard 816.48 ft <= 817.00 ft" reads
// "0.52 ft (10.5 %)"; length checks (the buildability rules' spacings and widths) likewise beside the
// percentage of their limit; other checks give the percentage of their limit alone.
import { describe, expect, it } from "vitest";
import { makeCheck } from "../../src/assess/rules/rule.js";
import { slackText } from "../../src/report/console.js";
import { outfit } from "../cli/run.js";

const FT = 0.3048;

/** An "at most" elevation check with the contract's slack: on depths above the pond floor. */
function elevation(kind: "freeboard" | "spillway-dry", value: number, limit: number, floor: number, toSI = FT) {
  return makeCheck(kind, "100-yr", `100-yr ${kind}`, value * toSI, limit * toSI, (limit - value) / (limit - floor));
}

describe("slackText", () => {
  it("an elevation check in feet: the distance to its limit beside the share of the depth (hand: 817.00 - 816.48 = 0.52 ft; 0.52 / 4.95 = 10.5 %)", () => {
    expect(slackText("US", elevation("freeboard", 816.48, 817, 812.05))).toBe("0.52 ft (10.5 %)");
  });

  it("a failing one is negative in both (hand: 105.00 - 105.08 = -0.08 ft; -0.08 / 5 = -1.6 %)", () => {
    expect(slackText("US", elevation("spillway-dry", 105.08, 105, 100))).toBe("-0.08 ft (-1.6 %)");
  });

  it("in metres to the millimetre in SI (hand: 100.500 - 100.200 = 0.300 m; 0.3 / 2.5 = 12.0 %)", () => {
    expect(slackText("SI", elevation("freeboard", 100.2, 100.5, 98, 1))).toBe("0.300 m (12.0 %)");
  });

  it("a distance that rounds to nothing prints no negative zero", () => {
    expect(slackText("US", elevation("freeboard", 105.0004, 105, 100))).toBe("0.00 ft (0.0 %)");
  });

  it("a length check: control levels 0.05 ft apart against at least 0.25 ft (hand: 0.05 - 0.25 = -0.20 ft; -0.20 / 0.25 = -80.0 %)", () => {
    expect(slackText("US", makeCheck("level-spacing", "outlet", "control levels at least 0.25 ft apart", 0.05 * FT, 0.25 * FT, (0.05 - 0.25) / 0.25))).toBe("-0.20 ft (-80.0 %)");
    // An "at most" one: a 2.00 ft weir against a usable 3.00 ft (hand: 3.00 - 2.00 = 1.00 ft; 1 / 3 = 33.3 %).
    expect(slackText("US", makeCheck("notch-width", "outlet", "E3 weir within its wall", 2 * FT, 3 * FT, 1 / 3))).toBe("1.00 ft (33.3 %)");
  });

  it("flow and hours checks keep the percentage of their limit alone", () => {
    expect(slackText("US", makeCheck("peak-upper", "2-yr", "2-yr peak within upper band", 1.769 * FT ** 3, 6.4 * FT ** 3, 0.724))).toBe("72.4 %");
    expect(slackText("US", makeCheck("drawdown", "2-yr", "2-yr drawdown", 37.7, 72, 0.4764))).toBe("47.6 %");
  });
});

describe("route's checks table", () => {
  it("gives every elevation and length check of cases/demo its distance to the limit, from the JSON's value and limit, beside the JSON's slack", () => {
    const json = JSON.parse(outfit("route", "cases/demo/case.json", "--json").stdout);
    const text = outfit("route", "cases/demo/case.json").stdout;
    const elevations = json.checks.filter((c: { unit: string }) => c.unit === "ft");
    expect(elevations.length).toBeGreaterThan(5);
    for (const check of elevations) {
      // The distance the check keeps: limit - value for "at most", value - limit for "at least"; either
      // way its size is |limit - value|, with the sign of the slack.
      const distance = (Math.sign(check.slack) * Math.abs(check.limit - check.value)).toFixed(2);
      const row = text.split("\n").find((line: string) => line.startsWith(`${check.name} `))!;
      expect(row, check.name).toContain(` ${distance === "-0.00" ? "0.00" : distance} ft (${(100 * check.slack).toFixed(1)} %)  `);
    }
  });
});
