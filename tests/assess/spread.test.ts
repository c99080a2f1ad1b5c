// The spread: a design routed again with more inflow, its openings half clogged and a higher
// tailwater, and its reserve (limit level minus highest stage) under each. Checked against closed
// forms: a vertical-walled tank whose outlet never flows holds the whole inflow volume, so its
// highest stage is the floor plus volume / plan area (mass conservation), and 20 % more inflow raises
// it by 20 %; a rectangular weir without end contractions passes Q = C L H^1.5 (Francis), so the
// weir with half its open length blocked routes exactly as a weir half as long (the clogged routing
// checked against the case with the shorter weir, routed on its own).
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { spreadDepartures, spreadOf } from "../../src/assess/spread.js";
import { routeCase } from "../../src/routing/routeCase.js";

const FT = 0.3048;
// A triangular inflow: 10 cfs at 30 min, nothing at 90 min: 0.5 * 90 * 60 s * 10 cfs = 27,000 ft3.
const tank = (extra: Record<string, unknown> = {}) =>
  parseCase({
    name: "Tank whose outlet never flows (invented)",
    units: "US",
    pond: { bottom: 50, top: 60, storage: { prismoid: { length: 100, width: 50, sideSlope: 0 } } },
    storms: [{ name: "100-yr", returnPeriod: 100, inflow: { series: [[0, 0], [30, 10], [90, 0]] } }],
    criteria: { freeboard: { depth: "1 ft" } },
    outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "6 in", invert: 58.95 }] },
    ...extra,
  }).case;

describe("the spread's reserve", () => {
  it("in a tank that holds the whole inflow: floor + volume / area, 10 and 20 % higher with 10 and 20 % more inflow (mass conservation)", () => {
    const c = tank();
    const spread = spreadOf(c, c.outlet!);
    const depth = 27000 / (100 * 50); // 5.4 ft
    const reserve = (factor: number) => (59 - (50 + factor * depth)) * FT; // below the freeboard level, 59 ft
    const by = Object.fromEntries(spread.departures.map((d) => [d.key, d]));
    expect(Object.keys(by)).toEqual(["inflow+10%", "inflow+20%", "clogged"]);
    expect(by["inflow+10%"].reserve).toBeCloseTo(reserve(1.1), 3);
    expect(by["inflow+20%"].reserve).toBeCloseTo(reserve(1.2), 3);
    // Clogging changes nothing in a tank whose outlet never flows.
    expect(by.clogged.reserve).toBeCloseTo(reserve(1), 3);
    expect(spread.reserve).toBe(by["inflow+20%"].reserve);
    expect(spread.worst).toMatchObject({ key: "inflow+20%", storm: "100-yr", by: "freeboard level" });
    expect(spread.routings).toBe(3);
  });

  it("measures to the spillway crest for a storm that must keep the spillway dry, and goes negative past it", () => {
    // Crest at 56.2 ft: 50 + 1.2 * 5.4 = 56.48 ft is 0.28 ft above it; 50 + 1.1 * 5.4 = 55.94 ft is 0.26 ft below.
    const c = tank({ outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "6 in", invert: 58.95 }], spillway: { crest: 56.2, length: 10, sideSlope: 3 } } });
    const spread = spreadOf(c, c.outlet!);
    expect(spread.worst).toMatchObject({ key: "inflow+20%", by: "spillway crest" });
    // Above the crest the spillway flows, so the stage is a little lower than the tank's: the reserve is negative, above -0.28 ft.
    expect(spread.reserve / FT).toBeLessThan(0);
    expect(spread.reserve / FT).toBeGreaterThan(-0.28 - 1e-6);
    expect(spread.departures.find((d) => d.key === "inflow+10%")!.reserve / FT).toBeCloseTo(0.26, 3);
  });

  it("routes the clogged weir as a weir half as long (Francis: Q = C L H^1.5, no end contractions)", () => {
    const json = (length: number) => ({
      name: "Weir pond (invented)",
      units: "US",
      pond: { bottom: 50, top: 60, storage: { prismoid: { length: 100, width: 50, sideSlope: 2 } } },
      storms: [{ name: "100-yr", returnPeriod: 100, inflow: { series: [[0, 0], [30, 40], [120, 0]] } }],
      criteria: { freeboard: { depth: "1 ft" } },
      outlet: { elements: [{ type: "weir", shape: "rectangular", length, crest: 51, endContractions: 0 }] },
    });
    const c = parseCase(json(4)).case;
    const half = parseCase(json(2)).case;
    const spread = spreadOf(c, c.outlet!);
    const clogged = spread.departures.find((d) => d.key === "clogged")!;
    const alone = routeCase(half, half.outlet!).storms[0].result.maxStage;
    expect(clogged.reserve).toBeCloseTo(59 * FT - alone, 9);
    // And more inflow raises the stage of a flowing outlet less than in proportion to its volume.
    const base = 59 * FT - routeCase(c, c.outlet!).storms[0].result.maxStage;
    const plus20 = spread.departures.find((d) => d.key === "inflow+20%")!.reserve;
    expect(plus20).toBeLessThan(base);
  });

  it("raises a given tailwater by 0.5 ft (0.15 m in SI), and leaves a free outfall out; the case's larger clogging share is used", () => {
    expect(spreadDepartures(tank()).map((d) => d.label)).toEqual(["inflow +10 %", "inflow +20 %", "openings 50 % clogged"]);
    const held = tank({ tailwater: { elevation: 52 }, criteria: { freeboard: { depth: "1 ft" }, clogging: { fraction: 0.6 } } });
    expect(spreadDepartures(held).map((d) => d.label)).toEqual(["inflow +10 %", "inflow +20 %", "openings 60 % clogged", "tailwater 0.5 ft higher"]);
    expect(spreadOf(held, held.outlet!).departures).toHaveLength(4);
  });
});
