// User text (case, storm and file names) is shown as text: a case named <script>alert(1)</script>
// renders literally and nothing in it runs, in the HTML report, the Markdown and its SVG files.
import { afterAll, describe, expect, it } from "vitest";
import { copyFileSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { launchBrowser, lazy, openFile } from "./browser.js";
import { DEMO, outfit, temporaryDirectory } from "./support.js";
import { markdownText } from "../../src/report/markdown.js";

const CASE_NAME = "<script>alert(1)</script>";
const STORM_NAME = "<img src=x onerror=alert(2)>";
const OTHER_STORM = `10-yr "wet" & 'windy'`;
const FILE_NAME = `odd <b>name<b> & "quoted".json`;

describe("escaping of user text", () => {
  const report = lazy(async () => {
    const dir = temporaryDirectory();
    const demo = JSON.parse(readFileSync(DEMO, "utf8"));
    for (const storm of demo.storms) copyFileSync(join(dirname(DEMO), storm.inflow.file), join(dir, storm.inflow.file));
    demo.name = CASE_NAME;
    demo.storms[0].name = STORM_NAME;
    demo.storms[1].name = OTHER_STORM;
    const caseFile = join(dir, FILE_NAME);
    writeFileSync(caseFile, JSON.stringify(demo));
    const run = outfit("report", caseFile, "--out", join(dir, "report.html"));
    if (run.status !== 0) throw new Error(`outfit report failed: ${run.stderr}`);
    return { dir, caseFile, html: readFileSync(join(dir, "report.html"), "utf8"), browser: await launchBrowser() };
  });

  afterAll(async () => {
    const ready = await report.settled();
    await ready?.browser.close();
    if (ready) rmSync(ready.dir, { recursive: true, force: true });
  });

  it("writes the names escaped into the HTML", async () => {
    const { html } = await report.get();
    expect(html).not.toContain("<script");
    expect(html).not.toContain("<img");
    expect(html).not.toContain("<b>name");
    expect(html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    expect(html).toContain("&lt;img src=x onerror=alert(2)&gt;");
    expect(html).toContain("10-yr &quot;wet&quot; &amp; &#39;windy&#39;");
  });

  it("renders the names as text in Chromium and runs nothing", async () => {
    const { browser, dir } = await report.get();
    const watched = await openFile(browser, join(dir, "report.html"));
    const page = watched.page;
    expect(watched.dialogs).toEqual([]);
    expect(watched.errors).toEqual([]);
    expect(watched.requests).toEqual([]);
    expect(await page.locator("script, img, b").count()).toBe(0);
    expect(await page.locator("h1").textContent()).toBe(`Review report: ${CASE_NAME}`);
    expect(await page.title()).toBe(`Review report: ${CASE_NAME}`);
    expect(await page.locator(".subtitle").textContent()).toContain(FILE_NAME);
    const cells = await page.$$eval("td", (tds) => tds.map((td) => td.textContent));
    expect(cells).toContain(STORM_NAME);
    expect(cells).toContain(OTHER_STORM);
    // In the plots too: the rating plot labels each storm's target point with its name.
    const labels = await page.$$eval("svg[data-plot=rating] g[data-points=targets] > g", (gs) => gs.map((g) => g.getAttribute("data-label")));
    expect(labels).toEqual([STORM_NAME, OTHER_STORM, "100-yr"]);
    const figureHeads = await page.$$eval(".figure-head", (heads) => heads.map((h) => h.textContent ?? ""));
    expect(figureHeads.some((text) => text.includes(`${STORM_NAME}: inflow and outflow`))).toBe(true);
    await page.close();
  });

  it("escapes the names in Markdown and in the SVG files beside it, which run nothing either", async () => {
    const { browser, dir, caseFile } = await report.get();
    const out = join(dir, "md", "report.md");
    const run = outfit("report", caseFile, "--format", "md", "--out", out);
    expect(run.status, run.stderr).toBe(0);
    const md = readFileSync(out, "utf8");
    expect(md).not.toMatch(/<script|<img|<b>/);
    expect(md).toContain(markdownText(CASE_NAME));
    expect(md).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    const svgs = readdirSync(join(dir, "md")).filter((f) => f.endsWith(".svg"));
    expect(svgs.length).toBeGreaterThan(3);
    for (const svg of svgs) expect(readFileSync(join(dir, "md", svg), "utf8")).not.toMatch(/<script|<img|<b>/);
    const hydrograph = svgs.find((f) => f.includes("storm-1-hydrograph"))!;
    const watched = await openFile(browser, join(dir, "md", hydrograph));
    expect(watched.dialogs).toEqual([]);
    expect(watched.errors).toEqual([]);
    expect(await watched.page.locator("title").first().textContent()).toBe(`${STORM_NAME}: inflow and outflow`);
    await watched.page.close();
  });

  it("escapes Markdown's own special characters", () => {
    expect(markdownText("a|b *c* _d_ [e](f) `g` <h> & \\")).toBe("a\\|b \\*c\\* \\_d\\_ \\[e\\](f) \\`g\\` &lt;h&gt; &amp; \\\\");
  });
});
