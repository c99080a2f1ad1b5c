// Honest inputs (issue 11): each class of input that once ended in an internal error, a silent
// misreading, a non-finite number or a hang, reproduced in process through the loader.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { loadCase, parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { parseInflowCsv } from "../../src/case/csv.js";
import { editDistance, nearestKey } from "../../src/case/unknownFields.js";
import { costsSchema } from "../../src/case/schema.js";
import { FOOT, parseLength, parseNumber } from "../../src/units.js";

const BASE_FILE = "tests/case/valid-base.json";
const base = JSON.parse(readFileSync(BASE_FILE, "utf8")) as Record<string, any>;
const dir = mkdtempSync(join(tmpdir(), "outfit-inputs-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function variant(change: (c: Record<string, any>) => void) {
  const c = structuredClone(base);
  change(c);
  return c;
}
/** The CaseError a file value gives (fails the test when it loads). */
function problemOf(json: unknown, file = join(dir, "case.json")): string {
  try {
    parseCase(json, { file });
  } catch (error) {
    expect(error).toBeInstanceOf(CaseError);
    return (error as Error).message;
  }
  throw new Error("the case loaded");
}

describe("keys named like Object.prototype members are fields like any other", () => {
  for (const key of ["constructor", "toString", "__proto__", "hasOwnProperty", "valueOf"]) {
    it(`a field "${key}" is reported as unknown, not an internal error`, () => {
      const json = JSON.parse(JSON.stringify(base).replace('"bottom"', `"${key}": {"x": 1}, "bottom"`));
      const loaded = parseCase(json, { file: join(process.cwd(), BASE_FILE) });
      expect(loaded.notices.some((n) => n.includes(`pond.${key}: field not in the case format`))).toBe(true);
    });
    it(`a unit "${key}" is an unknown unit`, () => {
      expect(problemOf(variant((c) => (c.pond.top = `106 ${key}`)))).toContain(`pond.top: found "106 ${key}", expected a length`);
    });
  }
  it("an IDF curve named constructor is looked up as the file's own, not Object's", () => {
    const json = variant((c) => {
      c.hydrology = { post: { area: "5 ac", runoffCoefficient: 0.5, tc: 20 } };
      c.storms[0] = { name: "2-yr", returnPeriod: 2, target: 3, rainfall: { idf: "constructor" } };
    });
    expect(problemOf(json)).toContain('storms[0].rainfall.idf: found "constructor", expected the name of a curve in hydrology.idf (there is none)');
  });
  it("the schema's cost weights are the parts' (src/parts/cost.ts), then the pond's (src/sizing/pondCost.ts), in the order docs/case-format.md lists them", () => {
    expect(Object.keys(costsSchema.shape)).toEqual(["opening", "orificeDiameter", "weir", "weirLength", "level", "riser", "riserPerimeter", "barrel", "excavation", "fill", "land"]);
  });
});

describe("numbers: one parser, finite and bounded, for numbers and numeric strings", () => {
  it("rejects overflowing and underflowing text and numbers with the field named", () => {
    expect(problemOf(variant((c) => (c.pond.storage.prismoid.length = "1e999")))).toContain("pond.storage.prismoid.length: found \"1e999\"");
    expect(problemOf(variant((c) => (c.pond.storage.prismoid.length = "-1e999")))).toContain("pond.storage.prismoid.length");
    expect(problemOf(variant((c) => (c.storms[0].target = 5e-324)))).toContain("storms[0].target: found 5e-324");
    expect(problemOf(variant((c) => (c.storms[0].target = "1e-999 cfs")))).toContain("storms[0].target");
    expect(problemOf(variant((c) => (c.pond.top = 1e300)))).toContain("pond.top: found 1e+300");
  });
  it("parseNumber is the single reader: decimal text only, finite, within 1e-12..1e12", () => {
    expect(parseNumber("12.5")).toBe(12.5);
    expect(parseNumber("-3e2")).toBe(-300);
    for (const bad of ["1e999", "Infinity", "NaN", "0x10", "", " ", "1e-999", "12abc", "1,5"]) expect(parseNumber(bad), bad).toBeNull();
  });
  it("a target of zero is not an allowable release (the ratio would be undefined)", () => {
    expect(problemOf(variant((c) => (c.storms[0].target = 0)))).toContain("storms[0].target: found 0, expected an allowable peak outflow greater than zero");
  });
  it("an inflow spanning 1e308 minutes (or 60 days) is an error, not a hang", () => {
    expect(problemOf(variant((c) => c.storms[0].inflow.series.push([1e308, 0])))).toContain("storms[0].inflow.series");
    expect(problemOf(variant((c) => c.storms[0].inflow.series.push([60 * 1440, 0])))).toContain("an inflow spanning at most 30 days");
  });
});

describe("units where users write them", () => {
  const load = (change: (c: Record<string, any>) => void) => parseCase(variant(change), { file: join(process.cwd(), BASE_FILE) }).case;
  it("flows in cfs, L/s and m3/s (1 cfs = 0.3048^3 m3/s exactly)", () => {
    expect(load((c) => (c.storms[0].target = "6.5 cfs")).storms[0].target).toBeCloseTo(6.5 * FOOT ** 3, 12);
    expect(load((c) => (c.storms[0].target = "184 L/s")).storms[0].target).toBeCloseTo(0.184, 12);
    expect(load((c) => (c.storms[0].target = "0.18 m3/s")).storms[0].target).toBeCloseTo(0.18, 12);
    const s = load((c) => (c.storms[0].inflow.series[1][1] = "170 L/s")).storms[0];
    expect(s.inflow.flows[1]).toBeCloseTo(0.17, 12);
  });
  it("stage-area areas in ac, ha, m2 and ft2 (1 ac = 43,560 ft2)", () => {
    const c = load((c) => (c.pond.storage = { stageArea: [[99, "0.1 ac"], [103, "4356 ft2"], [104, 0.15 * 43560], [107, "0.0700 ha"]] }));
    if (c.pond.storage.kind !== "stageArea") throw new Error("not a stage-area pond");
    expect(c.pond.storage.areas[0]).toBeCloseTo(4356 * FOOT ** 2, 6);
    expect(c.pond.storage.areas[1]).toBeCloseTo(4356 * FOOT ** 2, 6);
    expect(c.pond.storage.areas[3]).toBeCloseTo(700, 6);
  });
  it("areas in different units are still checked for order after conversion", () => {
    const json = variant((c) => (c.pond.storage = { stageArea: [[99, "1 ac"], [107, "1000 m2"]] }));
    expect(problemOf(json)).toContain("pond.storage.stageArea[1][1]: found \"1000 m2\", expected area not decreasing");
  });
  it('"6 inch", "6 inches" and 6" are six inches', () => {
    for (const text of ["6 inch", "6 inches", '6"', "6in"]) expect(parseLength(text, "US")).toBeCloseTo(0.1524, 12);
  });
});

describe("misspelled known fields are errors with a suggestion; unknown ones notes", () => {
  it.each([
    [(c: Record<string, any>) => (c.criteria = { freeboard: { dept: 1 } }), "criteria.freeboard.dept", "depth"],
    [(c: Record<string, any>) => (c.criteria = { drawdown: { hour: 24 } }), "criteria.drawdown.hour", "hours"],
    [(c: Record<string, any>) => (c.criteria = { tolerence: { over: 0 } }), "criteria.tolerence", "tolerance"],
    [(c: Record<string, any>) => (c.outlet.elements[0].coefficent = 0.6), "outlet.elements[0].coefficent", "coefficient"],
    [(c: Record<string, any>) => (c.costs = { openings: 2 }), "costs.openings", "opening"],
    [(c: Record<string, any>) => (c.pond.permanentpool = 100), "pond.permanentpool", "permanentPool"],
  ])("%#", (change, path, near) => {
    expect(problemOf(variant(change))).toContain(`${path}: found the field`);
    expect(problemOf(variant(change))).toContain(`(did you mean ${near}?)`);
  });
  it("a misspelled required field is named with its suggestion before the missing field", () => {
    const message = problemOf(variant((c) => {
      c.outlet.elements[0].diamter = c.outlet.elements[0].diameter;
      delete c.outlet.elements[0].diameter;
    }));
    expect(message.split("\n")[0]).toContain("outlet.elements[0].diamter: found the field \"diamter\", expected a field of the case format (did you mean diameter?)");
  });
  it("a field far from every known name stays a note", () => {
    const loaded = parseCase(variant((c) => (c.comment = "invented test pond")), { file: join(process.cwd(), BASE_FILE) });
    expect(loaded.notices[0]).toContain("comment: field not in the case format, ignored");
  });
  it("edit distance: the optimal string alignment distance (Damerau 1964 transpositions)", () => {
    expect(editDistance("kitten", "sitting")).toBe(3); // the textbook Levenshtein example
    expect(editDistance("tolerence", "tolerance")).toBe(1);
    expect(editDistance("hosrs", "hours")).toBe(1);
    expect(nearestKey("dept", ["depth", "storm"])).toBe("depth");
    expect(nearestKey("x", ["y"])).toBeNull();
  });
});

describe("spreadsheet CSV exports", () => {
  it("semicolons with decimal commas (5;0,26) are read in full", () => {
    const r = parseInflowCsv("minutes;flow\n0;0\n5;0,26\n10;1,5\n15;0\n", "x.csv");
    if ("where" in r) throw new Error(r.expected);
    expect(r.flows).toEqual([0, 0.26, 1.5, 0]);
    expect(r.reading).toContain("separator semicolon");
  });
  it("a header Time (h),Flow (cfs) is hours and cfs; hh:mm times are clock times", () => {
    const r = parseInflowCsv("Time (h),Flow (cfs)\n0,0\n0.5,3\n1.25,0\n", "x.csv");
    if ("where" in r) throw new Error(r.expected);
    expect(r.times).toEqual([0, 30, 75]);
    expect(r.flowFactor).toBeCloseTo(FOOT ** 3, 15);
    expect(r.reading).toContain("times in hours");
    for (const h of ["hr", "hours", "HOURS", "time_h"]) {
      const q = parseInflowCsv(`${h},flow\n0,0\n2,1\n`, "x.csv");
      if ("where" in q) throw new Error(q.expected);
      expect(q.times[1], h).toBe(120);
    }
    const c = parseInflowCsv("time\tflow\n00:00\t0\n01:30\t2\n02:00:30\t0\n", "x.csv");
    if ("where" in c) throw new Error(c.expected);
    expect(c.times).toEqual([0, 90, 120.5]);
    expect(c.reading).toContain("separator tab");
  });
  it("rows with more cells than columns, unknown time units and ambiguous commas are errors at file:line", () => {
    expect(parseInflowCsv("t,q\n0,0\n5,0,26\n", "x.csv")).toMatchObject({ where: "x.csv:3" });
    expect(parseInflowCsv("Time (days),Q\n0,0\n1,1\n", "x.csv")).toMatchObject({ where: "x.csv:1" });
    expect(parseInflowCsv('minutes,flow\n0,0\n5,"0,26"\n', "x.csv")).toMatchObject({ where: "x.csv:3" });
    expect(parseInflowCsv("min,flow\n0,0\n5,1e999\n", "x.csv")).toMatchObject({ where: "x.csv:3" });
  });
  it("the case's notes say how an inflow file was read", () => {
    writeFileSync(join(dir, "sheet.csv"), "Zeit (min);Abfluss (cfs)\n0;0\n30;6,0\n60;12,5\n120;3,0\n240;0\n");
    const json = variant((c) => (c.storms[0].inflow = { file: "sheet.csv" }));
    writeFileSync(join(dir, "sheet-case.json"), JSON.stringify(json));
    const loaded = loadCase(join(dir, "sheet-case.json"));
    expect(Array.from(loaded.case.storms[0].inflow.flows).map((q) => q / FOOT ** 3)).toEqual([0, 6, 12.5, 3, 0].map((q) => expect.closeTo(q, 9)));
    expect(loaded.notices.join("\n")).toContain("sheet.csv: read with separator semicolon, decimal comma or point, times in minutes, flows in cfs");
  });
});
