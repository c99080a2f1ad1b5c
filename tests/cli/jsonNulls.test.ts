// No null or non-finite number in any --json output of the bundled cases, but where the case-format
// contract documents a null (no target, no ratio or band without one, never drained) or a value may be
// absent (a source label, a check value not reached, the governing limit, the binding check).
import { readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { outfit } from "./run.js";

const DOCUMENTED = new Set(["target", "ratio", "withinTolerance", "drawdownHours", "value", "label", "governingLimit", "binding"]);

/** Paths of nulls outside the documented keys (JSON.parse turns no non-finite number back: they print as null). */
function nulls(value: unknown, path: string, allowed: ReadonlySet<string>, into: string[] = []): string[] {
  if (Array.isArray(value)) value.forEach((v, i) => nulls(v, `${path}[${i}]`, allowed, into));
  else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (v === null && !allowed.has(k)) into.push(`${path}.${k}`);
      else nulls(v, `${path}.${k}`, allowed, into);
    }
  }
  return into;
}

/** Each command on the bundled cases where it has something to say (hydrograph: storms from rainfall; pond: a site). */
const RUNS: [string, string, ...string[]][] = [
  // Every bundled case with an outlet to route.
  ...readdirSync("cases").filter((name) => !["infeasible", "si-headwall"].includes(name)).map((name): [string, string] => ["route", name]),
  ["rate", "demo"], ["rate", "si-wet-barrel"], ["rate", "underground"], ["rate", "cipolletti"],
  ["volume", "demo", "--type", "II"], ["volume", "underground"], ["volume", "rational"], ["volume", "site-only"],
  ["hydrograph", "demo-rainfall"], ["hydrograph", "rational"],
  ["pond", "site-only"],
];

describe("--json outputs hold no null where a number belongs", () => {
  it.each(RUNS)("%s %s", (command, name, ...options) => {
    const run = outfit(command, `cases/${name}/case.json`, ...options, "--json");
    expect(run.status).toBe(0);
    expect(nulls(JSON.parse(run.stdout), command, command === "route" ? DOCUMENTED : new Set(["label"]))).toEqual([]);
  });
  it("design and design --size-pond", () => {
    for (const args of [["cases/demo/case.json"], ["cases/site-only/case.json", "--size-pond"]]) {
      const run = outfit("design", ...args, "--budget", "1500", "--quiet", "--json");
      expect(run.status).toBe(0);
      expect(nulls(JSON.parse(run.stdout), "design", DOCUMENTED)).toEqual([]);
    }
  });
});
