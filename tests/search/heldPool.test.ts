// A wet pond whose permanent pool is held by the downstream water level: the lake the outlet
// discharges into stands at the pool's elevation (tailwater 100.00 ft = permanent pool 100.00 ft), so
// the lowest orifice starts at the tailwater and the barrel's outlet (invert 99.0 ft) is always drowned;
// four storms and no tolerance above the target (tolerance.over 0). Such a case was reported to get
// nothing compliant in 20,000 routings although its catalogue holds a compliant design. The invented
// fixture (tests/search/fixtures/held-pool) carries, as its existing outlet, a design drawn from its own
// catalogue by hand (8 in at the pool, 2 x 10 in, 12 in, a 3 ft weir, a 4 ft riser, a 30 in barrel, every
// level on the 0.05 ft step), and its targets are that design's routed peaks x 1.04 (rounded): so a
// compliant design exists in the catalogue by construction, with every storm at 96 % of its target.
// The search must find compliant designs of its own in 20,000 routings, with the existing outlet as
// its row 0 and from nothing but the spillway.
import { mkdtempSync, readFileSync, writeFileSync, cpSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { outfit, ROOT } from "../cli/run.js";

const FIXTURE = join(ROOT, "tests/search/fixtures/held-pool");

interface DesignJson {
  candidates: { rank: number; compliant: boolean; existing?: boolean; storms: { name: string; peakOutflow: number; target: number }[] }[];
}

function design(dir: string): DesignJson {
  const r = outfit("design", join(dir, "case.json"), "--budget", "20000", "--workers", "1", "--seed", "outfit", "--json", "--out", join(dir, "run"));
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as DesignJson;
}

describe("a wet pond whose pool the downstream water level holds", () => {
  it("the fixture is that pond: tailwater at the pool, four storms, nothing above the target, its existing outlet compliant at 96 % of each target", () => {
    const c = JSON.parse(readFileSync(join(FIXTURE, "case.json"), "utf8"));
    expect(c.tailwater.elevation).toBe(c.pond.permanentPool);
    expect(c.storms).toHaveLength(4);
    expect(c.criteria.tolerance.over).toBe(0);
    const r = outfit("route", join(FIXTURE, "case.json"), "--json");
    expect(r.status, r.stderr).toBe(0);
    const routed = JSON.parse(r.stdout);
    expect(routed.compliant).toBe(true);
    for (const s of routed.storms) {
      expect(s.peakOutflow / s.target).toBeGreaterThan(0.95);
      expect(s.peakOutflow / s.target).toBeLessThanOrEqual(1);
    }
  });

  it("design finds compliant designs of its own in 20,000 routings, beside the existing outlet", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-held-"));
    cpSync(FIXTURE, dir, { recursive: true });
    const d = design(dir);
    const found = d.candidates.filter((c) => c.compliant && c.rank > 0);
    expect(found.length).toBeGreaterThan(0);
    for (const s of found[0].storms) expect(s.peakOutflow).toBeLessThanOrEqual(s.target);
  });

  it("design finds compliant designs from nothing but the spillway", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-held-"));
    cpSync(FIXTURE, dir, { recursive: true });
    const c = JSON.parse(readFileSync(join(dir, "case.json"), "utf8"));
    c.outlet = { spillway: c.outlet.spillway };
    writeFileSync(join(dir, "case.json"), JSON.stringify(c, null, 2));
    const d = design(dir);
    const found = d.candidates.filter((x) => x.compliant);
    expect(found.length).toBeGreaterThan(0);
    for (const s of found[0].storms) expect(s.peakOutflow).toBeLessThanOrEqual(s.target);
  });
});
