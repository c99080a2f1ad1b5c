// The report's storage section: the estimates side by side with the storage the routed outlet uses
// (read back from the HTML opened in Chromium, and from the Markdown), and the sizing trade-off of a
// case with site limits.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFileSync, rmSync } from "node:fs";
import { join } from "node:path";
import type { Page } from "playwright-core";
import { loadCase } from "../../src/case/load.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { storageCurve } from "../../src/storage/curve.js";
import { formatter } from "../../src/format.js";
import { launchBrowser, openFile, type Browser } from "./browser.js";
import { outfit, ROOT, temporaryDirectory } from "./support.js";

const dir = temporaryDirectory();
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
}, 60_000);
afterAll(async () => {
  await browser?.close();
  rmSync(dir, { recursive: true, force: true });
});

/** The cells of the tables whose caption matches, row by row. */
async function tables(page: Page, caption: RegExp): Promise<string[][][]> {
  return page.$$eval(
    "table",
    (all, source) =>
      all
        .filter((t) => new RegExp(source).test(t.querySelector("caption")?.textContent ?? ""))
        .map((t) => Array.from(t.querySelectorAll("tbody tr"), (tr) => Array.from(tr.querySelectorAll("td"), (td) => (td.textContent ?? "").trim()))),
    caption.source,
  );
}

describe.each(["underground", "site-only"])("the storage section of cases/%s", (name) => {
  const file = join(ROOT, `cases/${name}/case.json`);
  const c = loadCase(file).case;
  const f = formatter(c.units);
  const routed = routeCase(c, c.outlet!);
  const pool = storageCurve(c.pond).volume(c.pond.pool);
  let page: Page;
  let markdown: string;
  beforeAll(async () => {
    const html = join(dir, `${name}.html`);
    expect(outfit("report", file, "--out", html).status).toBe(0);
    page = (await openFile(browser, html)).page;
    const md = join(dir, `${name}.md`);
    expect(outfit("report", file, "--format", "md", "--out", md).status).toBe(0);
    markdown = readFileSync(md, "utf8");
  }, 60_000);

  it("lists every storm's estimates, lower bounds marked, and the routed outlet's storage beside them", async () => {
    const [rows] = await tables(page, /^Storage estimates beside the storage the routed outlet uses/);
    expect(rows.map((r) => r[1])).toContain("rising release (lower bound)");
    expect(rows.map((r) => r[1])).toContain("routed: orifice and weir");
    const outletRows = rows.filter((r) => r[1] === "the routed outlet");
    expect(outletRows).toHaveLength(routed.storms.length);
    routed.storms.forEach((s, i) => expect(outletRows[i][2]).toBe(f.volume(s.result.maxStorage - pool)));
    expect(markdown).toContain("| **the routed outlet** |");
  });

  it("shows the sizing trade-off exactly when the case has site limits", async () => {
    const tradeOff = await tables(page, /^Sizing trade-off/);
    if (c.site) {
      expect(tradeOff).toHaveLength(1);
      expect(tradeOff[0].some((r) => r[r.length - 1] === "chosen (least cost)")).toBe(true);
      expect(tradeOff[0].some((r) => r[r.length - 1].startsWith("not possible: top"))).toBe(true);
      expect(markdown).toContain("**Sizing trade-off:");
    } else {
      expect(tradeOff).toHaveLength(0);
      expect(await page.textContent("body")).toContain("Declared above the system's top: MH-1");
    }
  });
});
