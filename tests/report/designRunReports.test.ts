// Design-run reports of the bundled cases, in Chromium: the demo's run report stays under 1 MB and no
// text of its candidates plot overlaps another (the text boxes measured by the browser, with a control
// that finds an overlap); the frontage case's report (storms from rainfall, a bypass) holds the
// hydrology section, plots the flow at the point of analysis as the routed outflow plus the bypass, and
// draws each candidate's outlet to scale with no label over another.
import { afterAll, describe, expect, it } from "vitest";
import { readFileSync, rmSync, statSync } from "node:fs";
import { join } from "node:path";
import type { Page } from "playwright-core";
import { loadCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { toCaseUnits } from "../../src/units.js";
import { launchBrowser, lazy, openFile } from "./browser.js";
import { interpolate, readPlots, seriesData } from "./readPlots.js";
import { outfit, temporaryDirectory } from "./support.js";

interface TextBox {
  text: string;
  left: number;
  right: number;
  top: number;
  bottom: number;
}

/** Every drawn text of a plot, with the box the browser lays it out in. */
async function textBoxes(page: Page, figure: string): Promise<TextBox[]> {
  return page.$$eval(`figure[data-figure="${figure}"] svg text`, (texts) =>
    texts
      .filter((t) => (t.textContent ?? "").trim() !== "")
      .map((t) => {
        const r = t.getBoundingClientRect();
        return { text: t.textContent ?? "", left: r.left, right: r.right, top: r.top, bottom: r.bottom };
      }),
  );
}

/** Pairs of texts whose boxes overlap by more than half a pixel each way. */
function overlaps(boxes: readonly TextBox[]): string[] {
  const found: string[] = [];
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i];
      const b = boxes[j];
      const x = Math.min(a.right, b.right) - Math.max(a.left, b.left);
      const y = Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top);
      if (x > 0.5 && y > 0.5) found.push(`"${a.text}" and "${b.text}"`);
    }
  }
  return found;
}

const MEGABYTE = 1_000_000;

describe("design-run reports of the bundled cases, in Chromium", () => {
  const reports = lazy(async () => {
    const dir = temporaryDirectory();
    const run = (caseFile: string, name: string, budget: string) => {
      const out = join(dir, name);
      const design = outfit("design", caseFile, "--top", "5", "--budget", budget, "--out", out, "--quiet");
      if (design.status !== 0) throw new Error(`outfit design failed: ${design.stderr}`);
      const report = outfit("report", out, "--out", join(dir, `${name}.html`));
      if (report.status !== 0) throw new Error(`outfit report failed: ${report.stderr}`);
      return { out, html: join(dir, `${name}.html`) };
    };
    const demo = run("cases/demo/case.json", "demo", "20000");
    const frontage = run("cases/bypass-point/case.json", "frontage", "6000");
    const browser = await launchBrowser();
    return { dir, demo, frontage, browser, demoPage: await openFile(browser, demo.html), frontagePage: await openFile(browser, frontage.html) };
  });

  afterAll(async () => {
    const ready = await reports.settled();
    await ready?.browser.close();
    if (ready) rmSync(ready.dir, { recursive: true, force: true });
  });

  it("the demo's design-run report, five candidates, is under 1 MB", async () => {
    const { demo, demoPage } = await reports.get();
    expect(statSync(demo.html).size).toBeLessThan(MEGABYTE);
    expect(await demoPage.page.$$eval("section[id^='candidate-'] h2, h2", (h) => h.length)).toBeGreaterThan(5);
    const results = JSON.parse(readFileSync(join(demo.out, "results.json"), "utf8"));
    expect(results.candidates.length).toBe(5);
  });

  it("no text of the candidates plot overlaps another (boxes measured in the browser)", async () => {
    const { demoPage } = await reports.get();
    const boxes = await textBoxes(demoPage.page, "candidates");
    // Tick labels, axis titles, the legend and the storms named over their bands.
    expect(boxes.length).toBeGreaterThan(20);
    for (const storm of ["2-yr", "10-yr", "100-yr"]) expect(boxes.map((b) => b.text)).toContain(storm);
    expect(overlaps(boxes)).toEqual([]);
  });

  it("finds an overlap when there is one (control: a storm name moved onto another)", async () => {
    const { demoPage } = await reports.get();
    await demoPage.page.evaluate(() => {
      const texts = Array.from(document.querySelectorAll('figure[data-figure="candidates"] svg [data-band-name] text'));
      const [a, b] = texts;
      b.setAttribute("x", a.getAttribute("x")!);
      b.setAttribute("y", a.getAttribute("y")!);
    });
    expect(overlaps(await textBoxes(demoPage.page, "candidates")).length).toBeGreaterThan(0);
  });

  it("the frontage case's report holds the hydrology section and draws the flow at the point as outflow plus bypass", async () => {
    const { frontage, frontagePage } = await reports.get();
    expect(statSync(frontage.html).size).toBeLessThan(MEGABYTE);
    const page = frontagePage.page;
    expect(frontagePage.errors).toEqual([]);
    const captions = await page.$$eval("section:has(> h2#hydrology) table caption", (c) => c.map((x) => x.textContent ?? ""));
    for (const table of [/^Drainage areas/, /^Sub-areas/, /^Time of concentration by segment/, /^Rainfall of each storm/, /^Runoff of every area/]) {
      expect(captions.some((c) => table.test(c)), String(table)).toBe(true);
    }
    const hydrologyText = await page.$eval("section:has(> h2#hydrology)", (s) => s.textContent ?? "");
    for (const words of ["TR-55 Figure 2-3", "NEH 630 ch. 16", "TR-55 eq 3-3", "bypassing the pond", "east swale"]) expect(hydrologyText).toContain(words);
    // The best candidate routed here: its storms' hydrograph plots draw outflow + bypass at the point.
    const first = loadCase(join(frontage.out, "candidate-01.json")).case;
    const routing = routeCase(first, first.outlet!, { record: true });
    const u = toCaseUnits(first.units);
    const plots = await readPlots(page);
    for (const [i, { result }] of routing.storms.entries()) {
      const plot = plots.find((p) => p.figure === `c1-storm-${i + 1}-hydrograph`)!;
      const series = result.series!;
      const routed = series.time.map((t, k) => [t / 3600, u.flow(series.outflow[k] + series.bypass![k])] as const);
      const drawn = seriesData(plot, "at-point");
      for (let k = 0; k <= 30; k++) {
        const t = plot.xDomain[0] + (k / 30) * (plot.xDomain[1] - plot.xDomain[0]);
        expect(Math.abs(interpolate(drawn, t) - interpolate(routed, t))).toBeLessThan(0.003 * u.flow(result.peakAtPoint));
      }
      const marked = plot.points.find((q) => q.group === "peak-at-point")!;
      expect(marked.y).toBeCloseTo(u.flow(result.peakAtPoint), 9);
    }
  });

  it("the frontage case's report draws each candidate's outlet to scale, its labels over none other", async () => {
    const { frontage, frontagePage } = await reports.get();
    const page = frontagePage.page;
    const first = loadCase(join(frontage.out, "candidate-01.json")).case;
    const outlet = first.outlet!;
    const u = toCaseUnits(first.units);
    // Measured by the browser in the drawing's own units (getBBox), against the scale it states.
    const drawn = await page.$eval('figure[data-figure="c1-outlet-drawing"] svg', (svg) => {
      const box = (selector: string) => (svg.querySelector(selector) as SVGGraphicsElement).getBBox();
      const wall = box("[data-wall]");
      const e1 = box('[data-opening="E1"]');
      return { scale: Number(svg.getAttribute("data-scale")), wall: { height: wall.height, width: wall.width }, e1: { height: e1.height, bottom: e1.y + e1.height }, top: Number(svg.getAttribute("data-elevation-top")), y0: Number(svg.getAttribute("data-y-top")) };
    });
    const riser = outlet.riser!;
    const base = Math.min(outlet.barrel!.inletInvert, first.pond.bottom);
    // The wall from the riser's base to its rim, and around its perimeter, at the drawing's scale.
    expect(drawn.wall.height).toBeCloseTo(u.length(riser.crest - base) * drawn.scale, 0);
    expect(drawn.wall.width).toBeCloseTo(u.length(riser.shape === "circular" ? Math.PI * riser.diameter : 2 * (riser.length + riser.width)) * drawn.scale, 0);
    // E1 (the lowest orifice) as high as its diameter, its bottom at its invert.
    const e1 = outlet.elements[0];
    if (e1.type === "orifice" && e1.shape === "circular") {
      expect(drawn.e1.height).toBeCloseTo(u.length(e1.diameter) * drawn.scale, 0);
      expect(drawn.e1.bottom).toBeCloseTo(drawn.y0 + (drawn.top - u.length(e1.invert)) * drawn.scale, 0);
    }
    const boxes = await textBoxes(page, "c1-outlet-drawing");
    expect(boxes.map((b) => b.text).join(" ")).toMatch(/rim \d+\.\d\d ft/);
    expect(overlaps(boxes)).toEqual([]);
  });
});
