import { describe, expect, it } from "vitest";
import { parseCase, loadCase } from "../../src/case/load.js";
import { CaseError, type Problem } from "../../src/case/errors.js";
import { nrcsHydrograph } from "../../src/hydrology/nrcsHydrograph.js";
import { distributionMassCurve } from "../../src/hydrology/distributions.js";
import { runoffDepth } from "../../src/hydrology/runoff.js";
import { hydrographVolume } from "../../src/hydrology/hydrograph.js";
import { AREA_UNITS } from "../../src/units.js";

// An invented site: a 10 ac parcel, pasture before and offices after development.
const IN = 0.0254;
const AC = AREA_UNITS.ac;
const CFS = 0.3048 ** 3;

function baseCase(): Record<string, any> {
  return {
    name: "Test site (invented)",
    units: "US",
    pond: { bottom: 100, top: 106, storage: { prismoid: { length: 150, width: 80, sideSlope: 3 } } },
    hydrology: {
      pre: { area: "10 ac", curveNumber: 65, runoffCoefficient: 0.3, tc: 30 },
      post: { area: "10 ac", curveNumber: 88, runoffCoefficient: 0.75, tc: 10 },
      idf: { "10-yr": { formula: { a: 60, b: 12, c: 0.82 } } },
    },
    storms: [{ name: "10-yr", returnPeriod: 10, rainfall: { depth: "5 in", distribution: "II" } }],
  };
}

function problems(json: unknown): Problem[] {
  try {
    parseCase(json);
  } catch (error) {
    if (error instanceof CaseError) return error.problems;
    throw error;
  }
  throw new Error("the case was accepted");
}

function problemAt(json: unknown, where: string): Problem {
  const found = problems(json).find((p) => p.where === `case: ${where}`);
  if (!found) throw new Error(`no problem at ${where}: ${JSON.stringify(problems(json))}`);
  return found;
}

describe("storms given by rainfall", () => {
  it("derive the inflow from the post-development area and the target from the pre-development peak", () => {
    const { case: c } = parseCase(baseCase());
    const curve = distributionMassCurve("II", 5 * IN);
    const post = nrcsHydrograph(10 * AC, 88, 600, curve);
    const pre = nrcsHydrograph(10 * AC, 65, 1800, curve);
    expect(Array.from(c.storms[0].inflow.times)).toEqual(Array.from(post.hydrograph.times));
    c.storms[0].inflow.flows.forEach((q, i) => expect(q).toBeCloseTo(post.hydrograph.flows[i], 12));
    expect(c.storms[0].target! / pre.peak).toBeCloseTo(1, 12);
    // The inflow holds the post-development runoff depth (TR-55 eq 2-3) over the area.
    expect(hydrographVolume(c.storms[0].inflow) / (10 * AC * runoffDepth(5 * IN, 88))).toBeCloseTo(1, 4);
  });
  it("keep an explicit target and an explicit inflow (explicit values win)", () => {
    const json = baseCase();
    json.storms[0].target = 7.5;
    json.storms.push({ name: "given inflow", returnPeriod: 25, inflow: { series: [[0, 0], [30, 9], [90, 0]] }, rainfall: { depth: "6 in", distribution: "II" } });
    const { case: c } = parseCase(json);
    expect(c.storms[0].target).toBeCloseTo(7.5 * CFS, 12);
    expect(Array.from(c.storms[1].inflow.flows, (q) => q / CFS)).toEqual([0, expect.closeTo(9, 12), 0]);
    expect(c.storms[1].target! / nrcsHydrograph(10 * AC, 65, 1800, distributionMassCurve("II", 6 * IN)).peak).toBeCloseTo(1, 12);
  });
  it("have no target without a pre-development area", () => {
    const json = baseCase();
    delete json.hydrology.pre;
    expect(parseCase(json).case.storms[0].target).toBeNull();
  });
  it("use the converted curve numbers with the initial abstraction ratio 0.05", () => {
    const json = baseCase();
    json.hydrology.initialAbstractionRatio = 0.05;
    const { case: c } = parseCase(json);
    expect(hydrographVolume(c.storms[0].inflow) / (10 * AC * runoffDepth(5 * IN, 88, 0.05))).toBeCloseTo(1, 4);
  });
  it("compose curve numbers of sub-areas by area (TR-55 ch. 2)", () => {
    const json = baseCase();
    json.hydrology.post = { parts: [{ area: "6 ac", curveNumber: 98 }, { area: "4 ac", curveNumber: 74 }], tc: 10 };
    const { case: c } = parseCase(json);
    const composite = (6 * 98 + 4 * 74) / 10;
    const expected = nrcsHydrograph(10 * AC, composite, 600, distributionMassCurve("II", 5 * IN)).hydrograph.flows;
    c.storms[0].inflow.flows.forEach((q, i) => expect(q).toBeCloseTo(expected[i], 12));
  });
  it("accept SI units with unit strings", () => {
    const json = baseCase();
    json.units = "SI";
    json.pond = { bottom: 10, top: 12, storage: { prismoid: { length: 40, width: 20, sideSlope: 3 } } };
    json.hydrology.post.area = "4.9 ha";
    json.storms[0].rainfall.depth = "81 mm";
    const { case: c } = parseCase(json);
    expect(hydrographVolume(c.storms[0].inflow) / (49000 * runoffDepth(0.081, 88))).toBeCloseTo(1, 4);
  });
  it("take a hyetograph of cumulative depths", () => {
    const json = baseCase();
    json.storms[0].rainfall = { hyetograph: [[0, 0], [60, 0.3], [90, 1.9], [180, "2.4 in"]] };
    const { case: c } = parseCase(json);
    expect(hydrographVolume(c.storms[0].inflow) / (10 * AC * runoffDepth(2.4 * IN, 88))).toBeCloseTo(1, 4);
  });
});

describe("rational storms", () => {
  it("target the pre-development peak C i(Tc) A and take the duration needing the most storage as the inflow", () => {
    const json = baseCase();
    json.storms[0].rainfall = { idf: "10-yr" };
    const { case: c } = parseCase(json);
    const i = (minutes: number) => 60 / Math.pow(minutes + 12, 0.82); // in/h, the case's formula
    // Q = C i A with 1 ac in/h = 1.0083 cfs.
    expect(c.storms[0].target! / CFS).toBeCloseTo(0.3 * i(30) * 10 * 1.00833, 3);
    const inflow = c.storms[0].inflow;
    const times = Array.from(inflow.times);
    expect(times[1]).toBe(600);
    const td = times[2] / 60;
    expect(td).toBeGreaterThan(10);
    expect(inflow.flows[1] / CFS).toBeCloseTo(0.75 * i(td) * 10 * 1.00833, 3);
  });
  it("read an IDF table log-log and refuse a Tc shorter than its first duration", () => {
    const json = baseCase();
    json.storms[0].rainfall = { idf: "table" };
    json.hydrology.idf = { table: { table: [[15, "4.1 in/h"], [30, 2.9], [60, 1.8], [120, 1.1]] } };
    const p = problemAt(json, "hydrology.idf.table.table[0][0]");
    expect(p.found).toBe("15 min");
    expect(p.expected).toContain("10.0 min");
  });
});

describe("bad hydrology input names the field, the value and what was expected", () => {
  it("curve number outside 30-100", () => {
    const json = baseCase();
    json.hydrology.post.curveNumber = 120;
    const p = problemAt(json, "hydrology.post.curveNumber");
    expect(p.found).toBe("120");
    expect(p.expected).toContain("from 30 to 100");
  });
  it("negative area", () => {
    const json = baseCase();
    json.hydrology.pre.area = "-3 ac";
    const p = problemAt(json, "hydrology.pre.area");
    expect(p.found).toBe('"-3 ac"');
    expect(p.expected).toContain("greater than zero");
  });
  it("unknown area unit", () => {
    const json = baseCase();
    json.hydrology.pre.area = "3 acres";
    expect(problemAt(json, "hydrology.pre.area").expected).toContain("ac, ha, km2");
  });
  it("unknown distribution", () => {
    const json = baseCase();
    json.storms[0].rainfall.distribution = "IV";
    const p = problemAt(json, "storms[0].rainfall.distribution");
    expect(p.found).toBe('"IV"');
    expect(p.expected).toContain('"I", "IA", "II" or "III"');
  });
  it("sheet flow longer than TR-55's 300 ft", () => {
    const json = baseCase();
    json.hydrology.twoYearRainfall = "3.5 in";
    json.hydrology.post = { area: "10 ac", curveNumber: 88, flowPath: [{ type: "sheet", length: 400, slope: 0.01, manningN: 0.15 }] };
    const p = problemAt(json, "hydrology.post.flowPath[0].length");
    expect(p.found).toContain("400");
    expect(p.expected).toContain("300 ft");
  });
  it("sheet flow without the 2-year rainfall", () => {
    const json = baseCase();
    json.hydrology.post = { area: "10 ac", curveNumber: 88, flowPath: [{ type: "sheet", length: 100, slope: 0.01, manningN: 0.15 }] };
    expect(problemAt(json, "hydrology.twoYearRainfall").expected).toContain("TR-55 eq 3-3");
  });
  it("an NRCS storm on an area without a curve number", () => {
    const json = baseCase();
    delete json.hydrology.post.curveNumber;
    expect(problemAt(json, "hydrology.post.curveNumber").expected).toContain("NRCS method");
  });
  it("an unknown IDF curve", () => {
    const json = baseCase();
    json.storms[0].rainfall = { idf: "25-yr" };
    const p = problemAt(json, "storms[0].rainfall.idf");
    expect(p.found).toBe('"25-yr"');
    expect(p.expected).toContain("10-yr");
  });
  it("a rainfall without a hydrology section", () => {
    const json = baseCase();
    delete json.hydrology;
    expect(problemAt(json, "storms[0].rainfall").expected).toContain("hydrology section");
  });
  it("a storm with neither inflow nor rainfall", () => {
    const json = baseCase();
    delete json.storms[0].rainfall;
    expect(problemAt(json, "storms[0].inflow").expected).toContain("rainfall");
  });
  it("two ways of giving Tc", () => {
    const json = baseCase();
    json.hydrology.post.watershedLag = { flowLength: 900, slope: 0.02 };
    expect(problemAt(json, "hydrology.post").expected).toContain("exactly one of tc, flowPath, watershedLag");
  });
  it("a hyetograph that falls", () => {
    const json = baseCase();
    json.storms[0].rainfall = { hyetograph: [[0, 0], [60, 1.2], [120, 1.0]] };
    expect(problemAt(json, "storms[0].rainfall.hyetograph[2][1]").expected).toContain("not below");
  });
});

describe("the existing storm form", () => {
  it("still loads the demo case unchanged", () => {
    const { case: c } = loadCase("cases/demo/case.json");
    expect(c.storms.map((s) => s.target! / CFS)).toEqual([6.5, 14, 30]);
    expect(Math.max(...c.storms[0].inflow.flows) / CFS).toBeCloseTo(22, 10);
  });
});

describe("impervious shares, runoff methods and areas bypassing the pond (hydrology section)", () => {
  it("a sub-area given by its pervious number and impervious share takes TR-55 Figure 2-3's composite number", () => {
    const json = baseCase();
    json.hydrology.post = { parts: [{ area: "6 ac", perviousCurveNumber: 61, impervious: 0.65 }, { area: "4 ac", curveNumber: 74 }], tc: 10 };
    const { case: c } = parseCase(json);
    // 6 ac at 61 + 0.65 x (98 - 61) = 85.05 and 4 ac at 74, area-weighted: 80.63.
    const composite = (6 * 85.05 + 4 * 74) / 10;
    expect(hydrographVolume(c.storms[0].inflow) / (10 * AC * runoffDepth(5 * IN, composite))).toBeCloseTo(1, 4);
  });

  it('"separate" computes the connected impervious part at CN 98 and the rest at its own number, adding the runoff', () => {
    const json = baseCase();
    json.hydrology.runoffMethod = "separate";
    json.hydrology.post = { parts: [{ area: "6 ac", perviousCurveNumber: 61, impervious: 0.65 }, { area: "4 ac", curveNumber: 74 }], tc: 10 };
    const { case: c } = parseCase(json);
    const p = 5 * IN;
    const expected = 3.9 * AC * runoffDepth(p, 98) + 2.1 * AC * runoffDepth(p, 61) + 4 * AC * runoffDepth(p, 74);
    expect(hydrographVolume(c.storms[0].inflow) / expected).toBeCloseTo(1, 4);
    // More runoff than the composite number gives (the runoff equation is convex in CN).
    expect(expected).toBeGreaterThan(10 * AC * runoffDepth(p, (6 * 85.05 + 4 * 74) / 10));
  });

  it("an area bypassing the pond gives the storm's bypass, later by its lag; a further point its target and runoff", () => {
    const json = baseCase();
    json.hydrology.bypass = { area: "2 ac", curveNumber: 80, tc: 6, lag: 5 };
    json.hydrology.points = [{ name: "south ditch", pre: { area: "1 ac", curveNumber: 60, tc: 15 }, post: { area: "1 ac", curveNumber: 70, tc: 12 } }];
    const { case: c } = parseCase(json);
    const storm = c.storms[0];
    const curve = distributionMassCurve("II", 5 * IN);
    const own = nrcsHydrograph(2 * AC, 80, 360, curve);
    expect(storm.bypass!.times[0]).toBe(own.hydrograph.times[0] + 300);
    expect(Array.from(storm.bypass!.flows)).toEqual(Array.from(own.hydrograph.flows));
    expect(hydrographVolume(storm.bypass!) / (2 * AC * runoffDepth(5 * IN, 80))).toBeCloseTo(1, 4);
    expect(storm.points).toHaveLength(1);
    expect(storm.points[0].pond).toBe(false);
    expect(storm.points[0].target).toBeCloseTo(nrcsHydrograph(AC, 60, 900, curve).peak, 12);
    expect(Math.max(...storm.points[0].bypass!.flows)).toBeCloseTo(nrcsHydrograph(AC, 70, 720, curve).peak, 12);
  });

  it("a storm's own bypass and point values win over derived ones", () => {
    const json = baseCase();
    json.hydrology.bypass = { area: "2 ac", curveNumber: 80, tc: 6 };
    json.hydrology.points = [{ name: "south ditch", pre: { area: "1 ac", curveNumber: 60, tc: 15 } }];
    json.storms[0].bypass = { series: [[0, 0], [60, 1.5], [120, 0]], lag: 10 };
    json.storms[0].points = [{ name: "south ditch", target: 0.9, bypass: { series: [[0, 0], [30, 0.5], [90, 0]] } }];
    const { case: c } = parseCase(json);
    expect(Array.from(c.storms[0].bypass!.times)).toEqual([600, 4200, 7800]);
    expect(c.storms[0].points[0].target).toBeCloseTo(0.9 * CFS, 12);
    expect(Math.max(...c.storms[0].points[0].bypass!.flows)).toBeCloseTo(0.5 * CFS, 12);
  });

  it("names the field when a further point receives nothing, or impervious comes without a pervious number", () => {
    const json = baseCase();
    json.storms[0].points = [{ name: "north", target: 1 }];
    expect(problemAt(json, "storms[0].points[0]").expected).toMatch(/a bypass \(file or series\), pond: true/);
    const other = baseCase();
    other.hydrology.post = { area: "10 ac", impervious: 0.4, tc: 10 };
    expect(problemAt(other, "hydrology.post.perviousCurveNumber").expected).toMatch(/pervious curve number/);
  });
});
