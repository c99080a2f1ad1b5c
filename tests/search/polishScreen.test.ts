// Polish skips a step that breaks more geometric rules than the best design so far without routing
// it: such a step cannot be better (`better` ranks compliance, then fewer broken rules, first). The
// polished design must be the one every step routed gives (`screen` off), with fewer
// evaluations where steps break the geometry (ordinance-mix, invented).
import { describe, expect, it } from "vitest";
import { fileURLToPath } from "node:url";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { Evaluator } from "../../search/engine/evaluate.js";
import { planLayouts } from "../../search/engine/layouts.js";
import { polish, snap, stagedStart } from "../../search/engine/fit.js";
import { reachAboveLevel } from "../../search/engine/layout.js";

describe("polish screens steps by the geometric rules", () => {
  it("ordinance-mix: the same polished designs as routing every step, in fewer evaluations", () => {
    const loaded = loadCase(fileURLToPath(new URL("../../cases/ordinance-mix/case.json", import.meta.url)));
    const p = buildProblem(loaded.case, loaded.data);
    const layouts = planLayouts(p, 2).layouts.filter(({ layout }) => layout.levels.length >= 2 && layout.riser).slice(0, 4);
    expect(layouts.length).toBeGreaterThan(0);
    let screened = 0;
    let routed = 0;
    for (const { layout } of layouts) {
      // Start with the rim on the lattice just over the top opening, so that a step down breaks the rule that openings stay below it.
      const start = stagedStart(p, layout, new Evaluator(p)).map((x) => snap(p, x));
      const top = layout.levels[layout.levels.length - 1];
      const topOf = start[start.length - 2] + reachAboveLevel(top, p);
      start[start.length - 1] = Math.ceil(topOf / p.stepM - 1e-9) * p.stepM;
      const a = new Evaluator(p);
      const b = new Evaluator(p);
      const one = polish(p, layout, a.evaluate(layout, start), a);
      const every = polish(p, layout, b.evaluate(layout, start), b, 6, false);
      expect(one.vars).toEqual(every.vars);
      expect(one.objective).toBe(every.objective);
      expect(a.evaluations).toBeLessThanOrEqual(b.evaluations);
      screened += a.evaluations;
      routed += b.evaluations;
    }
    expect(screened).toBeLessThan(routed);
  });
});
