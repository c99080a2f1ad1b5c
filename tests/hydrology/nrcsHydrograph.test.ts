import { describe, expect, it } from "vitest";
import { nrcsHydrograph, PEAK_CONVERGENCE, unitDuration } from "../../src/hydrology/nrcsHydrograph.js";
import { distributionMassCurve, DISTRIBUTIONS } from "../../src/hydrology/distributions.js";
import { runoffDepth } from "../../src/hydrology/runoff.js";

const IN = 0.0254;
const MM = 0.001;
const SQUARE_MILE = 640 * 43560 * 0.3048 ** 2;
const CFS = 0.3048 ** 3;
const HOUR = 3600;

describe("NRCS runoff hydrograph", () => {
  it.each([
    ["II", 78, 0.8, 5.9],
    ["II", 61, 0.3, 3.1],
    ["III", 90, 1.5, 7.0],
    ["IA", 70, 0.12, 4.0],
  ] as const)("holds the runoff depth of the whole storm: volume = A Q(P) within 0.5 %% (Type %s, CN %i, Tc %f h, P %f in)", (type, cn, tc, p) => {
    const area = 0.7 * SQUARE_MILE;
    const h = nrcsHydrograph(area, cn, tc * HOUR, distributionMassCurve(type, p * IN));
    expect(Math.abs(h.volume / (area * runoffDepth(p * IN, cn)) - 1)).toBeLessThan(0.005);
  });

  // FHWA HEC-22 (3rd ed., 2009) Example 3-5: A = 2.35 mi2 (6.1 km2), CN 78, P = 5.9 in (150 mm), Type II,
  // Tc = 0.8 h -> qp = 3354 cfs (96 m3/s). The printed peak comes from TR-55's graphical method (its
  // App. F fit to TR-20 hydrographs), not from a convolution; the convolved peak must agree within 5 %
  // (our allowance for that fit and for the 0.25-h resolution of the Type II values near 12 h).
  it("HEC-22 Example 3-5 (US): peak within 5 % of 3354 cfs", () => {
    const h = nrcsHydrograph(2.35 * SQUARE_MILE, 78, 0.8 * HOUR, distributionMassCurve("II", 5.9 * IN));
    expect(Math.abs(h.runoff / IN - 3.49)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(h.peak / CFS / 3354 - 1)).toBeLessThan(0.05);
  });
  it("HEC-22 Example 3-5 (SI): peak within 5 % of 96 m3/s", () => {
    const h = nrcsHydrograph(6.1e6, 78, 0.8 * HOUR, distributionMassCurve("II", 150 * MM));
    expect(Math.abs(h.runoff / MM - 89)).toBeLessThanOrEqual(0.5);
    expect(Math.abs(h.peak / 96 - 1)).toBeLessThan(0.05);
  });

  it("gives the same hydrograph for the Type II values given as a hyetograph", () => {
    const depth = 4 * IN;
    const rows = DISTRIBUTIONS.II.rows;
    const hyetograph = { times: rows.map((r) => r[0] * HOUR), depths: rows.map((r) => r[1] * depth) };
    const a = nrcsHydrograph(1e6, 82, 1800, distributionMassCurve("II", depth));
    const b = nrcsHydrograph(1e6, 82, 1800, hyetograph);
    expect(Array.from(b.hydrograph.flows)).toEqual(Array.from(a.hydrograph.flows));
  });

  it("steps no longer than 0.133 Tc, whole fractions of the rainfall's step (NEH 630 ch. 16)", () => {
    expect(unitDuration(45 * 60, 900)).toBe(5 * 60); // 0.133 Tc = 5.99 min: 15 min / 3
    expect(unitDuration(3 * HOUR, 900)).toBe(15 * 60); // 0.133 Tc = 23.9 min: the step itself
    expect(unitDuration(3 * HOUR, 240)).toBe(4 * 60);
    expect(unitDuration(6 * 60, 900)).toBeCloseTo(900 / 19, 9); // 0.133 Tc = 47.9 s: 15 min / 19
    expect(unitDuration(6 * 60, 10)).toBe(10);
    // A hyetograph of 5- and 10-minute intervals: its step is 5 min.
    const hyetograph = { times: [0, 300, 900, 1200, 1800], depths: [0, 0.001, 0.004, 0.006, 0.007] };
    expect(unitDuration(HOUR, hyetograph)).toBe(300);
  });

  it("a larger peak rate factor gives a sharper, higher peak for the same runoff", () => {
    const curve = distributionMassCurve("II", 5 * IN);
    const peaks = [300, 484, 600].map((prf) => nrcsHydrograph(SQUARE_MILE, 80, HOUR, curve, { ratio: 0.2, peakRateFactor: prf }).peak);
    expect(peaks[0]).toBeLessThan(peaks[1]);
    expect(peaks[1]).toBeLessThan(peaks[2]);
  });

  it("peaks after the Type II burst at 11.75-12 h and after it by about the lag", () => {
    const h = nrcsHydrograph(SQUARE_MILE, 80, HOUR, distributionMassCurve("II", 5 * IN));
    expect(h.timeOfPeak).toBeGreaterThan(12 * HOUR);
    expect(h.timeOfPeak).toBeLessThan(12 * HOUR + 1.5 * 0.6 * HOUR);
  });
});

// The peak of a convolved NRCS hydrograph depends on the unit duration (a 12-minute step gives a
// 250 ac, CN 75, Tc 1.53 h area's peak 7.5 % below a 1-minute one). The "converged" option halves the
// step until the peak changes by at most PEAK_CONVERGENCE (0.5 %); its peak must match a 5-second
// computation within that tolerance. The default is the method's own step (D <= 0.133 Tc). Invented
// areas, Type II 24-hour storms of 5.1 and 7 in.
describe("NRCS peaks converge in the unit duration (the converged option)", () => {
  const AC = 43560 * 0.3048 ** 2;
  it.each([
    [250, 75, 1.53],
    [640, 80, 2],
    [40, 70, 0.5],
  ] as const)("%i ac, CN %i, Tc %f h", (acres, cn, tcHours) => {
    for (const p of [5.1, 7]) {
      const rain = distributionMassCurve("II", p * IN);
      const converged = nrcsHydrograph(acres * AC, cn, tcHours * HOUR, rain, { ratio: 0.2, peakRateFactor: 484, unitDuration: "converged" });
      const fine = nrcsHydrograph(acres * AC, cn, tcHours * HOUR, rain, undefined, 5);
      const first = nrcsHydrograph(acres * AC, cn, tcHours * HOUR, rain, undefined, unitDuration(tcHours * HOUR, 900));
      // The default is the method's step: the first step, not refined.
      expect(nrcsHydrograph(acres * AC, cn, tcHours * HOUR, rain).peak).toBe(first.peak);
      expect(Math.abs(converged.peak / fine.peak - 1)).toBeLessThanOrEqual(PEAK_CONVERGENCE);
      // The refinement did something: the first step alone is off by more than the tolerance.
      expect(Math.abs(first.peak / fine.peak - 1)).toBeGreaterThan(PEAK_CONVERGENCE);
      expect(converged.unitDuration!).toBeLessThan(first.unitDuration!);
      // The volume stays the runoff depth over the area (TR-55 eq 2-3) at the refined step.
      expect(Math.abs(converged.volume / (acres * AC * runoffDepth(p * IN, cn)) - 1)).toBeLessThan(0.005);
    }
  });
});
