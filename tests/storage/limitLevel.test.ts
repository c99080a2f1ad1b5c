// The limit level of every storage question: the lower of the freeboard level and, for a storm that
// must keep the spillway dry, the spillway crest; an underground system's top (or permitted ponding).
// Storage below it against the prismoid's closed form (HEC-22 eq 8-7, the case-format contract).
import { describe, expect, it } from "vitest";
import { limitLevel, storageBelow } from "../../src/storage/limitLevel.js";
import { prismoidVolume } from "../../src/storage/prismoid.js";
import { caseEstimates } from "../../src/sizing/stormEstimates.js";
import { volumeJson } from "../../src/report/volume.js";
import { caseOf } from "./support.js";

/** The pond: floor 32 x 16 ft at 20 ft, 3 : 1, top 24 ft, freeboard 0.5 ft, spillway crest 23.2 ft. */
const json = {
  name: "Limit levels (invented)",
  units: "US",
  pond: { bottom: 20, top: 24, storage: { prismoid: { length: 32, width: 16, sideSlope: 3 } } },
  criteria: { freeboard: { depth: "0.5 ft" }, spillway: { dryThrough: 10 } },
  storms: [
    { name: "2-yr", returnPeriod: 2, target: 1.02, inflow: { series: [[0, 0], [30, 3.2], [140, 0]] } },
    { name: "25-yr", returnPeriod: 25, target: 6.25, inflow: { series: [[0, 0], [30, 7.5], [140, 0]] } },
  ],
  outlet: { spillway: { crest: 23.2, length: 8, sideSlope: 3 } },
};
const FT3 = 0.3048 ** 3;

describe("limit levels of a pond with a spillway", () => {
  const c = caseOf(json);
  it("a storm that keeps the spillway dry stops at the crest: V(3.2) = 1,638.4 + 1,474.56 + 393.216 = 3,506.18 ft3", () => {
    const l = limitLevel(c.pond, c.criteria, c.outlet!.spillway, 2);
    expect(l.by).toBe("spillway crest");
    expect(l.level / 0.3048).toBeCloseTo(23.2, 9);
    expect(storageBelow(c.pond, l.level) / FT3).toBeCloseTo(prismoidVolume(32, 16, 3, 3.2), 6);
    expect(prismoidVolume(32, 16, 3, 3.2)).toBeCloseTo(3506.176, 3);
  });
  it("a larger storm (the spillway may flow) stops at the freeboard level: V(3.5) = 4,070.5 ft3", () => {
    const l = limitLevel(c.pond, c.criteria, c.outlet!.spillway, 25);
    expect(l.by).toBe("freeboard level");
    expect(storageBelow(c.pond, l.level) / FT3).toBeCloseTo(4070.5, 6);
  });
  it("volume reports each storm's limit level and the storage below it", () => {
    const j = volumeJson(c, caseEstimates(c, c.storms.map(() => ({ group: null, rational: null }))));
    expect(j.storms[0].limitLevel).toMatchObject({ by: "spillway crest" });
    expect(j.storms[0].available).toBeCloseTo(3506.176, 2);
    expect(j.storms[1].available).toBeCloseTo(4070.5, 2);
    expect(j.limitLevel).toBeCloseTo(23.2, 9);
    expect(j.availableStorage).toBeCloseTo(3506.176, 2);
  });
});

describe("limit levels of an underground system", () => {
  const underground = (ponding?: unknown, top = 22) =>
    caseOf({
      name: "Underground limits (invented)",
      units: "SI",
      pond: {
        bottom: 20,
        top,
        storage: { pipeGallery: { diameter: 0.6, length: 10, count: 3, invert: 20.15, stone: { voidRatio: 0.4, length: 10, width: 4, top: 21 }, structures: [{ name: "MH-1", area: 1.2, rim: 22 }], ...(ponding ? { surfacePonding: ponding } : {}) } },
      },
      criteria: { freeboard: { depth: 0.2 } },
      storms: [{ name: "s", returnPeriod: 5, target: 0.01, inflow: { series: [[0, 0], [10, 0.02], [30, 0]] } }],
    });
  it("the system's top, below the freeboard level", () => {
    const c = underground();
    expect(limitLevel(c.pond, c.criteria, undefined, 5)).toEqual({ level: 21, by: "system top" });
  });
  it("the surface ponding the case permits", () => {
    const c = underground({ stageArea: [[22, 0], [22.3, 200]], limit: 22.1 });
    // Permitted up to 22.1 m, above the freeboard level 21.8 m: the freeboard level governs.
    expect(limitLevel(c.pond, c.criteria, undefined, 5)).toEqual({ level: 21.8, by: "freeboard level" });
    // With the top of embankment at 23 m (freeboard level 22.8 m) the permitted ponding governs.
    const higher = underground({ stageArea: [[22, 0], [22.3, 200]], limit: 22.1 }, 23);
    expect(limitLevel(higher.pond, higher.criteria, undefined, 5)).toEqual({ level: 22.1, by: "permitted ponding" });
  });
});
