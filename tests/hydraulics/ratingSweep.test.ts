// The rating sweep (outletRating.ts) and its tables against the direct evaluation: the orifice
// integral by the 24-point rule (orifice.ts, the case-format contract's integral over the wetted
// opening), the chamber by Brent's method to 1e-11 and the tailwater-rating root by outlet.ts, each
// stage on its own. Closed forms where they exist: the small-head limit pi sqrt(D) h^2 / 4 (the
// bottom of a circle is a parabola of width 2 sqrt(D y); the Beta integral B(3/2, 3/2) = pi/8) and
// the orifice equation A sqrt(2 g H) for a deep circle (HEC-22 eq 8-17) with the first correction of
// the binomial series for the head's variation over the opening.
import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import type { Case, Outlet, Tailwater } from "../../src/model.js";
import { parseCase } from "../../src/case/load.js";
import { circularOpeningIntegral, SHORT_RULE, SHORT_RULE_COVER } from "../../src/parts/orificeIntegral.js";
import { CIRCLE_TABLE_TOLERANCE, wettedCircleTabulated } from "../../src/parts/circleTable.js";
import { buildRatingTable, ratingBreaks, ratingOnsets, stageGrid, type StageGrid } from "../../src/routing/ratingTable.js";
import { circularBarrel, demoOutlet } from "./barrelFixtures.js";
import { dischargeAtTailwater } from "../../src/hydraulics/outlet.js";
import { tailwaterLevel } from "../../src/hydraulics/tailwater.js";
import { randomPonds } from "../routing/support/randomPonds.js";
import { OpeningsSweep } from "../../src/hydraulics/openingsSweep.js";

/** Stated error of the sweep's outflow against the direct evaluation, relative to the flow (0.001 %;
 * the tables' errors are 1e-6, the warm roots' 1e-7 of the free flow). */
const SWEEP_FLOW_TOLERANCE = 1e-5;

describe("dimensionless table of the free circular orifice integral", () => {
  it(`is within ${CIRCLE_TABLE_TOLERANCE} of the 24-point integral from the first millimetre of head to three diameters`, () => {
    let worst = 0;
    for (const d of [0.05, 0.075, 0.15, 0.3, 0.6, 1.2]) {
      for (let k = 1; k <= 6000; k++) {
        const h = (3 * d * k) / 6000;
        const direct = circularOpeningIntegral(d, 10, 10 + h, -Infinity);
        worst = Math.max(worst, Math.abs(wettedCircleTabulated(d, h) / direct - 1));
      }
    }
    expect(worst).toBeLessThan(CIRCLE_TABLE_TOLERANCE);
    expect(worst).toBeGreaterThan(0);
  });

  it("meets the closed forms: pi sqrt(D) h^2 / 4 at small heads, A sqrt(H) on the centre when deep", () => {
    const d = 0.3;
    const h = 1e-4 * d;
    // Next term of the small-head series is O(h/D) relative: 1e-4 here.
    expect(wettedCircleTabulated(d, h) / ((Math.PI * Math.sqrt(d) * h * h) / 4)).toBeCloseTo(1, 3);
    const deep = 20 * d;
    const area = (Math.PI * d * d) / 4;
    // With the first term of the binomial series of sqrt(H - z) over the circle, 1 - (r/H)^2 / 32
    // (the next, 5 (r/H)^4 / 1024, is below 1e-8 here).
    const p = d / 2 / (deep - d / 2);
    expect(wettedCircleTabulated(d, deep) / (area * Math.sqrt(deep - d / 2) * (1 - (p * p) / 32))).toBeCloseTo(1, 7);
    expect(wettedCircleTabulated(d, 0)).toBe(0);
  });
});

describe("8-point rule for a circular orifice under water standing over its top", () => {
  it("is within 1e-6 of the 24-point rule for every downstream level inside the opening", () => {
    let worst = 0;
    for (const d of [0.05, 0.2, 0.9]) {
      for (let i = 0; i <= 200; i++) {
        const ws = d * (1 + SHORT_RULE_COVER + (4 * i) / 200);
        for (let j = 1; j < 100; j++) {
          const ds = (d * j) / 100;
          const direct = circularOpeningIntegral(d, 0, ws, ds);
          worst = Math.max(worst, Math.abs(circularOpeningIntegral(d, 0, ws, ds, SHORT_RULE) / direct - 1));
        }
      }
    }
    expect(worst).toBeLessThan(1e-6);
  });
});

/**
 * Largest difference of two ratings on the same grid, relative to the flow (flows below 1e-9 of the
 * peak are compared with that). A barrel under a tailwater rating is the one exception: there the
 * equation O = discharge(WS, TW(O)) evaluates the exact barrel, whose headwater is not monotone
 * everywhere (DEVELOPERS.md, barrel notes), so it may have more than one root; a stage where the
 * two differ counts as agreeing when the sweep's outflow solves the equation at least as well as
 * the direct one (its residual is no larger), and such stages are counted.
 */
function worstDifference(outlet: Outlet, c: Case, tail: Tailwater, grid: StageGrid): { worst: number; otherRoot: number } {
  const direct = buildRatingTable(c.pond, outlet, tail, { grid, direct: true });
  const sweep = buildRatingTable(c.pond, outlet, tail, { grid });
  let peak = 0;
  for (const q of direct.outflow) peak = Math.max(peak, q);
  let worst = 0;
  let otherRoot = 0;
  for (let i = 0; i < direct.outflow.length; i++) {
    const q = direct.outflow[i];
    const difference = Math.abs(sweep.outflow[i] - q) / Math.max(q, 1e-9 * peak);
    if (difference >= SWEEP_FLOW_TOLERANCE && outlet.barrel && tail.kind === "rating") {
      const ws = grid.stage[i];
      const residual = (o: number) => Math.abs(dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, o), true) - o);
      if (residual(sweep.outflow[i]) <= residual(q)) {
        otherRoot++;
        continue;
      }
    }
    worst = Math.max(worst, difference);
  }
  return { worst, otherRoot };
}

describe("rating sweep against the direct evaluation at every stage", () => {
  const ponds = randomPonds("rating sweep", 12);
  const random = seedrandom("rating sweep barrels");
  const tails = (c: Case, outlet: Outlet): Tailwater[] => {
    const pool = c.pond.pool;
    const depth = c.pond.top - c.pond.bottom;
    const low = (outlet.barrel?.outletInvert ?? pool) - 0.1;
    return [
      { kind: "free" },
      { kind: "elevation", elevation: pool + 0.2 * depth },
      { kind: "rating", flows: [0, 0.05, 0.5, 5], elevations: [low, low + 0.2 * depth, low + 0.5 * depth, low + depth] },
    ];
  };

  it(`holds every random invented outlet, with and without a barrel, under every kind of tailwater, within ${SWEEP_FLOW_TOLERANCE} of flow on the search's grid and on route's`, () => {
    let checked = 0;
    let worst = 0;
    let otherRoot = 0;
    let stages = 0;
    for (const pond of ponds) {
      const c = parseCase(pond.json).case;
      const plain = c.outlet!;
      const largest = plain.elements.reduce((m, e) => Math.max(m, e.type === "orifice" && e.shape === "circular" ? e.diameter : 0.3), 0.3);
      const withBarrel: Outlet = {
        ...plain,
        barrel: circularBarrel(Math.max(0.3, largest * (0.8 + random())), "concrete-square-headwall", 0.002 + 0.03 * random(), { outletInvert: c.pond.pool - 0.3 - 0.5 * random(), length: 20 + 40 * random() }),
      };
      for (const outlet of [plain, withBarrel]) {
        for (const tail of tails(c, outlet)) {
          // The search's grid (uniform, on the elevation lattice) and route's (graded above each onset).
          const grids = [stageGrid(c.pond, [], (c.pond.top - c.pond.bottom) / 200), stageGrid(c.pond, ratingBreaks(c.pond, outlet), undefined, ratingOnsets(outlet, tail))];
          for (const grid of grids) {
            const { worst: difference, otherRoot: other } = worstDifference(outlet, c, tail, grid);
            otherRoot += other;
            stages += grid.stage.length;
            if (!(difference < SWEEP_FLOW_TOLERANCE)) throw new Error(`${difference} on ${pond.summary} with ${JSON.stringify(outlet.barrel ?? null)} and ${JSON.stringify(tail)}`);
            worst = Math.max(worst, difference);
            checked++;
          }
        }
      }
    }
    expect(checked).toBe(12 * 2 * 3 * 2);
    // Stages where the sweep found another (no worse) root: few.
    // Stages where the sweep found another (no worse) root: under 1 % of those compared.
    expect(otherRoot).toBeLessThan(0.01 * stages);
    expect(worst).toBeLessThan(SWEEP_FLOW_TOLERANCE);
  });

  it("holds the demo outlet with 18, 24 and 36-inch barrels, free and under a tailwater rating", () => {
    const c = parseCase(randomPonds("demo pond", 1)[0].json).case;
    const ft = 0.3048;
    const demoPond = { ...c.pond, bottom: 99.5 * ft, top: 106 * ft, pool: 99.5 * ft };
    const demo = { ...c, pond: demoPond };
    const rating: Tailwater = { kind: "rating", flows: [0, 0.3, 1.5, 4], elevations: [99 * ft, 100.2 * ft, 101.5 * ft, 103 * ft] };
    for (const size of [18, 24, 36]) {
      for (const tail of [{ kind: "free" } as Tailwater, rating]) {
        const outlet = demoOutlet(size);
        const grid = stageGrid(demoPond, ratingBreaks(demoPond, outlet), undefined, ratingOnsets(outlet, tail));
        expect(worstDifference(outlet, demo, tail, grid).worst).toBeLessThan(SWEEP_FLOW_TOLERANCE);
      }
    }
  });
});

describe("openings at a constant downstream level from kept columns", () => {
  it("give the pointwise sum (OpeningsSweep.flow, each part's orifice, weir and rim equation) bit for bit, from new and from kept columns", () => {
    let compared = 0;
    let drowned = 0;
    for (const pond of randomPonds("columns at a level", 8)) {
      const c = parseCase(pond.json).case;
      const outlet = c.outlet!;
      const grid = stageGrid(c.pond, [], (c.pond.top - c.pond.bottom) / 200).stage;
      const depth = c.pond.top - c.pond.bottom;
      for (const fraction of [0.05, 0.3, 0.6]) {
        const tw = c.pond.bottom + fraction * depth;
        for (let pass = 0; pass < 2; pass++) {
          const sweep = new OpeningsSweep(outlet, true);
          sweep.useGrid(grid);
          const columns = new Float64Array(grid.length);
          sweep.flowsAtLevel(tw, columns);
          const pointwise = new OpeningsSweep(outlet, true);
          pointwise.useGrid(grid);
          for (let i = 0; i < grid.length; i++) {
            const free = pointwise.setGridStage(i);
            const expected = free > 0 ? pointwise.flow(tw) : free;
            if (columns[i] !== expected) throw new Error(`stage ${grid[i]}: ${columns[i]} against ${expected} on ${pond.summary} at ${tw}`);
            if (expected < free) drowned++;
            compared++;
          }
        }
      }
    }
    expect(compared).toBeGreaterThan(8 * 3 * 2 * 200);
    // The level reaches the openings at a good share of the stages (the check is not vacuous).
    expect(drowned).toBeGreaterThan(0.1 * compared);
  });
});
