// The invented cases/ordinance-mix through `route --json`: each storm's governing release limit is the
// smallest of its forms, computed by hand from the case file; the new rules' checks carry their labels;
// a bad clogging kind is a case error (exit 2) naming the field.
import { mkdtempSync, readFileSync, writeFileSync, copyFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { outfit } from "./run.js";

describe("cases/ordinance-mix", () => {
  const run = outfit("route", "cases/ordinance-mix/case.json", "--json");
  const json = JSON.parse(run.stdout);

  it("routes (exit 0) and names each storm's governing limit with its source", () => {
    expect(run.status).toBe(0);
    const storms = Object.fromEntries(json.storms.map((s: { name: string }) => [s.name, s]));
    // 2-yr: min(0.5 x 14 = 7.0, 0.2 cfs/ac x 32 ac = 6.4) = 6.4 cfs, the per-area cap.
    expect(storms["2-yr"].target).toBeCloseTo(6.4, 9);
    expect(storms["2-yr"].governingLimit).toEqual({ form: "per-area", statement: "0.2 cfs/ac over 32 ac", label: "county ordinance 4.2(c)" });
    // 10-yr: min(0.75 x 19 = 14.25, 0.45 x 32 = 14.4) = 14.25 cfs; 100-yr: min(0.8 x 38 = 30.4, 1.0 x 32 = 32) = 30.4 cfs.
    expect(storms["10-yr"].target).toBeCloseTo(14.25, 9);
    expect(storms["10-yr"].governingLimit.form).toBe("share-of-pre");
    expect(storms["100-yr"].target).toBeCloseTo(30.4, 9);
    expect(storms["100-yr"].releaseLimits.map((l: { flow: number }) => l.flow)).toEqual([expect.closeTo(30.4, 9), expect.closeTo(32, 9)]);
  });

  it("lists the new rules' checks with their labels, and clogged twins beside the unclogged checks", () => {
    const byKey = Object.fromEntries(json.checks.map((k: { key: string }) => [k.key, k]));
    expect(byKey["blocked-outlet:100-yr"].label).toBe("county ordinance 6.4");
    expect(byKey["blocked-outlet:100-yr"].limit).toBeCloseTo(106 - 0.5, 9);
    expect(byKey["extended-detention:water-quality volume"].label).toBe("county ordinance 5.3");
    expect(byKey["extended-detention:water-quality volume"].limit).toBe(24);
    expect(byKey["minimum-opening:outlet"].limit).toBeCloseTo(3, 9); // inches
    expect(byKey["freeboard:100-yr:clogged"].condition).toBe("clogged");
    // Clogging holds water back: the clogged stage is at least the unclogged one.
    expect(byKey["freeboard:100-yr:clogged"].value).toBeGreaterThanOrEqual(byKey["freeboard:100-yr"].value);
    expect(byKey["peak-upper:2-yr:clogged"]).toBeUndefined(); // not among the named kinds
  });

  it("prints the governing limits in the console output", () => {
    const text = outfit("route", "cases/ordinance-mix/case.json").stdout;
    expect(text).toContain("2-yr: 6.400 cfs (0.2 cfs/ac over 32 ac, county ordinance 4.2(c))");
    expect(text).toMatch(/Caution: Preliminary design aid/);
  });

  it("a clogging kind no rule has is a case error naming the field (exit 2)", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-ruleforms-"));
    const c = JSON.parse(readFileSync("cases/ordinance-mix/case.json", "utf8"));
    c.criteria.clogging.checks = ["freeboard", "peak-hieght"];
    for (const f of ["inflow-2yr.csv", "inflow-10yr.csv", "inflow-100yr.csv"]) copyFileSync(join("cases/ordinance-mix", f), join(dir, f));
    writeFileSync(join(dir, "case.json"), JSON.stringify(c));
    const bad = outfit("route", join(dir, "case.json"));
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain("criteria.clogging.checks[1]");
    expect(bad.stderr).toContain("peak-hieght");
  });
});
