// The search's thinned inflow (src/routing/thinInflow.ts): a long 1-second record thinned keeps the
// inflow volume exactly, and the peaks routed on it on the search's grid agree with the `route` path
// on the full record within the stated error (0.5 % of the peak outflow, the routing conventions'
// tolerance in the case-format contract; the thinning alone, on one grid, within 0.05 %).
import { describe, expect, it } from "vitest";
import type { Case, Hydrograph } from "../../src/model.js";
import { parseCase } from "../../src/case/load.js";
import { buildRatingTable } from "../../src/routing/ratingTable.js";
import { drainedStage, routeCase } from "../../src/routing/routeCase.js";
import { route } from "../../src/routing/router.js";
import { hydrographVolume } from "../../src/hydrology/hydrograph.js";
import { SEARCH_THIN_ABOVE, searchInflow, thinInflow } from "../../src/routing/thinInflow.js";
import { buildProblem } from "../../search/engine/problem.js";
import { Evaluator } from "../../search/engine/evaluate.js";
import { plantedDryCase } from "../search/helpers.js";

const DAY = 86400;

/**
 * An invented two-day record at 1-second points (172,801): a Gaussian storm of peak `peak` (m3/s)
 * and width `width` (s), centred at hour 24, on no base flow.
 */
function longRecord(peak: number, width: number): Hydrograph {
  const n = 2 * DAY + 1;
  const times = new Float64Array(n);
  const flows = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    times[i] = i;
    flows[i] = peak * Math.exp(-(((i - DAY) / width) ** 2));
  }
  flows[n - 1] = 0;
  return { times, flows };
}

/** The planted dry pond of the search tests with every storm's inflow replaced by a long record. */
function longCase(width: number) {
  const targets = [6, 12, 24]; // cfs
  const loaded = parseCase({ ...plantedDryCase, storms: plantedDryCase.storms.map((s, i) => ({ ...s, target: targets[i] })) });
  const peaks = [0.4, 0.74, 1.25]; // m3/s: about the planted case's 14, 26 and 44 cfs
  const c: Case = { ...loaded.case, storms: loaded.case.storms.map((s, i) => ({ ...s, inflow: longRecord(peaks[i], width) })) };
  return { c, data: loaded.data };
}

const widths: [string, number][] = [
  ["a flashy storm (width 10 min)", 600],
  ["a storm of width 45 min", 2700],
  ["a broad storm (width 3 h)", 3 * 3600],
];

describe("thinned inflow for the search", () => {
  it.each(widths)("%s: the volume is the full record's, and the Gaussian integral's", (_name, width) => {
    const full = longRecord(1.25, width);
    const thin = thinInflow(full);
    expect(thin.times.length).toBeLessThan(full.times.length / 50);
    // Closed form: the integral of exp(-(t/w)^2) over the line is w sqrt(pi) (the Gaussian integral;
    // the record spans at least 8 widths either side, so its tails are below 1e-28).
    const exact = 1.25 * width * Math.sqrt(Math.PI);
    expect(Math.abs(hydrographVolume(full) / exact - 1)).toBeLessThan(1e-9);
    expect(Math.abs(hydrographVolume(thin) / hydrographVolume(full) - 1)).toBeLessThan(1e-12);
    // The peak point and its neighbours are nodes: the peak keeps its time and (to an eighth of its
    // second difference) its value; no flow is negative.
    const peakAt = thin.flows.indexOf(Math.max(...thin.flows));
    expect(thin.times[peakAt]).toBe(DAY);
    expect(Math.abs(thin.flows[peakAt] / 1.25 - 1)).toBeLessThan(1e-6);
    expect(Math.min(...thin.flows)).toBeGreaterThanOrEqual(0);
    expect(thin.times[0]).toBe(0);
    expect(thin.times[thin.times.length - 1]).toBe(2 * DAY);
  });

  it("merges runs only while the flow stays within the tolerance and the run within the longest gap", () => {
    const full = longRecord(1.25, 2700);
    const thin = thinInflow(full, { tolerance: 0.002, maxGap: 600 });
    for (let k = 1; k < thin.times.length; k++) {
      const a = thin.times[k - 1];
      const b = thin.times[k];
      expect(b - a).toBeLessThanOrEqual(600);
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = a; i <= b; i++) {
        lo = Math.min(lo, full.flows[i]);
        hi = Math.max(hi, full.flows[i]);
      }
      if (b - a > 1) expect(hi - lo).toBeLessThanOrEqual(0.002 * 1.25 + 1e-15);
    }
  });

  it("leaves short inflows as they are (the search then routes exactly what route does)", () => {
    const short = longRecord(1, 600);
    const cut = { times: short.times.subarray(0, SEARCH_THIN_ABOVE), flows: short.flows.subarray(0, SEARCH_THIN_ABOVE) };
    expect(searchInflow(cut)).toBe(cut);
    expect(searchInflow(short)).not.toBe(short);
  });

  it.each(widths)("%s: the search's routed peaks agree with route on the full record", (_name, width) => {
    const { c, data } = longCase(width);
    const problem = buildProblem(c, data);
    const outlet = c.outlet!;
    const full = routeCase(c, outlet).storms;
    const search = new Evaluator(problem).routeStorms(outlet, c.storms);
    // The thinning alone: the full record and the thinned one on the search's own grid.
    const table = buildRatingTable(c.pond, outlet, c.tailwater, { grid: problem.grid });
    c.storms.forEach((storm, i) => {
      const thin = problem.inflows.get(storm)!;
      if ("durations" in thin) throw new Error("a storm of one hydrograph was expected");
      expect(thin.times.length).toBeLessThan(storm.inflow.times.length / 50);
      const onGrid = route(table, storm.inflow, { drainedStage: drainedStage(c), startStage: c.pond.pool });
      expect(Math.abs(search[i].result.peakOutflow / onGrid.peakOutflow - 1)).toBeLessThan(5e-4);
      expect(Math.abs(search[i].result.maxStage - onGrid.maxStage)).toBeLessThan(1e-3);
      // Search grid and thinned inflow against the route path on the full record.
      expect(Math.abs(search[i].result.peakOutflow / full[i].result.peakOutflow - 1)).toBeLessThan(0.005);
      expect(search[i].result.volumeIn / full[i].result.volumeIn).toBeCloseTo(1, 12);
      expect(search[i].result.steps).toBeLessThan(full[i].result.steps / 10);
    });
  });
});
