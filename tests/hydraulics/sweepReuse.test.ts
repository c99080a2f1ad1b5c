// The rating sweep's reuse of an earlier rating's lower stages (sweepReuse.ts: the chamber sweep and
// the root under a tailwater rating) is exact: an outlet
// rated after others on the same grid has bit for bit the rating it has on a grid of its own (a copy
// of the stages, where nothing is kept), whichever part moved. The sweep itself is held to the
// direct evaluation in ratingSweep.test.ts.
import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import type { Element, Outlet, Tailwater } from "../../src/case/model.js";
import { parseCase } from "../../src/case/load.js";
import { buildRatingTable, stageGrid } from "../../src/routing/ratingTable.js";
import { lowestDifference, sharedSweep, sortedParts } from "../../src/hydraulics/sweepReuse.js";
import { sweepContext } from "../../src/hydraulics/outletRating.js";
import { OpeningsSweep } from "../../src/hydraulics/openingsSweep.js";
import { circularBarrel, demoOutlet } from "./barrelFixtures.js";
import { randomPonds } from "../routing/support/randomPonds.js";

function moved(e: Element, by: number): Element {
  return e.type === "weir" ? { ...e, crest: e.crest + by } : { ...e, invert: e.invert + by };
}

/** The outlet with one part (element i, or the rim for i = elements.length) raised or lowered. */
function withMove(outlet: Outlet, i: number, by: number): Outlet {
  if (i < outlet.elements.length) return { ...outlet, elements: outlet.elements.map((e, k) => (k === i ? moved(e, by) : e)) };
  return { ...outlet, riser: { ...outlet.riser!, crest: outlet.riser!.crest + by } };
}

describe("rating sweep reusing the stages an earlier rating shares", () => {
  it("the lowest difference of two part lists is the lowest bottom of a part not in both", () => {
    expect(lowestDifference([1, 2, 3], ["a", "b", "c"], [1, 2, 3], ["a", "b", "c"])).toBe(Infinity);
    expect(lowestDifference([1, 2, 3], ["a", "b", "c"], [1, 2.5, 3], ["a", "b", "c"])).toBe(2);
    expect(lowestDifference([1, 2], ["a", "b"], [1, 2, 3], ["a", "b", "c"])).toBe(3);
    expect(lowestDifference([1], ["a"], [1], ["x"])).toBe(1);
    expect(sortedParts([3, 1, 1], ["c", "z", "a"])).toEqual({ bottoms: [1, 1, 3], keys: ["a", "z", "c"] });
  });

  it("gives every moved outlet exactly its fresh rating, on random invented ponds and the demo outlet, with a barrel under each kind of tailwater and without one under a rating", () => {
    const random = seedrandom("chamber reuse");
    let compared = 0;
    let reusedStages = 0;
    let stagesRated = 0;
    const cases = randomPonds("chamber reuse", 6).map((pond) => {
      const c = parseCase(pond.json).case;
      const largest = c.outlet!.elements.reduce((m, e) => Math.max(m, e.type === "orifice" && e.shape === "circular" ? e.diameter : 0.3), 0.3);
      const barrel = circularBarrel(Math.max(0.3, largest * (0.8 + random())), "concrete-square-headwall", 0.002 + 0.03 * random(), { outletInvert: c.pond.bottom - 0.3, length: 20 + 40 * random() });
      return { c, outlet: { ...c.outlet!, barrel } as Outlet };
    });
    const demo = parseCase(randomPonds("demo pond", 1)[0].json).case;
    const ft = 0.3048;
    cases.push({ c: { ...demo, pond: { ...demo.pond, bottom: 99.5 * ft, top: 106 * ft, pool: 99.5 * ft } }, outlet: demoOutlet(18) });
    for (const { c, outlet } of cases) {
      const depth = c.pond.top - c.pond.bottom;
      const low = c.pond.bottom - 0.1;
      const tails: Tailwater[] = [
        { kind: "free" },
        { kind: "elevation", elevation: c.pond.bottom + 0.3 * depth },
        { kind: "rating", flows: [0, 0.05, 0.5, 5], elevations: [low, low + 0.2 * depth, low + 0.5 * depth, low + depth] },
      ];
      const { barrel, ...withoutBarrel } = outlet;
      for (const [tail, base] of tails.flatMap((t) => [[t, outlet], ...(t.kind === "rating" ? [[t, withoutBarrel]] : [])] as [Tailwater, Outlet][])) {
        const grid = stageGrid(c.pond, [], depth / 300);
        expect(barrel).toBeDefined();
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
    }
    expect(compared).toBeGreaterThan(50);
    // The reuse is exercised: a good share of the stages came from kept ratings.
    expect(reusedStages).toBeGreaterThan(0.2 * stagesRated);
  });
});
