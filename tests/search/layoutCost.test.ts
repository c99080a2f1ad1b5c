// A layout's cost is kept per problem once computed (the sampler draws, the neighbours and a replayed
// run ask for the same layouts again): whatever was asked before, it is the cost of the outlet the
// layout makes, computed afresh here, on a single pond, a system, and an existing outlet with a kept
// riser (which costs nothing) and parts of its own.
import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import { loadCase } from "../../src/case/load.js";
import { buildProblem, type DesignLimits, type Layout, type SearchProblem } from "../../search/engine/problem.js";
import { layoutCost, neighbourLayouts, planning, sampleLayouts, scoreHere } from "../../search/engine/layouts.js";
import { designOutlet, designOutletFile, variableCount } from "../../search/engine/layout.js";
import { outletCost } from "../../search/engine/cost.js";

/** The outlet a layout makes (placeholder elevations one step apart), costed from nothing kept. */
function costAfresh(p: SearchProblem, layout: Layout): number {
  if (p.system) return p.system.ponds.reduce((sum, d, i) => sum + costAfresh(d.problem, layout.ponds![i]), 0);
  const vars = Array.from({ length: variableCount(p, layout) }, (_, i) => p.floor + (i + 1) * p.levelGapM);
  return outletCost(designOutlet(p, designOutletFile(p, layout, vars)), p.costs, p.case.criteria.buildability.levelSpacing);
}

const CASES: { name: string; limits?: DesignLimits }[] = [
  { name: "demo" },
  { name: "two-ponds" },
  // The existing riser kept (it costs nothing); the existing layout and its neighbours too.
  { name: "wet-value", limits: { vary: "all", keepRiser: true, keepBarrel: false, rankBy: "cost" } },
];

describe("layout costs kept per problem", () => {
  for (const { name, limits } of CASES) {
    it(`${name}: every sampled layout and neighbour costs what its outlet costs, asked once or twice`, () => {
      const loaded = loadCase(`cases/${name}/case.json`);
      const p = buildProblem(loaded.case, loaded.data, {}, limits);
      const plan = scoreHere(p, planning(p, 3)).result;
      const layouts = [...plan.layouts.map((s) => s.layout), ...sampleLayouts(p, plan, seedrandom("costs"), 200, Infinity)];
      if (p.existing) layouts.push(p.existing.layout, ...neighbourLayouts(p, p.existing.layout));
      expect(layouts.length).toBeGreaterThan(50);
      const costs = new Set<number>();
      for (const layout of [...layouts, ...layouts.slice().reverse()]) {
        const cost = layoutCost(p, layout);
        expect(cost).toBe(costAfresh(p, layout));
        costs.add(cost);
      }
      // Layouts of many costs, so a cost kept for the wrong layout would show.
      expect(costs.size).toBeGreaterThan(10);
    }, 120_000);
  }
});
