import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { boxCriticalDepth, circularCriticalDepth, circularFlowArea, circularTopWidth } from "../../src/hydraulics/criticalDepth.js";
import { GRAVITY } from "../../src/units.js";

describe("critical depth", () => {
  // Closed form: a circle flowing half full has A = pi D^2/8 and T = D, so the critical flow is
  // Q = sqrt(g A^3 / T) (Chow 1959, Open-Channel Hydraulics, eq 3-10: Q^2/g = A^3/T).
  it("a circle is half full at Q = sqrt(g (pi D^2/8)^3 / D)", () => {
    const d = 0.9;
    const q = Math.sqrt((GRAVITY * (Math.PI * d * d / 8) ** 3) / d);
    expect(circularCriticalDepth(q, d)).toBeCloseTo(d / 2, 12);
  });

  it("a rectangle: dc = (q^2/g)^(1/3) (Chow 1959, eq 4-6)", () => {
    const dc = boxCriticalDepth(3.0, 2.0);
    expect(dc).toBeCloseTo(Math.cbrt((1.5 * 1.5) / GRAVITY), 14);
    // The same condition Q^2/g = A^3/T with A = b y and T = b.
    expect((2 * dc) ** 3 / 2).toBeCloseTo((3.0 * 3.0) / GRAVITY, 12);
  });

  it("Q^2/g = A^3/T holds at the solved circular depth over eight decades of flow (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 3, noNaN: true }), fc.double({ min: -6, max: 2, noNaN: true }), (d, logRatio) => {
        // Flows from 1e-6 to 100 times the half-full critical flow.
        const q = Math.sqrt((GRAVITY * (Math.PI * d * d / 8) ** 3) / d) * 10 ** logRatio;
        const y = circularCriticalDepth(q, d);
        expect(y).toBeGreaterThan(0);
        expect(y).toBeLessThan(d);
        const a = circularFlowArea(d, y);
        const t = circularTopWidth(d, y);
        expect((a ** 3 / t) / ((q * q) / GRAVITY)).toBeCloseTo(1, 6);
      }),
      { numRuns: 500 },
    );
  });

  it("follows the small-depth limit A^3/T ~ d^5 theta^8 / 55296 down to vanishing flows (no underflow)", () => {
    // theta = 4 asin(sqrt(y/d)); for small theta, Q^2/g = d^5 theta^8 / 55296 (series of A and T).
    for (const q of [1e-150, 1e-100, 1e-40, 1e-20]) {
      const y = circularCriticalDepth(q, 0.5);
      const theta = 4 * Math.asin(Math.sqrt(y / 0.5));
      expect(5 * Math.log(0.5) + 8 * Math.log(theta) - Math.log(55296) - (2 * Math.log(q) - Math.log(GRAVITY))).toBeCloseTo(0, 9);
    }
  });

  it("rises with flow and is zero at zero flow", () => {
    expect(circularCriticalDepth(0, 1)).toBe(0);
    expect(boxCriticalDepth(0, 1)).toBe(0);
    let previous = 0;
    for (let q = 0.001; q < 50; q *= 1.3) {
      const y = circularCriticalDepth(q, 1.0);
      expect(y).toBeGreaterThan(previous);
      previous = y;
    }
  });
});
