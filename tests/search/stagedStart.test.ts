// The staged start shares the routings that differ only by parts still at their placeholder (above
// the grid, so they pass nothing): against the reference path, which routes every one, it must give
// the very same elevations for every planned layout, with fewer routings.
import { describe, expect, it } from "vitest";
import { fileURLToPath } from "node:url";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { Evaluator } from "../../search/engine/evaluate.js";
import { planLayouts } from "../../search/engine/layouts.js";
import { stagedStart } from "../../search/engine/fit.js";

describe("staged start with shared routings", () => {
  for (const name of ["si-headwall", "demo"]) {
    it(`${name}: the same starts as the reference path for every planned layout, with fewer routings`, () => {
      const loaded = loadCase(fileURLToPath(new URL(`../../cases/${name}/case.json`, import.meta.url)));
      const shared = buildProblem(loaded.case, loaded.data);
      const reference = buildProblem(loaded.case, loaded.data, { referencePath: true });
      const plan = planLayouts(shared, 2);
      expect(plan.layouts.length).toBeGreaterThan(3);
      const sharedEvaluator = new Evaluator(shared);
      const referenceEvaluator = new Evaluator(reference);
      for (const { layout } of plan.layouts) {
        for (const plain of [true, false]) {
          const a = stagedStart(shared, layout, sharedEvaluator, plain);
          const b = stagedStart(reference, layout, referenceEvaluator, plain);
          // The reference rates by the direct evaluation: the starts agree to far within a step.
          expect(a.length).toBe(b.length);
          a.forEach((x, i) => expect(Math.abs(x - b[i])).toBeLessThan(1e-3 * shared.stepM));
        }
      }
      expect(sharedEvaluator.routings).toBeLessThan(referenceEvaluator.routings);
    });
  }
});
