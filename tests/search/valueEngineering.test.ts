// Value engineering: with an outlet in the case, `design` routes and assesses it as the baseline
// (row 0), and gives every alternative its saving against it and a part-by-part change list. The
// baseline's numbers are checked against `outfit route` on the same case (the route path, run
// separately); costs against the cost proxy's weights computed by hand from the README's table.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parseCase, loadCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { FOOT } from "../../src/units.js";
import { buildProblem, DEFAULT_LIMITS, type DesignLimits } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";
import { baselineVerdict } from "../../search/engine/baseline.js";
import { gammaInflow, plantedDryCase } from "./helpers.js";

const cli = join(process.cwd(), "dist/src/cli.js");
function outfit(...args: string[]) {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: "utf8" });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** The planted dry pond's outlet as an existing outlet, targets 4 % above its routed peaks. */
function overbuiltCase() {
  const json = structuredClone(plantedDryCase) as typeof plantedDryCase & { storms: { target?: number }[] };
  const c = parseCase(json).case;
  routeCase(c, c.outlet!).storms.forEach((s, i) => (json.storms[i].target = Number(((s.result.peakOutflow / FOOT ** 3) * 1.04).toFixed(3))));
  return parseCase(json);
}

/** An invented small dry pond drained by one 4 in orifice; the catalogue holds nothing smaller. */
function minimalCase() {
  const json = {
    name: "Value engineering, invented small dry pond with one orifice",
    units: "US",
    pond: { bottom: 50, top: 56, storage: { prismoid: { length: 150, width: 75, sideSlope: 3 } } },
    storms: [{ name: "10-yr", returnPeriod: 10, target: undefined as number | undefined, inflow: { series: gammaInflow(3, 45) } }],
    outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "4 in", count: 1, invert: 50 }], spillway: { crest: 55, length: 10, sideSlope: 3 } },
    catalogue: { orifice: { diameters: ["4 in", "6 in", "8 in"], maxCount: 1 }, maxStages: 1, elevationStep: 0.05 },
  };
  const c = parseCase(json).case;
  json.storms[0].target = Number(((routeCase(c, c.outlet!).storms[0].result.peakOutflow / FOOT ** 3) * 1.04).toFixed(3));
  return parseCase(json);
}

async function search(loaded: ReturnType<typeof parseCase>, budget: number, limits: Partial<DesignLimits> = {}) {
  const p = buildProblem(loaded.case, loaded.data, {}, { ...DEFAULT_LIMITS, ...limits });
  return { p, run: await runSearch(p, { seed: "value", budget, top: 5, starts: 3, beam: 3 }) };
}

describe("design with an existing outlet (value engineering)", () => {
  it("cases/wet-value: shows the baseline as row 0 and each alternative's saving and change list (table, JSON, summary.txt)", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-value-"));
    const run = outfit("design", "cases/wet-value/case.json", "--budget", "3000", "--top", "3", "--out", dir, "--json");
    expect(run.code).toBe(0);
    const results = JSON.parse(run.stdout);
    const baseline = results.baseline;
    // The baseline is the case's outlet as given, routed by the route path: `outfit route` agrees.
    const routed = JSON.parse(outfit("route", "cases/wet-value/case.json", "--json").stdout);
    expect(baseline.compliant).toBe(routed.compliant);
    expect(baseline.compliant).toBe(false);
    baseline.storms.forEach((s: { peakOutflow: number; maxStage: number }, i: number) => {
      expect(s.peakOutflow).toBe(routed.storms[i].peakOutflow);
      expect(s.maxStage).toBe(routed.storms[i].maxStage);
    });
    expect(baseline.binding.name).toBe("1-yr peak within upper band");
    expect(baseline.binding.slack).toBeLessThan(0);
    // Cost proxy by hand (README weights, per ft): the kept 4 in orifice costs nothing; 2 x 8 in
    // orifices 2 x (1.0 + 4.0 x 8/12) = 7.333; one costed control level 0.5 (levels are counted over
    // the parts the proxy costs); a 4 ft riser 4.0 + 0.5 x pi x 4 = 10.283.
    expect(baseline.cost).toBeCloseTo(2 * (1 + (4 * 8) / 12) + 0.5 + 4 + 0.5 * Math.PI * 4, 6);
    expect(results.candidates.length).toBe(3);
    for (const c of results.candidates) {
      expect(c.saving.cost).toBeCloseTo(baseline.cost - c.cost, 9);
      expect(c.saving.percent).toBeCloseTo((100 * (baseline.cost - c.cost)) / baseline.cost, 9);
      expect(c.changes.length).toBeGreaterThan(0);
      for (const change of c.changes) {
        expect(["removed", "added", "resized", "moved"]).toContain(change.kind);
        if (change.kind === "moved") expect(change.text).toMatch(/ -> [\d.]+ ft \([+-][\d.]+ ft\)$/);
        if (change.kind === "resized") expect(change.text).toMatch(/: .*(in|ft).* -> .*(in|ft)/);
      }
      // The kept 4 in orifice at the pool is never changed.
      expect(c.changes.some((change: { text: string }) => /4 in orifice at 310\.00 ft/.test(change.text) && change.text.startsWith("removed"))).toBe(false);
    }
    expect(baseline.verdict).toMatch(/^The existing outlet is not compliant; \d+ compliant fix/);
    // The summary: row 0 with the Saving column, then every alternative's saving and change lines.
    const summary = readFileSync(join(dir, "summary.txt"), "utf8");
    expect(summary).toMatch(/Saving/);
    expect(summary).toMatch(/^0 +1 x 4 in orifice at 310\.00 ft;/m);
    expect(summary).toMatch(/Existing outlet: 1 x 4 in orifice at 310\.00 ft; 2 x 8 in orifices at 311\.00 ft/);
    expect(summary).toMatch(/against the existing outlet: (saves|costs) [\d.]+ units/);
    expect(summary).toMatch(/  change: (resized|moved|added|removed): /);
    expect(JSON.parse(readFileSync(join(dir, "results.json"), "utf8")).baseline.cost).toBe(baseline.cost);
    // The review report of the run (Markdown: no browser needed) shows row 0 and the savings.
    const report = outfit("report", dir, "--format", "md", "--out", join(dir, "report.md"));
    expect(report.code).toBe(0);
    const md = readFileSync(join(dir, "report.md"), "utf8");
    expect(md).toMatch(/\*\*Against the existing outlet \(row 0/);
    expect(md).toMatch(/\| 0 \(existing\) \| 1 x 4 in orifice at 310\.00 ft; 2 x 8 in orifices at 311\.00 ft;.*\| 126\.1 % \|/);
    expect(md).toContain(`Against the existing outlet: saving ${Number(results.candidates[0].saving.cost.toFixed(2))} cost units`);
    expect(md).toContain(results.candidates[0].changes[0].text.replace(/>/g, "&gt;"));
  });

  it("on a compliant existing outlet finds a cheaper compliant one and says what it saves", async () => {
    const { run } = await search(overbuiltCase(), 8000);
    const baseline = run.baseline!;
    expect(baseline.assessment.compliant).toBe(true);
    // 6 in: 1 + 4 x 0.5 = 3; 2 x 8 in: 2 x (1 + 4 x 8/12) = 7.333; 2 ft weir: 1.5 + 0.5 x 2 = 2.5;
    // three levels 1.5; 4 ft riser 4 + 0.5 x pi x 4 = 10.283 (README weights).
    expect(baseline.cost).toBeCloseTo(3 + 2 * (1 + (4 * 8) / 12) + 2.5 + 1.5 + 4 + 2 * Math.PI, 6);
    const cheaper = run.candidates.filter((c) => c.assessment.compliant && c.cost < baseline.cost);
    expect(cheaper.length).toBeGreaterThan(0);
    // Its one warning stands beside the word "compliant".
    expect(baseline.assessment.warnings).toHaveLength(1);
    expect(baselineVerdict(baseline, run.candidates, run.stoppedBecause)).toMatch(/^The existing outlet is compliant, 1 warning; \d+ compliant alternatives? (is|are) cheaper, the cheapest saves [\d.]+ units \([\d.]+ %\)\.$/);
    // Every candidate's change list turns the baseline into it: the parts removed are no longer
    // there, the ones added are, and a change list is empty only for the existing outlet itself.
    for (const c of run.candidates) {
      for (const change of c.changes!.changes) {
        if (change.kind === "added") expect(c.description).toContain(change.part);
        if (change.kind === "removed") expect(baseline.description).toContain(change.part);
      }
      if (c.changes!.changes.length === 0) expect(c.description).toBe(baseline.description);
    }
  });

  it("on a compliant existing outlet with nothing cheaper in the catalogue says so", async () => {
    const { run } = await search(minimalCase(), 1500);
    const baseline = run.baseline!;
    expect(baseline.assessment.compliant).toBe(true);
    // By hand: a 4 in orifice 1 + 4 x 4/12 = 2.333 and its level 0.5; any one-level outlet from this
    // catalogue costs at least that (6 in: 3.5, 8 in: 4.167), so nothing cheaper exists.
    expect(baseline.cost).toBeCloseTo(1 + 4 / 3 + 0.5, 9);
    expect(run.candidates.every((c) => c.cost >= baseline.cost - 1e-9)).toBe(true);
    expect(baselineVerdict(baseline, run.candidates, run.stoppedBecause)).toMatch(/^The existing outlet is compliant, and the catalogue holds no compliant outlet cheaper than it \(cost 2\.8 units\)/);
  });

  it("--vary elevations only moves parts; --vary openings and --keep-riser keep the riser; --keep-barrel keeps the barrel", async () => {
    const wet = loadCase("cases/wet-value/case.json");
    const onlyMoves = (await search(wet, 2000, { vary: "elevations" })).run;
    expect(onlyMoves.stoppedBecause).toMatch(/one layout the limits allow/);
    for (const c of onlyMoves.candidates) for (const change of c.changes!.changes) expect(change.kind).toBe("moved");
    expect(onlyMoves.candidates.some((c) => c.assessment.compliant)).toBe(true);

    const riser = wet.data.outlet!.riser!;
    for (const limits of [{ vary: "openings" as const }, { keepRiser: true }]) {
      const { run } = await search(wet, 1500, limits);
      for (const c of run.candidates) {
        expect(c.file.riser).toMatchObject({ shape: riser.shape, crest: riser.crest });
        expect(c.changes!.changes.some((change) => /riser/.test(change.part))).toBe(false);
      }
    }

    const barrelCase = loadCase("cases/si-wet-barrel/case.json");
    const { run } = await search(barrelCase, 1500, { keepBarrel: true });
    expect(run.candidates.length).toBeGreaterThan(0);
    for (const c of run.candidates) {
      expect(c.file.barrel).toMatchObject(barrelCase.data.outlet!.barrel!);
      expect(c.changes!.changes.some((change) => /barrel/.test(change.part))).toBe(false);
    }
  });

  it("keeps an existing part the catalogue does not list at its own size, moving only its elevation", async () => {
    const json = JSON.parse(readFileSync("cases/wet-value/case.json", "utf8"));
    json.outlet.elements[1] = { type: "orifice", shape: "circular", diameter: "7 in", count: 2, invert: 311, coefficient: 0.6 };
    const { p, run } = await search(parseCase(json), 1500, { vary: "elevations" });
    expect(p.existing!.layout.levels[0].existing).toBe(true);
    expect(run.candidates.length).toBeGreaterThan(0);
    for (const c of run.candidates) {
      expect(c.file.elements![1]).toMatchObject({ type: "orifice", shape: "circular", diameter: "7 in", count: 2, coefficient: 0.6 });
      for (const change of c.changes!.changes) expect(change.kind).toBe("moved");
    }
  });

  it("keeps proposals to the catalogue's most control levels when the existing outlet has more", async () => {
    const loaded = overbuiltCase();
    const json = { ...loaded.json as typeof plantedDryCase, catalogue: { ...plantedDryCase.catalogue, maxStages: 2 } };
    const { run } = await search(parseCase(json), 1500);
    // The existing outlet has three levels; it stays the baseline, but no alternative has more than two.
    expect(new Set(run.baseline!.outlet.elements.map((e) => (e.type === "weir" ? e.crest : e.invert))).size).toBe(3);
    expect(run.candidates.length).toBeGreaterThan(0);
    for (const c of run.candidates) expect(new Set(c.outlet.elements.map((e) => (e.type === "weir" ? e.crest : e.invert))).size).toBeLessThanOrEqual(2);
  });

  it("--rank change puts the smallest change to a failing outlet first among the compliant fixes", async () => {
    const { run } = await search(loadCase("cases/wet-value/case.json"), 3000, { rankBy: "change" });
    // The reported head of the ranking (top 5; further down, repeats of a reported design's openings follow).
    const compliant = run.candidates.slice(0, 5).filter((c) => c.assessment.compliant && c.assessment.warnings.length === 0);
    expect(compliant.length).toBeGreaterThan(1);
    for (let i = 1; i < compliant.length; i++) expect(compliant[i].changes!.score).toBeGreaterThanOrEqual(compliant[i - 1].changes!.score);
    // Refitting the existing elevations alone (two moves: the 2 x 8 in orifices and the rim) is the
    // smallest fix on this pond: 2 x 0.25 plus the moves' share of the depth.
    expect(compliant[0].changes!.changes.map((c) => c.kind)).toEqual(["moved", "moved"]);
  });

  it("refuses unknown limits and a change ranking without an existing outlet (exit 2)", () => {
    const bad = outfit("design", "cases/wet-value/case.json", "--vary", "sizes");
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--vary: found "sizes", expected "all", "openings" or "elevations"/);
    const noOutlet = outfit("design", "cases/si-headwall/case.json", "--rank", "change");
    expect(noOutlet.code).toBe(2);
    expect(noOutlet.stderr).toMatch(/--rank.*existing outlet/);
    const noOutletVary = outfit("design", "cases/si-headwall/case.json", "--vary", "elevations");
    expect(noOutletVary.code).toBe(2);
    expect(noOutletVary.stderr).toMatch(/outlet/);
  });
});
