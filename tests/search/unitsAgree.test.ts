// The search works in SI whatever the case's units: an invented US case and the same case written in
// SI (every value converted with the factors the loader uses: the international foot, 0.3048 m exactly
// by the 1959 yard and pound agreement, so both load to the same SI model) give
// the same ranking, design for design, up to the conversion of the written elevations. Only orifices
// are designed: their coefficient is dimensionless, while the weir and riser defaults are separate
// rounded values per unit system (3.33 ft^0.5/s against 1.84 m^0.5/s), which would differ by design.
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";
import { FOOT, baseWeirCoefficient } from "../../src/units.js";
import { gammaInflow } from "./helpers.js";

const CFS = FOOT ** 3;

const us = {
  name: "Orchard Lane dry basin (invented)",
  units: "US",
  pond: { bottom: 20, top: 25, storage: { prismoid: { length: 70, width: 35, sideSlope: 3 } } },
  storms: [
    { name: "2-yr", returnPeriod: 2, target: 1.2, inflow: { series: gammaInflow(4, 30) } },
    { name: "25-yr", returnPeriod: 25, target: 5.5, inflow: { series: gammaInflow(11, 30) } },
  ],
  criteria: { tolerance: { over: 0, under: 0.15 }, freeboard: { depth: 0.5 }, drawdown: { hours: 48 } },
  catalogue: { orifice: { diameters: [3, 4, 6, 8, 10, 12].map((d) => `${d} in`), maxCount: 3 }, weir: { shapes: [] }, maxStages: 2, elevationStep: 0.05 },
  outlet: { spillway: { crest: 23.9, length: 8, sideSlope: 3, coefficient: 2.8 } },
};

/** The same case in SI: lengths in m, flows in m3/s, the weir-type coefficient in m^0.5/s. */
const si = {
  ...us,
  units: "SI",
  pond: { bottom: 20 * FOOT, top: 25 * FOOT, storage: { prismoid: { length: 70 * FOOT, width: 35 * FOOT, sideSlope: 3 } } },
  storms: us.storms.map((s) => ({ ...s, target: s.target * CFS, inflow: { series: s.inflow.series.map(([t, q]) => [t, q * CFS]) } })),
  criteria: { ...us.criteria, freeboard: { depth: 0.5 * FOOT } },
  // The orifice sizes as sold, "3 in" (an SI case may name them so): a layout's key names its parts
  // as the catalogue writes them and seeds its fit's random starts, so the seeds agree too.
  catalogue: { ...us.catalogue, elevationStep: 0.05 * FOOT },
  outlet: { spillway: { crest: 23.9 * FOOT, length: 8 * FOOT, sideSlope: 3, coefficient: 2.8 * baseWeirCoefficient("US") } },
};

async function ranking(json: object) {
  const loaded = parseCase(json);
  const run = await runSearch(buildProblem(loaded.case, loaded.data), { seed: "units", budget: 4000, top: 5, starts: 3, beam: 3 });
  return run.candidates.map((c) => ({
    compliant: c.assessment.compliant,
    cost: c.cost,
    parts: c.outlet.elements.map((e) => (e.type === "orifice" && e.shape === "circular" ? { count: e.count, diameter: e.diameter, invert: e.invert } : null)),
    file: c.file,
  }));
}

describe("the search in SI", () => {
  it("ranks a US case and the same case written in SI alike, design for design", async () => {
    const a = await ranking(us);
    const b = await ranking(si);
    expect(a.length).toBeGreaterThan(2);
    expect(a.some((c) => c.compliant)).toBe(true);
    expect(b.length).toBe(a.length);
    a.forEach((x, i) => {
      const y = b[i];
      expect(y.compliant).toBe(x.compliant);
      expect(y.cost).toBeCloseTo(x.cost, 9);
      expect(y.parts.length).toBe(x.parts.length);
      x.parts.forEach((p, j) => {
        expect(y.parts[j]!.count).toBe(p!.count);
        expect(y.parts[j]!.diameter).toBeCloseTo(p!.diameter, 12);
        expect(y.parts[j]!.invert).toBeCloseTo(p!.invert, 9);
      });
      // The written files: elevations in each case's own unit, whole steps of 0.05 ft = 0.01524 m.
      x.file.elements!.forEach((e, j) => {
        const ft = (e as { invert: number }).invert;
        const m = (y.file.elements![j] as { invert: number }).invert;
        expect(m).toBeCloseTo(ft * FOOT, 9);
        expect(Math.abs(ft / 0.05 - Math.round(ft / 0.05))).toBeLessThan(1e-9);
      });
    });
  }, 120_000);
});
