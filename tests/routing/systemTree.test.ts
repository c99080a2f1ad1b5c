// The system router on a tree of ponds (several ponds draining into one: the elimination gathers their
// rows), listed downstream first so that the router's own order (upstream first) differs from the
// case's. Against odex 2.0.4 on the coupled storage equations (tests/routing/support/systemOde.ts),
// with systemOde.test.ts's tolerances: the case-format contract's 0.5 % on the flow reaching the
// outfall and 0.003 m on each pond's highest stage, 2 % on the largest flow back through a link, 0.01 %
// mass balance per pond and for the system. And the same ponds listed in another order route the same
// (each pond's results by name, and the series), up to rounding: the order only changes the order of
// the terms where several ponds drain into one.
import { describe, expect, it } from "vitest";
import { routeSystemCase } from "../../src/routing/routeSystem.js";
import { routeSystemByOde } from "./support/systemOde.js";
import { systemOf, treeOfPonds } from "./support/systems.js";

const PEAK = 0.005;
const STAGE = 0.003;
const REVERSE = 0.02;
const MASS_BALANCE = 1e-4;

describe("the system router on a tree of ponds", () => {
  const c = systemOf(treeOfPonds);
  const routing = routeSystemCase(c, undefined, { record: true });

  it("agrees with odex on the coupled storage equations", () => {
    for (const { storm, result } of routing.storms) {
      const ode = routeSystemByOde(c, storm.inflows!, { after: 6 * 3600, sampleStep: 2, tolerance: 1e-8 });
      expect(Math.abs(result.peakOutflow / ode.peakOutfall - 1)).toBeLessThan(PEAK);
      expect(Math.abs(result.massBalanceError)).toBeLessThan(MASS_BALANCE);
      result.ponds.forEach((p, i) => {
        expect(p.name).toBe(c.system!.ponds[i].name);
        expect(Math.abs(p.maxStage - ode.maxStage[i]), p.name).toBeLessThan(STAGE);
        expect(Math.abs(p.massBalanceError), p.name).toBeLessThan(MASS_BALANCE);
        if (ode.peakReverse[i] > 0) expect(Math.abs(p.peakReverse / ode.peakReverse[i] - 1), p.name).toBeLessThan(REVERSE);
        else expect(p.peakReverse, p.name).toBe(0);
      });
    }
  }, 120_000);

  it("routes the same whatever order the ponds are listed in", () => {
    const reordered = systemOf({ ...treeOfPonds, ponds: [...treeOfPonds.ponds].reverse() });
    const again = routeSystemCase(reordered, undefined, { record: true });
    const close = (a: number, b: number, what: string) => expect(Math.abs(a - b), what).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(a)));
    routing.storms.forEach(({ result }, s) => {
      const other = again.storms[s].result;
      expect(other.steps).toBe(result.steps);
      close(other.peakOutflow, result.peakOutflow, "outfall peak");
      for (const p of result.ponds) {
        const j = other.ponds.findIndex((q) => q.name === p.name);
        const q = other.ponds[j];
        for (const key of ["maxStage", "maxStorage", "peakOutflow", "peakReverse", "peakTotalInflow", "volumeIn", "volumeOut", "volumeBack"] as const) close(q[key], p[key], `${p.name} ${key}`);
        const i = result.ponds.indexOf(p);
        result.series!.stage[i].forEach((h, k) => close(other.series!.stage[j][k], h, `${p.name} stage ${k}`));
      }
    });
  });
});
