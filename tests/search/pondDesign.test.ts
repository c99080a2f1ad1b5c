// Pond and outlet designed together (`design --size-pond`) on an invented site with no pond, checked
// by `route` on the written case file; and storage shortfalls stated in volumes with units.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { outfit, outfitWith } from "../cli/run.js";

const dir = mkdtempSync(join(tmpdir(), "outfit-pond-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("design --size-pond on cases/site-only (no pond given)", () => {
  let results: any;
  beforeAll(() => {
    const run = outfit("design", "cases/site-only/case.json", "--size-pond", "--budget", "3000", "--out", dir, "--json");
    expect(run.status).toBe(0);
    results = JSON.parse(run.stdout);
  });

  it("proposes a pond and an outlet that `route` confirms: every storm within tolerance, every check passed", () => {
    expect(results.chosen.compliant).toBe(true);
    const run = outfit("route", join(dir, "pond-and-outlet.json"), "--json", "--check");
    expect(run.status).toBe(0);
    const routed = JSON.parse(run.stdout);
    expect(routed.compliant).toBe(true);
    for (const storm of routed.storms) expect(storm.withinTolerance, storm.name).toBe(true);
    // The written pond is the chosen one (floor twice as long as wide on 1 ft steps, at the depth the
    // trade-off chose: 3.70 ft, the spillway crest 23.20 ft plus the 0.5 ft freeboard, no deeper, since
    // the crest limits the storage and a deeper pond only digs more).
    const written = JSON.parse(readFileSync(join(dir, "pond-and-outlet.json"), "utf8"));
    expect(written.pond).toEqual(results.chosen.pond);
    expect(written.pond.top - written.pond.bottom).toBeCloseTo(results.tradeOff.find((t: { chosen: boolean }) => t.chosen).depth, 9);
    expect(written.pond.top).toBeCloseTo(23.7, 9);
    expect(written.pond.storage.prismoid.length).toBe(2 * written.pond.storage.prismoid.width);
  });

  it("is no larger than needed: one step smaller, the search finds no compliant outlet and the proposed outlet fails a check", () => {
    expect(results.smaller.steps).toBe(results.chosen.steps - 1);
    expect(results.smaller.compliant).toBe(false);
    const written = JSON.parse(readFileSync(join(dir, "pond-and-outlet.json"), "utf8"));
    written.pond = results.smaller.pond;
    const file = join(dir, "one-step-smaller.json");
    writeFileSync(file, JSON.stringify(written));
    const run = outfit("route", file, "--json", "--check");
    expect(run.status).toBe(1);
    const routed = JSON.parse(run.stdout);
    expect(routed.compliant).toBe(false);
    expect(routed.checks.some((c: { passed: boolean }) => !c.passed)).toBe(true);
  });

  it("the routed estimate seeds the size, and every size tried is costed with its excavation and land", () => {
    const pond = outfit("pond", "cases/site-only/case.json", "--json");
    const seeded = JSON.parse(pond.stdout).pond.storage.prismoid.width;
    expect(results.sizes[0].pond.storage.prismoid.width).toBe(seeded);
    for (const s of results.sizes) {
      // Default weights 0.001 per ft3 excavated, 0.002 per ft3 of fill and per ft2 of land (src/sizing/pondCost.ts).
      expect(s.pondCost).toBeCloseTo(0.001 * s.excavation + 0.002 * s.fill + 0.002 * s.land, 9);
    }
    expect(results.chosen.totalCost).toBeCloseTo(results.chosen.outletCost + results.chosen.pondCost, 9);
  });
});

describe("infeasible for lack of storage: the shortfall in volume, with units", () => {
  it("design on cases/infeasible states the storage shortfall (hand: prismoid 70 x 35, 3:1, to the freeboard level 3 ft up holds 10,509 ft3)", () => {
    // 7350 + 2835 + 324 = 10,509 ft3. The 2-yr inflow above its 0.150 cfs target, by the trapezoid
    // rule on a 0.01-minute grid of the inflow series (linear between points):
    const c = JSON.parse(readFileSync("cases/infeasible/case.json", "utf8"));
    const series: [number, number][] = c.storms.find((s: { name: string }) => s.name === "2-yr").inflow.series;
    let above = 0;
    for (let i = 1; i < series.length; i++) {
      const [t0, q0] = series[i - 1];
      const [t1, q1] = series[i];
      for (let k = 0; k < (t1 - t0) * 100; k++) {
        const qa = q0 + ((q1 - q0) * k) / ((t1 - t0) * 100);
        const qb = q0 + ((q1 - q0) * (k + 1)) / ((t1 - t0) * 100);
        above += 0.5 * (Math.max(0, qa - 0.15) + Math.max(0, qb - 0.15)) * 0.6;
      }
    }
    const run = outfit("design", "cases/infeasible/case.json", "--budget", "2000");
    expect(run.status).toBe(0);
    // The limit level is the spillway crest, 83 ft, which the freeboard level (84 - 1 ft) equals here.
    expect(run.stdout).toContain("the pond holds 10,509 ft3 between the floor and the 2-yr storm's limit level (83.00 ft, spillway crest)");
    const m = /at least ([\d,]+) ft3 more storage is needed/.exec(run.stdout);
    expect(m).not.toBeNull();
    expect(Math.abs(Number(m![1].replace(/,/g, "")) - (above - 10509))).toBeLessThanOrEqual(2);
  });

  it("design --size-pond within site limits too small says how much storage is missing", () => {
    const c = JSON.parse(readFileSync("cases/site-only/case.json", "utf8"));
    c.site.maxTopLength = 50;
    c.site.maxTopWidth = 36;
    const file = join(dir, "tight.json");
    writeFileSync(file, JSON.stringify(c));
    const run = outfit("design", file, "--size-pond", "--budget", "1500");
    expect(run.status).toBe(0);
    expect(run.stdout).toContain("No compliant pond and outlet: no compliant outlet up to the largest pond within the site limits");
    const add = /Add about ([\d,]+) ft3 of storage below the limit level/.exec(run.stdout);
    expect(add).not.toBeNull();
    // The advice against what the site without those limits needed: the smallest compliant pond's
    // storage below the limit level less what the largest pond within the limits holds. The lower
    // bound alone (the inflow above the target) advised a quarter of it; the routed estimate with the
    // allowance comes within 5 %.
    const holds = Number(/the pond holds ([\d,]+) ft3 between the floor/.exec(run.stdout)![1].replace(/,/g, ""));
    const free = JSON.parse(outfit("design", "cases/site-only/case.json", "--size-pond", "--budget", "3000", "--json").stdout);
    const needed = free.chosen.provided - holds;
    expect(Number(add![1].replace(/,/g, ""))).toBeGreaterThan(0.95 * needed);
  });
});

describe("design --size-pond as text", () => {
  const widest = (text: string) => Math.max(...text.split("\n").map((line) => line.length));
  const out = join(dir, "text-out");
  let narrow: string;
  let piped: string;
  beforeAll(() => {
    const run = outfitWith({ COLUMNS: "80" }, "design", "cases/site-only/case.json", "--size-pond", "--budget", "3000", "--quiet", "--out", out);
    expect(run.status).toBe(0);
    narrow = run.stdout;
    piped = outfit("design", "cases/site-only/case.json", "--size-pond", "--budget", "3000", "--quiet").stdout;
  });

  it("fits 80 columns: the sizes' earthwork and costs go below each row, with their units", () => {
    expect(widest(narrow)).toBeLessThanOrEqual(80);
    expect(narrow).toMatch(/^ {4}earthwork \(cut \+ fill\): [\d,]+ ft3; pond cost: [\d.]+ units/m);
    expect(narrow).toContain("<- chosen");
    // The same pond sizes as the full table.
    const sizes = (text: string) => [...text.matchAll(/(\d+\.\d ft x \d+\.\d ft floor) +([\d,]+ ft3)/g)].map((m) => `${m[1]} ${m[2]}`);
    expect(sizes(narrow)).toEqual(sizes(piped));
    expect(sizes(narrow).length).toBeGreaterThan(1);
  });

  it("the chosen outlet's warnings stand beside the word compliant, as its results.json lists them, and are listed", () => {
    const results = JSON.parse(readFileSync(join(out, "results.json"), "utf8"));
    const n = results.chosen.routing.warnings.length;
    const count = n === 0 ? "" : `, ${n} warning${n > 1 ? "s" : ""}`;
    for (const text of [narrow, piped, readFileSync(join(out, "summary.txt"), "utf8")]) {
      expect(text).toMatch(new RegExp(`\\nCompliant${count}; binding check: `));
      expect(text).toMatch(new RegExp(`compliant( outlet found)?${count}( \\(outlet of the size above, routed again\\))?\\s+<- chosen`));
      const listed = text.split("\nWarnings:")[1].split("\n\n")[0];
      if (n === 0) expect(listed.trim()).toBe("none");
      else expect(listed.split("\n").filter((line) => line.startsWith("  - "))).toHaveLength(n);
    }
  });

  it("piped and in summary.txt: the whole table on one line per size (the control: wider than 80)", () => {
    expect(piped).toMatch(/^Steps {2}Pond .*limit level {2}Footprint +Earthwork +Pond cost +Outlet {2}Result$/m);
    expect(piped).toMatch(/^ +\d+ {2}[\d.]+ ft x [\d.]+ ft floor +[\d,]+ ft3 +[\d,]+ ft2 +[\d,]+ ft3 +[\d.]+ units +(-|[\d.]+ units) {2}\S/m);
    expect(widest(piped)).toBeGreaterThan(80);
    expect(readFileSync(join(out, "summary.txt"), "utf8").trimEnd()).toBe(piped.trimEnd());
  });
});

