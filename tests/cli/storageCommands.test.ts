// The storage commands as a user meets them: help with examples, bad site input with exit 2.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { looksLikeStackTrace, outfit } from "./run.js";

const dir = mkdtempSync(join(tmpdir(), "outfit-storage-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("volume and pond", () => {
  it.each(["volume", "pond"])("`%s --help` shows its options and examples, exit 0", (command) => {
    const run = outfit(command, "--help");
    expect(run.status).toBe(0);
    expect(run.stdout).toContain(`Usage: outfit ${command} [options] <case>`);
    expect(run.stdout).toContain("--type <I|IA|II|III>");
    expect(run.stdout).toContain("Examples:");
  });

  it("`design --help` lists --size-pond with an example", () => {
    const run = outfit("design", "--help");
    expect(run.stdout).toContain("--size-pond");
    expect(run.stdout).toContain("outfit design cases/site-only/case.json --size-pond");
  });

  it("a bad site value: exit 2 naming the field, the value and what was expected, nothing written", () => {
    const c = JSON.parse(readFileSync("cases/site-only/case.json", "utf8"));
    c.site.maxDepth = -2;
    const file = join(dir, "bad.json");
    writeFileSync(file, JSON.stringify(c));
    const out = join(dir, "never.json");
    const run = outfit("pond", file, "--write", out);
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/site\.maxDepth: found -2, expected a length greater than zero/);
    expect(looksLikeStackTrace(run.stderr)).toBe(false);
    expect(() => readFileSync(out)).toThrow();
  });

  it("pond on a case without site limits: exit 2 naming the missing field", () => {
    const run = outfit("pond", "cases/demo/case.json");
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/site: found nothing \(the field is missing\), expected site limits/);
  });

  it("an underground case routes through the command line like any pond", () => {
    const run = outfit("route", "cases/underground/case.json", "--json");
    expect(run.status).toBe(0);
    const routed = JSON.parse(run.stdout);
    for (const s of routed.storms) expect(Math.abs(s.massBalanceError)).toBeLessThan(1e-3);
  });
});
