// The report of a design run (the fixture results directory): the candidates compared against each
// candidate's case file routed here through the project's API, the explanation lines, the plots, and
// the warning when the design run's numbers disagree with routing its candidate again.
import { afterAll, describe, expect, it } from "vitest";
import { cpSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { loadCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { outletDischarge } from "../../src/hydraulics/outlet.js";
import { toCaseUnits } from "../../src/units.js";
import { launchBrowser, lazy, openFile } from "./browser.js";
import { inverters, readPlots, seriesData } from "./readPlots.js";
import { printFigures, splitFigures } from "./printCheck.js";
import { eventWindow, peakWindow } from "../../src/report/review/window.js";
import { DESIGN_RUN, outfit, temporaryDirectory } from "./support.js";

interface ReportedCandidate {
  rank: number;
  description: string;
  explanation: string[];
  binding: { name: string; slack: number };
  caseFile: string;
}
const results = JSON.parse(readFileSync(join(DESIGN_RUN, "results.json"), "utf8")) as { candidates: ReportedCandidate[] };
const candidates = results.candidates.map((k) => {
  const c = loadCase(join(DESIGN_RUN, k.caseFile)).case;
  return { reported: k, case: c, routing: routeCase(c, c.outlet!, { record: true }) };
});
const c = candidates[0].case;
const u = toCaseUnits(c.units);

describe("HTML report of a design run, in Chromium", () => {
  const report = lazy(async () => {
    const dir = temporaryDirectory();
    const run = outfit("report", DESIGN_RUN, "--out", join(dir, "report.html"));
    if (run.status !== 0) throw new Error(`outfit report failed: ${run.stderr}`);
    const browser = await launchBrowser();
    const watched = await openFile(browser, join(dir, "report.html"));
    return { dir, browser, watched, plots: await readPlots(watched.page) };
  });

  afterAll(async () => {
    const ready = await report.settled();
    await ready?.browser.close();
    if (ready) rmSync(ready.dir, { recursive: true, force: true });
  });

  it("loads with no console error and no request", async () => {
    const { watched } = await report.get();
    expect(watched.errors).toEqual([]);
    expect(watched.requests).toEqual([]);
  });

  it("compares the candidates: per-storm peak/target, max stage and binding check as routed again", async () => {
    const { watched } = await report.get();
    const table = watched.page.locator("table", { has: watched.page.locator("caption", { hasText: "Candidates, best first" }) });
    const head = await table.locator("th").allTextContents();
    const rows = await table.locator("tbody tr").evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td"), (td) => td.textContent ?? "")));
    expect(rows.length).toBe(candidates.length);
    candidates.forEach(({ reported, routing }, i) => {
      const row = rows[i];
      expect(row[head.indexOf("Rank")]).toBe(`#${reported.rank}`);
      expect(row[head.indexOf("Description")]).toBe(reported.description);
      for (const { storm, result } of routing.storms) {
        const shown = Number.parseFloat(row[head.indexOf(`${storm.name} out / target`)]);
        expect(Math.abs(shown - (100 * result.peakOutflow) / storm.target!), storm.name).toBeLessThanOrEqual(0.05 + 1e-9);
      }
      const maxStage = Math.max(...routing.storms.map((s) => u.length(s.result.maxStage)));
      expect(Math.abs(Number.parseFloat(row[head.indexOf("Max stage")]) - maxStage)).toBeLessThanOrEqual(0.005 + 1e-9);
      expect(row[head.indexOf("Binding check")]).toContain(reported.binding.name);
    });
  });

  it("shows each candidate's explanation lines and no disagreement with the design run", async () => {
    const { watched } = await report.get();
    const items = await watched.page.locator("li").allTextContents();
    for (const { reported } of candidates) for (const line of reported.explanation) expect(items).toContain(line);
    expect(await watched.page.locator(".note.warning").count()).toBe(0);
  });

  it("plots every candidate's rating with its routed peaks, and each candidate in full", async () => {
    const { plots } = await report.get();
    const compared = plots.find((p) => p.figure === "candidates")!;
    expect(compared.series.length).toBe(candidates.length);
    const { x } = inverters(compared);
    const tolerance = 0.002 * (x(compared.xRange[1]) - x(compared.xRange[0]));
    candidates.forEach(({ reported, case: k, routing }) => {
      for (const [flow, stage] of seriesData(compared, `candidate-${reported.rank}`)) {
        expect(Math.abs(flow - u.flow(outletDischarge(k.outlet!, k.tailwater, stage / u.length(1))))).toBeLessThan(tolerance);
      }
      const peaks = compared.points.filter((q) => q.group === `peaks-${reported.rank}`);
      expect(peaks.map((q) => q.label)).toEqual(routing.storms.map((s) => s.storm.name));
      routing.storms.forEach(({ result }, j) => {
        expect(peaks[j].x).toBeCloseTo(u.flow(result.peakOutflow), 9);
        expect(peaks[j].y).toBeCloseTo(u.length(result.maxStage), 9);
      });
    });
    // Candidates compared, stage-storage, then per candidate its rating and per storm its hydrograph,
    // the peak detail where the event is long against its peaks, and the stage.
    const details = candidates.reduce((n, k) => n + k.routing.storms.filter((sr) => peakWindow(sr, eventWindow(sr)) !== null).length, 0);
    expect(plots.length).toBe(2 + candidates.length * (1 + 2 * c.storms.length) + details);
    for (const p of plots) expect(p.rendered.width * p.rendered.height, p.figure).toBeGreaterThan(0);
  });

  it("prints on A4 without splitting a plot across pages", async () => {
    const { watched, plots } = await report.get();
    const printed = await printFigures(watched.page, "A4");
    // Every plot and every outlet drawing is a figure.
    const drawings = await watched.page.$$eval("svg[data-drawing]", (d) => d.length);
    expect(drawings).toBeGreaterThan(0);
    expect(printed.figurePages.size).toBe(plots.length + drawings);
    expect(splitFigures(printed)).toEqual([]);
  });

  it("warns when the design run's numbers disagree with routing its candidate again, and escapes its text", async () => {
    const { browser, dir } = await report.get();
    const copy = join(dir, "tampered");
    cpSync(DESIGN_RUN, copy, { recursive: true });
    const json = JSON.parse(readFileSync(join(copy, "results.json"), "utf8"));
    json.candidates[0].storms[0].peakOutflow *= 1.05;
    json.candidates[1].explanation.push("<b>bold</b> claim");
    writeFileSync(join(copy, "results.json"), JSON.stringify(json));
    const run = outfit("report", copy);
    expect(run.status, run.stderr).toBe(0);
    const page = (await openFile(browser, join(copy, "report.html"))).page;
    const warnings = await page.locator(".note.warning").allTextContents();
    expect(warnings).toHaveLength(1);
    expect(warnings[0]).toContain(`${candidates[0].routing.storms[0].storm.name}: peak outflow reported`);
    expect(await page.locator("li", { hasText: "<b>bold</b> claim" }).count()).toBe(1);
    expect(await page.locator("b").count()).toBe(0);
    await page.close();
  });
});
