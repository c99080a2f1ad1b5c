// The point of analysis (case-format contract, "Bypass and the point of analysis"): the pond's outflow
// plus the bypass, summed at each instant. Checked by hand in a tank at steady state, against the
// routed series summed independently here, and against brute-force sampling of two broken lines.
import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import { PointTracker } from "../../src/routing/pointOfAnalysis.js";
import { routeCase } from "../../src/routing/routeCase.js";
import type { Hydrograph } from "../../src/model.js";
import { caseOf } from "./support/ponds.js";

const h = (points: [number, number][]): Hydrograph => ({ times: Float64Array.from(points, (p) => p[0]), flows: Float64Array.from(points, (p) => p[1]) });

/** A broken line's value at t: linear between points, zero outside them (the contract's hydrograph). */
function valueAt(g: Hydrograph, t: number): number {
  const n = g.times.length;
  if (t < g.times[0] || t > g.times[n - 1]) return 0;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (g.times[mid] <= t) lo = mid;
    else hi = mid;
  }
  if (hi === lo) return g.flows[lo];
  return g.flows[lo] + ((g.flows[hi] - g.flows[lo]) * (t - g.times[lo])) / (g.times[hi] - g.times[lo]);
}

describe("PointTracker", () => {
  it("finds the exact maximum of two broken lines summed (the sum is linear between the union of their points)", () => {
    const random = seedrandom("point of analysis");
    for (let trial = 0; trial < 40; trial++) {
      // An outflow series at irregular router steps and a bypass with points between them.
      const steps: [number, number][] = [[0, 0]];
      for (let i = 1; i < 60; i++) steps.push([steps[i - 1][0] + 30 + 300 * random(), 10 * random()]);
      const bypassPoints: [number, number][] = [];
      for (let t = 500 * random(); t < steps[steps.length - 1][0] + 2000; t += 50 + 700 * random()) bypassPoints.push([t, 8 * random()]);
      const outflow = h(steps);
      const bypass = h(bypassPoints);
      const tracker = new PointTracker(bypass);
      tracker.start(steps[0][0], steps[0][1]);
      for (let i = 1; i < steps.length; i++) tracker.step(steps[i - 1][0], steps[i - 1][1], steps[i][0], steps[i][1]);
      const last = steps[steps.length - 1][1];
      tracker.finish(last);
      // Brute force: the sum on a fine grid, and at every point of either line (the outflow held after its end).
      const outAt = (t: number) => (t > steps[steps.length - 1][0] ? last : valueAt(outflow, t));
      let best = -Infinity;
      const times = [...steps.map((s) => s[0]), ...bypassPoints.map((b) => b[0])];
      for (let t = 0; t <= times.reduce((a, b) => Math.max(a, b)); t += 5) times.push(t);
      for (const t of times) best = Math.max(best, outAt(t) + valueAt(bypass, t));
      expect(tracker.peak).toBeCloseTo(best, 9);
      expect(outAt(tracker.time) + valueAt(bypass, tracker.time)).toBeCloseTo(tracker.peak, 9);
    }
  });
});

/**
 * A tank filled at a steady 0.1 m3/s for 40 h through one orifice: long before the end the outflow
 * equals the inflow (steady state, where the stage no longer changes). A bypass triangle peaking at
 * 0.2 m3/s at 31 h then meets an outflow of 0.1 m3/s: the peak at the point of analysis is
 * 0.1 + 0.2 = 0.3 m3/s at 31 h (plus the lag, when given). Hand computation; invented tank.
 */
function steadyTank(bypass: unknown) {
  return caseOf({
    name: "steady tank with a bypass (invented)",
    units: "SI",
    pond: { bottom: 0, top: 4, storage: { prismoid: { length: 20, width: 20, sideSlope: 0 } } },
    storms: [
      {
        name: "steady",
        returnPeriod: 10,
        target: 0.35,
        inflow: { series: [[0, 0], [10, 0.1], [2400, 0.1], [2410, 0]] },
        bypass,
      },
    ],
    outlet: { elements: [{ type: "orifice", shape: "circular", diameter: 0.2, invert: 0 }] },
  });
}

describe("peak at the point of analysis", () => {
  it("is the steady outflow plus the bypass peak, at the bypass peak (hand computation)", () => {
    const c = steadyTank({ series: [[1800, 0], [1860, 0.2], [1920, 0]] });
    const { result } = routeCase(c, c.outlet!).storms[0];
    expect(result.peakOutflow).toBeCloseTo(0.1, 4);
    expect(Math.abs(result.peakAtPoint / 0.3 - 1)).toBeLessThan(1e-4);
    expect(result.timeOfPeakAtPoint).toBe(1860 * 60);
    expect(result.bypassAtPeak).toBeCloseTo(0.2, 12);
  });

  it("moves by the bypass's lag", () => {
    const c = steadyTank({ series: [[1800, 0], [1860, 0.2], [1920, 0]], lag: 45 });
    const { result } = routeCase(c, c.outlet!).storms[0];
    expect(result.timeOfPeakAtPoint).toBe((1860 + 45) * 60);
    expect(Math.abs(result.peakAtPoint / 0.3 - 1)).toBeLessThan(1e-4);
  });

  it("routes on to the end of a bypass that outlasts the inflow and the pond's drawdown", () => {
    // The bypass peaks at 0.05 m3/s 3 days after the inflow ended: the pond has drained by then.
    const c = steadyTank({ series: [[6700, 0], [6720, 0.05], [6740, 0]] });
    const { result } = routeCase(c, c.outlet!, { record: true }).storms[0];
    expect(result.series!.time[result.series!.time.length - 1]).toBeGreaterThanOrEqual(6740 * 60);
    // The largest sum is still the steady outflow (0.1) against 0.05 + a drained pond's trickle.
    expect(result.peakAtPoint).toBeCloseTo(result.peakOutflow, 9);
  });

  it("equals the routed series summed here at every step end and bypass point, on a multi-stage pond", () => {
    const c = caseOf({
      name: "dry pond with a frontage bypass (invented)",
      units: "US",
      pond: { bottom: 100, top: 106, storage: { prismoid: { length: 220, width: 110, sideSlope: 3 } } },
      storms: [
        {
          name: "10-yr",
          returnPeriod: 10,
          target: 40,
          inflow: { series: [[0, 0], [20, 8], [40, 35], [60, 62], [80, 48], [120, 25], [180, 10], [300, 0]] },
          // A quicker area: it peaks before the pond, on points the router does not land on.
          bypass: { series: [[0, 0], [17, 4], [33, 11], [47, 6], [71, 2.5], [131, 0]] },
        },
      ],
      outlet: {
        elements: [
          { type: "orifice", shape: "circular", diameter: "6 in", invert: 100 },
          { type: "orifice", shape: "circular", diameter: "10 in", invert: 102 },
        ],
        riser: { shape: "circular", diameter: 4, crest: 104.5 },
        spillway: { crest: 105, length: 12, sideSlope: 3 },
      },
    });
    const { storm, result } = routeCase(c, c.outlet!, { record: true }).storms[0];
    const series = result.series!;
    const outflow = h(series.time.map((t, i) => [t, series.outflow[i]]));
    let best = 0;
    for (const t of [...series.time, ...storm.bypass!.times]) best = Math.max(best, valueAt(outflow, t) + valueAt(storm.bypass!, t));
    expect(result.peakAtPoint).toBeCloseTo(best, 9);
    // The sum exceeds each part alone: the bypass peaks while the pond is still rising.
    expect(result.peakAtPoint).toBeGreaterThan(result.peakOutflow);
    expect(result.peakAtPoint).toBeLessThan(result.peakOutflow + 11 * 0.3048 ** 3);
  });
});
