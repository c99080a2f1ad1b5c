// The system router (ponds routed together, Newton's method on the coupled storage-indication steps)
// against an independent integration of the coupled storage equations by a general-purpose ODE solver
// (odex 2.0.4, Hairer and Wanner's ODEX; tests/routing/support/systemOde.ts), each pond's outflow and
// each link's flow by the project's direct evaluations (barrels pointwise, no table). Tolerances: the
// case-format contract's routing conventions (0.5 % on the peak outflow, here the flow reaching the
// outfall; 0.01 ft / 0.003 m on each pond's maximum stage), 2 % on the largest flow back through a
// link (the acceptance asked of systems), and 0.01 % mass balance per pond and for the system.
import { describe, expect, it } from "vitest";
import { routeSystemCase } from "../../src/routing/routeSystem.js";
import { FOOT } from "../../src/units.js";
import type { Case } from "../../src/model.js";
import { routeSystemByOde } from "./support/systemOde.js";
import { equaliserPipe, orificeLinkWithReverse, systemOf, threePonds } from "./support/systems.js";

const PEAK = 0.005;
const REVERSE = 0.02;
const MASS_BALANCE = 1e-4;
const stageTolerance = (c: Case) => (c.units === "US" ? 0.01 * FOOT : 0.003);

describe("the system router against odex on the coupled storage equations", () => {
  const systems: [string, unknown, boolean][] = [
    ["two ponds, an orifice link, the lower pond's level above the upper's floor first (US)", orificeLinkWithReverse, true],
    ["two ponds and a level equaliser pipe, flow back through the pipe (US)", equaliserPipe, true],
    ["three ponds in a chain, weirs, v-notch and a wet pond at the outfall (SI)", threePonds, false],
  ];
  it.each(systems)("%s", (_name, json, reverse) => {
    const c = systemOf(json);
    const routing = routeSystemCase(c);
    for (const { storm, result } of routing.storms) {
      const ode = routeSystemByOde(c, storm.inflows!, { after: 6 * 3600, sampleStep: 2, tolerance: 1e-8 });
      expect(Math.abs(result.peakOutflow / ode.peakOutfall - 1)).toBeLessThan(PEAK);
      expect(Math.abs(result.massBalanceError)).toBeLessThan(MASS_BALANCE);
      result.ponds.forEach((p, i) => {
        expect(Math.abs(p.maxStage - ode.maxStage[i]), p.name).toBeLessThan(stageTolerance(c));
        expect(Math.abs(p.massBalanceError), p.name).toBeLessThan(MASS_BALANCE);
        if (ode.peakReverse[i] > 0) expect(Math.abs(p.peakReverse / ode.peakReverse[i] - 1), p.name).toBeLessThan(REVERSE);
        else expect(p.peakReverse, p.name).toBe(0);
      });
      // The systems said to have reverse flow do (a test that cannot fail otherwise would prove nothing).
      if (reverse) expect(Math.max(...ode.peakReverse)).toBeGreaterThan(0.05 * ode.peakOutfall);
    }
  }, 120_000);
});
