import { describe, expect, it } from "vitest";
import {
  convolve,
  gammaShape,
  gammaShapeArea,
  gammaShapeParameter,
  peakRate,
  shapeArea,
  STANDARD_SHAPE,
  TABLE_16_1,
  timeToPeak,
  unitHydrograph,
} from "../../src/hydrology/unitHydrograph.js";
import { tcFromLag, watershedLag } from "../../src/hydrology/timeOfConcentration.js";

const IN = 0.0254;
const MM = 0.001;
const HOUR = 3600;
const SQUARE_MILE = 640 * 43560 * 0.3048 ** 2;
const CFS = 0.3048 ** 3;

/** Trapezoidal volume of ordinates at a regular step. */
function volume(flows: ArrayLike<number>, step: number): number {
  let v = 0;
  for (let i = 1; i < flows.length; i++) v += 0.5 * (flows[i] + flows[i - 1]) * step;
  return v;
}

describe("dimensionless unit hydrograph, NEH Part 630 ch. 16 Table 16-1", () => {
  // The table's third column, the mass curve Qa/Q, is not used by outfit; integrating the q/qp column
  // (as outfit reads it) must reproduce it. Tolerance: the table's third decimal plus the 0.2 % by
  // which its printed ordinates over-fill the area 645.333/484.
  const massCurve: [number, number][] = [
    [0.2, 0.006], [0.4, 0.035], [0.6, 0.107], [0.8, 0.228], [1.0, 0.375], [1.2, 0.522], [1.4, 0.65], [1.6, 0.751],
    [1.8, 0.822], [2.0, 0.871], [2.4, 0.934], [3.0, 0.977], [3.6, 0.993], [4.0, 0.997], [5.0, 1.0],
  ];
  it.each(massCurve)("Table 16-1 mass curve: Qa/Q at t/Tp %f is %f", (x, qa) => {
    const n = 20000;
    let part = 0;
    let whole = 0;
    for (let i = 0; i < n; i++) {
      const xi = ((i + 0.5) / n) * 5;
      const q = STANDARD_SHAPE.ratio(xi) * (5 / n);
      whole += q;
      if (xi < x) part += q;
    }
    expect(Math.abs(part / whole - qa)).toBeLessThanOrEqual(0.0025);
  });
  it("reads the printed ordinates at the printed times (Table 16-1 q/qp column)", () => {
    const printed: [number, number][] = [[0.5, 0.47], [1.0, 1.0], [1.5, 0.68], [2.0, 0.28], [3.0, 0.055], [4.5, 0.005]];
    for (const [x, q] of printed) expect(STANDARD_SHAPE.ratio(x)).toBeCloseTo(q, 12);
    expect(TABLE_16_1.length).toBe(33);
  });
  it("holds the area 645.333/484 = 1.3333 within the table's rounding (0.3 %)", () => {
    let area = 0;
    for (let i = 1; i < TABLE_16_1.length; i++) area += 0.5 * (TABLE_16_1[i][1] + TABLE_16_1[i - 1][1]) * (TABLE_16_1[i][0] - TABLE_16_1[i - 1][0]);
    expect(Math.abs(area / shapeArea(484) - 1)).toBeLessThan(0.003);
  });
});

describe("peak rate", () => {
  it("qp = 484 A Q / Tp in US units (cfs, mi2, in, h) (NEH 630 ch. 16; Bedient et al. 2013 eq 2-16)", () => {
    const q = peakRate(3.2 * SQUARE_MILE, 1.7 * IN, 2.5 * HOUR) / CFS;
    expect(q / ((484 * 3.2 * 1.7) / 2.5)).toBeCloseTo(1, 10);
  });
  it("qp = 0.2083 A Q / Tp in SI (m3/s, km2, mm, h): the same relation in SI units (closed form)", () => {
    const q = peakRate(5.5e6, 40 * MM, 1.5 * HOUR);
    expect(Math.abs(q / ((0.2083 * 5.5 * 40) / 1.5) - 1)).toBeLessThan(2e-4);
  });
  // Bedient, Huber & Vieux (2013) ch. 2 worked example: l = 26,400 ft, S = 2.82 in, Y = 1.9 % -> lag
  // L = 3.36 h; D = 2 h -> Tp = 4.36 h; A = 10 mi2 -> qp = 1,110 cfs per inch.
  it("Bedient et al. lag example: L 3.36 h, Tp 4.36 h, qp 1,110 cfs/in", () => {
    const cn = 1000 / (2.82 + 10);
    const lag = watershedLag(26400 * 0.3048, 0.019, cn);
    expect(Math.abs(lag / HOUR - 3.36)).toBeLessThanOrEqual(0.005);
    const tp = timeToPeak(2 * HOUR, tcFromLag(lag));
    expect(Math.abs(tp / HOUR - 4.36)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(peakRate(10 * SQUARE_MILE, IN, tp) / CFS - 1110)).toBeLessThanOrEqual(5);
  });
  it("Tp = D/2 + 0.6 Tc, and D = 0.133 Tc makes Tc + D = 1.7 Tp (NEH 630 ch. 16)", () => {
    const tc = 90 * 60;
    const d = 0.133 * tc;
    expect((tc + d) / timeToPeak(d, tc)).toBeCloseTo(1.7, 2);
  });
});

describe("gamma-equation DUH for other peak rate factors (NEH 630 ch. 16)", () => {
  it.each([0.8, 2, 3.7, 6])("the closed-form area e^m Gamma(m+1)/m^(m+1) matches numerical integration (m = %f)", (m) => {
    const n = 200000;
    const end = 40;
    let area = 0;
    for (let i = 0; i < n; i++) {
      const x = ((i + 0.5) / n) * end;
      area += Math.pow(x, m) * Math.exp(m * (1 - x)) * (end / n);
    }
    expect(gammaShapeArea(m) / area).toBeCloseTo(1, 5);
  });
  it.each([300, 484, 600])("finds the shape whose area is 645.333/PRF (PRF %i)", (prf) => {
    expect(gammaShapeArea(gammaShapeParameter(prf)) / shapeArea(prf)).toBeCloseTo(1, 8);
  });
  it("peaks at t = Tp with q/qp = 1", () => {
    const shape = gammaShape(300);
    expect(shape.ratio(1)).toBeCloseTo(1, 12);
    expect(shape.ratio(0.9)).toBeLessThan(1);
    expect(shape.ratio(1.1)).toBeLessThan(1);
  });
});

describe("unit hydrograph and convolution", () => {
  const cases: [number, number, number][] = [
    [484, 6 * 60, 30 * 60],
    [484, 5 * 60, 37.3 * 60],
    [484, 60, 4.9 * 60],
    [300, 10 * 60, 52 * 60],
    [600, 2 * 60, 13 * 60],
  ];
  it.each(cases)("a unit depth over the area returns its volume within 0.5 %% (PRF %i, step %i s, Tp %f s)", (prf, step, tp) => {
    const area = 2.4e6;
    const depth = 0.0254;
    const flows = convolve([depth], unitHydrograph(area, step, tp, prf));
    expect(Math.abs(volume(flows, step) / (area * depth) - 1)).toBeLessThan(0.005);
  });
  it.each([484, 300, 600])("peaks at qp = PRF A Q / Tp within 0.5 %% when a step lands on Tp (PRF %i)", (prf) => {
    const tp = 1.25 * HOUR;
    const uh = unitHydrograph(SQUARE_MILE, tp / 8, tp, prf);
    const peak = Math.max(...uh.ordinates) * IN;
    expect(Math.abs(peak / CFS / ((prf * 1 * 1) / 1.25) - 1)).toBeLessThan(0.005);
  });
  it("superposes: two unit increments give the sum of two shifted unit hydrographs", () => {
    const uh = unitHydrograph(1e6, 300, 1800);
    const flows = convolve([0.01, 0, 0.02], uh);
    const u = uh.ordinates;
    for (let n = 0; n < flows.length; n++) {
      const expected = 0.01 * (u[n] ?? 0) + 0.02 * (n >= 2 ? (u[n - 2] ?? 0) : 0);
      expect(flows[n]).toBeCloseTo(expected, 12);
    }
  });
});
