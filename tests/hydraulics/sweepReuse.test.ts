// The rating sweep's reuse of an earlier rating's lower stages (sweepReuse.ts: the chamber sweep and
// the root under a tailwater rating) is exact: an outlet
// rated after others on the same grid has bit for bit the rating it has on a grid of its own (a copy
// of the stages, where nothing is kept), whichever part moved. The sweep itself is held to the
// direct evaluation in ratingSweep.test.ts.
import { describe, expect, it } from "vitest";
import type { Outlet } from "../../src/model.js";
import { buildRatingTable, stageGrid } from "../../src/routing/ratingTable.js";
import { lowestDifference, sharedSweep, sortedParts } from "../../src/hydraulics/sweepReuse.js";
import { sweepContext } from "../../src/hydraulics/outletRating.js";
import { OpeningsSweep } from "../../src/hydraulics/openingsSweep.js";
import { barrelPonds, underEachTailwater, withMove } from "../routing/support/barrelPonds.js";

describe("rating sweep reusing the stages an earlier rating shares", () => {
  it("the lowest difference of two part lists is the lowest bottom of a part not in both", () => {
    expect(lowestDifference([1, 2, 3], ["a", "b", "c"], [1, 2, 3], ["a", "b", "c"])).toBe(Infinity);
    expect(lowestDifference([1, 2, 3], ["a", "b", "c"], [1, 2.5, 3], ["a", "b", "c"])).toBe(2);
    expect(lowestDifference([1, 2], ["a", "b"], [1, 2, 3], ["a", "b", "c"])).toBe(3);
    expect(lowestDifference([1], ["a"], [1], ["x"])).toBe(1);
    expect(sortedParts([3, 1, 1], ["c", "z", "a"])).toEqual({ bottoms: [1, 1, 3], keys: ["a", "z", "c"] });
  });

  it("gives every moved outlet exactly its fresh rating, on random invented ponds and the demo outlet, with a barrel under each kind of tailwater and without one under a rating", () => {
    let compared = 0;
    let reusedStages = 0;
    let stagesRated = 0;
    const cases = barrelPonds("chamber reuse", 6);
    for (const { c, outlet: base, tail } of underEachTailwater(cases)) {
      const depth = c.pond.top - c.pond.bottom;
      const grid = stageGrid(c.pond, [], depth / 300);
      const parts = base.elements.length + (base.riser ? 1 : 0);
      // The fit's pattern: the base, then each part moved a step up and down.
      const sequence: Outlet[] = [base];
      for (let i = 0; i < parts; i++) for (const by of [0.01 * depth, -0.02 * depth]) sequence.push(withMove(base, i, by));
      for (const o of sequence) {
        const sweep = new OpeningsSweep(o, true);
        sweep.useGrid(grid.stage, false);
        const sorted = sortedParts(sweep.partBottoms, sweep.partKeys);
        reusedStages += sharedSweep(grid.stage, sweepContext(o, tail), sorted.bottoms, sorted.keys).count;
        stagesRated += grid.stage.length;
        const shared = buildRatingTable(c.pond, o, tail, { grid });
        const alone = buildRatingTable(c.pond, o, tail, { grid: { stage: Float64Array.from(grid.stage), storage: grid.storage } });
        expect(Array.from(shared.outflow)).toEqual(Array.from(alone.outflow));
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(50);
    // The reuse is exercised: a good share of the stages came from kept ratings.
    expect(reusedStages).toBeGreaterThan(0.2 * stagesRated);
  });
});
