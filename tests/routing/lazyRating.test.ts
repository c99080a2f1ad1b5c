// The search's lazy rating table (ratingTable.ts `lazyRatingTable`, rated as the router climbs into
// the stages) against the whole table of the same outlet (`buildRatingTable`, on a grid of its own
// where nothing is kept): the same outflow at every stage it rated, bit for bit, however far each
// table was taken and in whatever order the fit's outlets came; the same routing; and fewer stages
// rated than the grid holds when the storms stay low. The whole table is itself held to the direct
// evaluation in tests/hydraulics/ratingSweep.test.ts.
import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import type { Hydrograph, Outlet } from "../../src/model.js";
import { buildRatingTable, lazyRatingTable, stageGrid } from "../../src/routing/ratingTable.js";
import { route } from "../../src/routing/router.js";
import { KEPT_SWEEPS } from "../../src/hydraulics/sweepReuse.js";
import { barrelPonds, underEachTailwater, withMove } from "./support/barrelPonds.js";

/** Invented ponds with a barrel under a free outfall, a fixed tailwater and a tailwater rating, and
 * the demo outlet. */
function cases(seed: string) {
  return underEachTailwater(barrelPonds(seed, 5));
}

/** A triangular inflow (m3/s over s) peaking at `peak` at `time`. */
function triangle(peak: number, time: number): Hydrograph {
  return { times: Float64Array.from([0, time, 3 * time]), flows: Float64Array.from([0, peak, 0]) };
}

describe("lazy rating table", () => {
  it("rates, to whatever stage each outlet of a fit is taken, exactly the whole table's outflow", () => {
    const random = seedrandom("lazy rating order");
    let compared = 0;
    let partial = 0;
    for (const { c, outlet, tail } of cases("lazy rating")) {
      const depth = c.pond.top - c.pond.bottom;
      const grid = stageGrid(c.pond, [], depth / 300);
      const n = grid.stage.length;
      const parts = outlet.elements.length + (outlet.riser ? 1 : 0);
      const sequence: Outlet[] = [outlet];
      for (let i = 0; i < parts; i++) for (const by of [0.01 * depth, -0.02 * depth]) sequence.push(withMove(outlet, i, by));
      for (const o of sequence) {
        const lazy = lazyRatingTable(c.pond, o, tail, { grid });
        // The router's pattern: a few calls, each a little higher, stopping anywhere on the grid.
        const stop = Math.floor(random() * n) + 1;
        let asked = 0;
        while (asked < stop) {
          asked = Math.min(stop, asked + 1 + Math.floor(random() * 40));
          expect(lazy.extend!(asked)).toBeGreaterThanOrEqual(asked);
        }
        const rated = lazy.rated!;
        expect(rated).toBeLessThanOrEqual(n);
        if (rated < n) partial++;
        const whole = buildRatingTable(c.pond, o, tail, { grid: { stage: Float64Array.from(grid.stage), storage: grid.storage } });
        expect(Array.from(lazy.outflow.subarray(0, rated))).toEqual(Array.from(whole.outflow.subarray(0, rated)));
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(60);
    expect(partial).toBeGreaterThan(compared / 2);
  });

  it("routes every storm as on the whole table, rating only the stages the storm reaches", () => {
    let fewer = 0;
    let routed = 0;
    for (const { c, outlet, tail } of cases("lazy routing")) {
      const depth = c.pond.top - c.pond.bottom;
      const grid = stageGrid(c.pond, [], depth / 300);
      const whole = buildRatingTable(c.pond, outlet, tail, { grid: { stage: Float64Array.from(grid.stage), storage: grid.storage } });
      for (const peak of [0.05, 0.5, 5]) {
        const inflow = triangle(peak, 3600);
        const options = { drainedStage: c.pond.pool + 0.01, startStage: c.pond.pool };
        const lazy = lazyRatingTable(c.pond, outlet, tail, { grid });
        const a = route(lazy, inflow, options);
        const b = route(whole, inflow, options);
        expect(a).toEqual(b);
        // The highest interval the storm used is rated, and little more.
        const reached = grid.stage.findIndex((z) => z >= a.maxStage);
        if (reached >= 0) expect(lazy.rated!).toBeGreaterThan(reached);
        if (peak === 0.05) {
          if (lazy.rated! < grid.stage.length) fewer++;
          routed++;
        }
        // A fixed step forms the whole indication column: the lazy table is rated whole first.
        const fixedLazy = lazyRatingTable(c.pond, outlet, tail, { grid });
        expect(route(fixedLazy, inflow, { ...options, step: 60 })).toEqual(route(whole, inflow, { ...options, step: 60 }));
        expect(fixedLazy.rated).toBe(grid.stage.length);
      }
    }
    expect(routed).toBeGreaterThan(12);
    // The smallest storm leaves the upper stages unrated on most ponds.
    expect(fewer).toBeGreaterThan(routed / 2);
  });

  it("refuses to take up a rating whose kept columns went to a newer one", () => {
    const { c, outlet, tail } = cases("lazy retired")[0];
    const grid = stageGrid(c.pond, [], (c.pond.top - c.pond.bottom) / 300);
    const first = lazyRatingTable(c.pond, outlet, tail, { grid });
    first.extend!(5);
    for (let i = 0; i < KEPT_SWEEPS; i++) lazyRatingTable(c.pond, withMove(outlet, 0, 0.001 * (i + 1)), tail, { grid }).extend!(5);
    expect(() => first.extend!(grid.stage.length)).toThrow(/kept columns/);
  });
});
