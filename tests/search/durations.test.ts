// The search routes a few durations of a modified rational storm (search/engine/durations.ts); every
// candidate is routed over the whole range through the route path, which decides compliance.
import { describe, expect, it } from "vitest";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";
import { Evaluator } from "../../search/engine/evaluate.js";
import { searchDurations, SEARCH_DURATIONS } from "../../search/engine/durations.js";

describe("modified rational storms in the search (cases/rational)", () => {
  const loaded = loadCase("cases/rational/case.json");
  const c = loaded.case;

  it("routes at most seven durations per storm, about those that govern the notional outlets and the critical one", () => {
    const found = searchDurations(c);
    for (const storm of c.storms) {
      const list = found.get(storm)!;
      expect(list.length).toBeLessThanOrEqual(SEARCH_DURATIONS);
      expect(list).toContain(storm.durations!.critical);
      for (const d of list) expect(d % 60).toBe(0);
    }
  });

  it("its routings agree with the whole range within 0.5 % on the compliant candidates' peaks, never above it elsewhere, and the compliant ones exceed no target", async () => {
    const p = buildProblem(c, loaded.data, {});
    const run = await runSearch(p, { seed: "outfit", budget: 4000, top: 5, starts: 3, beam: 3 });
    expect(run.success).toBe(true);
    const evaluator = new Evaluator(p);
    let worst = 0;
    for (const k of run.candidates) {
      const searched = evaluator.routeStorms(k.routing.outlet, c.storms);
      k.routing.storms.forEach((s, i) => {
        const ratio = searched[i].result.peakOutflow / s.result.peakOutflow;
        expect(s.result.governingDuration).toBeDefined();
        // A subset of the durations on a coarser grid: not above the whole range (grid differences aside).
        expect(ratio).toBeLessThan(1.002);
        if (!k.assessment.compliant) return;
        worst = Math.max(worst, Math.abs(ratio - 1));
        expect(s.result.peakOutflow).toBeLessThanOrEqual(s.storm.target! * (1 + c.criteria.over));
      });
    }
    // Measured (4000 routings, seed "outfit"): at most 0.13 % on the compliant candidates; up to 3.7 %
    // low on candidates that hold back far more than the targets ask (governed by storms of 100 min
    // and more, beyond the durations searched), which the route path finds non-compliant anyway.
    expect(worst).toBeLessThan(0.005);
  });
});
