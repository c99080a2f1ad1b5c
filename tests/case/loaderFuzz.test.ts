// Seeded loader fuzz: 5,000 mutated case files (one in 40 with a value nested 33 to 20,000 levels
// deep) through the loader and the `route` command's own output path, in process (a share of them
// also through the storage commands' JSON: volume, and pond for a site). For every file: no internal
// error (only a CaseError or UsageError may be thrown, which the CLI prints with exit 2); a user error
// names a field or file:line for every problem; an exit-0 output holds no NaN, Infinity or undefined
// and no null but where the format documents one; and no file takes longer than a generous bound (a
// hang detector, not a speed test: `npm run bench` measures speed). The bases cover ponds, hydrology,
// a pond chosen from its site, an underground system with exfiltration and modified rational storms.
import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import seedrandom from "seedrandom";
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { isUserError } from "../../src/commands/common.js";
import { routeOutput } from "../../src/commands/route.js";
import type { Case } from "../../src/model.js";
import { caseEstimates } from "../../src/sizing/stormEstimates.js";
import { volumeJson } from "../../src/report/volume.js";
import { choosePond } from "../../src/sizing/pondChoice.js";
import { pondCostWeights } from "../../src/sizing/pondCost.js";
import { sitePond } from "../../src/case/site.js";
import { sizingJson } from "../../src/report/pondSizing.js";
import { exfiltratingChambers } from "../routing/support/ponds.js";

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
// The storage forms: a pond chosen from its site (no pond given), an underground system with
// structures above its top and exfiltration, and modified rational storms routed over their durations.
const SITE_BASE = {
  name: "Site base (invented)",
  units: "US",
  site: { floor: 20, maxDepth: 4, maxTopLength: 150, existingGrade: 23, embankment: { maxHeight: 2 }, groundwater: { seasonalHigh: 16, separation: 2 }, step: 2 },
  criteria: { freeboard: { depth: "0.5 ft" } },
  storms: [
    { name: "2-yr", returnPeriod: 2, target: 1.0, inflow: { series: [[0, 0], [15, 1.6], [30, 3.2], [50, 1.8], [80, 0.5], [120, 0]] } },
    { name: "25-yr", returnPeriod: 25, target: 6, inflow: { series: [[0, 0], [15, 3.7], [30, 7.5], [50, 4.2], [80, 1.2], [120, 0]] } },
  ],
  outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "4 in", invert: 20 }], spillway: { crest: 23.2, length: 8, sideSlope: 3 } },
};
// The exfiltrating chambers of the routing tests, with surface ponding above their manhole and a target.
const UNDERGROUND_BASE = structuredClone(exfiltratingChambers) as Record<string, any>;
UNDERGROUND_BASE.pond.storage.chambers.surfacePonding = { stageArea: [[32, 0], [32.2, 80]], limit: 32.1 };
UNDERGROUND_BASE.storms[0].target = 0.03;
const RATIONAL_BASE = JSON.parse(readFileSync("cases/rational/case.json", "utf8"));
BASES.push(
  { name: "site", file: BASES[0].file, json: SITE_BASE, weight: 1 },
  { name: "underground", file: BASES[0].file, json: UNDERGROUND_BASE, weight: 1 },
  { name: "rational", file: resolve("cases/rational/case.json"), json: RATIONAL_BASE, weight: 1 },
);

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

/** Depths of the deep-nesting mutation: just past the loader's limit, and far past it (the stack). */
const DEEP = [33, 64, 1000, 5000, 20000];

/** A value nested `depth` levels deep, arrays and objects alternating (built without recursion). */
function deeplyNested(depth: number, rng: () => number): Json {
  let value: Json = rng() < 0.5 ? 1 : "6 in";
  for (let d = 0; d < depth; d++) value = d % 2 === 0 ? [value] : { series: value };
  return value;
}

/** Whether a mutated file holds the deep-nesting mutation (set by `mutate`). */
let nestedDeep = false;

function mutate(json: Json, rng: () => number): Json {
  const copy = structuredClone(json);
  nestedDeep = false;
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
  // One file in 40: a value nested far deeper than any case (last, so nothing above walks it).
  if (rng() < 1 / 40) {
    const all = places(copy);
    const [holder, key] = all[Math.floor(rng() * all.length)];
    (holder as Record<string, Json>)[key as string] = deeplyNested(DEEP[Math.floor(rng() * DEEP.length)], rng);
    nestedDeep = true;
  }
  return copy;
}

/**
 * Keys whose null the formats document: "none" in the contract (no target, no ratio or band without
 * one, never drained; a check value not reached), and text or objects that may be absent (a source
 * label, the governing limit, the binding check). A null anywhere else is a lost number.
 */
const NULLABLE = new Set(["target", "ratio", "withinTolerance", "drawdownHours", "value", "label", "governingLimit", "binding"]);

/** Problems with an exit-0 JSON output: non-finite numbers, or nulls where the format promises a number. */
function badJson(value: Json, path: string, into: string[], nullable: ReadonlySet<string> = NULLABLE): string[] {
  if (typeof value === "number" && !Number.isFinite(value)) into.push(`${path}: ${value}`);
  else if (Array.isArray(value)) value.forEach((v, i) => badJson(v, `${path}[${i}]`, into, nullable));
  else if (value && typeof value === "object") {
    const record = value as Record<string, Json>;
    for (const [k, v] of Object.entries(record)) {
      if (v === null && !nullable.has(k)) into.push(`${path}.${k}: null`);
      else badJson(v, `${path}.${k}`, into, nullable);
    }
    if ("ratio" in record && record.ratio === null && record.target !== null) into.push(`${path}.ratio: null with a target of ${String(record.target)}`);
  }
  return into;
}

/** The estimates (`volume --json`) and, for a site, the chosen pond (`pond --json`) of a loaded case: no null at all. */
function storageOutputs(c: Case): Json[] {
  const inputs = c.storms.map(() => ({ group: "II/III" as const, rational: null }));
  const outputs: Json[] = [volumeJson(c, caseEstimates(c, inputs))];
  if (c.site && c.storms.some((s) => s.target !== null)) {
    const choice = choosePond({ site: c.site, criteria: c.criteria, spillway: c.outlet?.spillway, tailwater: c.tailwater, storms: c.storms, costs: pondCostWeights(c.units, c.costs) });
    const pond = sitePond(choice);
    outputs.push(sizingJson(c, choice, pond ? caseEstimates({ ...c, pond }, inputs) : []));
  }
  return outputs.map((o) => JSON.parse(JSON.stringify(o)) as Json);
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
    const tally = { loaded: 0, userErrors: 0, routed: 0, nestedDeep: 0 };
    const failures: string[] = [];
    let slowest = 0;
    for (let n = 0; n < MUTATIONS && failures.length < 5; n++) {
      let r = rng() * totalWeight;
      const base = BASES.find((b) => (r -= b.weight) < 0) ?? BASES[0];
      const json = mutate(base.json, rng);
      const label = "fuzz.json";
      const started = performance.now();
      const deep = nestedDeep;
      try {
        const loaded = parseCase(json, { file: join(base.file, "..", label), label });
        if (deep) failures.push(`#${n} (${base.name}): a value nested past the limit was accepted`);
        tally.loaded++;
        const { text, code } = routeOutput(loaded.case, label, { json: n % 2 === 0 });
        expect([0, 1]).toContain(code);
        tally.routed++;
        if (n % 2 === 0) {
          const bad = badJson(JSON.parse(text), "", []);
          // Every fourth routed case also through the storage commands' JSON (volume; pond for a site).
          if (tally.routed % 4 === 0) for (const out of storageOutputs(loaded.case)) badJson(out, "(storage)", bad, new Set());
          if (bad.length > 0) failures.push(`#${n} (${base.name}): ${bad.slice(0, 3).join("; ")}\n${JSON.stringify(json).slice(0, 400)}`);
        } else if (/\bNaN\b|Infinity|undefined/.test(withoutUserText(text, json))) {
          failures.push(`#${n} (${base.name}): text output with ${/\bNaN\b|Infinity|undefined/.exec(text)![0]}: ${/.*(\bNaN\b|Infinity|undefined).*/.exec(text)![0]}\n${JSON.stringify(json).slice(0, 600)}`);
        }
      } catch (error) {
        if (!isUserError(error)) {
          failures.push(`#${n} (${base.name}): internal error ${error instanceof Error ? error.stack?.split("\n").slice(0, 3).join(" ") : String(error)}\n${deep ? "(deeply nested)" : JSON.stringify(json).slice(0, 400)}`);
        } else {
          tally.userErrors++;
          if (deep) {
            tally.nestedDeep++;
            const nested = error instanceof CaseError && error.problems.some((p) => /JSON nested [\d,]+ levels deep/.test(p.found));
            if (!nested) failures.push(`#${n} (${base.name}): deep nesting not reported as such: ${error instanceof Error ? error.message.slice(0, 300) : String(error)}`);
          }
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
    // Deep nesting was reached and always rejected as a user error (exit 2, never an internal error).
    expect(tally.nestedDeep).toBeGreaterThan(MUTATIONS / 80);
    expect(slowest).toBeLessThan(BOUND_SECONDS);
  }, 300_000);
});
