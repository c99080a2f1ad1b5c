// NEH Part 630 ch. 16 (2007) unit-hydrograph relations as outfit applies them by default: the unit
// duration D no longer than 0.133 Tc (from Tc + D = 1.7 Tp and L = 0.6 Tc), on the rainfall's step;
// Tp = D/2 + 0.6 Tc; the peak of a unit hydrograph qp = 484 A Q / Tp; Table 16-1's mass curve (Qa/Q)
// from its ordinates; the triangular equivalent with base 2.67 Tp and recession 1.67 Tp. Values of
// Table 16-1 from references.md sec. 5.2 (read in the source).
import { describe, expect, it } from "vitest";
import { convolve, peakRate, TABLE_16_1, timeToPeak, unitHydrograph } from "../../src/hydrology/unitHydrograph.js";
import { nrcsHydrograph, UNIT_DURATION_OF_TC, unitDuration } from "../../src/hydrology/nrcsHydrograph.js";
import { distributionMassCurve, resolution } from "../../src/hydrology/distributions.js";

const HOUR = 3600;
const SQUARE_MILE = 5280 ** 2 * 0.3048 ** 2;
const IN = 0.0254;
const CFS = 0.3048 ** 3;

describe("NEH 630 ch. 16 relations", () => {
  // Table 16-1, mass curve column Qa/Q at t/Tp (printed to three decimals).
  const massCurve: [number, number][] = [
    [0.5, 0.065], [1.0, 0.375], [1.5, 0.705], [2.0, 0.871], [3.0, 0.977], [4.0, 0.997], [5.0, 1.0],
  ];
  it.each(massCurve)("Table 16-1: the ordinates accumulate to Qa/Q at t/Tp %f (%f)", (x, qa) => {
    let area = 0;
    let total = 0;
    for (let i = 1; i < TABLE_16_1.length; i++) {
      const [x0, y0] = TABLE_16_1[i - 1];
      const [x1, y1] = TABLE_16_1[i];
      const piece = 0.5 * (y0 + y1) * (x1 - x0);
      total += piece;
      if (x1 <= x + 1e-9) area += piece;
    }
    // The printed mass curve rounds to 0.001 and the ordinates to 0.01: allow 0.006.
    expect(Math.abs(area / total - qa)).toBeLessThan(0.006);
  });

  it("the triangular equivalent of the same volume and peak has base 2.67 Tp and recession 1.67 Tp (K = 645.333/484)", () => {
    const k = 645.333 / 484; // area under q/qp against t/Tp
    const base = 2 * k;
    expect(base).toBeCloseTo(2.67, 2);
    expect(base - 1).toBeCloseTo(1.67, 2);
  });

  it.each([0.1, 0.25, 0.5, 1, 1.53, 2, 4])("Tc %f h: D <= 0.133 Tc on the rainfall's step, Tp = D/2 + 0.6 Tc, Tc + D <= 1.7 Tp", (tcHours) => {
    const rain = distributionMassCurve("II", 5 * IN);
    const tc = tcHours * HOUR;
    const h = nrcsHydrograph(SQUARE_MILE, 80, tc, rain);
    const d = h.unitDuration!;
    expect(d).toBe(unitDuration(tc, rain));
    expect(d).toBeLessThanOrEqual(UNIT_DURATION_OF_TC * tc + 1e-9);
    // On the rainfall's step: the 0.25-h rows of the Type II table fall on step ends.
    expect((resolution(rain) / d) % 1).toBeCloseTo(0, 9);
    expect(h.unitTimeToPeak).toBeCloseTo(d / 2 + 0.6 * tc, 9);
    // D = 0.133 Tc gives Tc + D = 1.7 Tp exactly; a shorter D a little more.
    expect((tc + d) / h.unitTimeToPeak!).toBeLessThanOrEqual(1.7 + 0.01);
    expect((tc + d) / h.unitTimeToPeak!).toBeGreaterThan(1.6);
  });

  it("one unit of runoff in one unit duration gives the unit hydrograph: qp = 484 A Q / Tp (cfs, mi2, in, h), at Tp", () => {
    const tc = HOUR;
    const d = 6 * 60;
    const tp = timeToPeak(d, tc);
    const uh = unitHydrograph(SQUARE_MILE, d, tp);
    const flows = convolve([IN], uh);
    let peak = 0;
    let at = 0;
    flows.forEach((q, j) => {
      if (q > peak) {
        peak = q;
        at = j;
      }
    });
    // The convolution spreads the inch over D, so its peak lags the unit hydrograph's by about D/2.
    expect(Math.abs(at * d - (tp + d / 2))).toBeLessThanOrEqual(d);
    expect(Math.abs(peakRate(SQUARE_MILE, IN, tp) / CFS - (484 * 1 * 1) / (tp / HOUR))).toBeLessThan(1e-6 * 484);
    // Sampled at D and scaled to hold exactly one inch, the peak stays within 1 % of 484 A Q / Tp.
    expect(Math.abs(Math.max(...uh.ordinates) * IN / CFS / ((484 * 1 * 1) / (tp / HOUR)) - 1)).toBeLessThan(0.01);
  });
});
