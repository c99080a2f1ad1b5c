// `route --csv-dir` writes every storm's routed series; integrated again by the trapezoidal rule
// (an independent rule: the router's volumes are its own step sums) they give the route's volumes
// within 0.1 %, and the storage column's change equals inflow less outflow.
import { describe, expect, it } from "vitest";
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { outfit } from "./run.js";

function readCsv(file: string): { head: string[]; rows: number[][] } {
  const [head, ...lines] = readFileSync(file, "utf8").trim().split("\n");
  return { head: head.split(","), rows: lines.map((l) => l.split(",").map(Number)) };
}

/** Trapezoidal integral of column `j` over time (minutes -> seconds). */
function trapezoid(rows: number[][], j: number): number {
  let sum = 0;
  for (let i = 1; i < rows.length; i++) sum += 0.5 * (rows[i][j] + rows[i - 1][j]) * (rows[i][0] - rows[i - 1][0]) * 60;
  return sum;
}

describe.each(["cases/demo/case.json", "cases/si-wet-barrel/case.json"])("route --csv-dir on %s", (file) => {
  it("writes one CSV per storm, units in the header, re-integrating to the routed volumes within 0.1 %", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-series-"));
    try {
      const run = outfit("route", file, "--csv-dir", dir, "--json");
      expect(run.status).toBe(0);
      const json = JSON.parse(run.stdout) as { units: string; storms: { name: string; volumeIn: number; volumeOut: number }[] };
      const flow = json.units === "US" ? "cfs" : "m3/s";
      const files = readdirSync(dir).sort();
      expect(files.length).toBe(json.storms.length);
      for (const storm of json.storms) {
        const { head, rows } = readCsv(join(dir, `${storm.name.replace(/[^A-Za-z0-9._-]+/g, "_")}.csv`));
        expect(head.slice(0, 5)).toEqual(["time (min)", `inflow (${flow})`, `outflow (${flow})`, `stage (${json.units === "US" ? "ft" : "m"})`, `storage (${json.units === "US" ? "ft3" : "m3"})`]);
        expect(head.length).toBeGreaterThan(5);
        for (const h of head.slice(5)) expect(h).toMatch(new RegExp(`\\(${flow.replace("/", "\\/")}\\)$`));
        const volumeIn = trapezoid(rows, 1);
        const volumeOut = trapezoid(rows, 2);
        expect(Math.abs(volumeIn - storm.volumeIn) / storm.volumeIn).toBeLessThan(0.001);
        expect(Math.abs(volumeOut - storm.volumeOut) / storm.volumeIn).toBeLessThan(0.001);
        // Continuity on the written columns: storage change = inflow volume - outflow volume.
        const change = rows[rows.length - 1][4] - rows[0][4];
        expect(Math.abs(change - (volumeIn - volumeOut)) / volumeIn).toBeLessThan(0.001);
        // The parts' flows add up to the routed outflow at its peak (the router reads the rating
        // table, the parts are evaluated exactly at the stage: within 1 %). With a barrel, the
        // barrel carries the openings and rim, and the total is the barrel plus the spillway.
        const peakRow = rows.reduce((a, b) => (b[2] > a[2] ? b : a));
        const part = (name: string) => head.findIndex((h) => h.startsWith(`${name} (`));
        const parts = part("barrel") >= 0
          ? peakRow[part("barrel")] + (part("spillway") >= 0 ? peakRow[part("spillway")] : 0)
          : peakRow.slice(5).reduce((a, b) => a + b, 0);
        expect(Math.abs(parts - peakRow[2]) / peakRow[2]).toBeLessThan(0.01);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("route --json --series", () => {
  it("includes each storm's series with the same columns as the CSV", () => {
    const run = outfit("route", "cases/demo/case.json", "--json", "--series");
    expect(run.status).toBe(0);
    const json = JSON.parse(run.stdout) as { storms: { series: Record<string, number[]>; volumeIn: number }[] };
    const s = json.storms[0].series;
    expect(Object.keys(s).slice(0, 3)).toEqual(["time (min)", "inflow (cfs)", "outflow (cfs)"]);
    const rows = s["time (min)"].map((t, i) => [t, s["inflow (cfs)"][i]]);
    expect(Math.abs(trapezoid(rows, 1) - json.storms[0].volumeIn) / json.storms[0].volumeIn).toBeLessThan(0.001);
  });

  it("--series without --json is a usage error (exit 2)", () => {
    const run = outfit("route", "cases/demo/case.json", "--series");
    expect(run.status).toBe(2);
    expect(run.stderr).toContain("--series");
  });
});
