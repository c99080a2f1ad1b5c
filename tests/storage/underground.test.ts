// Underground storage forms against closed forms and hand calculations (sources beside each check).
import { describe, expect, it } from "vitest";
import { segmentArea, segmentAreaIntegral } from "../../src/storage/circularSegment.js";
import { galleryVolume } from "../../src/storage/pipeGallery.js";
import { storageCurve } from "../../src/storage/curve.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { caseOf, caseProblems } from "./support.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import { surchargeWhere } from "../../src/report/storageNotes.js";


/** The circular segment in its central-angle form, A = (D^2/8)(theta - sin theta), theta = 2 acos(1 - 2y/D). */
const segmentByAngle = (d: number, y: number) => {
  const theta = 2 * Math.acos(1 - (2 * y) / d);
  return ((d * d) / 8) * (theta - Math.sin(theta));
};

describe("part-full circle (closed form of the circular segment)", () => {
  it("agrees with the central-angle form of the segment at every depth", () => {
    for (const d of [0.3, 1.2, 1.5]) for (let k = 1; k < 20; k++) expect(segmentArea(d, (k / 20) * d)).toBeCloseTo(segmentByAngle(d, (k / 20) * d), 12);
  });

  it("hand values: empty, half full pi D^2/8, full pi D^2/4; D = 1.2 m at 0.3 m: 0.36 acos(0.5) - 0.3 sqrt(0.27) = 0.221107 m2", () => {
    expect(segmentArea(1.2, 0)).toBe(0);
    expect(segmentArea(1.2, 0.6)).toBeCloseTo((Math.PI * 1.44) / 8, 12);
    expect(segmentArea(1.2, 1.2)).toBeCloseTo((Math.PI * 1.44) / 4, 12);
    expect(segmentArea(1.2, 0.3)).toBeCloseTo(0.221107, 6);
  });

  it("its depth integral is the integral of the area (Simpson's rule, 2000 panels)", () => {
    const d = 0.9;
    for (const y of [0.1, 0.45, 0.8, 0.9, 1.3]) {
      const n = 2000;
      const h = y / n;
      let s = segmentArea(d, 0) + segmentArea(d, y);
      for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * segmentArea(d, i * h);
      expect(segmentAreaIntegral(d, y)).toBeCloseTo((s * h) / 3, 6);
    }
  });
});

describe("pipe gallery stage-storage", () => {
  it("level pipes: count x length x segment area (closed form)", () => {
    const g = { diameter: 1.2, length: 30, count: 4, slope: 0, invert: 10 };
    for (const y of [0.1, 0.3, 0.6, 0.95, 1.2]) expect(galleryVolume(g, 10 + y) / (4 * 30 * segmentByAngle(1.2, y))).toBeCloseTo(1, 9);
    expect(galleryVolume(g, 12)).toBeCloseTo(4 * 30 * ((Math.PI * 1.44) / 4), 9);
  });

  it("a sloped pipe reproduces HEC-22 (3rd ed.) Example 8-3: 1500 mm, S = 0.01, L = 250 m (references.md sec. 6.2, read in the source)", () => {
    // Depth d at the low end: 0.4 m -> 6.31 m3, 0.8 m -> 32.87 m3, 1.5 m -> 132.54 m3 (printed to 0.01 m3).
    // At d = D the wedge is pi r^3 / S exactly and the example agrees to the printed digit. Below it the
    // example's ungula equations are approximations: the exact integral (checked against quadrature in
    // the next test) is 6.217 m3 (1.5 % under the print) at 0.4 m and 32.73 m3 (0.4 % under) at 0.8 m.
    const g = { diameter: 1.5, length: 250, count: 1, slope: 0.01, invert: 0 };
    expect(galleryVolume(g, 1.5)).toBeCloseTo(132.54, 2);
    expect(Math.abs(galleryVolume(g, 0.8) / 32.87 - 1)).toBeLessThan(0.005);
    expect(Math.abs(galleryVolume(g, 0.4) / 6.31 - 1)).toBeLessThan(0.02);
  });

  it("a sloped pipe equals the length integral of the segment area at the local depth (trapezoid rule, 20000 panels)", () => {
    const g = { diameter: 0.6, length: 80, count: 3, slope: 0.005, invert: 5 };
    for (const stage of [5.2, 5.5, 5.75, 6.0, 6.3]) {
      const n = 20000;
      let s = 0;
      for (let i = 0; i <= n; i++) s += (i === 0 || i === n ? 0.5 : 1) * segmentArea(0.6, stage - 5 - 0.005 * (i * 80) / n);
      expect(galleryVolume(g, stage) / (3 * s * (80 / n))).toBeCloseTo(1, 5);
    }
  });
});

/** A 10 m x 4 m bed of stone 1.0 m deep (void ratio 0.4) holding three level 0.6 m pipes 10 m long, inverts 0.15 m up. */
const bedCase = {
  name: "Pipes in stone (invented)",
  units: "SI",
  pond: {
    bottom: 20,
    top: 21,
    storage: { pipeGallery: { diameter: 0.6, length: 10, count: 3, invert: 20.15, stone: { voidRatio: 0.4, length: 10, width: 4 } } },
  },
  storms: [{ name: "10-yr", returnPeriod: 10, target: 0.02, inflow: { series: [[0, 0], [15, 0.06], [45, 0]] } }],
  outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "100 mm", invert: 20 }] },
};

describe("stone envelope: n (bed volume - pipes' volume) + water in the pipes (hand calculation)", () => {
  const curve = storageCurve(caseOf(bedCase).pond);
  it("below the pipes: 0.4 x 40 m2 x 0.15 m = 2.4 m3", () => {
    expect(curve.volume(20.15)).toBeCloseTo(2.4, 9);
  });
  it("pipes half full at 20.45: pipes 3 x 10 x pi 0.09 / 2 = 4.2412; stone 0.4 (40 x 0.45 - 4.2412) = 5.5035; total 9.7447 m3", () => {
    expect(curve.volume(20.45)).toBeCloseTo(9.7447, 3);
  });
  it("full at the bed's top 21.0: pipes 8.4823 + stone 0.4 (40 - 8.4823) = 12.6071; total 21.0894 m3", () => {
    expect(curve.volume(21)).toBeCloseTo(21.0894, 3);
  });
  it("above the bed nothing is counted when nothing is declared: the storage stops at the bed's top", () => {
    expect(curve.volume(21.5)).toBe(curve.volume(21));
    expect(curve.area(21.2)).toBe(0);
  });
  it("routes like any storage: the storm's volume balances and the peak is attenuated", () => {
    const c = caseOf(smallStorm);
    const r = routeCase(c, c.outlet!).storms[0].result;
    expect(Math.abs(r.massBalanceError)).toBeLessThan(1e-4);
    expect(r.peakOutflow).toBeLessThan(0.75 * 0.02);
    expect(r.maxStage).toBeLessThan(21);
    expect(r.maxStorage).toBeCloseTo(curve.volume(r.maxStage), 4);
  });
});

/** The bed case with a storm it holds below the bed's top (27 m3 of inflow). */
const smallStorm = { ...bedCase, storms: [{ name: "2-yr", returnPeriod: 2, target: 0.01, inflow: { series: [[0, 0], [15, 0.02], [45, 0]] } }] };

describe("declared storage above an underground system's top (closed forms)", () => {
  /** The bed case with two manholes rising above the bed's top (21.0): plan areas 1.2 and 0.8 m2, rims 22.0 and 22.5. */
  const withManholes = (ponding?: unknown) => {
    const json = structuredClone(bedCase) as Record<string, any>;
    json.pond.top = 23;
    json.pond.storage.pipeGallery.stone.top = 21;
    json.pond.storage.pipeGallery.structures = [
      { name: "MH-1", area: 1.2, rim: 22.0 },
      { name: "MH-2", area: "0.8 m2", rim: 22.5 },
    ];
    if (ponding) json.pond.storage.pipeGallery.surfacePonding = ponding;
    return storageCurve(caseOf(json).pond);
  };
  const bedFull = 21.0894;
  it("structures only: their plan areas from the top, and above a rim the structure carried up as a notional shaft", () => {
    const c = withManholes();
    expect(c.volume(21)).toBeCloseTo(bedFull, 3);
    // 0.5 m up: (1.2 + 0.8) x 0.5 = 1.0 m3.
    expect(c.volume(21.5) - c.volume(21)).toBeCloseTo(1.0, 12);
    expect(c.area(21.5)).toBeCloseTo(2.0, 12);
    // Above the rims with no ponding declared the shafts go on: 2.0 x 2.0 m at 23.0.
    expect(c.volume(23) - c.volume(21)).toBeCloseTo(4.0, 12);
  });
  it("surface ponding from 22.0 m (0 m2) to 22.3 m (300 m2), conic: the structures stop at their rims", () => {
    const c = withManholes({ stageArea: [[22.0, 0], [22.3, 300]], limit: 22.2 });
    // At 22.2 m: MH-1 (rim 22.0) 1.2 x 1.0 = 1.2; MH-2 (rim 22.5) 0.8 x 1.2 = 0.96; ponding to 0.2 m of a
    // linear area 0 -> 300 m2 over 0.3 m (area 200 m2 there): 0.2/3 (0 + 200 + 0) = 13.333 m3. Total 15.493 m3.
    expect(c.volume(22.2) - c.volume(21)).toBeCloseTo(1.2 + 0.96 + 13.3333, 3);
    expect(c.area(22.2)).toBeCloseTo(0.8 + 200, 9);
  });
  it("the surcharge check: its limit is the system's top, or the ponding level the case permits", () => {
    const json = structuredClone(smallStorm) as Record<string, any>;
    json.storms[0].inflow.series = [[0, 0], [15, 0.06], [45, 0]];
    json.pond.top = 23;
    json.pond.storage.pipeGallery.stone.top = 21;
    json.pond.storage.pipeGallery.structures = [{ name: "MH-1", area: 1.2, rim: 22.0 }];
    const c = caseOf(json);
    const routed = routeCase(c, c.outlet!);
    const check = evaluateChecks(c, c.outlet!, routed.storms).find((k) => k.kind === "surcharge")!;
    // 81 m3 of inflow into a system holding 21.09 m3 below its top: the water rises in MH-1.
    expect(check.limit).toBe(21);
    expect(check.value!).toBeGreaterThan(21);
    expect(check.passed).toBe(false);
    expect(surchargeWhere(c, check.value!)).toMatch(/MH-1/);
    expect(Math.abs(routed.storms[0].result.massBalanceError)).toBeLessThan(1e-4);
  });
});

describe("chambers from a per-unit stage-area table (area linear between rows: average-end area, exact)", () => {
  // One unit: 0 m: 2.0 m2, 0.5 m: 1.8 m2, 0.9 m: 0.6 m2, 1.0 m: 0 m2 (an invented arch).
  // By hand per unit: 0.5 (2.0 + 1.8)/2 = 0.95; 0.4 (1.8 + 0.6)/2 = 0.48; 0.1 (0.6 + 0)/2 = 0.03; total 1.46 m3.
  // At 0.7 m: area 1.8 - 1.2 (0.2/0.4) = 1.2; 0.95 + 0.2 (1.8 + 1.2)/2 = 1.25 m3.
  const json = {
    ...bedCase,
    pond: { bottom: 20, top: 21.2, storage: { chambers: { count: 12, base: 20.1, stageArea: [[0, 2.0], [0.5, 1.8], [0.9, 0.6], [1.0, 0]], stone: { voidRatio: 0.4, length: 12, width: 3, top: 21.2 } } } },
  };
  const curve = storageCurve(caseOf(json).pond);
  it("chambers alone and in stone", () => {
    // Stone below the base: 0.4 x 36 x 0.1 = 1.44 m3.
    expect(curve.volume(20.1)).toBeCloseTo(1.44, 9);
    // At 20.8 (0.7 m up): chambers 12 x 1.25 = 15; stone 0.4 (36 x 0.8 - 15) = 5.52; total 20.52 m3.
    expect(curve.volume(20.8)).toBeCloseTo(20.52, 9);
    // At 21.2: chambers 12 x 1.46 = 17.52; stone 0.4 (36 x 1.2 - 17.52) = 10.272; total 27.792 m3.
    expect(curve.volume(21.2)).toBeCloseTo(27.792, 9);
  });
});

describe("case file: underground forms are checked like the rest", () => {
  const problems = caseProblems;
  it("a bed whose top is below the pipes' crown names the field and what was expected", () => {
    const bad = structuredClone(bedCase) as typeof bedCase;
    (bad.pond.storage.pipeGallery.stone as Record<string, unknown>).top = 20.5;
    expect(problems(bad)).toMatch(/pond\.storage\.pipeGallery\.stone\.top[\s\S]*20\.5[\s\S]*highest crown/);
  });
  it("a void ratio of 1 or more is refused", () => {
    const bad = structuredClone(bedCase) as typeof bedCase;
    bad.pond.storage.pipeGallery.stone.voidRatio = 1.2;
    expect(problems(bad)).toMatch(/voidRatio[\s\S]*void ratio/);
  });
  it("two storage forms at once are refused", () => {
    const bad = structuredClone(bedCase) as Record<string, any>;
    bad.pond.storage.prismoid = { length: 10, width: 5, sideSlope: 3 };
    expect(problems(bad)).toMatch(/exactly one of prismoid, stageArea, stageStorage, pipeGallery, chambers/);
  });
});
