// Seeded loader fuzz (issue 11, acceptance): 5,000 mutated case files through the loader and the
// `route` command's own output path, in process. For every file: no internal error (only a
// CaseError or UsageError may be thrown, which the CLI prints with exit 2); a user error names a
// field or file:line for every problem; an exit-0 output holds no NaN, Infinity or undefined and
// no null where a number belongs; and no file takes longer than a generous bound (a hang detector,
// not a speed test: `npm run bench` measures speed).
import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import seedrandom from "seedrandom";
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { isUserError } from "../../src/commands/common.js";
import { routeOutput } from "../../src/commands/route.js";

const MUTATIONS = 5000;
/** Seconds any one file may take (hang detector; a typical file takes milliseconds). */
const BOUND_SECONDS = 5;

interface Base {
  name: string;
  file: string;
  json: unknown;
  weight: number;
}
const BASES: Base[] = [
  { name: "valid-base", file: "tests/case/valid-base.json", weight: 6 },
  { name: "small-compliant", file: "cases/small-compliant/case.json", weight: 2 },
  { name: "demo (CSV inflows)", file: "cases/demo/case.json", weight: 1 },
].map((b) => ({ ...b, file: resolve(b.file), json: JSON.parse(readFileSync(b.file, "utf8")) as unknown }));
// A small hydrology base (cheaper to derive than the bundled 24-hour demo): a 3-hour hyetograph
// (NRCS), an IDF curve (rational) and sub-areas, on the valid base's pond.
const hydrologyBase = structuredClone(BASES[0].json) as Record<string, any>;
hydrologyBase.hydrology = {
  twoYearRainfall: "3.1 in",
  pre: { area: "6 ac", curveNumber: 65, runoffCoefficient: 0.3, tc: 30 },
  post: {
    parts: [{ name: "roofs", area: "2.5 ac", curveNumber: 98, runoffCoefficient: 0.9 }, { area: 3.5, curveNumber: 70, runoffCoefficient: 0.3 }],
    flowPath: [{ type: "sheet", length: 90, slope: 0.02, manningN: 0.15 }, { type: "shallow", length: 300, slope: 0.01, surface: "paved" }],
  },
  idf: { "10-yr": { table: [[10, "5.2 in/h"], [30, 3.1], [60, 2.0], [180, 0.9]] } },
};
hydrologyBase.storms = [
  { name: "2-yr", returnPeriod: 2, rainfall: { hyetograph: [[0, 0], [60, "0.4 in"], [90, 1.6], [180, 2.2]] } },
  { name: "10-yr", returnPeriod: 10, rainfall: { idf: "10-yr" } },
];
BASES.push({ name: "hydrology", file: BASES[0].file, json: hydrologyBase, weight: 1 });

const STRANGE_VALUES: unknown[] = [
  0, -1, 1, 0.5, -0.0, 1e308, -1e308, 5e-324, 1e-300, 1e15, 123456789, 2 ** 53, 3.7,
  "", " ", "0", "1e999", "-1e999", "1e-999", "NaN", "Infinity", "-Infinity", "6 in", "6 inches", '6"', "184 L/s", "0.56 ac",
  "6.5 cfs", "0,26", "12 furlongs", "constructor", "__proto__", "toString", "\u001b[31mred", "x".repeat(300),
  null, true, false, [], {}, [[0, 0]], [[0, 0], [1e308, 1]], [[0, "1e999"], [10, 1]], { constructor: 1 }, ["a", "b"],
];
const STRANGE_KEYS = ["constructor", "toString", "__proto__", "valueOf", "hasOwnProperty", "x", "note", "\u001b[2J"];

type Json = unknown;
type Holder = Record<string, Json> | Json[];

/** Every (holder, key) pair in a JSON value: where a mutation may strike. */
function places(value: Json, into: [Holder, string | number][] = []): [Holder, string | number][] {
  if (Array.isArray(value)) value.forEach((v, i) => (into.push([value, i]), places(v, into)));
  else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      into.push([value as Record<string, Json>, k]);
      places(v, into);
    }
  }
  return into;
}

function misspell(key: string, rng: () => number): string {
  if (key.length < 2) return key + "s";
  const i = Math.floor(rng() * key.length);
  const kind = Math.floor(rng() * 3);
  if (kind === 0) return key.slice(0, i) + key.slice(i + 1); // a letter dropped
  if (kind === 1) return key.slice(0, i) + key[i] + key.slice(i); // a letter doubled
  return key.toLowerCase(); // the case lost
}

function mutate(json: Json, rng: () => number): Json {
  const copy = structuredClone(json);
  const count = 1 + Math.floor(rng() * 3);
  for (let m = 0; m < count; m++) {
    const all = places(copy);
    if (all.length === 0) break;
    const [holder, key] = all[Math.floor(rng() * all.length)];
    const pick = <T>(list: T[]) => list[Math.floor(rng() * list.length)];
    const kind = Math.floor(rng() * 8);
    const value = (holder as Record<string, Json>)[key as string];
    if (kind <= 2) (holder as Record<string, Json>)[key as string] = structuredClone(pick(STRANGE_VALUES));
    else if (kind === 3 && typeof value === "number") (holder as Record<string, Json>)[key as string] = value * pick([-1, 10, 1e3, 1e-3, 0, 1e200]);
    else if (kind === 4) {
      if (Array.isArray(holder)) holder.splice(key as number, 1);
      else delete holder[key as string];
    } else if (kind === 5 && !Array.isArray(holder)) {
      const v = holder[key as string];
      delete holder[key as string];
      holder[misspell(key as string, rng)] = v;
    } else if (kind === 6 && !Array.isArray(holder)) {
      // JSON.parse makes "__proto__" an own key, as a user's file would.
      Object.assign(holder, JSON.parse(`{${JSON.stringify(pick(STRANGE_KEYS))}: ${JSON.stringify(pick(STRANGE_VALUES))}}`));
    } else if (Array.isArray(holder)) holder.push(structuredClone(holder[key as number]));
    else if (typeof value === "string") (holder as Record<string, Json>)[key as string] = value + pick([" in", " cfs", "e999", "\u0007", ""]);
  }
  return copy;
}

/** Keys that hold numbers in the unmutated bases' outputs: where a null would be a lost number. */
const NUMERIC_KEYS = new Set<string>();
function collectNumericKeys(value: Json): void {
  if (Array.isArray(value)) value.forEach(collectNumericKeys);
  else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (typeof v === "number") NUMERIC_KEYS.add(k);
      collectNumericKeys(v);
    }
  }
}
for (const base of BASES) {
  const loaded = parseCase(base.json, { file: base.file });
  collectNumericKeys(JSON.parse(routeOutput(loaded.case, "base", { json: true }).text));
}

/** Keys whose null means "none" in the contract (no target, no ratio without one, never drained). */
const NULLABLE = new Set(["target", "ratio", "withinTolerance", "drawdownHours", "limit", "slack", "value", "cost", "bestCost", "part", "storm", "binding"]);

/** Problems with an exit-0 JSON output: non-finite numbers or nulls where numbers belong. */
function badJson(value: Json, path: string, into: string[]): string[] {
  if (typeof value === "number" && !Number.isFinite(value)) into.push(`${path}: ${value}`);
  else if (Array.isArray(value)) value.forEach((v, i) => badJson(v, `${path}[${i}]`, into));
  else if (value && typeof value === "object") {
    const record = value as Record<string, Json>;
    for (const [k, v] of Object.entries(record)) {
      if (v === null && NUMERIC_KEYS.has(k) && !NULLABLE.has(k)) into.push(`${path}.${k}: null`);
      else badJson(v, `${path}.${k}`, into);
    }
    if ("ratio" in record && record.ratio === null && record.target !== null) into.push(`${path}.ratio: null with a target of ${String(record.target)}`);
  }
  return into;
}

/** The text with the file's own strings (a case named "NaN") taken out. */
function withoutUserText(text: string, json: Json): string {
  const strings: string[] = [];
  const collect = (v: Json) => {
    if (typeof v === "string") strings.push(v);
    else if (Array.isArray(v)) v.forEach(collect);
    else if (v && typeof v === "object") Object.values(v).forEach(collect);
  };
  collect(json);
  for (const s of strings.filter((s) => s.length > 0).sort((a, b) => b.length - a.length)) text = text.split(s).join("");
  return text;
}

describe(`seeded loader fuzz: ${MUTATIONS} mutated case files`, () => {
  it("no internal error, no NaN/Infinity/null in outputs, every user error names a field or file:line", () => {
    const rng = seedrandom("outfit loader fuzz");
    const totalWeight = BASES.reduce((s, b) => s + b.weight, 0);
    const tally = { loaded: 0, userErrors: 0, routed: 0 };
    const failures: string[] = [];
    let slowest = 0;
    for (let n = 0; n < MUTATIONS && failures.length < 5; n++) {
      let r = rng() * totalWeight;
      const base = BASES.find((b) => (r -= b.weight) < 0) ?? BASES[0];
      const json = mutate(base.json, rng);
      const label = "fuzz.json";
      const started = performance.now();
      try {
        const loaded = parseCase(json, { file: join(base.file, "..", label), label });
        tally.loaded++;
        const { text, code } = routeOutput(loaded.case, label, { json: n % 2 === 0 });
        expect([0, 1]).toContain(code);
        tally.routed++;
        if (n % 2 === 0) {
          const bad = badJson(JSON.parse(text), "", []);
          if (bad.length > 0) failures.push(`#${n} (${base.name}): ${bad.slice(0, 3).join("; ")}\n${JSON.stringify(json).slice(0, 400)}`);
        } else if (/\bNaN\b|Infinity|undefined/.test(withoutUserText(text, json))) {
          failures.push(`#${n} (${base.name}): text output with ${/\bNaN\b|Infinity|undefined/.exec(text)![0]}: ${/.*(\bNaN\b|Infinity|undefined).*/.exec(text)![0]}\n${JSON.stringify(json).slice(0, 600)}`);
        }
      } catch (error) {
        if (!isUserError(error)) {
          failures.push(`#${n} (${base.name}): internal error ${error instanceof Error ? error.stack?.split("\n").slice(0, 3).join(" ") : String(error)}\n${JSON.stringify(json).slice(0, 400)}`);
        } else {
          tally.userErrors++;
          if (error instanceof CaseError) {
            for (const p of error.problems) {
              if (!/^(fuzz\.json: \S.*|[^\s:]+\.csv(:\d+)?)$/.test(p.where) || !p.expected) failures.push(`#${n} (${base.name}): a problem that names no field or file:line: ${JSON.stringify(p)}`);
            }
          }
        }
      }
      const seconds = (performance.now() - started) / 1000;
      slowest = Math.max(slowest, seconds);
      if (seconds > BOUND_SECONDS) failures.push(`#${n} (${base.name}): ${seconds.toFixed(1)} s\n${JSON.stringify(json).slice(0, 400)}`);
    }
    console.log(`loader fuzz: ${JSON.stringify(tally)}, slowest file ${slowest.toFixed(2)} s`);
    expect(failures).toEqual([]);
    // The fuzz reaches both sides: many files load and route, many are rejected.
    expect(tally.routed).toBeGreaterThan(MUTATIONS * 0.1);
    expect(tally.userErrors).toBeGreaterThan(MUTATIONS * 0.1);
    expect(slowest).toBeLessThan(BOUND_SECONDS);
  }, 300_000);
});
