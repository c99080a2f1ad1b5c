import { describe, expect, it } from "vitest";
import { prismoidArea, prismoidVolume } from "../../src/storage/prismoid.js";
import { storageCurve } from "../../src/storage/curve.js";
import { routeCase } from "../../src/routing/routeCase.js";
import type { Pond } from "../../src/model.js";
import { caseOf, wetPond } from "../routing/support/ponds.js";

describe("prismoid: V = L W d + (L + W) z d^2 + (4/3) z^2 d^3 (HEC-22 eq 8-7)", () => {
  it("hand-computed value: 40 x 20 floor, 3:1 sides, 2 m deep", () => {
    // 40*20*2 + 60*3*4 + (4/3)*9*8 = 1600 + 720 + 96 = 2416 m3
    expect(prismoidVolume(40, 20, 3, 2)).toBeCloseTo(2416, 10);
    expect(prismoidArea(40, 20, 3, 2)).toBeCloseTo(52 * 32, 10);
  });

  it("is exact: it equals the prismoidal formula d/6 (A1 + 4 Am + A2) (HEC-22 sec. 8.3), exact for an area quadratic in depth", () => {
    for (const [l, w, z, d] of [[85, 43, 3, 6.57], [10, 10, 0, 1], [30, 12, 4.5, 3.3]]) {
      const prismoidal = (d / 6) * (prismoidArea(l, w, z, 0) + 4 * prismoidArea(l, w, z, d / 2) + prismoidArea(l, w, z, d));
      expect(prismoidVolume(l, w, z, d) / prismoidal).toBeCloseTo(1, 12);
    }
  });

  it("reproduces HEC-22 Example 8-2's stage-storage (US column) within 1 %", () => {
    // Trapezoidal basin, 85 x 43 ft floor at 32.8 ft, Z = 3 (references.md sec. 6.2). One row is off:
    // 5,425 ft3 at 34.12 ft (10.4 m) disagrees with the example's own SI column there (155 m3 =
    // 5,474 ft3) and with the formula (5,521 ft3, 1.8 %); it looks like a misprint of 5,475 and is
    // held to 2 %.
    const printed: [number, number][] = [
      [33.46, 2567], [34.77, 8774], [35.43, 12455], [36.09, 16548],
      [36.75, 21074], [37.4, 26052], [38.06, 31503], [38.71, 37413], [39.37, 43906],
    ];
    for (const [stage, volume] of printed) expect(Math.abs(prismoidVolume(85, 43, 3, stage - 32.8) / volume - 1), `${stage} ft`).toBeLessThan(0.01);
    expect(Math.abs(prismoidVolume(85, 43, 3, 34.12 - 32.8) / 5425 - 1)).toBeLessThan(0.02);
  });

  it("reproduces Example 8-2's SI column to 0.8 m within 1 % (the printed values above 0.8 m run 1-2 % high, a known fault)", () => {
    const printed: [number, number][] = [[0.2, 72], [0.4, 155], [0.6, 248], [0.8, 353]];
    for (const [depth, volume] of printed) expect(Math.abs(prismoidVolume(26, 13, 3, depth) / volume - 1)).toBeLessThan(0.01);
    // The fault itself: 1.0 m is printed 470 m3, the formula gives 467.
    expect(prismoidVolume(26, 13, 3, 1.0)).toBeCloseTo(467, 0);
  });

  it("is zero at and below the floor", () => {
    expect(prismoidVolume(40, 20, 3, 0)).toBe(0);
    expect(prismoidVolume(40, 20, 3, -1)).toBe(0);
  });
});

const pond = (storage: Pond["storage"], bottom: number, top: number): Pond => ({ bottom, top, pool: bottom, storage });

describe("stage-area table: conic (frustum) volume dh/3 (A1 + A2 + sqrt(A1 A2)) (HEC-22 sec. 8.3)", () => {
  // Rows: 100 m: 1000 m2, 101 m: 1500 m2, 103 m: 3000 m2. By hand:
  //   100-101: (1/3)(1000 + 1500 + sqrt(1.5e6)) = (2500 + 1224.745)/3 = 1241.582
  //   101-103: (2/3)(1500 + 3000 + sqrt(4.5e6)) = (2/3)(4500 + 2121.320) = 4414.214
  //   101-102, area at 102 = 2250 (linear): (1/3)(1500 + 2250 + sqrt(3.375e6)) = (3750 + 1837.117)/3 = 1862.372
  const curve = storageCurve(pond({ kind: "stageArea", elevations: [100, 101, 103], areas: [1000, 1500, 3000] }, 100, 103));

  it("full intervals", () => {
    expect(curve.volume(101)).toBeCloseTo(1241.582, 2);
    expect(curve.volume(103)).toBeCloseTo(1241.582 + 4414.214, 2);
  });

  it("a partial depth uses the interpolated area there", () => {
    expect(curve.volume(102)).toBeCloseTo(1241.582 + 1862.372, 2);
    expect(curve.area(102)).toBeCloseTo(2250, 10);
  });

  it("vertical walls above the last row: the last row's area", () => {
    expect(curve.volume(104.5) - curve.volume(103)).toBeCloseTo(1.5 * 3000, 9);
    expect(curve.area(104.5)).toBe(3000);
  });

  it("storage is measured above pond.bottom when the table starts below it", () => {
    const raised = storageCurve(pond({ kind: "stageArea", elevations: [100, 101, 103], areas: [1000, 1500, 3000] }, 101, 103));
    expect(raised.volume(101)).toBe(0);
    expect(raised.volume(103)).toBeCloseTo(4414.214, 2);
  });
});

describe("stage-storage table: linear between rows", () => {
  const curve = storageCurve(pond({ kind: "stageStorage", elevations: [10, 11, 12.5], volumes: [0, 400, 1300] }, 10, 12.5));

  it("interpolates linearly and its area is the slope of the interval", () => {
    expect(curve.volume(10.25)).toBeCloseTo(100, 12);
    expect(curve.volume(11.75)).toBeCloseTo(400 + 0.75 * 600, 12);
    expect(curve.area(10.5)).toBeCloseTo(400, 12);
    expect(curve.area(12)).toBeCloseTo(600, 12);
  });

  it("vertical walls above the last row: storage grows with the last interval's area", () => {
    expect(curve.volume(13.5)).toBeCloseTo(1300 + 600, 9);
  });
});

describe("permanent pool", () => {
  it("every storm starts at the pool with zero inflow history; storage is counted above pond.bottom", () => {
    const c = caseOf(wetPond);
    const curve = storageCurve(c.pond);
    const { result } = routeCase(c, c.outlet!, { record: true }).storms[0];
    expect(result.series!.stage[0]).toBe(c.pond.pool);
    expect(result.series!.inflow[0]).toBe(0);
    expect(result.series!.outflow[0]).toBe(0);
    // The pool's own volume (conic 20-21 m: (500 + 800 + sqrt(4e5))/3 = 643.48 m3) is in every storage.
    expect(curve.volume(21)).toBeCloseTo((500 + 800 + Math.sqrt(500 * 800)) / 3, 9);
    expect(result.maxStorage).toBeGreaterThan(curve.volume(21));
    expect(Math.abs(result.massBalanceError)).toBeLessThan(1e-4);
  });

  it("a storm too small to reach the outlet leaves the pond at rest at the pool", () => {
    // 6 m3 on 800 m2 of pool: a rise of under 1 cm, below an orifice 1 m above the pool.
    const c = caseOf({
      ...wetPond,
      storms: [{ name: "trickle", returnPeriod: 1, inflow: { series: [[0, 0], [10, 0.01], [20, 0]] } }],
      outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "100 mm", invert: 22 }] },
    });
    const { result } = routeCase(c, c.outlet!).storms[0];
    expect(result.peakOutflow).toBe(0);
    expect(result.volumeOut).toBe(0);
    expect(result.storageChange).toBeCloseTo(result.volumeIn, 6);
    expect(Math.abs(result.massBalanceError)).toBeLessThan(1e-4);
  });
});
