// Pond sizing from site limits, against the prismoid's closed form and hand calculations.
import { describe, expect, it } from "vitest";
import { pondOfSize, sizePond, type Site } from "../../src/storage/sizing.js";
import { prismoidVolume } from "../../src/storage/prismoid.js";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { outfit } from "../cli/run.js";

const site: Site = {
  floor: 20, maxDepth: 4, sideSlope: 3, lengthToWidth: 2,
  maxTopLength: null, maxTopWidth: null, maxTopArea: null, pool: null, shape: null, step: 1,
};

describe("prismoid sized on a floor-width step", () => {
  it("the smallest width whose storage to the freeboard level holds the volume (hand: W 16 holds 4,070.5, W 15 holds 3,743.25)", () => {
    // V(3.5) = L W d + (L + W) z d^2 + (4/3) z^2 d^3 with L = 2W, z = 3, d = 4 - 0.5:
    // W 16: 1792 + 1764 + 514.5 = 4070.5; W 15: 1575 + 1653.75 + 514.5 = 3743.25.
    const s = sizePond(site, 0.5, 4065);
    expect(s.pond!.size).toBe(16);
    expect(s.pond!.provided).toBeCloseTo(4070.5, 9);
    expect(pondOfSize(site, 0.5, 15).provided).toBeCloseTo(3743.25, 9);
    // Footprint at the top (depth 4): (32 + 24) x (16 + 24) = 2240; excavation V(4) = 2048 + 2304 + 768 = 5120.
    expect(s.pond!.topArea).toBeCloseTo(2240, 9);
    expect(s.pond!.excavation).toBeCloseTo(prismoidVolume(32, 16, 3, 4), 9);
    expect(s.pond!.excavation).toBeCloseTo(5120, 9);
  });

  it("a permanent pool by volume: its depth is solved at each size and the storage counted above it", () => {
    const wet = { ...site, pool: { volume: 1000 } };
    const p = pondOfSize(wet, 0.5, 20);
    expect(prismoidVolume(40, 20, 3, p.pond.pool - 20)).toBeCloseTo(1000, 5);
    expect(p.provided).toBeCloseTo(prismoidVolume(40, 20, 3, 3.5) - 1000, 5);
  });

  it("site limits: a pond that needs more than the footprint allows is refused, with the largest that fits", () => {
    const tight = { ...site, maxTopLength: 60, maxTopWidth: 40 };
    const s = sizePond(tight, 0.5, 5000);
    expect(s.pond).toBeNull();
    // Top length 2W + 24 <= 60 and width W + 24 <= 40: W at most 16, which holds 4,070.5.
    expect(s.largest!.size).toBe(16);
    expect(s.largest!.provided).toBeCloseTo(4070.5, 9);
  });

  it("a stage-area shape scaled in plan: volumes scale with the factor (conic between rows)", () => {
    // Shape: 0 ft: 1000 ft2, 2 ft: 1600, 4 ft: 2400. Conic to 3.5 ft, area there 2200:
    // (2/3)(1000 + 1600 + sqrt(1.6e6)) + (1.5/3)(1600 + 2200 + sqrt(3.52e6)) = 2576.58 + 2838.08 = 5414.66 per unit scale.
    const shaped = { ...site, shape: { depths: [0, 2, 4], areas: [1000, 1600, 2400] }, step: 0.05 };
    const s = sizePond(shaped, 0.5, 4000);
    expect(s.pond!.size).toBeCloseTo(0.75, 12);
    expect(s.pond!.provided).toBeCloseTo(0.75 * 5414.66, 1);
    expect(pondOfSize(shaped, 0.5, 14).provided).toBeLessThan(4000);
  });
});

describe("a case with a site and no pond", () => {
  const json = {
    name: "Sized from the site (invented)",
    units: "US",
    site: { floor: 20, maxDepth: 4, step: 1 },
    criteria: { freeboard: { depth: "0.5 ft" } },
    storms: [{ name: "10-yr", returnPeriod: 10, target: 4, inflow: { series: [[0, 0], [30, 10], [90, 0]] } }],
  };
  it("routes the pond sized for the largest estimate (here the rising release: 5400 + 6480 = 11,880 ft3)", () => {
    const FT = 0.3048;
    const c = parseCase(json).case;
    expect(c.sizing!.required / FT ** 3).toBeCloseTo(11880, 6);
    expect(c.sizing!.method).toBe("rising-release");
    const s = c.pond.storage;
    if (s.kind !== "prismoid") throw new Error("a prismoid was expected");
    // Defaults (common practice): side slopes 3 : 1, floor twice as long as wide, 1 ft steps.
    const [l, w] = [s.length / FT, s.width / FT];
    expect(l).toBeCloseTo(2 * w, 9);
    expect(w).toBeCloseTo(Math.round(w), 9);
    expect(prismoidVolume(l, w, 3, 3.5)).toBeGreaterThanOrEqual(11880);
    expect(prismoidVolume(l - 2, w - 1, 3, 3.5)).toBeLessThan(11880);
  });
  it("neither pond nor site: the error names the field", () => {
    const { site: _, ...bare } = json;
    try {
      parseCase(bare);
      throw new Error("accepted");
    } catch (e) {
      expect(e).toBeInstanceOf(CaseError);
      expect((e as CaseError).message).toMatch(/pond[\s\S]*a pond \(bottom, top, storage\), or a site section/);
    }
  });
  it("`outfit pond` on the bundled site-only case: table with units, JSON with required and provided volumes", () => {
    const run = outfit("pond", "cases/site-only/case.json", "--json");
    expect(run.status).toBe(0);
    const j = JSON.parse(run.stdout);
    expect(j.withinLimits).toBe(true);
    expect(j.provided).toBeGreaterThanOrEqual(j.required);
    expect(j.pond.storage.prismoid.sideSlope).toBe(3);
    const text = outfit("pond", "cases/site-only/case.json").stdout;
    expect(text).toMatch(/Required storage\s+[\d,]+ ft3/);
    expect(text).toMatch(/Footprint at the top of embankment\s+[\d.]+ ft x [\d.]+ ft, [\d,]+ ft2/);
  });
});
