// The search recovers a planted outlet: route a known outlet, set each storm's target a little above
// its planted peak, and check that the search finds a compliant design from a catalogue that holds
// the planted parts. The reference is the planted outlet itself, routed independently.
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { assess } from "../../src/assess/assess.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";
import { FOOT } from "../../src/units.js";
import { gammaInflow as inflow, plantedDryCase as plantedCase, siteOnly } from "./helpers.js";

describe("the search recovers a planted outlet", () => {
  it("finds a compliant design when targets sit 4 % above the planted peaks (dry pond, three levels and a riser)", async () => {
    const planted = parseCase(plantedCase).case;
    const routing = routeCase(planted, planted.outlet!);
    const factor = 1.04;
    const json = structuredClone(plantedCase) as typeof plantedCase & { storms: { target?: number }[] };
    routing.storms.forEach((s, i) => {
      json.storms[i].target = Number(((s.result.peakOutflow / FOOT ** 3) * factor).toFixed(3));
    });
    const loaded = parseCase(json);
    // The planted outlet itself is compliant against these targets (ratio 1/1.04 = 0.96).
    const plantedAssessment = assess(loaded.case, routeCase(loaded.case, loaded.case.outlet!));
    expect(plantedAssessment.compliant).toBe(true);

    // The search starts from the site alone: the planted openings and riser are not given to it
    // (an outlet in the case would be its baseline, and the search would start from the answer).
    const search = siteOnly(json);
    const problem = buildProblem(search.case, search.data);
    expect(problem.existing).toBeNull();
    const run = await runSearch(problem, { seed: "planted", budget: 12000, top: 3, starts: 3, beam: 3 });
    expect(run.success).toBe(true);
    const best = run.candidates[0];
    expect(best.assessment.compliant).toBe(true);
    // Every reported number comes from the route path: routing the candidate again gives the same peaks.
    const again = routeCase(loaded.case, best.outlet);
    again.storms.forEach((s, i) => expect(s.result.peakOutflow).toBe(best.routing.storms[i].result.peakOutflow));
    // Design rules: catalogue sizes only, elevations on the 0.05 ft step, the lowest opening at the floor.
    const elevations = best.outlet.elements.map((e) => (e.type === "weir" ? e.crest : e.invert) / FOOT);
    expect(Math.min(...elevations)).toBeCloseTo(50, 9);
    for (const z of elevations) expect(Math.abs(z / 0.05 - Math.round(z / 0.05))).toBeLessThan(1e-6);
    for (const e of best.file.elements ?? []) {
      if (e.type === "orifice" && e.shape === "circular") expect(plantedCase.catalogue.orifice.diameters).toContain(e.diameter);
    }
  });

  it("finds a compliant design for a wet pond drained through a barrel (SI), targets 5 % above the planted peaks", async () => {
    const wet = {
      name: "Planted outlet, invented wet pond with a barrel",
      units: "SI",
      pond: {
        bottom: 20.0,
        top: 23.5,
        permanentPool: 21.0,
        storage: { stageArea: [[20.0, 900], [21.0, 1150], [22.0, 1420], [23.0, 1720], [24.0, 2050]] },
      },
      tailwater: { elevation: 19.4 },
      storms: [
        { name: "2-yr", returnPeriod: 2, inflow: { series: inflow(0.35, 40) } },
        { name: "10-yr", returnPeriod: 10, inflow: { series: inflow(0.7, 40) } },
        { name: "100-yr", returnPeriod: 100, inflow: { series: inflow(1.25, 40) } },
      ],
      criteria: { tolerance: { over: 0, under: 0.1 }, freeboard: { depth: "0.3 m" } },
      outlet: {
        elements: [
          { type: "orifice", shape: "circular", diameter: "100 mm", count: 1, invert: 21.0 },
          { type: "orifice", shape: "circular", diameter: "200 mm", count: 2, invert: 21.6 },
        ],
        riser: { shape: "circular", diameter: 1.2, crest: 22.5 },
        barrel: { shape: "circular", diameter: "600 mm", length: 25, inletInvert: 20.2, outletInvert: 19.9, manningN: 0.013, entrance: "concrete-square-headwall" },
        spillway: { crest: 22.9, length: 4, sideSlope: 3 },
      },
      catalogue: {
        orifice: { diameters: ["75 mm", "100 mm", "150 mm", "200 mm", "250 mm", "300 mm"], maxCount: 3 },
        weir: { shapes: ["rectangular"], lengths: [0.3, 0.6, 0.9, 1.2] },
        riser: { diameters: [0.9, 1.2, 1.5] },
        barrel: { diameters: ["450 mm", "600 mm", "750 mm"] },
        maxStages: 3,
        elevationStep: 0.01,
      },
    };
    const planted = parseCase(wet).case;
    const routing = routeCase(planted, planted.outlet!);
    const json = structuredClone(wet) as typeof wet & { storms: { target?: number }[] };
    routing.storms.forEach((s, i) => (json.storms[i].target = Number((s.result.peakOutflow * 1.05).toPrecision(4))));
    const loaded = parseCase(json);
    expect(assess(loaded.case, routeCase(loaded.case, loaded.case.outlet!)).compliant).toBe(true);
    // Only the site data (barrel and spillway) go to the search, not the planted openings and riser.
    const search = siteOnly(json);
    const run = await runSearch(buildProblem(search.case, search.data), { seed: "wet", budget: 5000, top: 3, starts: 3, beam: 3 });
    expect(run.success).toBe(true);
    const best = run.candidates[0];
    expect(best.assessment.compliant).toBe(true);
    // The barrel is site data: only its size may change, from the catalogue; length, inverts, n and entrance stay.
    expect(best.file.barrel).toMatchObject({ length: 25, inletInvert: 20.2, outletInvert: 19.9, manningN: 0.013, entrance: "concrete-square-headwall" });
    expect(["450 mm", "600 mm", "750 mm"]).toContain((best.file.barrel as { diameter: string }).diameter);
    // A wet pond's lowest opening sits at the permanent pool.
    const lowest = Math.min(...best.outlet.elements.map((e) => (e.type === "weir" ? e.crest : e.invert)));
    expect(lowest).toBeCloseTo(21.0, 9);
    for (const s of best.routing.storms) expect(Math.abs(s.result.massBalanceError)).toBeLessThan(1e-4);
  });

  it("is reproducible: the same seed and budget give the same ranking", async () => {
    const json = structuredClone(plantedCase) as typeof plantedCase & { storms: { target?: number }[] };
    [6.2, 12.5, 30].forEach((t, i) => (json.storms[i].target = t));
    const rank = async () => {
      const loaded = parseCase(json);
      const run = await runSearch(buildProblem(loaded.case, loaded.data), { seed: "same", budget: 3000, top: 5, starts: 2, beam: 2 });
      return run.candidates.slice(0, 5).map((c) => JSON.stringify(c.file));
    };
    expect(await rank()).toEqual(await rank());
  });
});
