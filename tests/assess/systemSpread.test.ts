// The spread of a system of ponds (src/assess/spread.ts, systemSpreadOf): the system routed together
// under each departure, each pond held against its own limit level (its freeboard level, or its
// spillway crest for a storm that must keep it dry). Checked on the bundled two-ponds demo against the
// departures routed independently here, and for what the departures must do: more inflow and clogged
// openings only raise the stages, so the reserves only shrink against the design routing's.
import { describe, expect, it } from "vitest";
import { loadCase } from "../../src/case/load.js";
import { routeSystemCase } from "../../src/routing/routeSystem.js";
import { systemSpreadOf } from "../../src/assess/spread.js";
import { limitLevel } from "../../src/storage/limitLevel.js";
import type { Case } from "../../src/model.js";

const c = loadCase("cases/two-ponds/case.json").case;
const outlets = c.system!.ponds.map((p) => p.outlet);

/** The least reserve over storms and ponds of a routing of the system. */
function leastReserve(routed: ReturnType<typeof routeSystemCase>, view: Case = c): number {
  let least = Infinity;
  for (const { storm, result } of routed.storms) {
    view.system!.ponds.forEach((p, i) => {
      least = Math.min(least, limitLevel(p.pond, view.criteria, outlets[i].spillway, storm.returnPeriod).level - result.ponds[i].maxStage);
    });
  }
  return least;
}

describe("the spread of a system of ponds", () => {
  const spread = systemSpreadOf(c, outlets);
  const design = leastReserve(routeSystemCase(c, outlets));

  it("gives each departure's least reserve over every storm and pond, as the departure routed here", () => {
    const scaled = (factor: number): Case => ({
      ...c,
      storms: c.storms.map((s) => ({ ...s, inflows: s.inflows!.map((h) => (h ? { times: h.times, flows: h.flows.map((q) => q * factor) } : null)) })),
    });
    expect(spread.departures.map((d) => d.key)).toEqual(["inflow+10%", "inflow+20%", "clogged"]);
    expect(spread.departures[0].reserve).toBeCloseTo(leastReserve(routeSystemCase(scaled(1.1), outlets)), 9);
    expect(spread.departures[1].reserve).toBeCloseTo(leastReserve(routeSystemCase(scaled(1.2), outlets)), 9);
    expect(spread.worst.storm).toMatch(/, pond (upper|lower)$/);
    expect(spread.reserve).toBe(Math.min(...spread.departures.map((d) => d.reserve)));
  });

  it("only shrinks the reserve: more inflow and clogged openings raise the stages", () => {
    for (const d of spread.departures) expect(d.reserve, d.key).toBeLessThan(design);
    expect(spread.departures[1].reserve).toBeLessThan(spread.departures[0].reserve);
  });
});
