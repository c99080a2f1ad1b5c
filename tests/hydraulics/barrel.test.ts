import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  barrelHeadwater,
  barrelState,
  criticalDepth,
  exactBarrelFlow,
  criticalHead,
  flowParameter,
  inletControlHeadwater,
  KU_SI,
  outletControlLoss,
  submergedRatio,
  SUBMERGED_LIMIT,
  unsubmergedRatio,
  UNSUBMERGED_LIMIT,
  barrelRise,
} from "../../src/hydraulics/barrel.js";
import { barrelCurve, barrelFlow, curveHeadwater } from "../../src/hydraulics/barrelCurve.js";
import { ENTRANCE_TABLE, entrancesFor, type Entrance, type EntranceName } from "../../src/parts/entrances.js";
import { ENTRANCES } from "../../src/parts/entrances.js";
import type { Barrel } from "../../src/model.js";
import { FOOT } from "../../src/units.js";
import { barrelArbitrary, boxBarrel, CFS, circularBarrel, flowAt } from "./barrelFixtures.js";

describe("HDS-5 inlet-control forms", () => {
  // FHWA HDS-5 (2nd ed., 2001) App. A, worked development of a dimensionless inlet-control curve
  // with K 0.0340, M 1.5, c 0.0496, Y 0.53 and S 0.02 (slope term -0.5 S = -0.01): the printed
  // submerged rows. Reproduced to the printed two decimals.
  const appendixRow: Entrance = { ...ENTRANCE_TABLE["cmp-projecting"], K: 0.034, M: 1.5, c: 0.0496, Y: 0.53, Ks: -0.5 };
  const submergedRows: [number, number][] = [[1, 0.57], [2, 0.72], [4, 1.31], [6, 2.31], [8, 3.69]];
  it.each(submergedRows)("HDS-5 App. A submerged: Q/AD^0.5 = %f gives HW/D %f", (x, printed) => {
    expect(submergedRatio(appendixRow, x, 0.02).toFixed(2)).toBe(printed.toFixed(2));
  });

  // The same table's unsubmerged rows (form 1, HW/D = Hc/D + K x^M - 0.5 S). The handbook took Hc/D
  // from its own critical-depth table of a circular section; with the critical head solved here
  // (Q^2/g = A^3/T) the rows agree within 0.035 in HW/D, not to the printed two decimals: at the
  // printed Qc/AD^0.5 of 4.60 and 6.20 the closed-form critical head is 2 to 3 % above the one the
  // table used (we get 1.572 and 2.079 for the printed 1.54 and 2.05; 0.098 for the printed 0.11
  // at 0.05). The row 2.54 is printed 0.55 in the copy at hand; references.md recomputes 0.97.
  const unsubmergedRows: [number, number][] = [[0.05, 0.11], [0.3, 0.27], [1.18, 0.58], [2.54, 0.97], [4.6, 1.54], [6.2, 2.05]];
  it.each(unsubmergedRows)("HDS-5 App. A unsubmerged: Qc/AD^0.5 = %f gives HW/D %f within 0.035", (x, printed) => {
    const pipe = circularBarrel(1, "cmp-projecting", 0.02);
    const q = flowAt(pipe, x);
    const hcRatio = criticalHead(pipe, q, criticalDepth(pipe, q)) / barrelRise(pipe);
    expect(Math.abs(unsubmergedRatio(appendixRow, x, 0.02, hcRatio) - printed)).toBeLessThan(0.035);
  });

  it("form 2 has no critical-head or slope term (HDS-5 App. A eq A.2)", () => {
    const form2: Entrance = { ...ENTRANCE_TABLE["box-wingwall-30-75"], form: 2, K: 0.515, M: 0.667 };
    expect(unsubmergedRatio(form2, 2, 0.05, 0.9)).toBeCloseTo(0.515 * 2 ** 0.667, 12);
  });

  it("Ku for SI is 1.811 (HDS-5 App. A): the exact conversion 1/sqrt(0.3048) rounds to it", () => {
    expect(KU_SI.toFixed(3)).toBe("1.811");
  });
});

describe("barrel headwater against hand computations", () => {
  // references.md sec. 1.4 [D]: computed with the HDS-5 equations above (form 1 with
  // Hc = dc + Vc^2/2g, Ks = -0.5, submerged form for x >= 4; Ku 1 US, 1.811 SI; g 32.174 / 9.81).
  // Verified here independently (a separate script solving Q^2/g = A^3/T by bisection):
  //   48-in RCP, S 0.01: Q 30 -> x 1.194, dc 1.624 ft, Hc 2.234 ft, HW 2.2699; Q 60 -> x 2.387, HW 3.5027;
  //   Q 120 -> x 4.775 submerged, HW 6.2893 ft.
  //   36-in CMP headwall, S 0.02: Q 20 -> HW 2.0249 ft (printed 2.03); Q 80 -> x 6.53, HW 6.8946 (printed 6.90).
  //   1.2 m RCP, S 0.01: Q 1.0 -> 0.7684 m; Q 3.0 -> 1.7168 m (printed 1.716, made with Ku 1.811 and
  //   g 9.81; here Ku = 1/sqrt(0.3048) and g 9.80665).
  // So the printed 2.03, 6.90 and 1.716 are within one unit of their last digit, the others exact.
  const rows: [string, Barrel, number, number, number][] = [
    ["48-in RCP square edge, S 0.01, 30 cfs", circularBarrel(4 * FOOT, "concrete-square-headwall", 0.01), 30 * CFS, 2.27 * FOOT, 0.005 * FOOT],
    ["48-in RCP square edge, S 0.01, 60 cfs", circularBarrel(4 * FOOT, "concrete-square-headwall", 0.01), 60 * CFS, 3.5 * FOOT, 0.005 * FOOT],
    ["48-in RCP square edge, S 0.01, 120 cfs", circularBarrel(4 * FOOT, "concrete-square-headwall", 0.01), 120 * CFS, 6.29 * FOOT, 0.005 * FOOT],
    ["36-in CMP headwall, S 0.02, 20 cfs", circularBarrel(3 * FOOT, "cmp-headwall", 0.02), 20 * CFS, 2.03 * FOOT, 0.006 * FOOT],
    ["36-in CMP headwall, S 0.02, 80 cfs", circularBarrel(3 * FOOT, "cmp-headwall", 0.02), 80 * CFS, 6.9 * FOOT, 0.006 * FOOT],
    ["1.2 m RCP square edge, S 0.01, 1.0 m3/s", circularBarrel(1.2, "concrete-square-headwall", 0.01), 1.0, 0.768, 0.0005],
    ["1.2 m RCP square edge, S 0.01, 3.0 m3/s", circularBarrel(1.2, "concrete-square-headwall", 0.01), 3.0, 1.716, 0.001],
  ];
  it.each(rows)("inlet control: %s", (_label, barrel, q, expected, tolerance) => {
    expect(Math.abs(inletControlHeadwater(barrel, q) - expected)).toBeLessThanOrEqual(tolerance);
  });

  // Outlet-control loss H = (1 + ke + 29 n^2 L / R^1.33) V^2/2g (HDS-5 2nd ed. eq 7), references.md
  // sec. 1.4 [D]: 48-in, n 0.012, L 100 ft, ke 0.5, Q 120 cfs -> V 9.55 ft/s, H 2.72 ft (verified:
  // 2.7175); SI 1.2 m, L 30 m, Q 3.0 -> V 2.653 m/s, H 0.689 m (verified with Ku 19.63: 0.6888).
  it("outlet-control loss, 48-in RCP, 120 cfs: 2.72 ft", () => {
    const b = circularBarrel(4 * FOOT, "concrete-square-headwall", 0.01, { length: 100 * FOOT, manningN: 0.012 });
    expect(outletControlLoss(b, 120 * CFS) / FOOT).toBeCloseTo(2.72, 2);
  });
  it("outlet-control loss, 1.2 m RCP, 3.0 m3/s: 0.689 m", () => {
    const b = circularBarrel(1.2, "concrete-square-headwall", 0.01, { length: 30, manningN: 0.012 });
    expect(outletControlLoss(b, 3.0)).toBeCloseTo(0.689, 3);
  });

  it("outlet control: HW = H + max(TW, (dc + D)/2) - L S (HDS-5 2nd ed. eq 10)", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.005, { length: 80, manningN: 0.013 });
    const q = 1.2;
    const dc = criticalDepth(b, q);
    const low = barrelState(b, q, -Infinity);
    expect(low.outletHeadwater).toBeCloseTo(outletControlLoss(b, q) + (dc + 0.9) / 2 - 0.4, 12);
    const high = barrelState(b, q, 1.5);
    expect(high.outletHeadwater).toBeCloseTo(outletControlLoss(b, q) + 1.5 - 0.4, 12);
  });
});

describe("entrance table", () => {
  // HDS-5 2nd ed. Table 9 / 3rd ed. Table A.1 (K, M, c, Y, Ks) and 2nd ed. Table 12 / 3rd ed.
  // Table C.2 (ke), as listed in references.md sec. 1.2 and 1.3 [F].
  const published: Record<EntranceName, [number, number, number, number, number, number]> = {
    "concrete-square-headwall": [0.0098, 2.0, 0.0398, 0.67, -0.5, 0.5],
    "concrete-groove-headwall": [0.0018, 2.0, 0.0292, 0.74, -0.5, 0.2],
    "concrete-groove-projecting": [0.0045, 2.0, 0.0317, 0.69, -0.5, 0.2],
    "cmp-headwall": [0.0078, 2.0, 0.0379, 0.69, -0.5, 0.5],
    "cmp-mitered": [0.021, 1.33, 0.0463, 0.75, 0.7, 0.7],
    "cmp-projecting": [0.034, 1.5, 0.0553, 0.54, -0.5, 0.9],
    "box-wingwall-30-75": [0.026, 1.0, 0.0347, 0.81, -0.5, 0.4],
    "box-wingwall-15-90": [0.061, 0.75, 0.04, 0.8, -0.5, 0.5],
  };
  it.each([...ENTRANCES])("%s carries its published HDS-5 row and ke", (name) => {
    const row = ENTRANCE_TABLE[name];
    expect([row.K, row.M, row.c, row.Y, row.Ks, row.ke]).toEqual(published[name]);
    expect(row.form).toBe(1);
  });
  it("every entrance the case format lists has exactly one row, and the shapes split them", () => {
    expect(Object.keys(ENTRANCE_TABLE).sort()).toEqual([...ENTRANCES].sort());
    expect(entrancesFor("box")).toEqual(["box-wingwall-30-75", "box-wingwall-15-90"]);
    expect(entrancesFor("circular")).toHaveLength(6);
  });
  it.each([...ENTRANCES])("%s: the straight transition rises from the unsubmerged value at 3.5 to the submerged one at 4.0", (name) => {
    const row = ENTRANCE_TABLE[name];
    const barrel = row.shape === "circular" ? circularBarrel(1, name, 0.02) : boxBarrel(1.5, 1, name, 0.02);
    const below = inletControlHeadwater(barrel, flowAt(barrel, UNSUBMERGED_LIMIT) * (1 - 1e-9));
    const start = inletControlHeadwater(barrel, flowAt(barrel, UNSUBMERGED_LIMIT) * (1 + 1e-9));
    const end = inletControlHeadwater(barrel, flowAt(barrel, SUBMERGED_LIMIT) * (1 - 1e-9));
    const after = inletControlHeadwater(barrel, flowAt(barrel, SUBMERGED_LIMIT) * (1 + 1e-9));
    expect(start).toBeCloseTo(below, 6);
    expect(after).toBeCloseTo(end, 6);
    expect(end).toBeGreaterThan(start);
    expect(end / barrelRise(barrel)).toBeCloseTo(submergedRatio(row, SUBMERGED_LIMIT, 0.02), 6);
  });
});

/** A random barrel of either shape with an entrance that fits it (SI). */
const randomBarrel = barrelArbitrary({ min: -0.02, max: 0.1 }, { min: 5, max: 150 });

describe("headwater and its inverse", () => {
  it("headwater is finite and >= 0, and the barrel's curve rises with flow, for every barrel, flow and tailwater (property)", () => {
    fc.assert(
      fc.property(
        randomBarrel,
        fc.double({ min: 0, max: 12, noNaN: true }),
        fc.double({ min: 0, max: 12, noNaN: true }),
        fc.oneof(fc.constant(-Infinity), fc.double({ min: -2, max: 5, noNaN: true })),
        (b, x1, x2, tw) => {
          const q1 = flowAt(b, Math.min(x1, x2));
          const q2 = flowAt(b, Math.max(x1, x2));
          const h1 = barrelHeadwater(b, q1, tw);
          const h2 = barrelHeadwater(b, q2, tw);
          expect(Number.isFinite(h1) && Number.isFinite(h2)).toBe(true);
          expect(h1).toBeGreaterThanOrEqual(0);
          // The exact headwater may dip where a drowned inlet gives way to a jump in the barrel
          // (barrel.ts); the tabulated curve the chamber solve uses never falls.
          const curve = barrelCurve(b, tw);
          expect(curveHeadwater(curve, q2)).toBeGreaterThanOrEqual(curveHeadwater(curve, q1));
          expect(inletControlHeadwater(b, q2)).toBeGreaterThanOrEqual(inletControlHeadwater(b, q1) - 1e-12);
        },
      ),
      { numRuns: 400 },
    );
  });

  it("flow from headwater inverts headwater from flow, on the curve and pointwise, and is monotone (property)", () => {
    fc.assert(
      fc.property(
        randomBarrel,
        fc.double({ min: 0.001, max: 10, noNaN: true }),
        fc.oneof(fc.constant(-Infinity), fc.double({ min: -2, max: 5, noNaN: true })),
        (b, x, tw) => {
          const q = flowAt(b, x);
          const hw = b.inletInvert + curveHeadwater(barrelCurve(b, tw), q);
          const back = barrelFlow(b, hw, tw);
          // Equal flows, or (on a stretch the curve holds level) the same headwater.
          expect(Math.abs(back - q) <= 1e-9 * q || Math.abs(curveHeadwater(barrelCurve(b, tw), back) - (hw - b.inletInvert)) <= 1e-12).toBe(true);
          expect(barrelFlow(b, hw + 0.01, tw)).toBeGreaterThan(back);
          expect(barrelFlow(b, hw - 0.01, tw)).toBeLessThanOrEqual(back);
          // The exact inverse finds a flow with the exact headwater asked for.
          const head = barrelHeadwater(b, q, tw);
          const exact = exactBarrelFlow(b, b.inletInvert + head, tw);
          expect(Math.abs(barrelHeadwater(b, exact, tw) - head)).toBeLessThanOrEqual(1e-9 * (1 + head));
        },
      ),
      { numRuns: 300 },
    );
  });

  it("no NaN at zero flow, at full flow or with the tailwater above the inlet", () => {
    const b = circularBarrel(0.6, "concrete-square-headwall", 0.01, { length: 40 });
    // At zero flow outlet control gives (0 + D)/2 - L S = 0.3 - 0.4 < 0 and inlet control 0.
    expect(barrelHeadwater(b, 0, -Infinity)).toBe(0);
    expect(barrelFlow(b, b.inletInvert, -Infinity)).toBe(0);
    expect(barrelFlow(b, b.inletInvert - 1, -Infinity)).toBe(0);
    // Full flow (headwater at the crown) and far beyond: finite and rising.
    const huge = barrelFlow(b, b.inletInvert + 100, -Infinity);
    expect(Number.isFinite(huge) && huge > 0).toBe(true);
    const full = barrelFlow(b, b.inletInvert + 0.6, -Infinity);
    expect(Number.isFinite(full) && full > 0 && full < huge).toBe(true);
    // Tailwater 1 m above the inlet: nothing flows until the headwater rises above it.
    const tw = b.inletInvert + 1;
    expect(barrelFlow(b, tw - 0.5, tw)).toBe(0);
    expect(barrelFlow(b, tw, tw)).toBe(0);
    const just = barrelFlow(b, tw + 0.01, tw);
    expect(Number.isFinite(just) && just > 0).toBe(true);
  });
});

describe("which control governs (HDS-5 ch. III, common practice)", () => {
  it("a short steep smooth barrel with a free outfall is in inlet control", () => {
    const b = circularBarrel(0.9, "concrete-square-headwall", 0.05, { length: 20, manningN: 0.012 });
    expect(barrelState(b, flowAt(b, 5), -Infinity).control).toBe("inlet");
  });
  it("a long flat rough barrel, or one against a high tailwater, is in outlet control", () => {
    const long = circularBarrel(0.9, "cmp-headwall", 0.001, { length: 200, manningN: 0.024 });
    expect(barrelState(long, flowAt(long, 5), -Infinity).control).toBe("outlet");
    const drowned = circularBarrel(0.9, "concrete-square-headwall", 0.01, { length: 30 });
    expect(barrelState(drowned, flowAt(drowned, 2), 2.5).control).toBe("outlet");
  });
  it("the same barrel in SI and in US units gives the same headwater (conversion at the boundary)", () => {
    const si = circularBarrel(1.2, "concrete-square-headwall", 0.01);
    // HW/D depends only on x = Ku Q/(A D^0.5): 1.2 m and 3.937 ft are the same pipe.
    expect(flowParameter(si, 3.0)).toBeCloseTo(3.0 / CFS / (Math.PI * (1.2 / FOOT) ** 2 / 4) / Math.sqrt(1.2 / FOOT), 9);
  });
});
