import { describe, expect, it } from "vitest";
import fc from "fast-check";
import type { Barrel, Element, Outlet, Tailwater } from "../../src/model.js";
import { chamberFlow, chamberLevel } from "../../src/hydraulics/chamber.js";
import { exactBarrelFlow } from "../../src/hydraulics/barrel.js";
import { barrelFlow } from "../../src/hydraulics/barrelCurve.js";
import { openingsFlow, outletDetail, outletDischarge } from "../../src/hydraulics/outlet.js";
import { tailwaterLevel } from "../../src/hydraulics/tailwater.js";
import { entrancesFor } from "../../src/parts/entrances.js";
import { FOOT } from "../../src/units.js";
import { boxBarrel, circularBarrel, circularRiser, demoOutlet, orifice, weir } from "./barrelFixtures.js";

const FREE: Tailwater = { kind: "free" };

/**
 * Independent brute force: scan chamber levels c on a fine grid from the barrel's inlet invert to
 * the pond stage, and find where the flow in through the openings, openingsFlow(WS, c), crosses the
 * barrel's flow at headwater c (the exact pointwise inverse, exactBarrelFlow, not the tabulated
 * curve the solver uses).
 */
function bruteForceChamber(outlet: Outlet, ws: number, tw: number, points = 4000): { level: number; flow: number } {
  const b = outlet.barrel!;
  const low = Math.min(b.inletInvert, ws);
  let previousLevel = low;
  let previousExcess = openingsFlow(outlet, ws, low) - exactBarrelFlow(b, low, tw);
  if (previousExcess <= 0) return { level: low, flow: openingsFlow(outlet, ws, low) };
  for (let i = 1; i <= points; i++) {
    const c = low + ((ws - low) * i) / points;
    const excess = openingsFlow(outlet, ws, c) - exactBarrelFlow(b, c, tw);
    if (excess <= 0) {
      const level = previousLevel + ((c - previousLevel) * previousExcess) / (previousExcess - excess);
      return { level, flow: exactBarrelFlow(b, level, tw) };
    }
    previousLevel = c;
    previousExcess = excess;
  }
  return { level: ws, flow: 0 };
}

/** A headwall box with two orifices and a weir, drained by a 0.9 m x 0.6 m box barrel (SI, invented). */
function boxOutlet(): Outlet {
  return {
    elements: [orifice(0.2, 10.0, 2), orifice(0.3, 10.8), weir(1.2, 11.5)],
    riser: circularRiser(1.2, 12.2),
    barrel: { ...boxBarrel(0.9, 0.6, "box-wingwall-30-75", 0.004, 40), inletInvert: 9.8, outletInvert: 9.64 },
  };
}

describe("chamber level against a brute-force scan", () => {
  const cases: [string, Outlet, number[], number][] = [
    ["demo outlet with an 18-in barrel (US, free outfall)", demoOutlet(18), [100.5, 101.5, 102.5, 103.5, 104.2, 104.75, 105.0, 105.5].map((z) => z * FOOT), -Infinity],
    ["demo outlet with a 24-in barrel against a 99.8 ft tailwater", demoOutlet(24), [100.3, 102.5, 104.6, 105.2].map((z) => z * FOOT), 99.8 * FOOT],
    ["box barrel under a headwall box (SI)", boxOutlet(), [10.1, 10.6, 11.2, 11.9, 12.5, 13.0], -Infinity],
    // A rim far wider than the barrel (the barrel's capacity): its free flow lies beyond the curve's
    // last node, so the solve takes the chamber as drowned there without the pointwise barrel.
    ["an 18-in barrel under a 1000 m rim (its capacity)", { elements: [], riser: circularRiser(1000, 100 * FOOT), barrel: demoOutlet(18).barrel }, [100.2, 101, 103, 105.5].map((z) => z * FOOT), -Infinity],
  ];
  for (const [label, outlet, stages, tw] of cases) {
    it.each(stages)(`${label}: stage %f m agrees within 0.1 % of flow`, (ws) => {
      const solved = chamberLevel(outlet, ws, tw);
      const brute = bruteForceChamber(outlet, ws, tw);
      expect(Math.abs(solved.flow - brute.flow)).toBeLessThanOrEqual(0.001 * brute.flow + 1e-12);
      expect(solved.level).toBeLessThanOrEqual(ws);
      expect(solved.flow).toBeGreaterThan(0);
    });
  }

  it("the solution balances: flow in through the openings at the chamber level equals the barrel's flow", () => {
    const outlet = demoOutlet(18);
    for (const z of [101, 103, 104.8, 105.5]) {
      const s = chamberLevel(outlet, z * FOOT, -Infinity);
      expect(openingsFlow(outlet, z * FOOT, s.level)).toBeCloseTo(s.flow, 9);
      expect(barrelFlow(outlet.barrel!, s.level, -Infinity)).toBeCloseTo(s.flow, 9);
    }
  });
});

describe("what governs", () => {
  it("below the barrel's capacity the openings alone govern: the rating equals the one without a barrel (common practice)", () => {
    const without = demoOutlet(null);
    // Each barrel's inlet sits in a sump one diameter (plus 0.1 ft) below the 6-in orifice (invert
    // 100 ft), so HDS-5's part-full outlet-control approximation, ho = (dc + D)/2 <= D, does not
    // reach the openings while the flow is small.
    const firstThrottled = (inches: number): number => {
      const outlet = demoOutlet(inches);
      const b = outlet.barrel!;
      const drop = (inches / 12) * FOOT + 0.1 * FOOT - 0.5 * FOOT;
      outlet.barrel = { ...b, inletInvert: 99.5 * FOOT - drop, outletInvert: 99 * FOOT - drop };
      for (let z = 100.05; z <= 106; z += 0.05) {
        const d = outletDetail(outlet, FREE, z * FOOT);
        const free = outletDischarge(without, FREE, z * FOOT);
        if (d.control.startsWith("barrel")) {
          expect(d.total).toBeLessThan(free);
          return z;
        }
        expect(d.total).toBeCloseTo(free, 12);
      }
      return Infinity;
    };
    const stages = [12, 15, 18, 24, 30, 36].map(firstThrottled);
    for (let i = 1; i < stages.length; i++) expect(stages[i]).toBeGreaterThan(stages[i - 1]);
    expect(stages[0]).toBeLessThan(104);
  });

  it("a larger barrel makes the total rating rise faster at high stage (common practice)", () => {
    const z1 = 105.0 * FOOT;
    const z2 = 105.9 * FOOT;
    const rise = (inches: number) => outletDischarge(demoOutlet(inches), FREE, z2) - outletDischarge(demoOutlet(inches), FREE, z1);
    expect(rise(18)).toBeLessThan(rise(24));
    expect(rise(24)).toBeLessThan(rise(30));
    expect(outletDetail(demoOutlet(18), FREE, z2).control).toMatch(/^barrel|spillway/);
  });

  it("names the barrel's control when the chamber throttles the openings", () => {
    const d = outletDetail(demoOutlet(18), FREE, 104.6 * FOOT);
    expect(d.control).toBe("barrel inlet control");
    expect(d.chamber!).toBeGreaterThan(104.5 * FOOT - 1);
    const drowned = outletDetail(demoOutlet(18), { kind: "elevation", elevation: 102 * FOOT }, 104.6 * FOOT);
    expect(drowned.control).toBe("barrel outlet control");
    expect(drowned.chamber!).toBeGreaterThan(102 * FOOT);
  });
});

describe("no reverse flow and tailwater", () => {
  it("no outflow when the tailwater stands above the pond, with or without a barrel", () => {
    for (const outlet of [demoOutlet(18), demoOutlet(null)]) {
      const tail: Tailwater = { kind: "elevation", elevation: 104 * FOOT };
      expect(outletDischarge(outlet, tail, 103.9 * FOOT)).toBe(0);
      expect(outletDetail(outlet, tail, 103.9 * FOOT).control).toBe("no flow");
    }
  });

  it("a tailwater rating: the outflow solves O = discharge(WS, TW(O)) with a barrel", () => {
    const outlet = demoOutlet(18);
    const tail: Tailwater = { kind: "rating", flows: [0, 0.2, 1.0], elevations: [99 * FOOT, 100.5 * FOOT, 102 * FOOT] };
    for (const z of [101, 103, 104.7, 105.4]) {
      const total = outletDischarge(outlet, tail, z * FOOT);
      const tw = tailwaterLevel(tail, total);
      expect(Number.isFinite(total) && total > 0).toBe(true);
      expect(chamberFlow(outlet, z * FOOT, tw, true)).toBeCloseTo(total, 8);
      expect(total).toBeLessThanOrEqual(outletDischarge(outlet, FREE, z * FOOT) + 1e-12);
    }
  });
});

/** Random openings, a random barrel under them, and a random tailwater (SI, invented). */
const outletArbitrary = fc
  .record({
    box: fc.boolean(),
    rise: fc.double({ min: 0.15, max: 1.5, noNaN: true }),
    span: fc.double({ min: 0.3, max: 2.5, noNaN: true }),
    length: fc.double({ min: 5, max: 120, noNaN: true }),
    slope: fc.double({ min: -0.01, max: 0.08, noNaN: true }),
    n: fc.double({ min: 0.01, max: 0.028, noNaN: true }),
    pick: fc.nat(),
    sump: fc.double({ min: -0.5, max: 0.3, noNaN: true }),
    orifices: fc.array(fc.record({ d: fc.double({ min: 0.05, max: 0.6, noNaN: true }), z: fc.double({ min: 0, max: 2.5, noNaN: true }), count: fc.integer({ min: 1, max: 3 }) }), { minLength: 1, maxLength: 3 }),
    weirs: fc.array(fc.record({ length: fc.double({ min: 0.2, max: 3, noNaN: true }), z: fc.double({ min: 0.3, max: 3, noNaN: true }) }), { maxLength: 2 }),
    riser: fc.option(fc.record({ d: fc.double({ min: 0.6, max: 2, noNaN: true }), z: fc.double({ min: 1.5, max: 3.5, noNaN: true }) })),
    tailwater: fc.option(fc.double({ min: -1, max: 3, noNaN: true })),
  })
  .map((r) => {
    const names = entrancesFor(r.box ? "box" : "circular");
    const entrance = names[r.pick % names.length];
    const base: Barrel = r.box ? boxBarrel(r.span, r.rise, entrance, r.slope, r.length, r.n) : circularBarrel(r.rise, entrance, r.slope, { length: r.length, manningN: r.n });
    const shift = r.sump - base.inletInvert;
    const barrel: Barrel = { ...base, inletInvert: base.inletInvert + shift, outletInvert: base.outletInvert + shift };
    const elements: Element[] = [...r.orifices.map((o) => orifice(o.d, o.z, o.count)), ...r.weirs.map((w) => weir(w.length, w.z))];
    const outlet: Outlet = { elements, barrel, ...(r.riser ? { riser: circularRiser(r.riser.d, r.riser.z) } : {}) };
    const tail: Tailwater = r.tailwater === null ? FREE : { kind: "elevation", elevation: r.tailwater };
    return { outlet, tail };
  });

describe("rating with a barrel (property)", () => {
  it("is finite, non-decreasing in stage, and keeps the chamber at or below the pond", () => {
    fc.assert(
      fc.property(outletArbitrary, ({ outlet, tail }) => {
        let previous = 0;
        for (let i = 0; i <= 120; i++) {
          const ws = -0.2 + (5 * i) / 120;
          const q = outletDischarge(outlet, tail, ws);
          expect(Number.isFinite(q)).toBe(true);
          expect(q).toBeGreaterThanOrEqual(previous * (1 - 1e-9) - 1e-15);
          previous = Math.max(previous, q);
          const tw = tailwaterLevel(tail, q);
          const s = chamberLevel(outlet, ws, tw);
          expect(Number.isFinite(s.level)).toBe(true);
          expect(s.level).toBeLessThanOrEqual(ws);
          expect(s.flow).toBeLessThanOrEqual(openingsFlow(outlet, ws, -Infinity) * (1 + 1e-12));
        }
      }),
      { numRuns: 120 },
    );
  });
});
