// The planner's first-level bound from the rules (`boundFirstLevel`): an opening at the floor that
// alone drains the water-quality volume faster than extended detention allows is left out, since
// openings added above only add flow (the drain only gets shorter). ordinance-mix (invented) asks for
// 0.5 in over 32 ac drained in at least 24 h. Checked against the drain integral itself: each option
// left out drains too fast alone and with any other level added at the next step; each kept drains
// slowly enough alone; and no planned layout (but the existing outlet's neighbours) starts with one left out.
import { describe, expect, it } from "vitest";
import { fileURLToPath } from "node:url";
import { loadCase } from "../../src/case/load.js";
import { buildProblem, type Layout } from "../../search/engine/problem.js";
import { planLayouts, barrelChoices, neighbourLayouts } from "../../search/engine/layouts.js";
import { designOutlet, designOutletFile, layoutKey } from "../../search/engine/layout.js";
import { drainTime, stageOfVolume } from "../../src/routing/drainTime.js";
import { storageCurve } from "../../src/storage/curve.js";
import { drainedStage } from "../../src/routing/routeCase.js";
import type { PartOption } from "../../src/parts/part.js";

describe("first-level bound from the extended-detention rule", () => {
  const loaded = loadCase(fileURLToPath(new URL("../../cases/ordinance-mix/case.json", import.meta.url)));
  const p = buildProblem(loaded.case, loaded.data);
  const c = p.case;
  const storage = storageCurve(c.pond);
  const pool = storage.volume(c.pond.pool);
  const rule = c.criteria.extendedDetention[0];
  const from = stageOfVolume(storage, c.pond, pool + rule.volume!);
  const to = Math.max(drainedStage(c), c.pond.pool);
  const barrel = barrelChoices(p)[0];
  const hours = (levels: PartOption[], vars: number[]) => {
    const layout: Layout = { levels, riser: null, barrel };
    return drainTime(storage, designOutlet(p, designOutletFile(p, layout, vars)), c.tailwater, from, to, true) / 3600;
  };

  it("leaves out the options that alone drain the volume too fast, and only those", () => {
    const plan = planLayouts(p, 3);
    expect(plan.bounded.length).toBeGreaterThan(0);
    expect(plan.firstOptions.length).toBeGreaterThan(0);
    for (const part of plan.bounded) expect(hours([part], [])).toBeLessThan(rule.hours);
    for (const part of plan.firstOptions) expect(hours([part], [])).toBeGreaterThanOrEqual(rule.hours);
    // The existing outlet and its neighbours are planned whatever the bounds (value engineering).
    const existing = new Set([p.existing!.layout, ...neighbourLayouts(p, p.existing!.layout)].map(layoutKey));
    const left = new Set(plan.bounded.map((part) => part.key));
    const planned = plan.layouts.filter(({ layout }) => !existing.has(layoutKey(layout)));
    expect(planned.length).toBeGreaterThan(10);
    for (const { layout } of planned) expect(left.has(layout.levels[0].key)).toBe(false);
  });

  it("an option left out stays too fast with a second level added just above it", () => {
    const plan = planLayouts(p, 1);
    const second = p.parts[0];
    for (const part of plan.bounded.slice(0, 4)) {
      const alone = hours([part], []);
      const withSecond = hours([part, second], [p.floor + part.height + p.stepM]);
      expect(withSecond).toBeLessThanOrEqual(alone);
      expect(withSecond).toBeLessThan(rule.hours);
    }
  });
});
