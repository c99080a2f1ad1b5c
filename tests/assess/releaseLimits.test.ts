// Release limits of a storm (the plain target plus each releaseLimits form): each form's flow computed
// by hand from its own statement, the smallest governing, its words and source label on the peak
// checks, and bad forms reported as case errors naming the field.
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { parseFlow, parseUnitAreaRate } from "../../src/units.js";
import { peakUpper } from "../../src/assess/rules/peakUpper.js";
import type { Check } from "../../src/assess/rules/rule.js";
import { NO_SPILLWAY, routed } from "./support.js";

const CFS = 0.3048 ** 3; // m3/s per ft3/s (international foot, exact)
const ACRE = 43560 * 0.3048 ** 2; // m2 (1 ac = 43,560 ft2, exact)

function caseWith(units: "US" | "SI", storm: Record<string, unknown>) {
  return parseCase({
    name: "release limit pond (invented)",
    units,
    pond: { bottom: 100, top: 106, storage: { prismoid: { length: 50, width: 30, sideSlope: 3 } } },
    storms: [{ name: "2-yr", returnPeriod: 2, inflow: { series: [[0, 0], [30, 5], [120, 0]] }, ...storm }],
  }).case;
}

describe("flow and unit-area rate parsing", () => {
  it("reads cfs, L/s and m3/s; a bare number is the case's flow unit", () => {
    expect(parseFlow("6.5 cfs", "US")).toBeCloseTo(6.5 * CFS, 12);
    expect(parseFlow("184 L/s", "SI")).toBeCloseTo(0.184, 12);
    expect(parseFlow(2, "US")).toBeCloseTo(2 * CFS, 12);
    expect(parseFlow(0.2, "SI")).toBe(0.2);
    expect(parseFlow("3 cfm", "US")).toHaveProperty("error"); // not a flow unit outfit knows (gpm is one)
  });

  it("reads cfs/ac, L/s/ha and m3/s/ha per square metre", () => {
    expect(parseUnitAreaRate("0.04 cfs/ac", "US")).toBeCloseTo((0.04 * CFS) / ACRE, 15);
    expect(parseUnitAreaRate("10 L/s/ha", "SI")).toBeCloseTo(0.01 / 1e4, 15);
    expect(parseUnitAreaRate("0.01 m3/s/ha", "SI")).toBeCloseTo(0.01 / 1e4, 15);
  });
});

describe("the smallest release limit governs", () => {
  it("computes each form from its statement and takes the smallest", () => {
    // 50 % of a given 4 cfs pre-development peak = 2 cfs; 0.04 cfs/ac over 12 ac = 0.48 cfs; 6.5 cfs.
    const c = caseWith("US", {
      target: 3,
      releaseLimits: [
        { flow: "6.5 cfs" },
        { shareOfPre: 0.5, prePeak: "4 cfs", source: "county ordinance 4.2" },
        { perArea: "0.04 cfs/ac", area: "12 ac", source: "county ordinance 4.3" },
      ],
    });
    const s = c.storms[0];
    expect(s.releaseLimits.map((l) => l.flow / CFS)).toEqual([3, 6.5, 2, 0.48].map((x) => expect.closeTo(x, 9)));
    expect(s.target! / CFS).toBeCloseTo(0.48, 9);
    expect(s.governingLimit).toMatchObject({ form: "per-area", statement: "0.04 cfs/ac over 12 ac", label: "county ordinance 4.3" });
  });

  it("a larger unit-area cap gives way to the share of the pre-development peak", () => {
    // SI: 80 % of 0.5 m3/s = 0.4 m3/s against 20 L/s/ha over 25 ha = 0.5 m3/s.
    const c = caseWith("SI", { releaseLimits: [{ shareOfPre: 0.8, prePeak: 0.5 }, { perArea: "20 L/s/ha", area: "25 ha" }] });
    expect(c.storms[0].target).toBeCloseTo(0.4, 12);
    expect(c.storms[0].governingLimit!.statement).toBe("80 % of the given pre-development peak 0.5");
  });

  it("names the governing form and its label on the peak checks; a plain target keeps its old name", () => {
    const c = caseWith("SI", { releaseLimits: [{ flow: "184 L/s", source: "town code 7.1" }] });
    const out: Check[] = [];
    // Peak 0.2 m3/s against 0.184: slack (0.184 - 0.2) / 0.184 < 0.
    peakUpper.evaluate({ case: c, outlet: NO_SPILLWAY, routings: { design: [routed(c.storms[0], 0.2, 101)] } }, out);
    expect(out[0].name).toBe("2-yr peak within upper band (flow 184 L/s)");
    expect(out[0].label).toBe("town code 7.1");
    expect(out[0].slack).toBeCloseTo((0.184 - 0.2) / 0.184, 12);
    expect(out[0].passed).toBe(false);
    const plain = caseWith("SI", { target: 0.3 });
    const again: Check[] = [];
    peakUpper.evaluate({ case: plain, outlet: NO_SPILLWAY, routings: { design: [routed(plain.storms[0], 0.2, 101)] } }, again);
    expect(again[0].name).toBe("2-yr peak within upper band");
    expect(again[0].label).toBeNull();
  });

  it("reports a share of the pre-development peak with no peak to take it of, and a rate without an area", () => {
    expect(() => caseWith("US", { releaseLimits: [{ shareOfPre: 0.5 }] })).toThrow(/storms\[0\]\.releaseLimits\[0\]\.prePeak/);
    expect(() => caseWith("US", { releaseLimits: [{ perArea: "0.04 cfs/ac" }] })).toThrow(CaseError);
    expect(() => caseWith("US", { releaseLimits: [{ flow: "3 cfm" }] })).toThrow(/flow unit among/);
    expect(() => caseWith("US", { releaseLimits: [{ shareOfPre: 1.5, prePeak: 2 }] })).toThrow(/fraction/);
  });
});

describe("a share of the pre-development peak the hydrology section derives", () => {
  it("is the share times the derived peak (the storm's target without release limits)", () => {
    // Invented 10 ac site, pasture before development (the hydrology tests' site).
    const json = {
      name: "derived pre peak (invented)",
      units: "US",
      pond: { bottom: 100, top: 106, storage: { prismoid: { length: 150, width: 80, sideSlope: 3 } } },
      hydrology: {
        pre: { area: "10 ac", curveNumber: 65, tc: 30 },
        post: { area: "10 ac", curveNumber: 88, tc: 10 },
      },
      storms: [{ name: "10-yr", returnPeriod: 10, rainfall: { depth: "5 in", distribution: "II" } }],
    };
    const plain = parseCase(json).case.storms[0];
    const pre = plain.target!; // the derived pre-development peak, as before
    expect(plain.governingLimit!.statement).toBe("pre-development peak (hydrology)");
    const withShare = parseCase({ ...json, storms: [{ ...json.storms[0], releaseLimits: [{ shareOfPre: 0.75, source: "county ordinance 4.2(a)" }] }] }).case.storms[0];
    expect(withShare.target).toBeCloseTo(0.75 * pre, 12);
    expect(withShare.governingLimit).toMatchObject({ form: "share-of-pre", statement: "75 % of the pre-development peak (hydrology)", label: "county ordinance 4.2(a)" });
  });
});
