// Output paths a user can get wrong are user errors (exit 2, the path named, nothing written),
// never internal errors (issue 11): a directory as --out, a path through a file, a special file
// system where Node's recursive mkdir never returns, and a design journal whose header is torn.
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { looksLikeStackTrace, outfit } from "./run.js";

const dir = mkdtempSync(join(tmpdir(), "outfit-outputs-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const CASE = "cases/small-compliant/case.json";

function expectUserError(run: ReturnType<typeof outfit>, where: string, found: string) {
  expect(run.status).toBe(2);
  expect(looksLikeStackTrace(run.stderr)).toBe(false);
  expect(run.stderr).not.toContain("internal error");
  expect(run.stderr).toContain(`${where}: found ${found}`);
}

describe("--out paths that cannot be written", () => {
  it("route --out naming a directory", () => {
    const target = join(dir, "a-directory");
    mkdirSync(target);
    expectUserError(outfit("route", CASE, "--out", target), target, "a directory");
    expect(readdirSync(target)).toEqual([]);
  });
  it("design --out under a file", () => {
    const file = join(dir, "plain-file");
    writeFileSync(file, "x");
    expectUserError(outfit("design", CASE, "--budget", "20", "--out", join(file, "run")), join(file, "run"), "a file where a directory is needed");
  });
  it("design --out /proc/x ends at once (Node's recursive mkdir spins there)", () => {
    if (!existsSync("/proc/self")) return; // no /proc on this system: nothing to reproduce
    expectUserError(outfit("design", CASE, "--budget", "20", "--out", "/proc/outfit-x"), "/proc/outfit-x", "no such file");
  });
  it("design --resume with a torn journal header: a warning, and the run goes on (no internal error)", () => {
    const run = join(dir, "torn");
    mkdirSync(run);
    writeFileSync(join(run, "journal.jsonl"), '{"signa');
    const r = outfit("design", CASE, "--budget", "20", "--out", run, "--resume");
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/warning: .*journal\.jsonl: line 1 is torn or corrupt .*\(the header\)/);
    expect(looksLikeStackTrace(r.stderr)).toBe(false);
    expect(readFileSync(join(run, "journal.jsonl"), "utf8").split("\n")[0]).toMatch(/^\{"journal":"outfit design",.*"signature":/);
  });
});

describe("terminal safety: control characters in user text are printed escaped", () => {
  it("an ANSI escape in the case and storm names reaches stdout and stderr as \\u001b", () => {
    const json = JSON.parse(readFileSync("tests/case/valid-base.json", "utf8"));
    json.name = "Pond \u001b[31mred\u001b[0m \u0007";
    json.storms[0].name = "2-yr\u001b]0;title\u0007";
    json["\u001b[2Jnote"] = 1;
    const file = join(dir, "escapes.json");
    writeFileSync(file, JSON.stringify(json));
    for (const args of [["route", file], ["route", file, "--json"], ["rate", file]]) {
      const r = outfit(...args);
      expect(r.status, args.join(" ")).toBe(0);
      expect(r.stdout + r.stderr).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
    }
    const r = outfit("route", file);
    expect(r.stdout).toContain("Pond \\u001b[31mred\\u001b[0m \\u0007");
    expect(r.stderr).toContain("\\u001b[2Jnote: field not in the case format");
  });
});
