import { describe, expect, it } from "vitest";
import {
  manningVelocity,
  MIN_TC_NRCS,
  shallowFlowVelocity,
  sheetFlowTime,
  travelTime,
} from "../../src/hydrology/timeOfConcentration.js";
import { nrcsHydrograph } from "../../src/hydrology/nrcsHydrograph.js";
import { distributionMassCurve } from "../../src/hydrology/distributions.js";

const FT = 0.3048;
const IN = 0.0254;

describe("sheet flow, TR-55 eq 3-3", () => {
  it("evaluated in its own units: Tt = 0.007 (nL)^0.8 / (P2^0.5 s^0.4) h with L ft, P2 in", () => {
    // n 0.24, L 100 ft, P2 3.6 in, s 0.01: 0.007 * 24^0.8 / (3.6^0.5 * 0.01^0.4) h.
    const hours = (0.007 * Math.pow(24, 0.8)) / (Math.sqrt(3.6) * Math.pow(0.01, 0.4));
    expect(sheetFlowTime(100 * FT, 0.01, 0.24, 3.6 * IN) / 3600).toBeCloseTo(hours, 10);
  });
  it("scales as (nL)^0.8, P2^-0.5 and s^-0.4", () => {
    const base = sheetFlowTime(30, 0.02, 0.15, 0.09);
    expect(sheetFlowTime(60, 0.02, 0.15, 0.09) / base).toBeCloseTo(Math.pow(2, 0.8), 10);
    expect(sheetFlowTime(30, 0.02, 0.3, 0.09) / base).toBeCloseTo(Math.pow(2, 0.8), 10);
    expect(sheetFlowTime(30, 0.02, 0.15, 0.36) / base).toBeCloseTo(0.5, 10);
    expect(sheetFlowTime(30, 0.08, 0.15, 0.09) / base).toBeCloseTo(Math.pow(4, -0.4), 10);
  });
});

describe("shallow concentrated flow", () => {
  // HEC-22 (2009) Table 3-3, intercept coefficients k of V = k S^0.5 (V m/s, S in percent): unpaved
  // 0.491, paved 0.619 (read in a reproduction of the table). TR-55's App. F equations
  // (16.1345 and 20.3282 s^0.5 ft/s) must agree with them within 0.5 %.
  it.each([
    ["unpaved", 0.491],
    ["paved", 0.619],
  ] as const)("%s velocity agrees with HEC-22 Table 3-3 (k = %f)", (surface, k) => {
    for (const slope of [0.005, 0.02, 0.08]) {
      expect(Math.abs(shallowFlowVelocity(slope, surface) / (k * Math.sqrt(100 * slope)) - 1)).toBeLessThan(0.005);
    }
  });
  it("travel time is length over velocity", () => {
    const t = travelTime({ type: "shallow", length: 200, slope: 0.01, surface: "unpaved" }, NaN);
    expect(t).toBeCloseTo(200 / shallowFlowVelocity(0.01, "unpaved"), 10);
  });
});

describe("channel flow, Manning (TR-55 eq 3-4)", () => {
  it("the SI form equals the US form V = 1.49 r^(2/3) s^(1/2) / n within the rounding of 1.49 (1.486)", () => {
    const us = (1.49 * Math.pow(1.2, 2 / 3) * Math.sqrt(0.004)) / 0.035;
    expect(Math.abs(manningVelocity(1.2 * FT, 0.004, 0.035) / FT / us - 1)).toBeLessThan(0.003);
  });
});

describe("TR-55 minimum Tc", () => {
  it("uses 0.1 h when the flow path is shorter (TR-55 ch. 3)", () => {
    const h = nrcsHydrograph(40000, 90, 120, distributionMassCurve("II", 0.08));
    expect(h.tc).toBe(MIN_TC_NRCS);
    expect(MIN_TC_NRCS).toBe(360);
  });
});
