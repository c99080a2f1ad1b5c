// The point of analysis end to end through the built command line: `route --json` reports the
// contract's peakAtPoint and ratio = peakAtPoint / target (checked by hand on a tank at steady state);
// `design` on the bundled invented case with an undetained frontage meets the target at the point and
// names the point's check where it governs; a design aimed at the pond's outflow alone fails there.
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { outfit, ROOT } from "./run.js";

const CASE = join(ROOT, "cases/bypass-point/case.json");

describe("route with a bypass", () => {
  // A tank filled at a steady 0.1 m3/s: its outflow settles at the inflow (steady state). A bypass
  // triangle peaking at 0.2 m3/s at 31 h joins it: the peak at the point is 0.1 + 0.2 = 0.3 m3/s at
  // 31 h (hand computation), the pond's own peak 0.1 m3/s.
  it("reports peakAtPoint beside peakOutflow, and ratio = peakAtPoint / target", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-point-"));
    const file = join(dir, "tank.json");
    writeFileSync(
      file,
      JSON.stringify({
        name: "steady tank with a bypass (invented)",
        units: "SI",
        pond: { bottom: 0, top: 4, storage: { prismoid: { length: 20, width: 20, sideSlope: 0 } } },
        storms: [{ name: "steady", returnPeriod: 10, target: 0.35, inflow: { series: [[0, 0], [10, 0.1], [2400, 0.1], [2410, 0]] }, bypass: { series: [[1800, 0], [1860, 0.2], [1920, 0]] } }],
        outlet: { elements: [{ type: "orifice", shape: "circular", diameter: 0.2, invert: 0 }] },
      }),
    );
    const run = outfit("route", file, "--json");
    expect(run.status).toBe(0);
    const storm = JSON.parse(run.stdout).storms[0];
    expect(Math.abs(storm.peakOutflow / 0.1 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(storm.peakAtPoint / 0.3 - 1)).toBeLessThan(1e-3);
    expect(storm.timeOfPeakAtPoint).toBe(1860);
    expect(storm.ratio).toBeCloseTo(storm.peakAtPoint / 0.35, 12);
    expect(storm.withinTolerance).toBe(false); // 0.3 is below the 10 % band under 0.35
    const csv = outfit("route", file, "--csv-dir", join(dir, "series"));
    expect(csv.status).toBe(0);
    const [head, ...rows] = readFileSync(join(dir, "series", "steady.csv"), "utf8").trim().split("\n");
    const columns = head.split(",");
    const point = columns.indexOf("at point (m3/s)");
    expect(point).toBeGreaterThan(0);
    const out = columns.indexOf("outflow (m3/s)");
    const bypass = columns.indexOf("bypass (m3/s)");
    for (const row of rows.map((r) => r.split(",").map(Number))) expect(row[point]).toBeCloseTo(row[out] + row[bypass], 6);
  });
});

describe("design to the point of analysis (cases/bypass-point)", () => {
  it("meets every storm's target at the point and names the point's check where it governs", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-point-design-"));
    const run = outfit("design", CASE, "--budget", "6000", "--top", "3", "--out", dir, "--quiet");
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/pt\/target %/);
    const results = JSON.parse(readFileSync(join(dir, "results.json"), "utf8"));
    const first = results.candidates[0];
    expect(first.compliant).toBe(true);
    for (const s of first.storms) {
      expect(s.peakAtPoint).toBeGreaterThan(s.peakOutflow);
      expect(s.peakAtPoint).toBeLessThanOrEqual(s.target * (1 + 1e-12));
      expect(s.ratio).toBeCloseTo(s.peakAtPoint / s.target, 12);
    }
    // Where a peak check governs, it is the point's check, and it says so.
    const governed = results.candidates.filter((c: { binding: { kind: string } }) => c.binding.kind.startsWith("peak-"));
    expect(governed.length).toBeGreaterThan(0);
    for (const c of governed) {
      expect(c.binding.point).toBe("point of analysis");
      expect(c.binding.name).toMatch(/at the point of analysis/);
    }
    expect(run.stdout).toMatch(/binding: \S+ peak at the point of analysis within (upper|lower) band/);
    // The written candidate routes again to the same peaks at the point.
    const again = JSON.parse(outfit("route", join(dir, "candidate-01.json"), "--json").stdout);
    again.storms.forEach((s: { peakAtPoint: number }, i: number) => expect(s.peakAtPoint).toBe(first.storms[i].peakAtPoint));
  });

  it("a design aimed at the pond's outflow alone exceeds the target at the point", () => {
    // The same case without the bypass area: the search then holds the pond's outflow to the target.
    const dir = mkdtempSync(join(tmpdir(), "outfit-point-pond-"));
    const json = JSON.parse(readFileSync(CASE, "utf8"));
    delete json.hydrology.bypass;
    delete json.hydrology.points;
    json.$schema = undefined;
    const pondOnly = join(dir, "pond-only.json");
    writeFileSync(pondOnly, JSON.stringify(json));
    const run = outfit("design", pondOnly, "--budget", "4000", "--top", "1", "--out", join(dir, "run"), "--quiet");
    expect(run.status).toBe(0);
    const candidate = JSON.parse(readFileSync(join(dir, "run", "candidate-01.json"), "utf8"));
    // That outlet in the case with the bypass: routed, it fails at the point of analysis.
    const withBypass = JSON.parse(readFileSync(CASE, "utf8"));
    withBypass.outlet = candidate.outlet;
    withBypass.$schema = undefined;
    const file = join(dir, "with-bypass.json");
    writeFileSync(file, JSON.stringify(withBypass));
    const routed = JSON.parse(outfit("route", file, "--json").stdout);
    expect(routed.compliant).toBe(false);
    expect(routed.storms.some((s: { peakAtPoint: number; target: number }) => s.peakAtPoint > s.target)).toBe(true);
    expect(routed.checks.some((k: { passed: boolean; point?: string }) => !k.passed && k.point === "point of analysis")).toBe(true);
  });
});
