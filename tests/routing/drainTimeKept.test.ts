// The drain time (its mid-stage grids kept between calls): its outflows from the rating sweep against the direct evaluation at every mid-stage
// (the reference): the sweep is held within 1e-5 of flow (tests/hydraulics/ratingSweep.test.ts), so
// the drain integral, a sum of dS / O, agrees within 1e-5 as well. Invented ponds and outlets, with
// a barrel under a free outfall, a fixed tailwater and a tailwater rating; one without a barrel
// against Torricelli's closed form as a yardstick (t = 2A/(Cd a sqrt(2g)) (sqrt(h0) - sqrt(h1))).
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { drainTime } from "../../src/routing/drainTime.js";
import { storageCurve } from "../../src/storage/curve.js";

const outlet = {
  elements: [
    { type: "orifice", shape: "circular", diameter: "6 in", count: 1, invert: 100 },
    { type: "orifice", shape: "circular", diameter: "10 in", count: 2, invert: 101.4 },
    { type: "weir", shape: "rectangular", length: 2, crest: 102.6, endContractions: 2 },
  ],
  riser: { shape: "circular", diameter: 4, crest: 103.8 },
  barrel: { shape: "circular", diameter: "18 in", length: 60, inletInvert: 99.5, outletInvert: 99, manningN: 0.013, entrance: "concrete-square-headwall" },
  spillway: { crest: 105, length: 20, sideSlope: 3 },
};

function pond(tailwater: unknown) {
  return parseCase({
    name: "drain time pond (invented)",
    units: "US",
    pond: { bottom: 100, top: 106, storage: { prismoid: { length: 200, width: 100, sideSlope: 3 } } },
    storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [60, 30], [240, 0]] } }],
    ...(tailwater === undefined ? {} : { tailwater }),
    outlet,
  }).case;
}

describe("drain time through the rating sweep", () => {
  const tailwaters: [string, unknown][] = [
    ["free outfall", undefined],
    ["fixed tailwater over the barrel's outlet", { elevation: 99.8 }],
    ["tailwater rating", { rating: [[0, 99.2], [10, 100.1], [40, 101.3], [120, 102.4]] }],
  ];
  for (const [name, tailwater] of tailwaters) {
    it(`${name}: within 1e-5 of the direct evaluation from every start stage`, () => {
      const c = pond(tailwater);
      const storage = storageCurve(c.pond);
      for (const fromFt of [100.6, 101.9, 103.1, 104.4, 105.7]) {
        const from = fromFt * 0.3048;
        const to = 100.1 * 0.3048;
        const swept = drainTime(storage, c.outlet!, c.tailwater, from, to);
        const direct = drainTime(storage, c.outlet!, c.tailwater, from, to, true);
        expect(direct).toBeGreaterThan(0);
        expect(Number.isFinite(direct)).toBe(true);
        expect(Math.abs(swept / direct - 1)).toBeLessThan(1e-5);
        // Again from the same stages (the grid and the parts' columns are kept): the same number.
        expect(drainTime(storage, c.outlet!, c.tailwater, from, to)).toBe(swept);
      }
    });
  }

  it("a vertical-walled pond through one small orifice: Torricelli's time within 0.5 %", () => {
    const c = parseCase({
      name: "Torricelli pond (invented)",
      units: "SI",
      pond: { bottom: 0, top: 4, storage: { prismoid: { length: 20, width: 10, sideSlope: 0 } } },
      storms: [{ name: "wq", returnPeriod: 1, inflow: { series: [[0, 0], [60, 0.1], [120, 0]] } }],
      outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "50 mm", invert: 0 }] },
    }).case;
    const G = 9.80665;
    const centre = 0.025;
    const k = 0.61 * (Math.PI / 4) * 0.05 ** 2 * Math.sqrt(2 * G); // Cd 0.61, the contract's default
    const closed = ((2 * 200) / k) * (Math.sqrt(3 - centre) - Math.sqrt(0.6 - centre));
    const t = drainTime(storageCurve(c.pond), c.outlet!, c.tailwater, 3, 0.6);
    expect(Math.abs(t / closed - 1)).toBeLessThan(5e-3);
  });
});
