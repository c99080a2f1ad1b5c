import { describe, expect, it } from "vitest";
import { criticalDuration, modifiedRationalHydrograph, rationalPeak, requiredStorage } from "../../src/hydrology/rational.js";
import { intensity, type IdfCurve } from "../../src/hydrology/idf.js";
import { AREA_UNITS, INTENSITY_UNITS } from "../../src/units.js";

const CFS = 0.3048 ** 3;

describe("rational method Q = C i A", () => {
  it("C 1, 1 in/h on 1 ac gives 1.008 cfs: the units constant of the US form (closed form)", () => {
    expect(rationalPeak(1, INTENSITY_UNITS["in/h"], AREA_UNITS.ac) / CFS).toBeCloseTo(1.00833, 5);
  });
  it("C 1, 1 mm/h on 1 ha gives 1/360 m3/s: the SI form Q = C i A / 360 (closed form)", () => {
    expect(rationalPeak(1, INTENSITY_UNITS["mm/h"], AREA_UNITS.ha)).toBeCloseTo(1 / 360, 12);
  });
});

describe("IDF curves", () => {
  it("log-log interpolation reproduces a power law between its points (closed form)", () => {
    const law = (t: number) => 0.002 * Math.pow(t, -0.7);
    const durations = [300, 900, 3600, 21600];
    const curve: IdfCurve = { kind: "table", durations, intensities: durations.map(law) };
    for (const t of [300, 500, 1200, 3600, 7000, 21600]) expect(intensity(curve, t) / law(t)).toBeCloseTo(1, 10);
  });
  it("is undefined outside the table (no extrapolation)", () => {
    const curve: IdfCurve = { kind: "table", durations: [300, 3600], intensities: [2e-5, 8e-6] };
    expect(intensity(curve, 200)).toBeNaN();
    expect(intensity(curve, 4000)).toBeNaN();
  });
  it("formula i = a / (t + b)^c with t and b in minutes", () => {
    const curve: IdfCurve = { kind: "formula", a: 1e-3, b: 10, c: 0.8 };
    expect(intensity(curve, 20 * 60)).toBeCloseTo(1e-3 / Math.pow(30, 0.8), 15);
  });
});

describe("modified rational hydrograph and storage", () => {
  it("is a trapezoid holding Qp td (a triangle when td = tc)", () => {
    const trapezoid = modifiedRationalHydrograph(2, 600, 1800);
    expect(Array.from(trapezoid.times)).toEqual([0, 600, 1800, 2400]);
    expect(Array.from(trapezoid.flows)).toEqual([0, 2, 2, 0]);
    const triangle = modifiedRationalHydrograph(2, 600, 600);
    expect(Array.from(triangle.times)).toEqual([0, 600, 1200]);
  });
  // V = Qp td - Qa (td + tc) / 2: the inflow volume less a linearly rising outflow, until the inflow has
  // receded to Qa. Checked against direct integration of the two hydrographs (closed form vs numbers).
  it.each([
    [3, 1.2, 900, 2700],
    [5, 0.5, 600, 600],
    [1, 0.9, 1200, 5400],
  ])("V matches direct integration (Qp %f, Qa %f, tc %i s, td %i s)", (qp, qa, tc, td) => {
    const tStar = td + tc * (1 - qa / qp);
    const inflow = (t: number) => (t < tc ? (qp * t) / tc : t < td ? qp : Math.max(0, qp * (1 - (t - td) / tc)));
    const n = 400000;
    let v = 0;
    for (let i = 0; i < n; i++) {
      const t = ((i + 0.5) / n) * tStar;
      v += (inflow(t) - (qa * t) / tStar) * (tStar / n);
    }
    expect(requiredStorage(qp, td, tc, qa) / v).toBeCloseTo(1, 6);
  });
  it("needs no storage when the peak does not exceed the release", () => {
    expect(requiredStorage(1, 3600, 600, 1.5)).toBe(0);
  });
});

describe("critical storm duration", () => {
  // For i = a/(t+b)^c, V(td) = C A a td/(td+b)^c - Qa (td + tc)/2 is largest where
  // dV/dtd = C A a [(td+b)^-c - c td (td+b)^(-c-1)] - Qa/2 = 0 (closed form; t in minutes here).
  it("lands on the duration where dV/dtd = 0 within the sweep step", () => {
    const a = 2.2e-4;
    const b = 8;
    const c = 0.78;
    const curve: IdfCurve = { kind: "formula", a, b, c };
    const area = 60000;
    const runoff = 0.8;
    const tc = 600;
    const allowable = 0.25;
    const sweep = criticalDuration(runoff, area, tc, curve, allowable, 30);
    const derivative = (minutes: number) =>
      runoff * area * a * (Math.pow(minutes + b, -c) - c * minutes * Math.pow(minutes + b, -c - 1)) * 60 - (allowable * 60) / 2;
    let lo = tc / 60;
    let hi = 24 * 60;
    for (let i = 0; i < 100; i++) {
      const mid = 0.5 * (lo + hi);
      if (derivative(mid) > 0) lo = mid;
      else hi = mid;
    }
    expect(Math.abs(sweep.critical.duration / 60 - lo)).toBeLessThanOrEqual(0.5);
    expect(sweep.critical.storage).toBeGreaterThan(0);
    expect(sweep.trials[0].duration).toBe(tc);
  });
  it("takes the duration tc when no duration needs storage", () => {
    const curve: IdfCurve = { kind: "formula", a: 1e-5, b: 10, c: 0.8 };
    const sweep = criticalDuration(0.5, 1000, 900, curve, 10);
    expect(sweep.critical.duration).toBe(900);
    expect(sweep.critical.storage).toBe(0);
  });
});
