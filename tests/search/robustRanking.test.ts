// Ranking by robustness (`design --rank robust`): compliant designs ordered by their least reserve
// over the spread (limit level minus highest stage with 10 and 20 % more inflow and the openings half
// clogged), largest first. The reserve itself is checked against closed forms in
// tests/assess/spread.test.ts; here, that the search ranks by it, that each shown design's spread is
// what routing its written case file again under the same departures gives, and that it is not the
// cost ranking (the cost bar is off: costlier layouts that keep more reserve are fitted).
import { describe, expect, it } from "vitest";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { outfit } from "../cli/run.js";
import { loadCase } from "../../src/case/load.js";
import { spreadOf } from "../../src/assess/spread.js";

const CASE = "cases/small-compliant/case.json";
type Candidate = { compliant: boolean; cost: number; spread?: { reserve: number; worst: { departure: string; storm: string; limit: string }; departures: { departure: string; reserve: number }[] } };

describe("design --rank robust", () => {
  it("ranks compliant designs by their least reserve over the spread, largest first, each shown with its spread", () => {
    const out = mkdtempSync(join(tmpdir(), "outfit-robust-"));
    const robust = outfit("design", CASE, "--rank", "robust", "--budget", "8000", "--workers", "1", "--top", "5", "--quiet", "--json", "--out", out);
    expect(robust.status, robust.stderr).toBe(0);
    const r = JSON.parse(robust.stdout) as { candidates: Candidate[] };
    const compliant = r.candidates.filter((c) => c.compliant);
    expect(compliant.length).toBeGreaterThanOrEqual(3);
    for (const c of r.candidates) expect(c.spread).toBeDefined();
    // Non-increasing reserve (to the millimetre the ranking uses; the JSON is in ft).
    const mm = (c: Candidate) => Math.round(c.spread!.reserve * 0.3048 * 1000);
    for (let i = 1; i < compliant.length; i++) expect(mm(compliant[i])).toBeLessThanOrEqual(mm(compliant[i - 1]));
    // The spread of the first design, computed again from its written case file.
    const again = loadCase(join(out, "candidate-01.json")).case;
    const spread = spreadOf(again, again.outlet!);
    expect(spread.reserve / 0.3048).toBeCloseTo(r.candidates[0].spread!.reserve, 6);
    expect(spread.worst.key).toBe(r.candidates[0].spread!.worst.departure);

    const cheapest = outfit("design", CASE, "--budget", "8000", "--workers", "1", "--top", "1", "--quiet", "--json");
    const c = JSON.parse(cheapest.stdout) as { candidates: Candidate[] };
    // The cost ranking's best is shown with its spread too, and keeps no more reserve than the robust ranking's best.
    expect(c.candidates[0].spread).toBeDefined();
    expect(c.candidates[0].spread!.reserve).toBeLessThanOrEqual(r.candidates[0].spread!.reserve + 1e-9);
    expect(r.candidates[0].cost).toBeGreaterThanOrEqual(c.candidates[0].cost);
  });

  it("refuses another order, naming the three (exit 2)", () => {
    const r = outfit("design", CASE, "--rank", "safest");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--rank.*"cost", "change" or "robust"/);
  });
});
