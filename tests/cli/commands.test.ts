// The built command line as a user meets it: help with examples, usage errors with exit code 2,
// the demo routed end to end.
import { mkdtempSync, readFileSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { looksLikeStackTrace, outfit } from "./run.js";

const out = mkdtempSync(join(tmpdir(), "outfit-cli-"));
afterAll(() => rmSync(out, { recursive: true, force: true }));

describe("help", () => {
  it.each(["route", "rate"])("`%s --help` shows its options and an example, exit 0", (command) => {
    const run = outfit(command, "--help");
    expect(run.status).toBe(0);
    expect(run.stdout).toContain(`Usage: outfit ${command} [options] <case>`);
    expect(run.stdout).toContain("Examples:");
    expect(run.stdout).toContain(`outfit ${command} cases/demo/case.json`);
  });

  it("`--help` lists the commands, exit 0", () => {
    const run = outfit("--help");
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/route \[options\] <case>/);
    expect(run.stdout).toMatch(/rate \[options\] <case>/);
  });
});

describe("usage errors exit 2 without a stack trace", () => {
  const usage: [string, string[], string][] = [
    ["no case file given", ["route"], "missing required argument 'case'"],
    ["an unknown option", ["route", "cases/demo/case.json", "--bogus"], "unknown option '--bogus'"],
    ["an unknown command", ["frobnicate"], "unknown command 'frobnicate'"],
    ["a step that is not a number", ["route", "cases/demo/case.json", "--step", "abc"], '--step: found "abc", expected a number greater than zero'],
    ["a rating step that is not a length", ["rate", "cases/demo/case.json", "--stage-step", "ten"], '--stage-step: found "ten", expected a length greater than zero'],
  ];
  it.each(usage)("%s", (_name, args, message) => {
    const run = outfit(...args);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain(message);
    expect(looksLikeStackTrace(run.stderr)).toBe(false);
  });
});

describe("the demo case end to end", () => {
  it("routes every storm with a mass balance error below 0.01 % (JSON written whole with --out)", () => {
    const target = join(out, "route.json");
    const run = outfit("route", "cases/demo/case.json", "--json", "--out", target);
    expect(run.status).toBe(0);
    expect(run.stderr).toContain(`wrote ${target}`);
    const json = JSON.parse(readFileSync(target, "utf8"));
    expect(json.storms.map((s: { name: string }) => s.name)).toEqual(["2-yr", "10-yr", "100-yr"]);
    for (const s of json.storms) {
      expect(Math.abs(s.massBalanceError)).toBeLessThan(1e-4);
      expect(s.peakOutflow).toBeGreaterThan(0);
      expect(s.peakOutflow).toBeLessThan(s.peakInflow);
    }
    // No temporary file left beside the output.
    expect(readdirSync(out)).toEqual(["route.json"]);
  });

  it("--step fixes the step; --verbose says how the steps were chosen", () => {
    const fixed = JSON.parse(outfit("route", "cases/demo/case.json", "--json", "--step", "1").stdout);
    const automatic = JSON.parse(outfit("route", "cases/demo/case.json", "--json").stdout);
    for (let i = 0; i < 3; i++) {
      expect(fixed.storms[i].peakOutflow / automatic.storms[i].peakOutflow).toBeCloseTo(1, 2);
      expect(fixed.storms[i].steps).toBeGreaterThan(automatic.storms[i].steps);
    }
    const verbose = outfit("route", "cases/demo/case.json", "--verbose");
    expect(verbose.status).toBe(0);
    expect(verbose.stdout).toMatch(/mass balance error/);
  });
});
