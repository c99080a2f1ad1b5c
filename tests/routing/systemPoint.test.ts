// The point of analysis of a system of ponds (case-format contract, "Bypass and the point of analysis"
// with "Systems of ponds"): a storm's bypass joins the flow reaching the outfall, summed at each
// instant, and the target applies to the sum. Checked against odex's integration of the coupled storage
// equations with the bypass sampled beside the outfall (tests/routing/support/systemOde.ts; 0.5 % on
// the peak, the contract's routing tolerance), against the routed series summed here, and a further
// point that the outfall's flow reaches; a ponds list of one with a bypass gives the single pond's result.
import { describe, expect, it } from "vitest";
import { routeSystemCase } from "../../src/routing/routeSystem.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { assessSystem } from "../../src/assess/systemAssess.js";
import type { Hydrograph } from "../../src/model.js";
import { routeSystemByOde } from "./support/systemOde.js";
import { orificeLinkWithReverse, systemOf, threePonds } from "./support/systems.js";
import { caseOf } from "./support/ponds.js";

const PEAK = 0.005;
const CFS = 0.3048 ** 3;

/** A broken line's value at t: linear between points, zero outside them (the contract's hydrograph). */
function valueAt(g: Hydrograph, t: number): number {
  const n = g.times.length;
  if (t < g.times[0] || t > g.times[n - 1]) return 0;
  let j = 0;
  while (j < n - 2 && g.times[j + 1] < t) j++;
  return g.flows[j] + ((g.flows[j + 1] - g.flows[j]) * (t - g.times[j])) / (g.times[j + 1] - g.times[j]);
}

/** The two-pond orifice system (flow back) with a bypass that peaks while the outfall's flow is high, and a further point. */
function withBypass(bypass: [number, number][], extra: Record<string, unknown> = {}) {
  const storm = orificeLinkWithReverse.storms[0];
  return systemOf({ ...orificeLinkWithReverse, storms: [{ ...storm, target: 20, bypass: { series: bypass }, ...extra }] });
}
const BYPASS: [number, number][] = [[0, 0], [40, 3], [110, 6.5], [160, 2], [260, 0]];

describe("a system's point of analysis", () => {
  it("matches odex's outfall flow plus the bypass at the same instant (0.5 %), and is larger than the outfall's own peak", () => {
    const c = withBypass(BYPASS);
    const { storm, result } = routeSystemCase(c).storms[0];
    const ode = routeSystemByOde(c, storm.inflows!, { after: 6 * 3600, sampleStep: 2, tolerance: 1e-8, bypass: storm.bypass! });
    expect(Math.abs(result.peakAtPoint / ode.peakAtPoint - 1)).toBeLessThan(PEAK);
    expect(Math.abs(result.peakOutflow / ode.peakOutfall - 1)).toBeLessThan(PEAK);
    // The bypass changes what the target is judged on: the sum is well above the outfall's own peak.
    expect(result.peakAtPoint).toBeGreaterThan(result.peakOutflow + 2 * CFS);
    expect(result.bypassAtPeak).toBeGreaterThan(0);
  }, 60_000);

  it("is the largest sum of the routed outfall series and the bypass over every step end and bypass point", () => {
    const c = withBypass(BYPASS);
    const routing = routeSystemCase(c, undefined, { record: true });
    const { storm, result } = routing.storms[0];
    const series = result.series!;
    // The routed flow reaching the outfall is linear between step ends: the sum's maximum lies on a step end or a bypass point.
    const outfall: Hydrograph = { times: Float64Array.from(series.time), flows: Float64Array.from(series.outfall) };
    let best = 0;
    for (const t of [...series.time, ...storm.bypass!.times]) best = Math.max(best, valueAt(outfall, t) + valueAt(storm.bypass!, t));
    expect(result.peakAtPoint).toBeCloseTo(best, 12);
    // The recorded bypass is the storm's at every step end.
    series.time.forEach((t, j) => expect(series.bypass![j]).toBeCloseTo(valueAt(storm.bypass!, t), 12));
  });

  it("carries the target to the point: the outfall's peak check is judged on the sum, and fails where the outfall alone would pass", () => {
    const plain = systemOf({ ...orificeLinkWithReverse, storms: [{ ...orificeLinkWithReverse.storms[0], target: 20 }] });
    const plainRouting = routeSystemCase(plain);
    const plainPeak = plainRouting.storms[0].result.peakOutflow;
    // A target just above the outfall's own peak: met without a bypass, exceeded with it.
    const target = (1.02 * plainPeak) / CFS;
    const alone = systemOf({ ...orificeLinkWithReverse, storms: [{ ...orificeLinkWithReverse.storms[0], target }] });
    const joined = systemOf({ ...orificeLinkWithReverse, storms: [{ ...orificeLinkWithReverse.storms[0], target, bypass: { series: BYPASS } }] });
    const upperOf = (checks: ReturnType<typeof assessSystem>["checks"]) => checks.find((k) => k.pond === "outfall" && k.kind === "peak-upper")!;
    const aloneCheck = upperOf(assessSystem(alone, routeSystemCase(alone)).checks);
    const joinedRouting = routeSystemCase(joined);
    const joinedCheck = upperOf(assessSystem(joined, joinedRouting).checks);
    expect(aloneCheck.passed).toBe(true);
    expect(joinedCheck.passed).toBe(false);
    expect(joinedCheck.value).toBeCloseTo(joinedRouting.storms[0].result.peakAtPoint, 12);
  });

  it("a further point reached by the outfall's flow gets the outfall plus its own runoff", () => {
    const runoff: [number, number][] = [[0, 0], [90, 4], [200, 0]];
    const c = withBypass(BYPASS, { points: [{ name: "culvert", pond: true, bypass: { series: runoff }, target: 40 }] });
    const routing = routeSystemCase(c, undefined, { record: true });
    const { storm, result } = routing.storms[0];
    const series = result.series!;
    const outfall: Hydrograph = { times: Float64Array.from(series.time), flows: Float64Array.from(series.outfall) };
    const own = storm.points[0].bypass!;
    let best = 0;
    for (const t of [...series.time, ...own.times]) best = Math.max(best, valueAt(outfall, t) + valueAt(own, t));
    expect(result.downstream![0].peak).toBeCloseTo(best, 12);
    const check = assessSystem(c, routing).checks.find((k) => k.kind === "further-point-peak")!;
    expect(check.pond).toBe("outfall");
    expect(check.value).toBeCloseTo(best, 12);
  });

  it("three ponds: the bypass joins only the flow reaching the outfall (odex, 0.5 %)", () => {
    const storm = threePonds.storms[0];
    const c = systemOf({ ...threePonds, storms: [{ ...storm, bypass: { series: [[0, 0], [30, 0.3], [80, 0.1], [150, 0]] } }] });
    const { storm: s, result } = routeSystemCase(c).storms[0];
    const ode = routeSystemByOde(c, s.inflows!, { after: 6 * 3600, sampleStep: 2, tolerance: 1e-8, bypass: s.bypass! });
    expect(Math.abs(result.peakAtPoint / ode.peakAtPoint - 1)).toBeLessThan(PEAK);
  }, 60_000);

  it("a ponds list of one with a bypass routes exactly as the single pond", () => {
    const pond = { bottom: 100, top: 106, storage: { prismoid: { length: 120, width: 70, sideSlope: 3 } } };
    const outlet = { elements: [{ type: "orifice", shape: "circular", diameter: "10 in", invert: 100 }] };
    const storm = { name: "10-yr", returnPeriod: 10, target: 12, inflow: { series: [[0, 0], [30, 25], [90, 8], [150, 0]] }, bypass: { series: BYPASS } };
    const single = caseOf({ name: "one pond (invented)", units: "US", pond, outlet, storms: [storm] });
    const listed = systemOf({ name: "one pond (invented)", units: "US", ponds: [{ name: "only", pond, outlet, to: "outfall" }], storms: [storm] });
    const a = routeCase(single, single.outlet!).storms[0].result;
    const b = routeCase(listed, listed.outlet!).storms[0].result;
    expect(b.peakAtPoint).toBe(a.peakAtPoint);
    expect(b.timeOfPeakAtPoint).toBe(a.timeOfPeakAtPoint);
    expect(b.peakOutflow).toBe(a.peakOutflow);
  });
});
