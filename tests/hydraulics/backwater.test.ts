import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createRequire } from "node:module";
import type { Barrel } from "../../src/model.js";
import { backwaterProfile, type Profile } from "../../src/hydraulics/backwater.js";
import { CIRCLE_MAX_FACTOR_DEPTH_RATIO, criticalSlopeFlows, manningFlow, normalDepth } from "../../src/hydraulics/normalDepth.js";
import { barrelCriticalDepth } from "../../src/hydraulics/criticalDepth.js";
import { FOOT, GRAVITY } from "../../src/units.js";
import { boxBarrel, circularBarrel } from "./barrelFixtures.js";

// odex 2.0.4 (Hairer and Wanner's ODEX, Gragg-Bulirsch-Stoer extrapolation), a general-purpose ODE
// solver from the registry, loaded through require so that its TypeScript source is not type-checked.
interface OdexSolver {
  absoluteTolerance: number;
  relativeTolerance: number;
  maxSteps: number;
  solve(f: (x: number, y: number[]) => number[], x0: number, y0: number[], x1: number): { y: number[]; outcome: number };
}
const { Solver } = createRequire(import.meta.url)("odex") as { Solver: new (n: number) => OdexSolver };

/** Section geometry written independently of src/: circle by theta = 2 acos(1 - 2y/D) (Chow 1959, Table 2-1). */
function geometry(b: Barrel, y: number): { area: number; perimeter: number; top: number } {
  if (b.shape === "box") return { area: b.span * y, perimeter: b.span + 2 * y, top: b.span };
  const d = b.diameter;
  const theta = 2 * Math.acos(1 - (2 * y) / d);
  return { area: (d * d * (theta - Math.sin(theta))) / 8, perimeter: (d * theta) / 2, top: d * Math.sin(theta / 2) };
}

/**
 * The GVF equation dy/dx = (S0 - Sf)/(1 - Fr^2) (Chow 1959, eq 9-13), Manning Sf = n^2 V^2 / R^(4/3)
 * (SI), integrated by odex upstream from the outlet: xi = distance upstream, dy/dxi = -dy/dx.
 */
function odexInletDepth(b: Barrel, q: number, outletDepth: number, distance = b.length): number {
  const s0 = (b.inletInvert - b.outletInvert) / b.length;
  const rhs = (_xi: number, [y]: number[]) => {
    const { area, perimeter, top } = geometry(b, y);
    const r = area / perimeter;
    const v = q / area;
    const sf = (b.manningN * b.manningN * v * v) / Math.pow(r, 4 / 3);
    const fr2 = (q * q * top) / (GRAVITY * area ** 3);
    return [-(s0 - sf) / (1 - fr2)];
  };
  const solver = new Solver(1);
  solver.absoluteTolerance = 1e-12;
  solver.relativeTolerance = 1e-12;
  solver.maxSteps = 100000;
  const result = solver.solve(rhs, 0, [outletDepth], distance);
  expect(result.outcome).toBe(0);
  return result.y[0];
}

describe("normal depth against Manning's equation", () => {
  // Manning (SI): Q = (1/n) A R^(2/3) S^(1/2) (Chow 1959, eq 6-1). Closed-form sections: a circle
  // half full has A = pi D^2/8 and R = D/4; a rectangle B wide flowing B/2 deep has A = B^2/2, R = B/4.
  it("a circle half full: Q = (1/n)(pi D^2/8)(D/4)^(2/3) S^(1/2) has normal depth D/2", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.004, { length: 50, manningN: 0.013 });
    const q = (1 / 0.013) * ((Math.PI * 0.81) / 8) * Math.pow(0.9 / 4, 2 / 3) * Math.sqrt(0.004);
    expect(normalDepth(b, q)).toBeCloseTo(0.45, 10);
  });

  it("a box 1.2 m wide flowing 0.6 m deep: Q = (1/n)(B^2/2)(B/4)^(2/3) S^(1/2)", () => {
    const b = boxBarrel(1.2, 0.9, "box-wingwall-30-75", 0.002, 40, 0.015);
    const q = (1 / 0.015) * (1.44 / 2) * Math.pow(0.3, 2 / 3) * Math.sqrt(0.002);
    expect(normalDepth(b, q)).toBeCloseTo(0.6, 10);
  });

  it("a circle's section factor peaks near 0.938 D at about 1.076 times the full-flow capacity (Chow 1959, Fig. 6-3; from memory)", () => {
    expect(CIRCLE_MAX_FACTOR_DEPTH_RATIO).toBeCloseTo(0.938, 3);
    const b = circularBarrel(0.6, "concrete-square-headwall", 0.01, { length: 30 });
    const full = manningFlow(b, 0.6, 0.01);
    expect(full).toBeCloseTo((1 / 0.013) * ((Math.PI * 0.36) / 4) * Math.pow(0.15, 2 / 3) * 0.1, 10);
    expect(manningFlow(b, 0.6 * CIRCLE_MAX_FACTOR_DEPTH_RATIO, 0.01) / full).toBeCloseTo(1.076, 3);
    // No normal depth above that flow; the full-flow capacity itself has one below the peak.
    expect(normalDepth(b, 1.08 * full)).toBe(Infinity);
    expect(normalDepth(b, full) / 0.6).toBeGreaterThan(0.8);
    expect(normalDepth(b, full) / 0.6).toBeLessThan(CIRCLE_MAX_FACTOR_DEPTH_RATIO);
  });

  it("a barrel's slope is critical where normal depth equals critical depth: steep between two such flows, mild outside", () => {
    // The critical slope Sc = n^2 g A / (T R^(4/3)) (Manning with Q^2 = g A^3/T; Chow 1959, sec. 7-2)
    // is large at small depths and again near the crown. The demo's 24-in barrel (S = 0.5/60) is
    // steep from about 0.014 cfs to about 20 cfs; a barrel at S = 0.0005 is mild at every flow.
    const b = circularBarrel(2 * FOOT, "concrete-square-headwall", 0.5 / 60, { length: 60 * FOOT });
    const flows = criticalSlopeFlows(b);
    expect(flows).toHaveLength(2);
    for (const q of flows) expect(normalDepth(b, q) / barrelCriticalDepth(b, q)).toBeCloseTo(1, 9);
    const [low, high] = flows;
    expect(normalDepth(b, 0.5 * low)).toBeGreaterThan(barrelCriticalDepth(b, 0.5 * low));
    expect(normalDepth(b, Math.sqrt(low * high))).toBeLessThan(barrelCriticalDepth(b, Math.sqrt(low * high)));
    expect(normalDepth(b, 1.02 * high)).toBeGreaterThan(barrelCriticalDepth(b, 1.02 * high));
    expect(criticalSlopeFlows(circularBarrel(2 * FOOT, "concrete-square-headwall", 0.0005, { length: 60 * FOOT }))).toEqual([]);
  });

  it("none on a horizontal or adverse barrel", () => {
    expect(normalDepth(circularBarrel(0.6, "concrete-square-headwall", 0), 0.1)).toBe(Infinity);
    expect(normalDepth(circularBarrel(0.6, "concrete-square-headwall", -0.002), 0.1)).toBe(Infinity);
  });

  it("Manning's flow at the solved depth is the flow asked for (property)", () => {
    fc.assert(
      fc.property(
        fc.boolean(),
        fc.double({ min: 0.2, max: 2.5, noNaN: true }),
        fc.double({ min: 1e-4, max: 0.05, noNaN: true }),
        fc.double({ min: 0.01, max: 0.9, noNaN: true }),
        (box, rise, slope, depthRatio) => {
          const b = box ? boxBarrel(1.5 * rise, rise, "box-wingwall-30-75", slope) : circularBarrel(rise, "concrete-square-headwall", slope);
          const q = manningFlow(b, depthRatio * rise, slope);
          expect(normalDepth(b, q) / rise).toBeCloseTo(depthRatio, 9);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("backwater profile against an independent odex integration of the GVF equation", () => {
  const within = (profile: Profile, reference: number) => {
    expect(profile.end).toBe("inlet");
    expect(Math.abs(profile.depth - reference)).toBeLessThanOrEqual(0.005 * reference);
  };

  it("M2, 36-in-like circle (0.9 m) on a mild slope, tailwater between critical and normal depth", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.0008, { length: 150 });
    const q = 0.3;
    const yc = barrelCriticalDepth(b, q);
    const yn = normalDepth(b, q);
    expect(yc).toBeLessThan(yn);
    const start = 0.5 * (yc + yn);
    const profile = backwaterProfile(b, q, start);
    expect(profile.kind).toBe("M2");
    expect(profile.depth).toBeGreaterThan(start);
    expect(profile.depth).toBeLessThan(yn);
    within(profile, odexInletDepth(b, q, start));
  });

  it("M1, the same barrel against a high tailwater (85 % of the rise)", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.0008, { length: 150 });
    const q = 0.3;
    const profile = backwaterProfile(b, q, 0.765);
    expect(profile.kind).toBe("M1");
    expect(profile.depth).toBeLessThan(0.765);
    expect(profile.depth).toBeGreaterThan(normalDepth(b, q));
    within(profile, odexInletDepth(b, q, 0.765));
  });

  it("M2 and M1 in a box barrel", () => {
    const b = boxBarrel(1.2, 0.9, "box-wingwall-30-75", 0.0005, 200);
    const q = 0.4;
    const start = 0.5 * (barrelCriticalDepth(b, q) + normalDepth(b, q));
    const m2 = backwaterProfile(b, q, start);
    expect(m2.kind).toBe("M2");
    within(m2, odexInletDepth(b, q, start));
    const m1 = backwaterProfile(b, q, 0.765);
    expect(m1.kind).toBe("M1");
    within(m1, odexInletDepth(b, q, 0.765));
  });

  it("A2 on an adverse slope and S1 on a steep one (drowned to the inlet)", () => {
    const adverse = circularBarrel(0.75, "concrete-square-headwall", -0.004, { length: 60 });
    const a2 = backwaterProfile(adverse, 0.2, 0.4);
    expect(a2.kind).toBe("A2");
    expect(a2.depth).toBeGreaterThan(0.4);
    within(a2, odexInletDepth(adverse, 0.2, 0.4));
    const steep = circularBarrel(0.6, "concrete-square-headwall", 0.01, { length: 20 });
    const s1 = backwaterProfile(steep, 0.05, 0.5);
    expect(s1.kind).toBe("S1");
    expect(s1.depth).toBeLessThan(0.5);
    within(s1, odexInletDepth(steep, 0.05, 0.5));
  });
});

describe("closed-form behaviour of the profile", () => {
  it("a long mild barrel's inlet depth tends to normal depth, from below (M2) and from above (M1)", () => {
    const q = 0.3;
    const depths = [100, 400, 1600, 6400].map((length) => {
      const b = circularBarrel(0.9, "concrete-square-headwall", 0.0008, { length });
      return [backwaterProfile(b, q, 0).depth, backwaterProfile(b, q, 0.8).depth];
    });
    const yn = normalDepth(circularBarrel(0.9, "concrete-square-headwall", 0.0008), q);
    for (let i = 1; i < depths.length; i++) {
      expect(depths[i][0]).toBeGreaterThan(depths[i - 1][0]);
      expect(depths[i][1]).toBeLessThan(depths[i - 1][1]);
    }
    for (const [below, above] of depths) {
      expect(below).toBeLessThanOrEqual(yn);
      expect(above).toBeGreaterThanOrEqual(yn);
    }
    expect(Math.abs(depths[3][0] - yn)).toBeLessThan(1e-4 * yn);
    expect(Math.abs(depths[3][1] - yn)).toBeLessThan(1e-4 * yn);
  });

  it("uniform flow: starting at normal depth, the profile is flat", () => {
    for (const b of [circularBarrel(0.6, "concrete-square-headwall", 0.003, { length: 80 }), boxBarrel(1.5, 1.0, "box-wingwall-30-75", 0.002, 80)]) {
      const q = manningFlow(b, 0.4, (b.inletInvert - b.outletInvert) / b.length);
      const profile = backwaterProfile(b, q, 0.4);
      expect(profile.depth).toBeCloseTo(0.4, 9);
      // A start a hair off normal depth stays there too.
      expect(backwaterProfile(b, q, 0.4 + 1e-7).depth).toBeCloseTo(0.4, 6);
    }
  });

  it("horizontal: the H2 profile rises upstream from critical depth and reaches the crown in a long enough barrel", () => {
    const short = circularBarrel(0.6, "concrete-square-headwall", 0, { length: 30 });
    const q = 0.1;
    const h2 = backwaterProfile(short, q, -Infinity);
    expect(h2.kind).toBe("H2");
    expect(h2.depth).toBeGreaterThan(barrelCriticalDepth(short, q));
    expect(h2.end).toBe("inlet");
    const long = circularBarrel(0.6, "concrete-square-headwall", 0, { length: 30000 });
    const full = backwaterProfile(long, q, -Infinity);
    expect(full.end).toBe("crown");
    expect(full.distance).toBeLessThan(30000);
    expect(full.distance).toBeGreaterThan(30);
  });

  it("steep: a tailwater below critical depth leaves the flow supercritical; a higher one is drowned until the depth falls to critical", () => {
    const b = circularBarrel(0.6, "concrete-square-headwall", 0.03, { length: 40 });
    const q = 0.15;
    expect(normalDepth(b, q)).toBeLessThan(barrelCriticalDepth(b, q));
    expect(backwaterProfile(b, q, 0.1).end).toBe("critical");
    const jump = backwaterProfile(b, q, 0.51);
    expect(jump.kind).toBe("S1");
    expect(jump.end).toBe("critical");
    expect(jump.distance).toBeLessThan(40);
    // Where the profile says critical depth is reached, odex's integration of the same equation is
    // within 20 % of it 3 % short of there (the depth falls like the square root of the distance left), and a barrel that much shorter is drowned.
    const yc = barrelCriticalDepth(b, q);
    const near = odexInletDepth(b, q, 0.51, 0.97 * jump.distance);
    expect(near).toBeGreaterThan(yc);
    expect(near).toBeLessThan(1.2 * yc);
    const shorter = circularBarrel(0.6, "concrete-square-headwall", 0.03, { length: 0.97 * jump.distance });
    const drowned = backwaterProfile(shorter, q, 0.51);
    expect(drowned.end).toBe("inlet");
    expect(Math.abs(drowned.depth - near)).toBeLessThanOrEqual(0.005 * near);
  });

  it("a step limit stops the integration and says so", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.0008, { length: 150 });
    const cut = backwaterProfile(b, 0.3, 0, 1);
    expect(cut.limited).toBe(true);
    expect(cut.steps).toBe(1);
    const whole = backwaterProfile(b, 0.3, 0);
    expect(whole.limited).toBe(false);
    expect(whole.distance).toBe(150);
  });
});

describe("backwater profile against odex over random barrels (property)", () => {
  it("inlet depth within 0.5 % wherever the profile reaches the inlet from a start above critical depth", () => {
    let compared = 0;
    fc.assert(
      fc.property(
        fc.boolean(),
        fc.double({ min: 0.3, max: 2, noNaN: true }),
        fc.double({ min: 5, max: 300, noNaN: true }),
        fc.double({ min: -0.01, max: 0.03, noNaN: true }),
        fc.double({ min: 0.011, max: 0.025, noNaN: true }),
        fc.double({ min: 0.02, max: 0.6, noNaN: true }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        (box, rise, length, slope, n, flowRatio, startRatio) => {
          const b = box ? boxBarrel(1.5 * rise, rise, "box-wingwall-30-75", slope, length, n) : circularBarrel(rise, "concrete-square-headwall", slope, { length, manningN: n });
          // A flow between 2 % and 60 % of the flow that is critical at the full rise (Q^2/g = A^3/T).
          const area = b.shape === "box" ? b.span * rise : (Math.PI * rise * rise) / 4;
          const q = flowRatio * Math.sqrt(GRAVITY * area * area * (b.shape === "box" ? rise : rise / 2));
          const yc = barrelCriticalDepth(b, q);
          const start = yc + startRatio * (0.95 * rise - yc);
          if (start < 1.05 * yc) return;
          // Near a critical slope (normal depth within 10 % of critical) dy/dx is nearly singular
          // along the whole profile, which an integrator stepping in x cannot pass.
          if (Math.abs(normalDepth(b, q) - yc) < 0.1 * yc) return;
          const profile = backwaterProfile(b, q, start);
          if (profile.end !== "inlet") return;
          compared++;
          const reference = odexInletDepth(b, q, start);
          expect(Math.abs(profile.depth - reference)).toBeLessThanOrEqual(0.005 * reference);
        },
      ),
      { numRuns: 200 },
    );
    expect(compared).toBeGreaterThan(80);
  });
});
