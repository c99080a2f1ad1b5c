// Every class of bad case file, run through the built command line: exit code 2, no stack trace,
// nothing on stdout, nothing written, and a message naming where (JSON path or file:line), the value
// found and what was expected (the contract's error expectations; DEVELOPERS.md house rules).
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { looksLikeStackTrace, outfit } from "./run.js";

const dir = "tests/case/malformed";

// [file, where, found, expected]
const cases: [string, string, string, string][] = [
  ["wrong-type.json", "wrong-type.json: pond.storage.prismoid.sideSlope", 'found "3:1"', "expected a finite number"],
  ["missing-field.json", "missing-field.json: pond.top", "found nothing (the field is missing)", "expected a length"],
  ["unsorted-table.json", "unsorted-table.json: pond.storage.stageStorage[2][0]", "found 101", "expected elevation strictly increasing (row before has 102)"],
  ["non-monotone-table.json", "non-monotone-table.json: pond.storage.stageStorage[2][1]", "found 3500", "expected volume not decreasing (row before has 4000)"],
  ["negative-flow.json", "negative-flow.json: storms[1].inflow.series[3][1]", "found -2.5", "expected a flow of zero or more"],
  ["unknown-unit.json", "unknown-unit.json: outlet.elements[0].diameter", 'found "6 cubits"', 'expected a length unit among ft, foot, feet, in, inch, inches, ", m, mm, cm ("cubits" is not one)'],
  ["repeated-storm-names.json", "repeated-storm-names.json: storms[1].name", 'found "2-yr"', "expected a storm name not used by another storm"],
  ["top-below-bottom.json", "top-below-bottom.json: pond.top", "found 98.5", "expected an elevation above pond.bottom (100)"],
  ["missing-csv-file.json", "missing-csv-file.json: storms[0].inflow.file", 'found "no-such-inflow.csv": no such file', "expected a readable CSV inflow file"],
  ["bad-csv-row.json", "bad-row-inflow.csv:5", 'found "seven"', "expected a flow (number)"],
  ["unknown-element-type.json", "unknown-element-type.json: outlet.elements[2].type", 'found "gate"', 'expected an element type: "orifice", "weir" or "regulator"'],
  ["two-storage-forms.json", "two-storage-forms.json: pond.storage", 'found "prismoid and stageArea"', "expected exactly one of prismoid, stageArea, stageStorage"],
  // A point 5,000 arrays deep: a user error naming the depth, not an internal error (stack overflow).
  ["deeply-nested.json", "deeply-nested.json: storms[0].inflow.series[0][0][0][0]", "found JSON nested 5,005 levels deep", "expected a case file nested at most 32 levels deep"],
];

const out = mkdtempSync(join(tmpdir(), "outfit-malformed-"));
afterAll(() => rmSync(out, { recursive: true, force: true }));

describe("malformed case files through `outfit route`", () => {
  it.each(cases)("%s", (file, where, found, expected) => {
    const target = join(out, `${file}.out`);
    const run = outfit("route", `${dir}/${file}`, "--json", "--out", target);
    expect(run.status).toBe(2);
    expect(run.stdout).toBe("");
    expect(looksLikeStackTrace(run.stderr)).toBe(false);
    expect(existsSync(target)).toBe(false);
    // The first problem is this file's own, on one line: where, found, expected.
    const lines = run.stderr.trim().split("\n");
    expect(lines[0]).toBe("outfit: error:");
    expect(lines[1]).toContain(`${where}: ${found}`);
    expect(lines[1]).toContain(expected);
  });

  it("each fixture is otherwise valid: a single problem is reported, except the unsorted table's follow-on", () => {
    for (const [file] of cases) {
      const lines = outfit("route", `${dir}/${file}`).stderr.trim().split("\n");
      expect(lines.length, file).toBe(file === "unsorted-table.json" ? 3 : 2);
    }
  });

  it("the valid file these fixtures were cut from routes (the fixtures fail for their own reason only)", () => {
    const run = outfit("route", `${dir}/../valid-base.json`, "--json");
    expect(run.status).toBe(0);
    const storms = JSON.parse(run.stdout).storms as { massBalanceError: number }[];
    expect(storms.length).toBe(2);
    for (const s of storms) expect(Math.abs(s.massBalanceError)).toBeLessThan(1e-4);
  });

  it("a file that is not JSON: file:line:column and the parser's words", () => {
    const run = outfit("route", `${dir}/../not-json.json`);
    expect(run.status).toBe(2);
    expect(looksLikeStackTrace(run.stderr)).toBe(false);
    expect(run.stderr).toMatch(/not-json\.json:\d+:\d+: found text that is not JSON \(.+\), expected a JSON case file/);
  });

  it("a case file that does not exist", () => {
    const run = outfit("route", "no/such/case.json");
    expect(run.status).toBe(2);
    expect(looksLikeStackTrace(run.stderr)).toBe(false);
    expect(run.stderr).toContain("no/such/case.json: found no such file, expected a readable case file (JSON)");
  });
});
