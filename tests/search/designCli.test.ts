// `outfit design` end to end through the built CLI: results and candidate case files are written,
// `outfit route` on a written candidate reproduces the reported peaks exactly, an infeasible case is
// explained in engineering terms, and a journal lets a run resume without losing finished work.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

const cli = join(process.cwd(), "dist/src/cli.js");
function outfit(...args: string[]) {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: "utf8" });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("outfit design", () => {
  it.each(["cases/si-headwall/case.json", "cases/si-wet-barrel/case.json", "cases/demo/case.json"])("%s: writes results and candidates that route again to exactly the reported peaks", (caseFile) => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-design-"));
    const run = outfit("design", caseFile, "--budget", "4000", "--top", "2", "--out", dir);
    expect(run.code).toBe(0);
    const results = JSON.parse(readFileSync(join(dir, "results.json"), "utf8"));
    expect(results.command).toBe("design");
    expect(results.candidates.length).toBeGreaterThan(0);
    const first = results.candidates[0];
    expect(first.compliant).toBe(true);
    expect(first.caseFile).toBe("candidate-01.json");
    // Every coefficient is written out in the candidate's outlet.
    for (const e of first.outlet.elements) expect(typeof e.coefficient).toBe("number");
    const routed = outfit("route", join(dir, first.caseFile), "--json");
    expect(routed.code).toBe(0);
    const again = JSON.parse(routed.stdout);
    again.storms.forEach((s: { peakOutflow: number; maxStage: number }, i: number) => {
      expect(s.peakOutflow).toBe(first.storms[i].peakOutflow);
      expect(s.maxStage).toBe(first.storms[i].maxStage);
    });
    expect(again.compliant).toBe(true);
    expect(existsSync(join(dir, "journal.jsonl"))).toBe(true);
  });

  it("explains an infeasible case in engineering terms and shows the closest candidates", () => {
    const run = outfit("design", "cases/infeasible/case.json", "--budget", "3000", "--json");
    expect(run.code).toBe(0);
    const results = JSON.parse(run.stdout);
    expect(results.search.success).toBe(false);
    expect(results.infeasible.join(" ")).toMatch(/smallest catalogue opening at the pond floor \(1 x 4 in orifice\) already passes/);
    expect(results.infeasible.join(" ")).toMatch(/smaller opening or a flow regulator, or add storage/);
  });

  it("resumes from its journal with a larger budget: the fitted layouts are replayed, their designs kept, and it goes further", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-resume-"));
    const first = outfit("design", "cases/small-compliant/case.json", "--budget", "2500", "--out", dir, "--json");
    expect(first.code).toBe(0);
    const journalLines = readFileSync(join(dir, "journal.jsonl"), "utf8").trim().split("\n").length;
    expect(journalLines).toBeGreaterThan(1);
    const second = outfit("design", "cases/small-compliant/case.json", "--budget", "5000", "--out", dir, "--resume", "--json");
    expect(second.code).toBe(0);
    const a = JSON.parse(first.stdout);
    const b = JSON.parse(second.stdout);
    // The first run's designs come back from the journal, so the best can only stay or improve.
    expect(b.candidates[0].cost).toBeLessThanOrEqual(a.candidates[0].cost);
    // Every layout of the first run came from the journal; the larger budget reached further.
    expect(b.search.layoutsFromJournal).toBe(a.search.layoutsFitted);
    expect(b.search.layoutsFitted).toBeGreaterThan(a.search.layoutsFitted);
  });

  it("runs on the demo variant whose storms are given by rainfall only", () => {
    const run = outfit("design", "cases/demo-rainfall/case.json", "--budget", "1500", "--top", "1", "--json");
    expect(run.code).toBe(0);
    const results = JSON.parse(run.stdout);
    expect(results.candidates.length).toBe(1);
    // Targets come from the pre-development peaks the hydrology derives.
    for (const s of results.candidates[0].storms) expect(s.target).toBeGreaterThan(0);
  });

  it.each(["route", "rate", "design", "report", "hydrograph"])("`%s --help` lists its options and shows an example", (command) => {
    const help = outfit(command, "--help");
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/Options:/);
    expect(help.stdout).toMatch(/Examples?:\n\s+outfit /);
  });

  it("refuses --out naming a file (exit 2, nothing written)", () => {
    const run = outfit("design", "cases/small-compliant/case.json", "--out", "package.json");
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/--out: found "package.json", expected a directory/);
    expect(run.stdout).toBe("");
  });

  it("refuses --resume with a journal of another case (exit 2, names the option)", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-resume-"));
    expect(outfit("design", "cases/small-compliant/case.json", "--budget", "500", "--out", dir).code).toBe(0);
    const other = outfit("design", "cases/si-headwall/case.json", "--budget", "500", "--out", dir, "--resume");
    expect(other.code).toBe(2);
    expect(other.stderr).toMatch(/--resume/);
    expect(other.stderr).not.toMatch(/at .*\.js:\d+/);
  });
});
