// A case copied elsewhere (a candidate's case file under --out, a sized pond's --write) still points
// at the files the original named: its inflow files and its "$schema".
import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { rebaseCase } from "../../src/case/rebase.js";
import { ROOT, outfit } from "./run.js";

const dir = mkdtempSync(join(tmpdir(), "outfit-rebase-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Where a path written in a file in `fileDir` points. */
const target = (fileDir: string, path: string) => resolve(fileDir, path);

describe("rebaseCase", () => {
  it("makes relative paths point at the same files from the new directory, and leaves absolute paths and addresses alone", () => {
    const from = "/data/cases/north";
    const to = "/tmp/run/out";
    const copy: Record<string, unknown> = {
      $schema: "../../docs/case.schema.json",
      storms: [{ inflow: { file: "inflow-2yr.csv" } }, { inflow: { file: "/abs/inflow-10yr.csv" } }, { inflow: { series: [[0, 0]] } }],
    };
    rebaseCase(copy, from, to);
    expect(target(to, copy.$schema as string)).toBe("/data/docs/case.schema.json");
    const storms = copy.storms as { inflow: { file?: string } }[];
    expect(target(to, storms[0].inflow.file!)).toBe("/data/cases/north/inflow-2yr.csv");
    expect(storms[1].inflow.file).toBe("/abs/inflow-10yr.csv");
    expect(storms[2].inflow.file).toBeUndefined();

    const addressed: Record<string, unknown> = { $schema: "https://example.invalid/case.schema.json" };
    rebaseCase(addressed, from, to);
    expect(addressed.$schema).toBe("https://example.invalid/case.schema.json");
  });
});

describe("copied case files on disk", () => {
  it("design --out: each candidate's $schema and inflow files resolve from the output directory", () => {
    const out = join(dir, "deeper", "design-out");
    const run = outfit("design", "cases/demo/case.json", "--budget", "1500", "--top", "2", "--quiet", "--out", out);
    expect(run.status).toBe(0);
    const candidate = JSON.parse(readFileSync(join(out, "candidate-01.json"), "utf8"));
    expect(target(out, candidate.$schema)).toBe(resolve(ROOT, "docs/case.schema.json"));
    expect(existsSync(target(out, candidate.$schema))).toBe(true);
    const files = (candidate.storms as { inflow: { file: string } }[]).map((s) => target(out, s.inflow.file));
    expect(files).toContain(resolve(ROOT, "cases/demo/inflow-2yr.csv"));
    for (const f of files) expect(existsSync(f)).toBe(true);
    // The copy routes from where it is (its inflow files are found).
    expect(outfit("route", join(out, "candidate-01.json")).status).toBe(0);
  });

  it("pond --write: the written case's $schema resolves from where it is written", () => {
    const written = join(dir, "sized", "pond.json");
    const run = outfit("pond", "cases/site-only/case.json", "--write", written);
    expect([0, 1]).toContain(run.status);
    const copy = JSON.parse(readFileSync(written, "utf8"));
    expect(target(dirname(written), copy.$schema)).toBe(resolve(ROOT, "docs/case.schema.json"));
  });
});
