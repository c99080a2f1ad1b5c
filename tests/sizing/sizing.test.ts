// Pond sizing from site limits, against the prismoid's closed form and hand calculations.
import { describe, expect, it } from "vitest";
import { pondOfSize, sizePond, type Site, type StorageNeed } from "../../src/storage/sizing.js";
import { prismoidVolume } from "../../src/storage/prismoid.js";
import { storageBelow } from "../../src/storage/limitLevel.js";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { CATALOGUE_ALLOWANCE } from "../../src/sizing/pondChoice.js";
import { caseLimitLevel } from "../../src/sizing/stormEstimates.js";
import { routedEstimates } from "../../src/sizing/routedEstimate.js";
import { outfit } from "../cli/run.js";

export const plainSite: Site = {
  floor: 20, maxDepth: 4, sideSlope: 3, lengthToWidth: 2,
  maxTopLength: null, maxTopWidth: null, maxTopArea: null, pool: null, shape: null, step: 1,
  existingGrade: null, embankment: { maxHeight: null, topWidth: 10, outsideSlope: 3 }, groundwater: null,
  outfallInvert: null, outfallFall: 0, depthStep: 1,
};
const site = plainSite;
const levels = { floor: 20, top: 24 };
/** A need of `volume` below the freeboard level 23.5 (top 24 less 0.5). */
const need = (volume: number): StorageNeed[] => [{ storm: "x", volume, limit: (p) => p.top - 0.5 }];

describe("prismoid sized on a floor-width step", () => {
  it("the smallest width whose storage to the freeboard level holds the volume (hand: W 16 holds 4,070.5, W 15 holds 3,743.25)", () => {
    // V(3.5) = L W d + (L + W) z d^2 + (4/3) z^2 d^3 with L = 2W, z = 3, d = 4 - 0.5:
    // W 16: 1792 + 1764 + 514.5 = 4070.5; W 15: 1575 + 1653.75 + 514.5 = 3743.25.
    const s = sizePond(site, levels, need(4065));
    expect(s.pond!.size).toBe(16);
    expect(storageBelow(s.pond!.pond, 23.5)).toBeCloseTo(4070.5, 9);
    expect(storageBelow(pondOfSize(site, levels, 15).pond, 23.5)).toBeCloseTo(3743.25, 9);
    // Footprint at the top (depth 4): (32 + 24) x (16 + 24) = 2240; volume below the top V(4) = 2048 + 2304 + 768 = 5120,
    // all of it cut when no existing grade is given.
    expect(s.pond!.topArea).toBeCloseTo(2240, 9);
    expect(s.pond!.cut).toBeCloseTo(prismoidVolume(32, 16, 3, 4), 9);
    expect(s.pond!.cut).toBeCloseTo(5120, 9);
    expect(s.pond!.fill).toBe(0);
    expect(s.pond!.land).toBeCloseTo(2240, 9);
  });

  it("a permanent pool by volume: its depth is solved at each size and the storage counted above it", () => {
    const wet = { ...site, pool: { volume: 1000 } };
    const p = pondOfSize(wet, levels, 20);
    expect(prismoidVolume(40, 20, 3, p.pond.pool - 20)).toBeCloseTo(1000, 5);
    expect(storageBelow(p.pond, 23.5)).toBeCloseTo(prismoidVolume(40, 20, 3, 3.5) - 1000, 5);
  });

  it("site limits: a pond that needs more than the footprint allows is refused, with the largest that fits", () => {
    const tight = { ...site, maxTopLength: 60, maxTopWidth: 40 };
    const s = sizePond(tight, levels, need(5000));
    expect(s.pond).toBeNull();
    // Top length 2W + 24 <= 60 and width W + 24 <= 40: W at most 16, which holds 4,070.5.
    expect(s.largest!.size).toBe(16);
    expect(storageBelow(s.largest!.pond, 23.5)).toBeCloseTo(4070.5, 9);
  });

  it("a stage-area shape scaled in plan: volumes scale with the factor (conic between rows)", () => {
    // Shape: 0 ft: 1000 ft2, 2 ft: 1600, 4 ft: 2400. Conic to 3.5 ft, area there 2200:
    // (2/3)(1000 + 1600 + sqrt(1.6e6)) + (1.5/3)(1600 + 2200 + sqrt(3.52e6)) = 2576.58 + 2838.08 = 5414.66 per unit scale.
    const shaped = { ...site, shape: { depths: [0, 2, 4], areas: [1000, 1600, 2400] }, step: 0.05 };
    const s = sizePond(shaped, levels, need(4000));
    expect(s.pond!.size).toBeCloseTo(0.75, 12);
    expect(storageBelow(s.pond!.pond, 23.5)).toBeCloseTo(0.75 * 5414.66, 1);
    expect(storageBelow(pondOfSize(shaped, levels, 14).pond, 23.5)).toBeLessThan(4000);
  });
});

describe("earthwork against an existing grade (hand calculation)", () => {
  // Floor 20 x 10 ft at 96, side slopes 3 : 1, top 102, grade 100: 2 ft of embankment with a 10 ft
  // crest and 3 : 1 outside slopes.
  const graded: Site = { ...site, floor: null, lengthToWidth: 2, existingGrade: 100, embankment: { maxHeight: 2, topWidth: 10, outsideSlope: 3 } };
  const p = pondOfSize(graded, { floor: 96, top: 102 }, 10);
  it("cut: the pond below the grade, V(4) = 20 x 10 x 4 + 30 x 3 x 16 + 12 x 64 = 800 + 1440 + 768 = 3,008 ft3", () => {
    expect(p.cut).toBeCloseTo(3008, 9);
  });
  it("fill: the frustum under the embankment's outer faces less the water's room above the grade", () => {
    // Top of the pond at 102: 20 + 36 = 56 by 10 + 36 = 46. Outer crest edge 76 x 66; outer toe at the
    // grade 88 x 78. Frustum (prismoid formula, 2 ft): 76 x 66 x 2 + 142 x 3 x 4 + 12 x 8 = 10,032 + 1,704 + 96 = 11,832.
    // The pond between 100 and 102: V(6) - V(4) = (1200 + 3240 + 2592) - 3008 = 4,024. Fill 11,832 - 4,024 = 7,808 ft3.
    expect(p.fill).toBeCloseTo(7808, 9);
    expect(p.embankment).toBeCloseTo(2, 12);
  });
  it("land: the outer toe's rectangle, 88 x 78 = 6,864 ft2", () => {
    expect(p.land).toBeCloseTo(6864, 9);
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
  it("routes the pond that holds the routed estimate, plus the catalogue allowance, below the limit level; one step narrower does not", () => {
    const c = parseCase(json).case;
    expect(c.sizing!.method).toMatch(/^routed-/);
    expect(c.sizing!.withinLimits).toBe(true);
    const s = c.pond.storage;
    if (s.kind !== "prismoid") throw new Error("a prismoid was expected");
    // Defaults (common practice): side slopes 3 : 1, floor twice as long as wide, 1 ft steps.
    const FT = 0.3048;
    const [l, w] = [s.length / FT, s.width / FT];
    expect(l).toBeCloseTo(2 * w, 9);
    expect(w).toBeCloseTo(Math.round(w), 9);
    const estimate = Math.max(...routedEstimates({ pond: c.pond, tailwater: c.tailwater, storms: c.storms, drawdownDepth: c.criteria.drawdownDepth, over: 0, under: 0.1 })[0].results.map((r) => r.storage));
    const limit = caseLimitLevel(c, c.storms[0]).level;
    expect(storageBelow(c.pond, limit)).toBeGreaterThanOrEqual(estimate * (1 + CATALOGUE_ALLOWANCE));
    const narrower = { ...c.pond, storage: { ...s, width: s.width - FT, length: s.length - 2 * FT } };
    expect(storageBelow(narrower, limit)).toBeLessThan(estimate * (1 + CATALOGUE_ALLOWANCE) * 1.02);
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
  it("`outfit pond` on the bundled site-only case: table with units, JSON with the storage each storm needs and is given", () => {
    const run = outfit("pond", "cases/site-only/case.json", "--json");
    expect(run.status).toBe(0);
    const j = JSON.parse(run.stdout);
    expect(j.withinLimits).toBe(true);
    expect(j.sizedTo.method).toMatch(/^routed-/);
    for (const p of j.provided) expect(p.storage).toBeGreaterThanOrEqual(j.sizedTo.volume * (p.storm === j.sizedTo.storm ? 1 : 0));
    expect(j.pond.storage.prismoid.sideSlope).toBe(3);
    const text = outfit("pond", "cases/site-only/case.json").stdout;
    expect(text).toMatch(/Sized to\s+[\d,]+ ft3: the 25-yr storm's routed estimate/);
    expect(text).toMatch(/Footprint at the top of embankment\s+[\d.]+ ft x [\d.]+ ft, [\d,]+ ft2/);
  });
});
