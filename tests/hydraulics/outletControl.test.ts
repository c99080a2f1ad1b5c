import { describe, expect, it } from "vitest";
import fc from "fast-check";
import type { Barrel } from "../../src/model.js";
import {
  APPROXIMATION_MIN_RATIO,
  approximateOutletHeadwater,
  barrelRise,
  barrelState,
  criticalDepth,
  inletControlHeadwater,
  outletControl,
  outletControlDoubt,
  outletControlLoss,
  PROFILE_ONLY_RATIO,
} from "../../src/hydraulics/barrel.js";
import { backwaterProfile } from "../../src/hydraulics/backwater.js";
import { FOOT, GRAVITY } from "../../src/units.js";
import { barrelArbitrary, boxBarrel, CFS, circularBarrel, flowAt, flowAtApproximateRatio } from "./barrelFixtures.js";

/** The demo pond's barrel (cases/demo/case.json): inlet 99.5 ft, outlet 99.0 ft, 60 ft, n 0.013. */
function demoBarrel(inches: number): Barrel {
  return circularBarrel((inches / 12) * FOOT, "concrete-square-headwall", 0.5 / 60, { length: 60 * FOOT, outletInvert: 99 * FOOT });
}

const randomBarrel = barrelArbitrary({ min: -0.01, max: 0.05 }, { min: 5, max: 300 });

describe("where HDS-5's approximation is kept", () => {
  it("exactly the contract's formula wherever its HW/D is 0.75 or more (property)", () => {
    let kept = 0;
    fc.assert(
      fc.property(randomBarrel, fc.double({ min: -6, max: 1.5, noNaN: true }), fc.oneof(fc.constant(-Infinity), fc.double({ min: -2, max: 4, noNaN: true })), (b, logX, tw) => {
        const q = flowAt(b, 10 ** logX);
        const approximation = approximateOutletHeadwater(b, q, tw);
        const control = outletControl(b, q, tw);
        expect(control.approximation).toBe(approximation);
        if (approximation / barrelRise(b) >= APPROXIMATION_MIN_RATIO) {
          kept++;
          expect(control.method).toBe("approximation");
          expect(control.headwater).toBe(approximation);
        }
        // With the outlet submerged the barrel is full over part of its length: the formula again.
        if (tw - b.outletInvert >= barrelRise(b)) expect(control.headwater).toBe(approximation);
      }),
      { numRuns: 400 },
    );
    expect(kept).toBeGreaterThan(50);
  });

  it("the formula is HDS-5's: H + max(TW, (dc + D)/2) - L S (HDS-5 2nd ed. eq 10)", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.005, { length: 80, manningN: 0.013 });
    const q = 1.2;
    const dc = criticalDepth(b, q);
    expect(approximateOutletHeadwater(b, q, -Infinity)).toBeCloseTo(outletControlLoss(b, q) + (dc + 0.9) / 2 - 0.4, 12);
    expect(approximateOutletHeadwater(b, q, 1.5)).toBeCloseTo(outletControlLoss(b, q) + 1.5 - 0.4, 12);
  });
});

describe("where the backwater profile replaces it", () => {
  it("uniform flow in a box: HW = yn + (1 + ke) V^2/2g, by hand", () => {
    // Box 1.2 m x 1.2 m, S 0.002, n 0.013, flowing 0.3 m deep at normal depth: A = 0.36 m2,
    // P = 1.8 m, R = 0.2 m, Q = (1/n) A R^(2/3) S^(1/2) (Manning, SI). Tailwater at normal depth,
    // so the profile is flat; ke = 0.4 for 30-75 degree wingwalls (HDS-5 Table C.2).
    const b = boxBarrel(1.2, 1.2, "box-wingwall-30-75", 0.002, 50);
    const q = (1 / 0.013) * 0.36 * Math.pow(0.2, 2 / 3) * Math.sqrt(0.002);
    const v = q / 0.36;
    const control = outletControl(b, q, b.outletInvert + 0.3);
    expect(control.approximation / 1.2).toBeLessThan(PROFILE_ONLY_RATIO);
    expect(control.method).toBe("profile");
    expect(control.headwater).toBeCloseTo(0.3 + 1.4 * ((v * v) / (2 * GRAVITY)), 8);
  });

  it("the demo's 24-in barrel at 1 cfs: steep, the flow passes critical depth near the inlet, inlet control governs", () => {
    const b = demoBarrel(24);
    const q = 1 * CFS;
    const state = barrelState(b, q, -Infinity);
    expect(state.outlet.method).toBe("inlet");
    expect(state.control).toBe("inlet");
    // HDS-5's approximation would put the chamber (dc + D)/2 - L S above the inlet: at least
    // D/2 - L S = 0.5 ft, the orifice's invert; the barrel really runs a few inches deep.
    expect(approximateOutletHeadwater(b, q, -Infinity)).toBeGreaterThan(0.5 * FOOT);
    expect(state.headwater).toBe(inletControlHeadwater(b, q));
    expect(state.headwater).toBeLessThan(0.5 * FOOT);
    expect(criticalDepth(b, q) / FOOT).toBeLessThan(0.4);
  });

  it("the same barrel against a tailwater 0.8 ft above its outlet: drowned at small flows, a jump in the barrel at larger ones", () => {
    const b = demoBarrel(24);
    const tw = 99.8 * FOOT;
    const small = barrelState(b, 0.1 * CFS, tw);
    expect(small.outlet.method).toBe("profile");
    expect(small.outlet.profile!.kind).toBe("S1");
    expect(small.control).toBe("outlet");
    // The profile is drowned by the tailwater: the inlet stands about 99.8 - 99.5 ft deep.
    expect(small.outlet.profile!.depth / FOOT).toBeGreaterThan(0.29);
    expect(small.outlet.profile!.depth / FOOT).toBeLessThan(0.31);
    const larger = barrelState(b, 2 * CFS, tw);
    expect(larger.outlet.profile!.end).toBe("critical");
    expect(larger.control).toBe("inlet");
  });

  it("a mild barrel under outlet control: HW from the M2 profile, below the approximation's", () => {
    const b = circularBarrel(0.6, "concrete-square-headwall", 0.0005, { length: 120 });
    const q = 0.05;
    const state = barrelState(b, q, -Infinity);
    expect(state.outlet.method).toBe("profile");
    expect(state.outlet.profile!.kind).toBe("M2");
    expect(state.control).toBe("outlet");
    const profile = backwaterProfile(b, q, -Infinity);
    const area = (() => {
      const theta = 2 * Math.acos(1 - (2 * profile.depth) / 0.6);
      return (0.36 * (theta - Math.sin(theta))) / 8;
    })();
    expect(state.outletHeadwater).toBeCloseTo(profile.depth + 1.5 * ((q / area) ** 2 / (2 * GRAVITY)), 9);
    expect(state.outletHeadwater).toBeLessThan(state.outlet.approximation);
  });

  it("still water: at zero flow the level of the tailwater, or of the outlet invert on an adverse barrel", () => {
    const mild = circularBarrel(0.9, "concrete-square-headwall", 0.002, { length: 50 });
    expect(outletControl(mild, 0, -Infinity).headwater).toBeLessThan(0);
    expect(outletControl(mild, 0, mild.inletInvert + 0.2).headwater).toBeCloseTo(0.2, 12);
    // A 1.5 m barrel with its inlet 0.1 m below its outlet (the approximation's HW/D is 0.57 there).
    const adverse = circularBarrel(1.5, "concrete-square-headwall", -0.002, { length: 50 });
    expect(outletControl(adverse, 0, -Infinity).headwater).toBeCloseTo(0.1, 12);
  });
});

describe("the join between profile and formula", () => {
  it("is continuous where the approximation's HW/D passes 0.6 and 0.75 (property)", () => {
    fc.assert(
      fc.property(randomBarrel, fc.oneof(fc.constant(-Infinity), fc.double({ min: -1, max: 0.5, noNaN: true })), (b, twDepth) => {
        const tw = b.outletInvert + twDepth * barrelRise(b);
        for (const ratio of [PROFILE_ONLY_RATIO, APPROXIMATION_MIN_RATIO]) {
          if (approximateOutletHeadwater(b, 0, tw) / barrelRise(b) >= ratio) continue;
          const q = flowAtApproximateRatio(b, tw, ratio)!;
          // Continuous: the change across the switch shrinks with the flow step (a step would not).
          const change = (step: number) => {
            const below = outletControl(b, q * (1 - step), tw);
            const above = outletControl(b, q * (1 + step), tw);
            if (below.profile && above.profile && below.profile.end !== above.profile.end) return null;
            return Math.abs(above.headwater - below.headwater);
          };
          const fine = change(1e-10);
          const coarse = change(1e-6);
          if (fine === null || coarse === null) continue;
          expect(fine).toBeLessThanOrEqual(1e-9 * barrelRise(b) + 1e-3 * coarse);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("blends linearly in the approximation's HW/D between 0.6 and 0.75", () => {
    const b = circularBarrel(0.6, "concrete-square-headwall", 0.0005, { length: 120 });
    const q60 = flowAtApproximateRatio(b, -Infinity, PROFILE_ONLY_RATIO)!;
    const q75 = flowAtApproximateRatio(b, -Infinity, APPROXIMATION_MIN_RATIO)!;
    const q = Math.sqrt(q60 * q75);
    const control = outletControl(b, q, -Infinity);
    expect(control.method).toBe("blend");
    const profile = backwaterProfile(b, q, -Infinity);
    expect(profile.end).toBe("inlet");
    const theta = 2 * Math.acos(1 - (2 * profile.depth) / 0.6);
    const area = (0.36 * (theta - Math.sin(theta))) / 8;
    const fromProfile = profile.depth + 1.5 * ((q / area) ** 2 / (2 * GRAVITY));
    const weight = (control.approximation / 0.6 - 0.6) / 0.15;
    expect(control.headwater).toBeCloseTo(fromProfile + weight * (control.approximation - fromProfile), 9);
  });
});

describe("doubtful outlet-control headwaters", () => {
  it("an adverse barrel the profile shows part full while the approximation's HW/D passes 0.75", () => {
    // Inlet 0.5 ft below the outlet: D/2 + 0.5 ft = 0.83 D for an 18-in pipe at small flows.
    const b = circularBarrel(1.5 * FOOT, "concrete-square-headwall", -0.5 / 60, { length: 60 * FOOT });
    const q = 0.5 * CFS;
    expect(outletControl(b, q, -Infinity).method).toBe("approximation");
    expect(backwaterProfile(b, q, -Infinity).end).toBe("inlet");
    expect(outletControlDoubt(b, q, -Infinity)).toBe("adverse, part full");
    // Ordinary barrels: none.
    expect(outletControlDoubt(demoBarrel(24), q, -Infinity)).toBeNull();
    expect(outletControlDoubt(demoBarrel(18), 20 * CFS, -Infinity)).toBeNull();
    expect(outletControlDoubt(circularBarrel(0.6, "concrete-square-headwall", 0.0005, { length: 120 }), 0.05, -Infinity)).toBeNull();
  });
});
