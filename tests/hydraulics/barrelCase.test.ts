import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { spawnSync } from "node:child_process";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import type { Case, Outlet } from "../../src/model.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { assess } from "../../src/assess/assess.js";
import { routeJson } from "../../src/report/json.js";
import { limitingPart } from "../../src/report/limiting.js";
import { routeReport } from "../../src/report/console.js";
import { ratingJson, ratingRows } from "../../src/report/rating.js";
import { outletDetail, outletDischarge } from "../../src/hydraulics/outlet.js";
import { BARREL_MAX_HEADWATER_RATIO } from "../../src/assess/warnings.js";
import { FOOT } from "../../src/units.js";

const DEMO = resolve("cases/demo/case.json");

/** The demo case file as JSON, changed by `edit`, loaded as the demo would be. */
function demoCase(edit: (json: any) => void = () => {}): Case {
  const json = JSON.parse(readFileSync(DEMO, "utf8"));
  edit(json);
  return parseCase(json, { file: DEMO }).case;
}

function barrelWarnings(c: Case): string[] {
  const routing = routeCase(c, c.outlet!);
  return assess(c, routing).warnings.filter((w) => w.part.startsWith("outlet.barrel")).map((w) => w.reason);
}

describe("the demo case with its barrel", () => {
  const c = demoCase();
  const routing = routeCase(c, c.outlet!);
  const assessment = assess(c, routing);

  it("has an 18-in concrete barrel, and its outlet still fails at least one check", () => {
    expect(c.outlet!.barrel).toMatchObject({ shape: "circular", entrance: "concrete-square-headwall", manningN: 0.013 });
    expect(c.outlet!.barrel!.shape === "circular" && c.outlet!.barrel!.diameter).toBeCloseTo(1.5 * FOOT, 12);
    expect(assessment.checks.some((check) => !check.passed)).toBe(true);
  });

  it("keeps the routing's mass balance below 0.01 % for every storm", () => {
    for (const { result } of routing.storms) expect(Math.abs(result.massBalanceError)).toBeLessThan(1e-4);
  });

  it("names the control at each storm's peak in the JSON, and the limiting part in the console table", () => {
    const json = routeJson(c, routing, assessment);
    const text = routeReport(c, routing, assessment);
    json.storms.forEach((s, i) => {
      const detail = outletDetail(c.outlet!, c.tailwater, routing.storms[i].result.maxStage);
      expect(s.controlAtPeak).toBe(detail.control);
      const row = text.split("\n").find((l) => l.startsWith(`${s.name} `))!;
      expect(row.trimEnd().endsWith(limitingPart(c.outlet!, detail))).toBe(true);
    });
    // The 18-in barrel limits the outlet at the 100-yr peak (its chamber stands above the rim).
    expect(json.storms.map((s) => s.controlAtPeak)).toContain("barrel outlet control");
  });

  it("rates every stage with the chamber level, the barrel's HW/D and its control", () => {
    const rows = ratingJson(c, c.outlet!, ratingRows(c, c.outlet!, 0.5 * FOOT)).rows;
    expect(rows).toHaveLength(13);
    for (const row of rows) {
      expect(row.chamber).not.toBeNull();
      expect(row.chamber!).toBeLessThanOrEqual(row.stage);
      expect(row.barrelHeadwaterRatio).toBeCloseTo((row.chamber! - 99.5) / 1.5, 9);
      expect(["inlet", "outlet"]).toContain(row.barrelControl);
      expect(row.barrel).toBeCloseTo(row.elements.reduce((a, b) => a + b, 0) + row.rim, 6);
    }
  });

  it(`warns that the 100-yr headwater exceeds HW/D ${BARREL_MAX_HEADWATER_RATIO}`, () => {
    expect(barrelWarnings(c).some((r) => r.includes("HW/D") && r.includes("100-yr"))).toBe(true);
  });
});

describe("barrel warnings", () => {
  it("a barrel running full under outlet control against a tailwater above its crown", () => {
    const c = demoCase((json) => (json.tailwater = { elevation: 101.0 }));
    expect(barrelWarnings(c).some((r) => r.startsWith("runs full under outlet control against a tailwater"))).toBe(true);
  });

  it("no barrel warning at low flows for the demo's 18-in barrel or a 24-in one at the demo's inverts", () => {
    // HDS-5's approximation put these chambers (dc + D)/2 - L S above the inlet even at small flows
    // (for 24 in: at the 6-in orifice's invert); the backwater profile shows a steep barrel whose
    // small flows pass critical depth near the inlet (inlet control, a few inches deep).
    expect(barrelWarnings(demoCase())).toEqual([
      expect.stringContaining("HW/D = 3.63 at the peak of 100-yr"),
    ]);
    expect(barrelWarnings(demoCase((json) => (json.outlet.barrel.diameter = "24 in")))).toEqual([]);
  });

  it("a note where an adverse barrel's headwater comes from HDS-5's approximation although the profile shows it part full", () => {
    // Inlet 0.5 ft below the outlet: the approximation's HW = D/2 + 0.5 ft = 0.83 D passes 0.75 D,
    // so the contract's formula applies, yet the barrel runs part full throughout.
    const c = demoCase((json) => {
      json.outlet.barrel.inletInvert = 99.0;
      json.outlet.barrel.outletInvert = 99.5;
    });
    const notes = barrelWarnings(c).filter((r) => r.includes("part full over its whole length"));
    expect(notes).toHaveLength(1);
    expect(notes[0]).toMatch(/^limits the outflow under outlet control at stages 100\.\d\d ft to \d+\.\d\d ft/);
  });

  it("none for a barrel set in a sump deep enough and large enough for the storms", () => {
    const c = demoCase((json) => {
      json.outlet.barrel = { ...json.outlet.barrel, diameter: "30 in", inletInvert: 97.0, outletInvert: 96.5 };
    });
    expect(barrelWarnings(c)).toEqual([]);
  });

  it("mass balance stays below 0.01 % with a box barrel and a tailwater rating", () => {
    const c = demoCase((json) => {
      json.outlet.barrel = { shape: "box", span: 2.0, rise: 1.5, length: 50, inletInvert: 98.5, outletInvert: 98.2, manningN: 0.013, entrance: "box-wingwall-30-75" };
      json.tailwater = { rating: [[0, 98.0], [10, 99.5], [60, 101.0]] };
    });
    const routing = routeCase(c, c.outlet!);
    for (const { result } of routing.storms) expect(Math.abs(result.massBalanceError)).toBeLessThan(1e-4);
  });
});

describe("bad barrel input", () => {
  it("an entrance that does not fit the barrel's shape is a CaseError naming the field, the value and what fits", () => {
    let error: unknown;
    try {
      demoCase((json) => (json.outlet.barrel = { ...json.outlet.barrel, shape: "box", span: 2, rise: 1.5, diameter: undefined }));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(CaseError);
    const problem = (error as CaseError).problems[0];
    expect(problem.where).toBe("case.json: outlet.barrel.entrance");
    expect(problem.found).toBe('"concrete-square-headwall"');
    expect(problem.expected).toContain("box-wingwall-30-75");
  });

  it("the CLI reports it and exits 2 without a stack trace", () => {
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    json.outlet.barrel.entrance = "box-wingwall-15-90";
    for (const storm of json.storms) storm.inflow.file = resolve("cases/demo", storm.inflow.file);
    const dir = mkdtempSync(join(tmpdir(), "outfit-barrel-"));
    const path = join(dir, "bad-entrance.json");
    writeFileSync(path, JSON.stringify(json));
    try {
      const run = spawnSync(process.execPath, [resolve("dist/src/cli.js"), "route", path], { encoding: "utf8" });
      expect(run.status).toBe(2);
      expect(run.stderr).toContain("outlet.barrel.entrance");
      expect(run.stderr).toContain("an entrance for a circular barrel");
      expect(run.stderr).not.toMatch(/\n\s+at /);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("low flows in the demo setting (the backwater fix)", () => {
  // The demo pond (cases/demo): a 6-in orifice at the floor (100.0 ft), the barrel's inlet 99.5 ft,
  // outlet 99.0 ft, 60 ft, n 0.013. At stages up to 100.5 ft the orifice passes under 0.5 cfs.
  const withoutBarrel = (c: Case): Outlet => ({ ...c.outlet!, barrel: undefined });
  for (const inches of [18, 24, 36]) {
    it(`a ${inches}-in barrel leaves the 6-in orifice at the floor unthrottled below 100.5 ft: the rating equals the openings-only rating`, () => {
      const c = demoCase((json) => (json.outlet.barrel.diameter = `${inches} in`));
      for (let z = 100.0; z <= 100.5 + 1e-9; z += 0.01) {
        const d = outletDetail(c.outlet!, c.tailwater, z * FOOT);
        expect(d.total).toBe(outletDischarge(withoutBarrel(c), c.tailwater, z * FOOT));
        expect(d.control).toMatch(/^(openings free|no flow)$/);
        if (d.total > 0) expect(d.chamber!).toBeLessThan(100.0 * FOOT);
      }
    });
  }

  it("with a 24-in or a 36-in barrel the pond drains to the floor after every storm", () => {
    for (const inches of [24, 36]) {
      const c = demoCase((json) => (json.outlet.barrel.diameter = `${inches} in`));
      const routing = routeCase(c, c.outlet!);
      const assessment = assess(c, routing);
      for (const { result } of routing.storms) expect(result.drawdownTime).not.toBeNull();
      const drawdown = assessment.checks.filter((check) => check.name.endsWith("drawdown"));
      expect(drawdown).toHaveLength(3);
      for (const check of drawdown) expect(check.passed).toBe(true);
      // Down to the floor: just above it the outlet still discharges what the orifice alone does.
      const z = 100.01 * FOOT;
      expect(outletDischarge(c.outlet!, c.tailwater, z)).toBeGreaterThan(0);
      expect(outletDischarge(c.outlet!, c.tailwater, z)).toBe(outletDischarge(withoutBarrel(c), c.tailwater, z));
    }
  });
});
