// Exfiltration: the wetted areas against closed forms, and routed storage against the closed-form
// solutions of a tank draining only into the ground (dS/dt = Q - k (A + P h) with vertical walls).
import { describe, expect, it } from "vitest";
import { exfiltrationArea, wettedBottom, wettedSides } from "../../src/storage/exfiltration.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import { caseOf, caseProblems } from "./support.js";
import { stormSeries } from "../../src/report/series.js";
import { infiltrationBasin } from "../routing/support/ponds.js";
import type { Pond } from "../../src/model.js";

const rate = { rate: 0.001, sides: true, drainHours: 72, label: null };

describe("wetted areas (closed forms)", () => {
  it("prismoid: floor L W, sides 2 (L + W + 2 z d) d sqrt(1 + z^2): L 40, W 20, z 3, d 2: 800 m2 and 2 x 72 x 2 x sqrt(10) = 910.74 m2", () => {
    const pond: Pond = { bottom: 10, top: 14, pool: 10, storage: { kind: "prismoid", length: 40, width: 20, sideSlope: 3 }, exfiltration: rate };
    expect(wettedBottom(pond)).toBe(800);
    expect(wettedSides(pond, 12)).toBeCloseTo(288 * Math.sqrt(10), 9);
    expect(exfiltrationArea(pond, 12)).toBeCloseTo(800 + 910.7359, 3);
  });
  it("a stage-area table of a square frustum gives the frustum's sides exactly at its rows (10 m square floor, 3 : 1, 1 m: 52 sqrt(10))", () => {
    const table: Pond = { bottom: 0, top: 2, pool: 0, storage: { kind: "stageArea", elevations: [0, 1, 2], areas: [100, 256, 484] }, exfiltration: rate };
    const prismoid: Pond = { ...table, storage: { kind: "prismoid", length: 10, width: 10, sideSlope: 3 } };
    expect(wettedSides(table, 1)).toBeCloseTo(52 * Math.sqrt(10), 9);
    expect(wettedSides(table, 2)).toBeCloseTo(wettedSides(prismoid, 2), 9);
    expect(wettedBottom(table)).toBe(100);
  });
  it("a stone bed: its base and its vertical walls 2 (L + W) h up to its top, nothing above", () => {
    const c = caseOf({
      name: "bed (invented)", units: "SI",
      pond: { bottom: 20, top: 22, storage: { pipeGallery: { diameter: 0.6, length: 10, count: 3, invert: 20.15, stone: { voidRatio: 0.4, length: 10, width: 4, top: 21 } } }, exfiltration: { rate: "10 mm/h", sides: true } },
      storms: [{ name: "s", returnPeriod: 2, inflow: { series: [[0, 0], [10, 0.01], [20, 0]] } }],
    });
    expect(wettedBottom(c.pond)).toBe(40);
    expect(wettedSides(c.pond, 20.5)).toBeCloseTo(28 * 0.5, 12);
    expect(wettedSides(c.pond, 21.7)).toBeCloseTo(28 * 1.0, 12);
  });
  it("the floor takes up its rate over the first millimetre, then the rate does not grow with depth (unit gradient)", () => {
    const pond: Pond = { bottom: 10, top: 14, pool: 10, storage: { kind: "prismoid", length: 40, width: 20, sideSlope: 0 }, exfiltration: { ...rate, sides: false } };
    expect(exfiltrationArea(pond, 10)).toBe(0);
    expect(exfiltrationArea(pond, 10.0005)).toBeCloseTo(400, 9);
    expect(exfiltrationArea(pond, 10.001)).toBeCloseTo(800, 9);
    expect(exfiltrationArea(pond, 13)).toBeCloseTo(800, 9);
  });
});

/** A tank with vertical walls and no outlet opening, fed a constant inflow for two hours. */
function tank(length: number, width: number, rate: string, sides: boolean, inflow: number, drainHours = 72) {
  return caseOf({
    name: "Exfiltrating tank (invented)",
    units: "SI",
    pond: { bottom: 0, top: 8, storage: { prismoid: { length, width, sideSlope: 0 } }, exfiltration: { rate, sides, drainHours } },
    storms: [{ name: "steady", returnPeriod: 2, inflow: { series: [[0, inflow], [120, inflow]] } }],
    criteria: { drawdown: { depth: 0.03 } },
  });
}

describe("routing with exfiltration against closed forms", () => {
  it("floor only: the stage rises at Q/A - k, and drains from its peak at k (k 36 mm/h = 1e-5 m/s)", () => {
    // A = 200 m2, Q = 0.01 m3/s for 2 h: h = (5e-5 - 1e-5) 7200 = 0.288 m; drained to 0.03 m after
    // (0.288 - 0.03) / 1e-5 = 25,800 s = 7.17 h. All the inflow leaves into the ground.
    const c = tank(20, 10, "36 mm/h", false, 0.01);
    const r = routeCase(c, { elements: [] }).storms[0].result;
    expect(r.maxStage).toBeCloseTo(0.288, 3);
    expect(r.drawdownTime! / 3600).toBeCloseTo(25800 / 3600, 2);
    expect(r.peakOutflow).toBe(0);
    expect(Math.abs(r.massBalanceError)).toBeLessThan(1e-6);
    expect(r.peakExfiltration).toBeCloseTo(200 * 1e-5, 9);
  });
  it("floor and walls: h(t) = h* (1 - exp(-k P t / A)), h* = (Q/k - A)/P (A 2 m2, P 6 m, k 1e-4 m/s, Q 0.002 m3/s: h* 3 m, 2.654 m after 2 h)", () => {
    const c = tank(2, 1, "360 mm/h", true, 0.002);
    const r = routeCase(c, { elements: [] }).storms[0].result;
    const closed = 3 * (1 - Math.exp((-1e-4 * 6 * 7200) / 2));
    expect(closed).toBeCloseTo(2.654, 3);
    // The contract's stage tolerance (0.003 m); without the walls the stage would reach 6.48 m.
    expect(Math.abs(r.maxStage - closed)).toBeLessThan(0.003);
    expect(Math.abs(r.massBalanceError)).toBeLessThan(1e-4);
  });
  it("the drain-time check reads the routed drain time against pond.exfiltration.drainHours", () => {
    for (const [limit, passed] of [[7, false], [8, true]] as const) {
      const c = tank(20, 10, "36 mm/h", false, 0.01, limit);
      const routed = routeCase(c, { elements: [] }).storms;
      const check = evaluateChecks(c, { elements: [] }, routed).find((k) => k.kind === "exfiltration-drain")!;
      expect(check.value).toBeCloseTo(25800 / 3600, 2);
      expect(check.limit).toBe(limit);
      expect(check.passed).toBe(passed);
      expect(check.slack).toBeCloseTo((limit - 25800 / 3600) / limit, 3);
    }
  });
  it("no drain-time check and no exfiltration without the field", () => {
    const c = caseOf({ name: "plain (invented)", units: "SI", pond: { bottom: 0, top: 8, storage: { prismoid: { length: 20, width: 10, sideSlope: 0 } } }, storms: [{ name: "s", returnPeriod: 2, inflow: { series: [[0, 0.01], [120, 0.01]] } }] });
    const routed = routeCase(c, { elements: [] }).storms;
    expect(evaluateChecks(c, { elements: [] }, routed).some((k) => k.kind === "exfiltration-drain")).toBe(false);
    expect(routed[0].result.volumeExfiltrated).toBe(0);
  });
});

describe("case file: exfiltration is checked like the rest", () => {
  const message = caseProblems;
  const base = { name: "x (invented)", units: "US", storms: [{ name: "s", returnPeriod: 2, inflow: { series: [[0, 0], [10, 1], [20, 0]] } }] };
  it("from a wet pond: refused, naming the field", () => {
    expect(message({ ...base, pond: { bottom: 0, top: 5, permanentPool: 1, storage: { prismoid: { length: 20, width: 10, sideSlope: 3 } }, exfiltration: { rate: "0.5 in/h" } } })).toMatch(/pond\.exfiltration: found exfiltration from a wet pond, expected a dry pond/);
  });
  it("from pipes without stone: refused (solid pipes do not exfiltrate)", () => {
    expect(message({ ...base, pond: { bottom: 0, top: 5, storage: { pipeGallery: { diameter: 2, length: 50, count: 2 } }, exfiltration: { rate: "0.5 in/h" } } })).toMatch(/pond\.exfiltration: found a pipe gallery without a stone bed/);
  });
  it("a rate that is not an intensity names the field and the expectation", () => {
    expect(message({ ...base, pond: { bottom: 0, top: 5, storage: { prismoid: { length: 20, width: 10, sideSlope: 3 } }, exfiltration: { rate: "0.5 cfs" } } })).toMatch(/pond\.exfiltration\.rate/);
  });
});

describe("the routed series carry the exfiltration", () => {
  it("route's CSV series: the outflow and exfiltration columns integrate again to the routed volumes (trapezoid rule, 0.1 %)", () => {
    const c = caseOf(infiltrationBasin);
    const sr = routeCase(c, c.outlet!, { record: true }).storms[0];
    const table = stormSeries(c, c.outlet!, sr);
    expect(table.head.slice(0, 4)).toEqual(["time (min)", "inflow (cfs)", "outflow (cfs)", "exfiltration (cfs)"]);
    const integral = (j: number) => table.rows.slice(1).reduce((sum, row, i) => sum + 0.5 * (row[j] + table.rows[i][j]) * (row[0] - table.rows[i][0]) * 60, 0);
    const FT3 = 0.3048 ** 3;
    expect(integral(2) / (sr.result.volumeOut / FT3)).toBeCloseTo(1, 3);
    expect(integral(3) / (sr.result.volumeExfiltrated / FT3)).toBeCloseTo(1, 3);
    expect(sr.result.volumeExfiltrated).toBeGreaterThan(0);
  });
});
