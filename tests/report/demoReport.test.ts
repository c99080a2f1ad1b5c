// The demo case's HTML report opened in Chromium: the plotted data is read back from the page and
// compared with the case routed here through the project's API; the page prints on A4 and Letter
// without splitting a plot.
import { afterAll, describe, expect, it } from "vitest";
import { mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { loadCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { assess } from "../../src/assess/assess.js";
import { interpolateAtStage } from "../../src/routing/ratingTable.js";
import { outletDetail } from "../../src/hydraulics/outlet.js";
import { storageCurve } from "../../src/storage/curve.js";
import { toCaseUnits } from "../../src/units.js";
import { CAUTION } from "../../src/report/caution.js";
import { launchBrowser, lazy, openFile } from "./browser.js";
import { interpolate, inverters, readPlots, seriesData } from "./readPlots.js";
import { eventWindow, peakWindow } from "../../src/report/review/window.js";
import { PAPER, printFigures, splitFigures } from "./printCheck.js";
import { DEMO, ROOT, outfit, temporaryDirectory } from "./support.js";

const { case: c } = loadCase(DEMO);
const outlet = c.outlet!;
const routing = routeCase(c, outlet, { record: true });
const u = toCaseUnits(c.units);

describe("HTML report of the demo case, in Chromium", () => {
  const report = lazy(async () => {
    const dir = temporaryDirectory();
    const file = join(dir, "demo.report.html");
    // As the README shows it (the command runs in the repository's root), so the screenshot below
    // can serve as the README's.
    const run = outfit("report", "cases/demo/case.json", "--out", file);
    if (run.status !== 0) throw new Error(`outfit report failed: ${run.stderr}`);
    const browser = await launchBrowser();
    const watched = await openFile(browser, file);
    return { dir, file, browser, watched, plots: await readPlots(watched.page) };
  });

  afterAll(async () => {
    const ready = await report.settled();
    await ready?.browser.close();
    if (ready) rmSync(ready.dir, { recursive: true, force: true });
  });

  const plot = async (figure: string) => {
    const { plots } = await report.get();
    const found = plots.find((p) => p.figure === figure);
    if (!found) throw new Error(`no figure ${figure} (has ${plots.map((p) => p.figure).join(", ")})`);
    return found;
  };

  it("loads with no console error, no request beyond the file itself and no dialog", async () => {
    const { watched } = await report.get();
    expect(watched.errors).toEqual([]);
    expect(watched.requests).toEqual([]);
    expect(watched.dialogs).toEqual([]);
  });

  it("refers to no external asset and holds no script", async () => {
    const { file } = await report.get();
    const html = readFileSync(file, "utf8");
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|src=|url\((?!#)|https?:/i);
  });

  it("draws every plot with a non-zero size and the expected number of series", async () => {
    const { plots } = await report.get();
    const parts = outlet.elements.length + (outlet.riser ? 1 : 0) + (outlet.barrel ? 1 : 0) + (outlet.spillway ? 1 : 0);
    const expected = new Map<string, number>([["stage-storage", 1], ["rating", parts + 1]]);
    routing.storms.forEach((sr, i) => {
      expected.set(`storm-${i + 1}-hydrograph`, 2);
      if (peakWindow(sr, eventWindow(sr))) expected.set(`storm-${i + 1}-peak`, 2);
      expected.set(`storm-${i + 1}-stage`, 1);
    });
    expect(plots.map((p) => p.figure).sort()).toEqual([...expected.keys()].sort());
    for (const p of plots) {
      expect(p.rendered.width, p.figure).toBeGreaterThan(300);
      expect(p.rendered.height, p.figure).toBeGreaterThan(150);
      expect(p.series.length, p.figure).toBe(expected.get(p.figure));
      for (const s of p.series) expect(s.box.width * s.box.height, `${p.figure} ${s.key}`).toBeGreaterThan(0);
    }
  });

  it("plots each storm's inflow and outflow as routed, at sampled times, over the event and around the peaks", async () => {
    for (const [i, sr] of routing.storms.entries()) {
      const { storm, result } = sr;
      const series = result.series!;
      const hours = series.time.map((t) => t / 3600);
      // The event: from the rise of the inflow to the outflow's recession below 5 % of its peak.
      const event = eventWindow(sr);
      expect(event.start).toBe(0);
      const after = series.time.findIndex((t, k) => t > result.timeOfPeakOutflow && series.outflow[k] < 0.05 * result.peakOutflow);
      expect(event.end).toBeGreaterThanOrEqual(hours[after] - 1e-9);
      expect(event.end).toBeLessThan(hours[hours.length - 1]);
      const detail = peakWindow(sr, event)!;
      for (const [figure, window] of [[`storm-${i + 1}-hydrograph`, event], [`storm-${i + 1}-peak`, detail]] as const) {
        const p = await plot(figure);
        expect(p.xDomain[0]).toBeCloseTo(window.start, 9);
        expect(p.xDomain[1]).toBeCloseTo(window.end, 9);
        const inflow = seriesData(p, "inflow");
        const outflow = seriesData(p, "outflow");
        expect(inflow[inflow.length - 1][0]).toBeCloseTo(p.xDomain[1], 3);
        const routedIn = hours.map((t, k) => [t, u.flow(series.inflow[k])] as const);
        const routedOut = hours.map((t, k) => [t, u.flow(series.outflow[k])] as const);
        const peakIn = u.flow(result.peakInflow);
        for (let k = 0; k <= 40; k++) {
          const t = p.xDomain[0] + (k / 40) * (p.xDomain[1] - p.xDomain[0]);
          expect(Math.abs(interpolate(inflow, t) - interpolate(routedIn, t)), `${storm.name} inflow at ${t} h`).toBeLessThan(0.002 * peakIn);
          expect(Math.abs(interpolate(outflow, t) - interpolate(routedOut, t)), `${storm.name} outflow at ${t} h`).toBeLessThan(0.002 * peakIn);
        }
        // The highest drawn point of the outflow line (the browser's bounding box) is the routed peak.
        const { y } = inverters(p);
        const box = p.series.find((s) => s.key === "outflow")!.box;
        expect(y(box.y) / u.flow(result.peakOutflow)).toBeCloseTo(1, 2);
        const marked = p.points.find((q) => q.group === "peak-outflow")!;
        expect(marked.x).toBeCloseTo(result.timeOfPeakOutflow / 3600, 9);
        expect(marked.y).toBeCloseTo(u.flow(result.peakOutflow), 9);
        expect(p.references.find((r) => r.key === "target")!.value).toBeCloseTo(u.flow(storm.target!), 9);
      }
      // The peak detail is narrower than a third of the event and holds both peaks.
      expect(detail.end - detail.start).toBeLessThan((event.end - event.start) / 3);
      for (const t of [result.timeOfPeakOutflow / 3600, series.time[series.inflow.indexOf(Math.max(...series.inflow))] / 3600]) {
        expect(t).toBeGreaterThan(detail.start);
        expect(t).toBeLessThan(detail.end);
      }
    }
  });

  it("plots each storm's stage as routed, with the top of embankment, freeboard line and spillway crest", async () => {
    for (const [i, { storm, result }] of routing.storms.entries()) {
      const p = await plot(`storm-${i + 1}-stage`);
      const series = result.series!;
      const routed = series.time.map((t, k) => [t / 3600, u.length(series.stage[k])] as const);
      const drawn = seriesData(p, "stage");
      const end = routed[routed.length - 1][0];
      expect(drawn[drawn.length - 1][0]).toBeCloseTo(end, 3);
      for (let k = 0; k <= 60; k++) {
        const t = (k / 60) * end;
        expect(Math.abs(interpolate(drawn, t) - interpolate(routed, t)), `${storm.name} stage at ${t} h`).toBeLessThan(0.003);
      }
      const { y } = inverters(p);
      expect(y(p.series[0].box.y)).toBeCloseTo(u.length(result.maxStage), 2);
      const refs = new Map(p.references.map((r) => [r.key, r.value]));
      expect(refs.get("top")).toBeCloseTo(u.length(c.pond.top), 9);
      expect(refs.get("freeboard")).toBeCloseTo(u.length(c.pond.top - c.criteria.freeboardDepth), 9);
      expect(refs.get("spillway")).toBeCloseTo(u.length(outlet.spillway!.crest), 9);
    }
  });

  it("plots the rating as the routing's rating table, part by part, with each storm's target band and routed peak", async () => {
    const p = await plot("rating");
    const { x } = inverters(p);
    const tolerance = 0.002 * (x(p.xRange[1]) - x(p.xRange[0]));
    const total = seriesData(p, "total");
    // Drawn within a tenth of a pixel of the table (the vertices the eye cannot tell apart are left out).
    expect(total.length).toBeGreaterThan(20);
    for (const [flow, stage] of total) {
      const routed = u.flow(interpolateAtStage(routing.table, routing.table.outflow, stage * (1 / u.length(1))));
      expect(Math.abs(flow - routed), `total at ${stage} ft`).toBeLessThan(tolerance);
    }
    outlet.elements.forEach((_, i) => {
      for (const [flow, stage] of seriesData(p, `element-${i + 1}`)) {
        const part = u.flow(outletDetail(outlet, c.tailwater, stage / u.length(1)).elements[i]);
        expect(Math.abs(flow - part), `E${i + 1} at ${stage} ft`).toBeLessThan(tolerance);
      }
    });
    const targets = p.points.filter((q) => q.group === "targets");
    const peaks = p.points.filter((q) => q.group === "peaks");
    expect(targets.length).toBe(c.storms.length);
    routing.storms.forEach(({ storm, result }, i) => {
      expect(targets[i].label).toBe(storm.name);
      expect(targets[i].x).toBeCloseTo(u.flow(storm.target!), 9);
      expect(targets[i].y).toBeCloseTo(u.length(result.maxStage), 9);
      expect(targets[i].xLow).toBeCloseTo(u.flow(storm.target! * (1 - c.criteria.under)), 9);
      expect(targets[i].xHigh).toBeCloseTo(u.flow(storm.target! * (1 + c.criteria.over)), 9);
      expect(peaks[i].x).toBeCloseTo(u.flow(result.peakOutflow), 9);
      expect(peaks[i].y).toBeCloseTo(u.length(result.maxStage), 9);
    });
  });

  it("plots stage-storage as the pond's storage curve", async () => {
    const p = await plot("stage-storage");
    const curve = storageCurve(c.pond);
    const drawn = seriesData(p, "storage");
    expect(drawn[0][1]).toBeCloseTo(u.length(c.pond.bottom), 3);
    expect(drawn[drawn.length - 1][1]).toBeCloseTo(u.length(c.pond.top), 3);
    const full = u.volume(curve.volume(c.pond.top));
    for (const [volume, stage] of drawn) expect(Math.abs(volume - u.volume(curve.volume(stage / u.length(1))))).toBeLessThan(0.001 * full);
  });

  it("shows every number in a table with its unit, in the cell or in its column's heading", async () => {
    const { watched } = await report.get();
    const cells = await watched.page.$$eval("td.number", (tds) =>
      tds.map((td) => {
        const table = td.closest("table")!;
        const index = Array.from(td.parentElement!.children).indexOf(td);
        return { text: td.textContent ?? "", head: table.querySelectorAll("thead th")[index]?.textContent ?? "" };
      }),
    );
    expect(cells.length).toBeGreaterThan(50);
    // An elevation check's slack carries both units: "0.52 ft (10.5 %)".
    const unit = /(ft|ft3|cfs|in|h|%|yr)(, (in|below|above) band)?$|^-?[\d.]+ ft \(-?[\d.]+ %\)$/;
    const headUnit = /\((ft|ft2|ft3|cfs|min|h)\)|HW\/D/;
    for (const { text, head } of cells) if (/\d/.test(text)) expect(unit.test(text) || headUnit.test(head), `${head}: ${text}`).toBe(true);
  });

  it("shows the checks with their slack, the methods with their sources and the caution", async () => {
    const { watched } = await report.get();
    const text = await watched.page.locator("body").innerText();
    for (const check of ["2-yr peak within lower band", "100-yr freeboard", "100-yr spillway dry", "100-yr drawdown"]) expect(text).toContain(check);
    const binding = assess(c, routing).binding!;
    expect(text).toContain(`${binding.name} (binding)`);
    expect(text).toContain(`slack ${(100 * binding.slack).toFixed(1)} %`);
    for (const source of ["HEC-22", "Villemonte", "Chow, Maidment & Mays"]) expect(text).toContain(source);
    expect(text).toContain(CAUTION);
  });

  it.each(Object.keys(PAPER) as (keyof typeof PAPER)[])("prints on %s without splitting a plot across pages", async (format) => {
    const { watched, plots } = await report.get();
    const printed = await printFigures(watched.page, format);
    for (const box of printed.mediaBoxes) {
      expect(box[2]).toBeCloseTo(PAPER[format][0], 0);
      expect(box[3]).toBeCloseTo(PAPER[format][1], 0);
    }
    // Every plot and every outlet drawing is a figure.
    const drawings = await watched.page.$$eval("svg[data-drawing]", (d) => d.length);
    expect(drawings).toBeGreaterThan(0);
    expect(printed.figurePages.size).toBe(plots.length + drawings);
    expect(printed.pageCount).toBeGreaterThan(3);
    // The figures are spread over several pages, so page breaks do fall between them.
    expect(new Set([...printed.figurePages.values()].map((pages) => pages[0])).size).toBeGreaterThan(2);
    expect(splitFigures(printed)).toEqual([]);
  });

  it("the page-split check finds a plot that is split (control)", async () => {
    const { browser, file } = await report.get();
    const page = await browser.context.newPage();
    await page.goto(`file://${file}`);
    // The first figure alone, below a spacer that leaves it too little room on page 1, and free to
    // break inside and after its head.
    await page.evaluate(() => {
      const figure = document.querySelector<HTMLElement>("figure.plot-figure")!;
      const spacer = document.createElement("div");
      spacer.style.height = "900px";
      document.querySelector("main")!.replaceChildren(spacer, figure);
      figure.style.setProperty("break-inside", "auto", "important");
      figure.querySelector<HTMLElement>(".figure-head")!.style.setProperty("break-after", "auto", "important");
    });
    const printed = await printFigures(page, "A4");
    await page.close();
    expect(printed.figurePages.size).toBe(1);
    // Its head is drawn on page 1, its caption on page 2.
    expect(printed.figurePages.get("fig-1")).toEqual([0, 1]);
    expect(splitFigures(printed)).toHaveLength(1);
  });

  it("saves a screenshot of the first screen", async () => {
    const { watched } = await report.get();
    const folder = join(ROOT, "out/report");
    mkdirSync(folder, { recursive: true });
    const png = await watched.page.screenshot({ fullPage: false });
    const path = join(folder, "demo-report.png");
    writeFileSync(path, png);
    expect(png.subarray(1, 4).toString("latin1")).toBe("PNG");
    expect(png.readUInt32BE(16)).toBe(1000); // IHDR width: the viewport
    expect(statSync(path).size).toBeGreaterThan(20_000);
  });
});
