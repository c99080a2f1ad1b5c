import { describe, expect, it } from "vitest";
import { buildRatingTable, GRADING_RATIO, stageGrid, tableFromColumns, interpolateAtStage } from "../../src/routing/ratingTable.js";
import { outletDischarge } from "../../src/hydraulics/outlet.js";
import { storageCurve } from "../../src/storage/curve.js";
import { FOOT } from "../../src/units.js";
import { caseOf, dryMultiStage, stageStorageWithTailwater, steepOrificeOnly, wetPond } from "./support/ponds.js";

const hasNode = (stage: Float64Array, z: number) => stage.some((s) => Math.abs(s - z) < 1e-9);

describe("rating table grid", () => {
  it("has every invert, opening top, crest, the rim, the spillway crest, the pool and the top as nodes", () => {
    const c = caseOf(dryMultiStage);
    const { stage } = buildRatingTable(c.pond, c.outlet!, c.tailwater);
    const ft = (x: number) => x * FOOT;
    for (const z of [100, 100.5, 102, 102 + 10 / 12, 103.5, 104.5, 105, 106]) expect(hasNode(stage, ft(z)), `${z} ft`).toBe(true);
    expect(stage[0]).toBe(c.pond.bottom);
    // The grid runs 50 % of the depth above the top (the router extrapolates beyond).
    expect(stage[stage.length - 1]).toBeGreaterThanOrEqual(ft(109) - 1e-9);
  });

  it("has the rows of a stage-storage or stage-area table as nodes (kinks of the storage)", () => {
    for (const json of [stageStorageWithTailwater, wetPond]) {
      const c = caseOf(json);
      const s = c.pond.storage;
      if (s.kind !== "stageArea" && s.kind !== "stageStorage") throw new Error("table storage expected");
      const { stage } = buildRatingTable(c.pond, c.outlet!, c.tailwater);
      for (const z of s.elevations) expect(hasNode(stage, z)).toBe(true);
    }
  });

  it("is graded above each onset: from step/256, each node's head above the onset is at most 1.08 times the one below", () => {
    const c = caseOf(wetPond);
    const { stage } = buildRatingTable(c.pond, c.outlet!, c.tailwater);
    const step = (c.pond.top - c.pond.bottom) / 800;
    const onset = 21.6; // the v-notch crest
    const i0 = stage.findIndex((z) => Math.abs(z - onset) < 1e-9);
    expect(stage[i0 + 1] - onset).toBeCloseTo(step / 256, 12);
    let checked = 0;
    for (let i = i0 + 1; stage[i] < onset + 20 * step; i++, checked++) {
      expect((stage[i + 1] - onset) / (stage[i] - onset)).toBeLessThanOrEqual(GRADING_RATIO * (1 + 1e-6));
    }
    expect(checked).toBeGreaterThan(80);
  });

  // The router interpolates the rating linearly between nodes; the grid must make that close to the
  // hydraulics everywhere, including the first millimetres above an invert or crest, where a flow
  // growing as H^1.5..H^2.5 is badly served by a uniform grid.
  const ponds: Record<string, unknown> = {
    "dry multi-stage": dryMultiStage,
    "wet pond": wetPond,
    "steep orifice-only": steepOrificeOnly,
    "tailwater over the orifice": stageStorageWithTailwater,
  };
  it.each(Object.keys(ponds))("linear interpolation in the table is within 0.2 percent of the rating at every interval midpoint: %s", (name) => {
    const c = caseOf(ponds[name]);
    const table = buildRatingTable(c.pond, c.outlet!, c.tailwater);
    let worst = 0;
    for (let i = 0; i + 1 < table.stage.length; i++) {
      if (table.outflow[i] <= 0) continue;
      const mid = 0.5 * (table.stage[i] + table.stage[i + 1]);
      const exact = outletDischarge(c.outlet!, c.tailwater, mid);
      worst = Math.max(worst, Math.abs((0.5 * (table.outflow[i] + table.outflow[i + 1])) / exact - 1));
    }
    expect(worst).toBeLessThan(0.002);
  });

  it("stores the pond's storage at every node and a non-decreasing rating", () => {
    const c = caseOf(dryMultiStage);
    const table = buildRatingTable(c.pond, c.outlet!, c.tailwater);
    const curve = storageCurve(c.pond);
    for (let i = 0; i < table.stage.length; i += 97) expect(table.storage[i]).toBe(curve.volume(table.stage[i]));
    for (let i = 1; i < table.stage.length; i++) {
      expect(table.stage[i]).toBeGreaterThan(table.stage[i - 1]);
      expect(table.outflow[i]).toBeGreaterThanOrEqual(table.outflow[i - 1]);
    }
  });

  it("keeps a contracted weir's rating level beyond H = 6L/n, where the Francis formula would fall", () => {
    // Francis: Q = C (L - 0.2 H) H^1.5 has dQ/dH = 0 at H = 6 L / n = 1.5 m for L = 0.5 m, n = 2.
    const c = caseOf({
      name: "short contracted weir (invented)",
      units: "SI",
      pond: { bottom: 0, top: 3, storage: { prismoid: { length: 20, width: 10, sideSlope: 0 } } },
      storms: [{ name: "s", returnPeriod: 2, inflow: { series: [[0, 0], [10, 1]] } }],
      outlet: { elements: [{ type: "weir", shape: "rectangular", length: 0.5, crest: 0, endContractions: 2 }] },
    });
    const table = buildRatingTable(c.pond, c.outlet!, c.tailwater);
    // The weir's own formula already holds the head at 6L/n, so the table needs no held node here.
    expect(table.heldNodes).toBe(0);
    const atLimit = interpolateAtStage(table, table.outflow, 1.5);
    expect(interpolateAtStage(table, table.outflow, 2.5)).toBeCloseTo(atLimit, 12);
  });

  it("uses a caller's grid as given", () => {
    const c = caseOf(dryMultiStage);
    const grid = stageGrid(c.pond, [], (c.pond.top - c.pond.bottom) / 10);
    const table = buildRatingTable(c.pond, c.outlet!, c.tailwater, { grid });
    expect(table.stage).toBe(grid.stage);
    expect(table.stage.length).toBe(16);
  });

  it("tableFromColumns keeps a textbook's columns exactly", () => {
    const table = tableFromColumns([0, 1, 2], [0, 10, 30], [0, 1, 4]);
    expect(Array.from(table.storage)).toEqual([0, 10, 30]);
    expect(interpolateAtStage(table, table.outflow, 1.5)).toBe(2.5);
  });
});
