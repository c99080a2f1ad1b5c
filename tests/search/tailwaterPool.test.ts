// A wet pond whose permanent pool is held by a constant downstream water level (an invented pond
// beside an invented lake): openings below the pool are then drowned, not a drain, and the search may
// place the lowest one anywhere from the floor up. Where only the lowest opening holds the pool, it
// stays at the pool. The planted outlet has its lowest opening half a metre below the pool.
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { assess } from "../../src/assess/assess.js";
import { outletDischarge } from "../../src/hydraulics/outlet.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";
import { gammaInflow, siteOnly } from "./helpers.js";

const inflow = (peak: number, timeToPeak: number) => gammaInflow(peak, timeToPeak, 4);

const POOL = 21.0;

function heldCase(tailwater: number) {
  return {
    name: "Planted outlet, invented wet pond held by a downstream lake",
    units: "SI",
    pond: { bottom: 20.0, top: 23.5, permanentPool: POOL, storage: { stageArea: [[20.0, 900], [21.0, 1150], [22.0, 1420], [23.0, 1720], [24.0, 2050]] } },
    tailwater: { elevation: tailwater },
    storms: [
      { name: "2-yr", returnPeriod: 2, target: undefined as number | undefined, inflow: { series: inflow(0.3, 40) } },
      { name: "100-yr", returnPeriod: 100, target: undefined as number | undefined, inflow: { series: inflow(1.1, 40) } },
    ],
    criteria: { tolerance: { over: 0, under: 0.05 }, freeboard: { depth: "0.3 m" }, drawdown: { hours: 48 } },
    outlet: {
      elements: [{ type: "orifice", shape: "circular", diameter: "150 mm", count: 1, invert: 20.5 }],
      riser: { shape: "circular", diameter: 1.2, crest: 22.3 },
      spillway: { crest: 22.9, length: 4, sideSlope: 3 },
    },
    catalogue: { orifice: { diameters: ["100 mm", "150 mm", "200 mm"], maxCount: 1 }, riser: { diameters: [0.9, 1.2, 1.5] }, maxStages: 1, elevationStep: 0.01 },
  };
}

/** Targets 2 % above the planted outlet's routed peaks (lake at the pool). */
function withTargets(json: ReturnType<typeof heldCase>) {
  const planted = parseCase(heldCase(POOL)).case;
  routeCase(planted, planted.outlet!).storms.forEach((s, i) => (json.storms[i].target = Number((s.result.peakOutflow * 1.02).toPrecision(4))));
  return json;
}

describe("a wet pond whose pool a constant tailwater holds", () => {
  it("rates a drowned orifice below the pool by the orifice equation with head = stage - tailwater", () => {
    const c = parseCase(heldCase(POOL)).case;
    // Stage 21.40 m, below the rim: only the 150 mm orifice at 20.50 m flows, wholly below the
    // tailwater at 21.00 m. Orifice equation (HEC-22 eq 8-17), Cd 0.61, head = 21.40 - 21.00 = 0.40 m:
    // Q = 0.61 * (pi/4 * 0.15^2) * sqrt(2 * 9.80665 * 0.40) = 0.61 * 0.0176715 * 2.80095 = 0.030193 m3/s.
    const byHand = 0.61 * ((Math.PI / 4) * 0.15 ** 2) * Math.sqrt(2 * 9.80665 * 0.4);
    expect(byHand).toBeCloseTo(0.030193, 5);
    expect(outletDischarge(c.outlet!, c.tailwater, 21.4)).toBeCloseTo(byHand, 6);
    // At the pool the lake stands level with the pond: nothing flows.
    expect(outletDischarge(c.outlet!, c.tailwater, POOL)).toBe(0);
  });

  it("recovers the planted outlet's lowest opening below the pool as a compliant design", async () => {
    const json = withTargets(heldCase(POOL));
    const full = parseCase(json);
    expect(assess(full.case, routeCase(full.case, full.case.outlet!)).compliant).toBe(true);
    const site = siteOnly(json);
    const problem = buildProblem(site.case, site.data);
    expect(problem.poolHeldByTailwater).toBe(true);
    expect(problem.floor).toBe(20.0);
    const run = await runSearch(problem, { seed: "held", budget: 4000, top: 3, starts: 3, beam: 3 });
    expect(run.success).toBe(true);
    const best = run.candidates[0];
    expect(best.assessment.compliant).toBe(true);
    const lowest = Math.min(...best.outlet.elements.map((e) => (e.type === "weir" ? e.crest : e.invert)));
    // Below the pool, above the floor, on the 0.01 m step.
    expect(lowest).toBeLessThan(POOL - 1e-9);
    expect(lowest).toBeGreaterThanOrEqual(20.0);
    expect(Math.abs(lowest / 0.01 - Math.round(lowest / 0.01))).toBeLessThan(1e-6);
    // Routed again through the route path: the same peaks.
    routeCase(site.case, best.outlet).storms.forEach((s, i) => expect(s.result.peakOutflow).toBe(best.routing.storms[i].result.peakOutflow));
  });

  it("keeps the lowest opening at the pool when the tailwater stands below it (the opening holds the pool)", async () => {
    // The same pond with the lake 1 cm below the pool: the pool is held by the lowest opening alone.
    const json = withTargets(heldCase(POOL - 0.01));
    const site = siteOnly(json);
    const problem = buildProblem(site.case, site.data);
    expect(problem.poolHeldByTailwater).toBe(false);
    expect(problem.floor).toBe(POOL);
    const run = await runSearch(problem, { seed: "held", budget: 4000, top: 3, starts: 3, beam: 3 });
    expect(run.candidates.length).toBeGreaterThan(0);
    for (const c of run.candidates) expect(Math.min(...c.outlet.elements.map((e) => (e.type === "weir" ? e.crest : e.invert)))).toBeCloseTo(POOL, 9);
    // On this pond no catalogue orifice at the pool meets the narrow 2-yr band: the drowned opening
    // below the pool is what makes the planted design possible.
    expect(run.success).toBe(false);
  });
});
