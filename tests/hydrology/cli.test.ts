import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parseInflowCsv } from "../../src/case/csv.js";

// The built command line (npm test builds before the tests run).
function outfit(...args: string[]) {
  const r = spawnSync(process.execPath, ["dist/src/cli.js", ...args], { encoding: "utf8" });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const DEMO = "cases/demo-rainfall/case.json";

describe("outfit on the rainfall demo", () => {
  it("route runs on storms given by rainfall only", () => {
    const r = outfit("route", DEMO, "--json");
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.storms.map((s: { name: string }) => s.name)).toEqual(["2-yr", "10-yr", "100-yr"]);
    for (const s of json.storms) {
      expect(s.target).toBeGreaterThan(0);
      expect(s.peakInflow).toBeGreaterThan(s.target);
      expect(Math.abs(s.massBalanceError)).toBeLessThan(0.005);
    }
  });

  it("hydrograph writes CSVs that route back to the same results as the rainfall case", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-hydrograph-"));
    const r = outfit("hydrograph", DEMO, "--out", dir);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("Caution:");
    expect(readdirSync(dir).sort()).toEqual(["10-yr-post.csv", "10-yr-pre.csv", "100-yr-post.csv", "100-yr-pre.csv", "2-yr-post.csv", "2-yr-pre.csv"]);
    const text = readFileSync(join(dir, "10-yr-post.csv"), "utf8");
    expect(text.split("\n")[0]).toBe("minutes,flow");
    const series = parseInflowCsv(text, "10-yr-post.csv");
    expect("times" in series).toBe(true);

    // The same case with the CSVs as inflow files and the printed targets routes the same.
    const rainfall = JSON.parse(outfit("route", DEMO, "--json").stdout);
    const demo = JSON.parse(readFileSync(DEMO, "utf8"));
    delete demo.hydrology;
    demo.storms = rainfall.storms.map((s: { name: string; returnPeriod: number; target: number }) => ({
      name: s.name,
      returnPeriod: s.returnPeriod,
      target: s.target,
      inflow: { file: `${s.name}-post.csv` },
    }));
    writeFileSync(join(dir, "case.json"), JSON.stringify(demo));
    const fromFiles = JSON.parse(outfit("route", join(dir, "case.json"), "--json").stdout);
    fromFiles.storms.forEach((s: { peakInflow: number; peakOutflow: number; maxStage: number }, i: number) => {
      // The CSV keeps six significant digits.
      expect(s.peakInflow / rainfall.storms[i].peakInflow).toBeCloseTo(1, 5);
      expect(s.peakOutflow / rainfall.storms[i].peakOutflow).toBeCloseTo(1, 4);
      expect(s.maxStage).toBeCloseTo(rainfall.storms[i].maxStage, 4);
    });
  });

  it("hydrograph --json gives runoff, peak and time to peak per storm and area", () => {
    const r = outfit("hydrograph", DEMO, "--json", "--storm", "100-yr");
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.storms).toHaveLength(1);
    const s = json.storms[0];
    expect(s.rainfall).toMatchObject({ kind: "distribution", depth: 7.6, distribution: "II" });
    expect(s.inflow).toBe("derived");
    expect(s.targetFrom).toBe("derived");
    expect(s.target).toBeCloseTo(s.areas.pre.peak, 10);
    expect(s.areas.post.runoff).toBeGreaterThan(s.areas.pre.runoff);
    expect(s.areas.post.timeOfPeak).toBeGreaterThan(12 * 60);
    expect(json.caution).toContain("licensed professional engineer");
  });

  it("hydrograph writes one selected hydrograph to a file, and refuses a file for several", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-hydrograph-"));
    const one = join(dir, "inflow.csv");
    expect(outfit("hydrograph", DEMO, "--storm", "2-yr", "--area", "post", "--out", one).code).toBe(0);
    expect(readFileSync(one, "utf8").startsWith("minutes,flow\n")).toBe(true);
    const many = outfit("hydrograph", DEMO, "--out", join(dir, "all.csv"));
    expect(many.code).toBe(2);
    expect(many.stderr).toContain("--out");
    expect(existsSync(join(dir, "all.csv"))).toBe(false);
  });

  it("hydrograph --help is complete and shows an example", () => {
    const r = outfit("hydrograph", "--help");
    expect(r.code).toBe(0);
    for (const option of ["--out", "--json", "--storm", "--area", "Examples:", "outfit hydrograph cases/demo-rainfall/case.json"]) {
      expect(r.stdout).toContain(option);
    }
  });
});

describe("bad hydrology input through the command line", () => {
  function withChange(change: (json: any) => void): string {
    const dir = mkdtempSync(join(tmpdir(), "outfit-bad-"));
    const json = JSON.parse(readFileSync(DEMO, "utf8"));
    change(json);
    const file = join(dir, "case.json");
    writeFileSync(file, JSON.stringify(json));
    return file;
  }
  it.each([
    ["curve number outside 30-100", (j: any) => (j.hydrology.post.parts[0].curveNumber = 120), "hydrology.post.parts[0].curveNumber", "120", "from 30 to 100"],
    ["negative area", (j: any) => (j.hydrology.pre.parts[1].area = "-5 ac"), "hydrology.pre.parts[1].area", '"-5 ac"', "greater than zero"],
    ["unknown distribution", (j: any) => (j.storms[1].rainfall.distribution = "IIa"), "storms[1].rainfall.distribution", '"IIa"', '"I", "IA", "II" or "III"'],
  ])("%s: exit 2 with the path, the value and the expectation", (_, change, path, value, expected) => {
    const file = withChange(change);
    const dir = join(file, "..", "out");
    for (const command of [["route", file], ["hydrograph", file, "--out", dir]]) {
      const r = outfit(...command);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(`case.json: ${path}: found ${value}, expected`);
      expect(r.stderr).toContain(expected);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(r.stdout).toBe("");
    }
    expect(existsSync(dir)).toBe(false);
  });
});
