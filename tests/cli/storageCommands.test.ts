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

describe("an underground system ends at its top (cases/underground: stone top 51.60 m below the top of embankment 52.00 m)", () => {
  /** The rating's storage column by stage (rate --csv at a 0.1 m step). */
  const storageByStage = (file: string) => {
    const run = outfit("rate", file, "--stage-step", "0.1", "--csv");
    expect(run.status).toBe(0);
    return new Map(run.stdout.trim().split("\n").slice(1).map((line) => line.split(",").map(Number) as [number, number]).map(([z, s]) => [z.toFixed(1), s]));
  };
  const declared = JSON.parse(readFileSync("cases/underground/case.json", "utf8"));

  it("rate: above the stone only the declared manholes add storage, their plan areas times the rise (1.77 + 1.13 m2: 0.29 m3 per 0.1 m)", () => {
    const s = storageByStage("cases/underground/case.json");
    for (const z of ["51.7", "51.8", "51.9", "52.0"]) expect(s.get(z)! - s.get((Number(z) - 0.1).toFixed(1))!).toBeCloseTo(0.29, 2);
    // Below the top the stone and pipes take water at their own rate (far more than the manholes).
    expect(s.get("51.6")! - s.get("51.5")!).toBeGreaterThan(10);
  });

  it("rate: with nothing declared above the stone the storage does not grow there at all", () => {
    const bare = structuredClone(declared);
    delete bare.pond.storage.pipeGallery.structures;
    const file = join(dir, "bare-underground.json");
    writeFileSync(file, JSON.stringify(bare));
    const s = storageByStage(file);
    for (const z of ["51.7", "51.8", "51.9", "52.0"]) expect(s.get(z)).toBe(s.get("51.6"));
  });

  it("a storm routed past the system's top fails the surcharge check, and the output says how high the water rises and where", () => {
    const big = structuredClone(declared);
    big.storms[1].inflow.series = big.storms[1].inflow.series.map(([t, q]: [number, number]) => [t, q * 1.6]);
    const file = join(dir, "surcharged.json");
    writeFileSync(file, JSON.stringify(big));
    const json = JSON.parse(outfit("route", file, "--json").stdout);
    const check = json.checks.find((c: { key: string }) => c.key === "surcharge:50-yr");
    expect(check).toMatchObject({ passed: false, limit: 51.6 });
    const storm = json.storms.find((s: { name: string }) => s.name === "50-yr");
    expect(storm.aboveSystemTop).toBeCloseTo(storm.maxStage - 51.6, 9);
    expect(storm.surchargeWhere).toMatch(/MH-1/);
    const text = outfit("route", file).stdout;
    expect(text).toMatch(/50-yr no surcharge .* <= 51\.600 m .* FAIL/);
    expect(text).toMatch(/Above system top/);
  });
});
