// What a plan reviewer checks by hand, in the HTML report opened in Chromium: the project block and
// the date of the run, figures numbered in document order (case and design-run reports), the fine
// stage-storage-discharge table with a row at every control elevation (storage against the
// prismoid's closed form in the case format), each storm's hydrograph table (inflow against the
// case's own inflow file), the pre- against post-development comparison, and no word split across
// lines in the table cells or headings checked.
import { afterAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { readFileSync, rmSync, writeFileSync } from "node:fs";
import { basename, join } from "node:path";
import type { Page } from "playwright-core";
import { loadCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { launchBrowser, lazy, openFile } from "./browser.js";
import { readPlots } from "./readPlots.js";
import { DEMO, DESIGN_RUN, ROOT, temporaryDirectory } from "./support.js";

/** 2026-03-04 05:06:07 UTC, fixed through SOURCE_DATE_EPOCH. */
const EPOCH = 1772600767;

function report(input: string, out: string): void {
  const env = { ...process.env, SOURCE_DATE_EPOCH: String(EPOCH) };
  const run = spawnSync(process.execPath, [join(ROOT, "dist/src/cli.js"), "report", input, "--out", out], { cwd: ROOT, encoding: "utf8", env });
  if (run.status !== 0) throw new Error(`outfit report failed: ${run.stderr}`);
}

const demoJson = JSON.parse(readFileSync(DEMO, "utf8")) as { project: Record<string, string>; storms: { name: string; inflow: { file: string } }[]; pond: { bottom: number; top: number; storage: { prismoid: { length: number; width: number; sideSlope: number } } } };
const { case: demo } = loadCase(DEMO);
const routing = routeCase(demo, demo.outlet!, { record: true });

/** Table cells by caption (text of each cell, row by row). */
async function tableByCaption(page: Page, caption: RegExp): Promise<{ head: string[]; rows: string[][] }[]> {
  return page.$$eval(
    "table",
    (tables, source) => {
      const pattern = new RegExp(source);
      return tables
        .filter((t) => pattern.test(t.querySelector("caption")?.textContent ?? ""))
        .map((t) => ({
          head: Array.from(t.querySelectorAll("thead th"), (th) => th.textContent ?? ""),
          rows: Array.from(t.querySelectorAll("tbody tr"), (tr) => Array.from(tr.querySelectorAll("td"), (td) => td.textContent ?? "")),
        }));
    },
    caption.source,
  );
}

/**
 * Words (in the selected elements) whose letters are laid out on more than one line. A line may end
 * after a hyphen ("concrete-square-" / "headwall"): that is a break, not a split word, so the parts
 * between hyphens are the words checked.
 */
async function splitWords(page: Page, selector: string): Promise<string[]> {
  return page.$$eval(selector, (elements) => {
    const split: string[] = [];
    for (const element of elements) {
      const walker = document.createTreeWalker(element, NodeFilter.SHOW_TEXT);
      for (let node = walker.nextNode(); node; node = walker.nextNode()) {
        const text = node.textContent ?? "";
        const re = /[^\s-]+/g;
        for (let m = re.exec(text); m; m = re.exec(text)) {
          const range = document.createRange();
          range.setStart(node, m.index);
          range.setEnd(node, m.index + m[0].length);
          const tops = new Set(Array.from(range.getClientRects(), (r) => Math.round(r.top)));
          if (tops.size > 1) split.push(m[0]);
        }
      }
    }
    return split;
  });
}

const figureNumbers = (page: Page) => page.$$eval("figure .figure-head a", (links) => links.map((a) => Number((a.textContent ?? "").replace(/\D+/g, ""))));

describe("review report: the project block and the tables a reviewer checks", () => {
  const opened = lazy(async () => {
    const dir = temporaryDirectory();
    const caseFile = join(dir, "demo.report.html");
    const designFile = join(dir, "design.report.html");
    report("cases/demo/case.json", caseFile);
    report(DESIGN_RUN, designFile);
    // The demo pond with its storms from rainfall, given a project section of its own.
    const rainfall = JSON.parse(readFileSync(join(ROOT, "cases/demo-rainfall/case.json"), "utf8")) as Record<string, unknown>;
    rainfall.project = { name: "Rainfall variant (invented)", revision: "C" };
    const rainfallCase = join(dir, "rainfall.json");
    writeFileSync(rainfallCase, JSON.stringify(rainfall));
    const rainfallFile = join(dir, "rainfall.report.html");
    report(rainfallCase, rainfallFile);
    const browser = await launchBrowser();
    return {
      dir,
      browser,
      rainfallCase,
      page: (await openFile(browser, caseFile)).page,
      design: (await openFile(browser, designFile)).page,
      rainfall: (await openFile(browser, rainfallFile)).page,
    };
  });

  afterAll(async () => {
    const ready = await opened.settled();
    await ready?.browser.close();
    if (ready) rmSync(ready.dir, { recursive: true, force: true });
  });

  it("shows the project block: every project field of the case file, the date of the run, the version and the inputs' hash", async () => {
    const { page } = await opened.get();
    const facts = await page.$$eval("header dl.project dt", (dts) => dts.map((dt) => [dt.textContent ?? "", dt.nextElementSibling?.textContent ?? ""]));
    const block = new Map(facts as [string, string][]);
    const labels: Record<string, string> = { name: "Project", number: "Project number", client: "Client", location: "Location", jurisdiction: "Jurisdiction", engineer: "Engineer", revision: "Revision" };
    for (const [field, label] of Object.entries(labels)) expect(block.get(label), label).toBe(demoJson.project[field]);
    expect(block.get("Date of run")).toBe("2026-03-04 05:06 UTC");
    const version = (JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")) as { version: string }).version;
    expect(block.get("outfit version")).toBe(version);
    // SHA-256 over the case file and its three inflow files (name, NUL, bytes, NUL; sorted by path).
    const files = [DEMO, ...demoJson.storms.map((s) => join(ROOT, "cases/demo", s.inflow.file))].sort();
    const hash = createHash("sha256");
    for (const f of files) hash.update(basename(f)).update("\0").update(readFileSync(f)).update("\0");
    expect(block.get("Input files (SHA-256)")).toBe(`${hash.digest("hex").slice(0, 16)} (4 files)`);
  });

  it("says where a project field is not given", async () => {
    const { rainfall } = await opened.get();
    const text = await rainfall.locator("header dl.project").innerText();
    expect(text).toContain("Rainfall variant (invented)");
    expect(text).toMatch(/Client\s+not given/);
  });

  it("numbers the figures 1, 2, 3, ... in document order, in the case and the design-run reports", async () => {
    const { page, design, rainfall } = await opened.get();
    for (const p of [page, design, rainfall]) {
      const numbers = await figureNumbers(p);
      expect(numbers.length).toBeGreaterThan(5);
      expect(numbers).toEqual(numbers.map((_, i) => i + 1));
    }
  });

  it("puts a space between a heading's number and its title (5.2 12-yr storm)", async () => {
    const { page } = await opened.get();
    const headings = await page.$$eval("h2, h3", (hs) => hs.map((h) => (h as HTMLElement).innerText));
    expect(headings.length).toBeGreaterThan(8);
    for (const h of headings) expect(h).toMatch(/^\d+(\.\d+)* \S/);
  });

  it("holds the stage-storage-discharge table at 0.1 ft with a row at every control elevation; storage is the prismoid's closed form", async () => {
    const { page } = await opened.get();
    const [table] = await tableByCaption(page, /^Stage-storage-discharge at 0\.1 ft intervals/);
    expect(table.head).toEqual(["Stage (ft)", "Control level", "Area (ft2)", "Incremental volume (ft3)", "Storage (ft3)", "Openings (cfs)", "Rim (cfs)", "Spillway (cfs)", "Total outflow (cfs)", "Limited by"]);
    const byStage = new Map(table.rows.map((r) => [r[0], r]));
    const controls: [string, RegExp][] = [
      ["100.00", /pond bottom.*E1 orifice invert/],
      ["102.00", /E2 orifice invert/],
      ["103.50", /E3 weir crest/],
      ["104.50", /riser rim/],
      ["105.00", /spillway crest.*freeboard line/],
      ["106.00", /top of embankment/],
    ];
    for (const [stage, label] of controls) expect(byStage.get(stage)?.[1], stage).toMatch(label);
    // Every 0.1 ft from the bottom to the top is a row.
    for (let k = 0; k <= 60; k++) expect(byStage.has((100 + k / 10).toFixed(2)), (100 + k / 10).toFixed(2)).toBe(true);
    // Case format: V(d) = L W d + (L + W) z d^2 + (4/3) z^2 d^3; A(d) = (L + 2 z d)(W + 2 z d).
    const { length: L, width: W, sideSlope: z } = demoJson.pond.storage.prismoid;
    const number = (text: string) => Number(text.replace(/,/g, ""));
    let previous = 0;
    for (const row of table.rows) {
      const d = Number(row[0]) - demoJson.pond.bottom;
      const volume = L * W * d + (L + W) * z * d * d + (4 / 3) * z * z * d ** 3;
      expect(Math.abs(number(row[4]) - volume), `storage at ${row[0]}`).toBeLessThanOrEqual(0.5 + 1e-9 * volume);
      expect(Math.abs(number(row[2]) - (L + 2 * z * d) * (W + 2 * z * d)), `area at ${row[0]}`).toBeLessThanOrEqual(0.5);
      expect(Math.abs(number(row[3]) - (number(row[4]) - previous)), `increment at ${row[0]}`).toBeLessThanOrEqual(1);
      previous = number(row[4]);
    }
  });

  it("holds a hydrograph table per storm whose inflow is the case's inflow file and whose peak row is the routed peak", async () => {
    const { page } = await opened.get();
    for (const [i, s] of demoJson.storms.entries()) {
      const [table] = await tableByCaption(page, new RegExp(`^${s.name}: inflow and outflow every \\d+ min from `));
      expect(table, s.name).toBeDefined();
      // Times in hours over an event longer than 6 h, else in minutes.
      const inHours = table.head[0] === "Time (h)";
      expect(table.head).toEqual([inHours ? "Time (h)" : "Time (min)", "Inflow (cfs)", "Outflow (cfs)", "Stage (ft)", "Storage (ft3)", "Note"]);
      expect(table.rows.length).toBeGreaterThan(10);
      expect(table.rows.length).toBeLessThanOrEqual(63);
      const minutes = (cell: string) => Number(cell) * (inHours ? 60 : 1);
      // The case's inflow file (minutes, cfs), linear between points.
      const points = readFileSync(join(ROOT, "cases/demo", s.inflow.file), "utf8").trim().split("\n").slice(1).map((l) => l.split(",").map(Number));
      const inflowAt = (t: number) => {
        if (t >= points[points.length - 1][0]) return 0;
        const k = points.findIndex((p) => p[0] > t);
        const [t0, q0] = points[k - 1];
        const [t1, q1] = points[k];
        return q0 + ((t - t0) / (t1 - t0)) * (q1 - q0);
      };
      for (const row of table.rows) {
        const expected = inflowAt(minutes(row[0]));
        expect(Math.abs(Number(row[1]) - expected), `${s.name} inflow at ${row[0]}`).toBeLessThanOrEqual(0.0051 * Math.max(1, expected));
      }
      const peakRow = table.rows.find((r) => r[5].includes("peak outflow"))!;
      const routed = routing.storms[i].result;
      expect(Math.abs(minutes(peakRow[0]) - routed.timeOfPeakOutflow / 60)).toBeLessThanOrEqual(inHours ? 0.3 : 0.05);
      expect(Number(peakRow[2]) / (routed.peakOutflow / 0.3048 ** 3)).toBeCloseTo(1, 3);
    }
  });

  it("trims the hydrograph tables of a 24-hour storm to the event, in hours, without runs of empty rows", async () => {
    const { rainfall, rainfallCase } = await opened.get();
    const { case: c } = loadCase(rainfallCase);
    const routed = routeCase(c, c.outlet!, { record: true });
    for (const sr of routed.storms) {
      const [table] = await tableByCaption(rainfall, new RegExp(`^${sr.storm.name}: inflow and outflow every \\d+ min from `));
      expect(table.head[0]).toBe("Time (h)");
      expect(table.rows.length).toBeLessThanOrEqual(63);
      const times = table.rows.map((r) => Number(r[0]));
      // The simulation runs from 0 h until the pond has drained; the table starts where runoff rises
      // (hours into the 24-hour storm) and ends once the outflow has receded below 5 % of its peak,
      // before the simulation ends, and no two rows in a row hold neither inflow nor outflow.
      const series = sr.result.series!;
      const simulated = series.time[series.time.length - 1] / 3600;
      const receded = series.time.find((t, k) => t > sr.result.timeOfPeakOutflow && series.outflow[k] < 0.05 * sr.result.peakOutflow)! / 3600;
      expect(times[0]).toBeGreaterThan(1);
      expect(times[times.length - 1]).toBeGreaterThanOrEqual(receded - 1);
      expect(times[times.length - 1]).toBeLessThan(simulated);
      const empty = table.rows.map((r) => Number(r[1]) === 0 && Number(r[2]) === 0);
      expect(empty.some((e, k) => e && empty[k + 1])).toBe(false);
      // And it holds the peaks.
      expect(table.rows.some((r) => r[r.length - 1].includes("peak inflow"))).toBe(true);
      expect(table.rows.some((r) => r[r.length - 1].includes("peak outflow"))).toBe(true);
    }
  });

  it("compares pre- and post-development per storm, with one plot of both hydrographs and the outflow", async () => {
    const { rainfall, rainfallCase } = await opened.get();
    const { case: c } = loadCase(rainfallCase);
    const tables = await tableByCaption(rainfall, /pre- against post-development/);
    expect(tables.length).toBe(c.storms.length);
    for (const [i, table] of tables.entries()) {
      expect(table.rows.map((r) => r[0])).toEqual(["pre-development runoff", "post-development inflow", "routed outflow", "allowable release (target)"]);
      // The target of a storm from rainfall is the pre-development peak (README, Storms from rainfall).
      expect(Number(table.rows[0][1]) / (c.storms[i].target! / 0.3048 ** 3)).toBeCloseTo(1, 2);
    }
    const plots = await readPlots(rainfall);
    const prePost = plots.filter((p) => /pre-post$/.test(p.figure));
    expect(prePost.length).toBe(c.storms.length);
    for (const p of prePost) expect(p.series.map((s) => s.key).sort()).toEqual(["inflow", "outflow", "pre"]);
  });

  it("splits no word across lines in the table cells and headings checked", async () => {
    const { page, design } = await opened.get();
    for (const p of [page, design]) {
      const split = await splitWords(p, "table td, table th, h2, h3, .figure-head");
      expect(split).toEqual([]);
    }
  });

  it("finds a word that is split (control: a narrow cell allowed to break anywhere)", async () => {
    const { page } = await opened.get();
    await page.evaluate(() => {
      const td = document.querySelector("tbody td")!;
      td.textContent = "spillway";
      (td as HTMLElement).style.cssText = "width: 3ch; max-width: 3ch; overflow-wrap: anywhere; white-space: normal; display: block";
      td.classList.add("split-control");
    });
    expect(await splitWords(page, "td.split-control")).toEqual(["spillway"]);
  });
});
