// The routings of the checks' variants (the spillway alone for the blocked-outlet rule, the smallest
// permitted orifice through the layout's barrel) do not depend on the elevations: an evaluator routes
// each once and reuses it. Every check must be what an evaluator routing everything afresh gives.
import { describe, expect, it } from "vitest";
import { fileURLToPath } from "node:url";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { Evaluator } from "../../search/engine/evaluate.js";
import { planLayouts } from "../../search/engine/layouts.js";
import { stagedStart } from "../../search/engine/fit.js";

describe("variant routings kept per evaluator", () => {
  it("ordinance-mix: the same checks as fresh evaluations, with the variants routed once per layout", () => {
    const loaded = loadCase(fileURLToPath(new URL("../../cases/ordinance-mix/case.json", import.meta.url)));
    const p = buildProblem(loaded.case, loaded.data);
    const storms = p.case.storms.length;
    const plan = planLayouts(p, 1);
    for (const { layout } of plan.layouts.slice(0, 3)) {
      const kept = new Evaluator(p);
      const start = stagedStart(p, layout, new Evaluator(p));
      const trials = [0, 1, 2, 3].map((k) => start.map((x, i) => x - (i === start.length - 1 ? k * p.stepM : 0)));
      let freshRoutings = 0;
      for (const vars of trials) {
        const a = kept.evaluate(layout, vars);
        const fresh = new Evaluator(p);
        const b = fresh.evaluate(layout, vars);
        freshRoutings += fresh.routings;
        expect(a.checks.map((c) => [c.key, c.value, c.slack])).toEqual(b.checks.map((c) => [c.key, c.value, c.slack]));
        expect(a.objective).toBe(b.objective);
      }
      // Design and clogged routings every time; the two variants (blocked outlet, smallest opening) once.
      expect(freshRoutings).toBe(trials.length * 4 * storms);
      expect(kept.routings).toBe(trials.length * 2 * storms + 2 * storms);
    }
  });
});
