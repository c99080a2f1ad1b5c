// The storage outputs at 80 columns: route's Storage table (governing durations, exfiltration, a
// surcharge and where the water stands), volume, pond's trade-off, design's candidate notes.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { outfitWith } from "./run.js";
import { infiltrationBasin } from "../routing/support/ponds.js";

const dir = mkdtempSync(join(tmpdir(), "outfit-terminal-storage-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const basin = join(dir, "basin.json");
writeFileSync(basin, JSON.stringify({ ...infiltrationBasin, storms: infiltrationBasin.storms.map((s) => ({ ...s, target: 10 })) }));

const RUNS: string[][] = [
  ["route", "cases/underground/case.json"],
  ["route", "cases/rational/case.json"],
  ["route", basin],
  ["volume", "cases/rational/case.json"],
  ["volume", "cases/underground/case.json"],
  ["pond", "cases/site-groundwater/case.json"],
  ["design", "cases/rational/case.json", "--budget", "1500", "--quiet"],
];

describe("storage outputs fit 80 columns", () => {
  it.each(RUNS)("%s %s", (...args) => {
    const run = outfitWith({ COLUMNS: "80" }, ...args);
    expect(run.status).toBe(0);
    const wide = run.stdout.split("\n").filter((line) => line.length > 80 && /\S\s+\S/.test(line.trim()));
    expect(wide).toEqual([]);
    expect(run.stdout).toContain("licensed professional engineer");
  });
  it("route names what the storage did: governing durations, exfiltration", () => {
    expect(outfitWith({ COLUMNS: "80" }, "route", "cases/rational/case.json").stdout).toMatch(/Governing\s*\n.*duration \(min\)\n10-yr +[\d,]+ +48\n/);
    expect(outfitWith({ COLUMNS: "80" }, "route", basin).stdout).toMatch(/Exfiltrated[\s\S]*10-yr +[\d,]+ +[\d,]+ +0\.\d+/);
  });
});
