import { describe, expect, it } from "vitest";
import { depthAt, distributionMassCurve, DISTRIBUTIONS, DISTRIBUTION_TYPES, resolution } from "../../src/hydrology/distributions.js";

describe("NRCS Type II 24-hour distribution", () => {
  // Bedient, Huber & Vieux, Hydrology and Floodplain Analysis, 5th ed. (2013), Table E6-4: hourly
  // cumulative Type II percentages, printed to 0.1 %. The shipped values (from memory, see the source
  // note in distributions.ts) must agree within 0.5 % of the 24-hour depth plus half the printed digit.
  const table: [number, number][] = [
    [6, 0.081], [9, 0.147], [10, 0.186], [11, 0.235], [12, 0.66], [13, 0.774], [14, 0.821], [15, 0.853], [16, 0.881], [18, 0.922],
  ];
  it.each(table)("Bedient et al. Table E6-4: %f h holds %f of the 24-hour depth", (hours, fraction) => {
    const curve = distributionMassCurve("II", 1);
    expect(Math.abs(depthAt(curve, hours * 3600) - fraction)).toBeLessThanOrEqual(0.0055);
  });
});

describe("every shipped distribution", () => {
  // Types I, IA and III are from memory (marked in distributions.ts) and are not checked against
  // values here; these checks hold for any 24-hour mass curve.
  it.each(DISTRIBUTION_TYPES.map((t) => [t]))("Type %s starts at 0, ends at the full depth at 24 h and never falls", (type) => {
    const rows = DISTRIBUTIONS[type].rows;
    expect(rows[0]).toEqual([0, 0]);
    expect(rows[rows.length - 1]).toEqual([24, 1]);
    for (let i = 1; i < rows.length; i++) {
      expect(rows[i][0]).toBeGreaterThan(rows[i - 1][0]);
      expect(rows[i][1]).toBeGreaterThanOrEqual(rows[i - 1][1]);
    }
    expect(DISTRIBUTIONS[type].source).toMatch(/NRCS Type/);
  });
});

describe("mass curve reading", () => {
  it("is linear between points and holds the total after the last", () => {
    const curve = { times: [0, 600, 1800], depths: [0, 0.01, 0.04] };
    expect(depthAt(curve, 300)).toBeCloseTo(0.005, 12);
    expect(depthAt(curve, 1200)).toBeCloseTo(0.025, 12);
    expect(depthAt(curve, 5000)).toBe(0.04);
    expect(resolution(curve)).toBe(600);
  });
  it("scales with the depth", () => {
    const a = distributionMassCurve("II", 0.1);
    expect(depthAt(a, 12 * 3600)).toBeCloseTo(0.1 * DISTRIBUTIONS.II.rows.find((r) => r[0] === 12)![1], 12);
    expect(resolution(a)).toBe(900);
  });
});
