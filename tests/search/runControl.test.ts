// The design run's infrastructure through the built CLI: the ranking is the same whatever the number
// of workers, shards or --top; a killed run resumes to exactly the uninterrupted ranking without
// losing or repeating a fitted layout; a damaged journal is reported and skipped; SIGINT writes the
// partial results and exits 3; stale candidate files go; --check exits 1 on an infeasible case.
import { afterEach, describe, expect, it } from "vitest";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { isLayoutLine, journalKeys, journalScreens } from "./helpers.js";

const cli = join(process.cwd(), "dist/src/cli.js");
const CASE = "cases/small-compliant/case.json";

function outfit(...args: string[]) {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: "utf8", timeout: 120_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const dir = (name: string) => mkdtempSync(join(tmpdir(), `outfit-${name}-`));
const ranking = (results: { candidates: { outlet: unknown; cost: number }[] }) => results.candidates.map((c) => JSON.stringify(c.outlet) + " " + c.cost);

const children: ChildProcess[] = [];
afterEach(() => {
  for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill("SIGKILL");
  children.length = 0;
});

/** Starts a run, waits until its journal holds `lines` entries, sends `signal`, and waits for the end. */
async function interrupt(args: string[], out: string, lines: number, signal: NodeJS.Signals) {
  const child = spawn(process.execPath, [cli, ...args], { stdio: ["ignore", "pipe", "pipe"] });
  children.push(child);
  let stdout = "";
  let stderr = "";
  child.stdout!.on("data", (d) => (stdout += d));
  child.stderr!.on("data", (d) => (stderr += d));
  const ended = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.on("exit", (code, sig) => resolve({ code, signal: sig })));
  const file = join(out, "journal.jsonl");
  while (child.exitCode === null) {
    // Fitted layouts' lines (a line being written may be torn: counted by its key's name, not parsed).
    if (existsSync(file) && (readFileSync(file, "utf8").match(/"key":/g) ?? []).length >= lines) break;
    await new Promise((r) => setTimeout(r, 20));
  }
  child.kill(signal);
  return { ...(await ended), stdout, stderr };
}

describe("design runs: determinism, interruption and recovery", () => {
  const BUDGET = "6000";
  let reference: ReturnType<typeof ranking> | undefined;
  const uninterrupted = () => {
    if (!reference) {
      const r = outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--json", "--quiet");
      expect(r.code).toBe(0);
      reference = ranking(JSON.parse(r.stdout));
    }
    return reference;
  };

  it("gives the same ranking on 1 and on 2 workers, and whatever --top", () => {
    const two = outfit("design", CASE, "--budget", BUDGET, "--workers", "2", "--json", "--quiet");
    expect(two.code).toBe(0);
    const results = JSON.parse(two.stdout);
    expect(results.search.workers).toBe(2);
    expect(ranking(results)).toEqual(uninterrupted());
    const one = outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--top", "1", "--json", "--quiet");
    expect(ranking(JSON.parse(one.stdout))).toEqual(uninterrupted().slice(0, 1));
  });

  it("does the same work on 1 and on 2 workers, through the widening's sampled layouts and on an existing outlet", () => {
    // small-compliant at 30,000 routings spends most of its budget scoring sampled layouts (on the
    // workers, in chunks); wet-value's existing outlet has parts no option list holds, and its
    // candidates' explanations and change lists are made on the workers.
    const work = (results: { search: Record<string, unknown>; candidates: Record<string, unknown>[]; baseline?: unknown }) => ({
      // The existing outlet's row: routed while the workers score the plan, after the parts in one thread.
      baseline: JSON.stringify(results.baseline ?? null),
      routings: results.search.routings,
      evaluations: results.search.evaluations,
      planned: results.search.layoutsPlanned,
      fitted: results.search.layoutsFitted,
      candidates: results.candidates.map((c) => JSON.stringify([c.outlet, c.cost, c.explanation, c.changes ?? null])),
    });
    for (const [file, budget] of [[CASE, "30000"], ["cases/wet-value/case.json", "6000"]]) {
      const [one, two] = ["1", "2"].map((workers) => {
        const r = outfit("design", file, "--budget", budget, "--workers", workers, "--top", "3", "--json", "--quiet");
        expect(r.code).toBe(0);
        return work(JSON.parse(r.stdout));
      });
      expect(one.candidates.length).toBeGreaterThan(0);
      expect(two).toEqual(one);
    }
  }, 240_000);

  it("resumes a SIGKILLed run: no fitted layout lost or repeated, the ranking of the uninterrupted run", async () => {
    const out = dir("kill");
    const killed = await interrupt(["design", CASE, "--budget", BUDGET, "--workers", "1", "--quiet", "--out", out], out, 6, "SIGKILL");
    expect(killed.signal).toBe("SIGKILL");
    expect(existsSync(join(out, "results.json"))).toBe(false);
    const before = journalKeys(out);
    expect(before.length).toBeGreaterThanOrEqual(6);
    const resumed = outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--quiet", "--out", out, "--resume", "--json");
    expect(resumed.code).toBe(0);
    const results = JSON.parse(resumed.stdout);
    expect(results.search.layoutsFromJournal).toBe(before.length);
    const after = journalKeys(out);
    expect(new Set(after).size).toBe(after.length);
    for (const key of before) expect(after).toContain(key);
    expect(after.length).toBe(results.search.layoutsFitted);
    expect(ranking(results)).toEqual(uninterrupted());
  });

  it("warns about a torn last line and a torn header, skips them and resumes to the same ranking", () => {
    const out = dir("torn");
    expect(outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--quiet", "--out", out).code).toBe(0);
    const file = join(out, "journal.jsonl");
    const lines = readFileSync(file, "utf8").split("\n").filter((l) => l !== "");
    // The header cut in half, the last entry cut short without its newline.
    lines[0] = lines[0].slice(0, 20);
    const last = lines.pop()!;
    writeFileSync(file, lines.join("\n") + "\n" + last.slice(0, last.length / 2));
    const resumed = outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--quiet", "--out", out, "--resume", "--json");
    expect(resumed.code).toBe(0);
    expect(resumed.stderr).toMatch(/warning: .*line 1 is torn or corrupt .*\(the header\)/);
    expect(resumed.stderr).toMatch(new RegExp(`warning: .*line ${lines.length + 1} is torn or corrupt .*fitted or scored again`));
    expect(resumed.stderr).not.toMatch(/internal error/);
    const results = JSON.parse(resumed.stdout);
    expect(results.search.layoutsFromJournal).toBe(lines.slice(1).filter(isLayoutLine).length);
    expect(ranking(results)).toEqual(uninterrupted());
    // The journal is whole again: a header and one entry per line.
    const again = readFileSync(file, "utf8").split("\n");
    expect(JSON.parse(again[0]).journal).toBe("outfit design");
    for (const line of again.slice(1, -1)) expect(() => JSON.parse(line)).not.toThrow();
  });

  it("resumes a journal of fits only (as written before verdicts and scored chunks were kept) to the same ranking, routing and scoring again", () => {
    const out = dir("bare");
    expect(outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--quiet", "--out", out).code).toBe(0);
    const file = join(out, "journal.jsonl");
    const lines = readFileSync(file, "utf8").split("\n").filter((l) => l !== "");
    const bare = lines.slice(1).filter(isLayoutLine).map((line) => {
      const { verdicts: _verdicts, ...rest } = JSON.parse(line) as Record<string, unknown>;
      return JSON.stringify(rest);
    });
    writeFileSync(file, [lines[0], ...bare].join("\n") + "\n");
    const resumed = outfit("design", CASE, "--budget", BUDGET, "--workers", "1", "--quiet", "--out", out, "--resume", "--json");
    expect(resumed.code).toBe(0);
    expect(resumed.stderr).toBe("");
    const results = JSON.parse(resumed.stdout);
    expect(results.search.layoutsFromJournal).toBe(bare.length);
    // The plan's and widenings' chunks were scored again: not every routing came from the journal.
    expect(results.search.routingsFromJournal).toBeLessThan(results.search.routings);
    expect(ranking(results)).toEqual(uninterrupted());
  });

  it.each(["SIGINT", "SIGTERM"] as const)("stops on %s with exit code 3, writing results.json and summary.txt of the partial run", async (signal) => {
    const out = dir("signal");
    const stopped = await interrupt(["design", CASE, "--budget", "400000", "--workers", "2", "--out", out], out, 4, signal);
    expect(stopped.code).toBe(3);
    const results = JSON.parse(readFileSync(join(out, "results.json"), "utf8"));
    expect(results.search.interrupted).toBe(true);
    expect(results.search.stoppedBecause).toBe(`it was interrupted by ${signal}`);
    expect(results.search.layoutsFitted).toBeGreaterThanOrEqual(4);
    expect(results.search.routings).toBeLessThan(400000);
    expect(results.search.layoutsFitted).toBe(journalKeys(out).length);
    const summary = readFileSync(join(out, "summary.txt"), "utf8");
    expect(summary).toContain(`stopped because it was interrupted by ${signal} (a partial run: --resume goes on from its journal)`);
    expect(summary).toMatch(/Caution:/);
  });

  it("3 shards divide the work of one run exactly; the gather fits nothing and gives its very ranking", () => {
    // 15,000 routings: three parts of the search (search/engine/partition.ts), one per shard.
    const budget = "15000";
    const single = dir("single");
    const one = outfit("design", CASE, "--budget", budget, "--workers", "1", "--quiet", "--out", single, "--json");
    expect(one.code).toBe(0);
    const oneRun = JSON.parse(one.stdout);
    expect(oneRun.search.parts).toBe(3);
    const shards = [1, 2, 3].map((k) => {
      const out = dir(`shard-${k}`);
      const r = outfit("design", CASE, "--budget", budget, "--shard", `${k}/3`, "--workers", "1", "--quiet", "--out", out, "--json");
      expect(r.code).toBe(0);
      const results = JSON.parse(r.stdout);
      const search = results.search;
      expect(search.shard).toBe(`${k}/3`);
      expect(search.partsRun).toBe(1);
      // An intermediate result, and says so: the existing outlet, the moves that relax each binding
      // check and the spread are left to the gather (the binding check and why are given).
      expect(search.leftToGather).toEqual(["baseline", "relax", "spread"]);
      expect(results.baseline).toBeUndefined();
      for (const c of results.candidates) {
        expect(c.spread).toBeUndefined();
        expect(c.binding.why).not.toBe("");
        expect(c.explanation.at(-1)).toBe("relax: explained when gathered (outfit gather)");
      }
      expect(readFileSync(join(out, "summary.txt"), "utf8")).toMatch(new RegExp(`Shard ${k}/3 of a divided search: an intermediate result, ranked among this shard's parts alone`));
      if (k === 1) {
        // So does the report on its results directory.
        const md = join(out, "report.md");
        expect(outfit("report", out, "--format", "md", "--out", md).code).toBe(0);
        expect(readFileSync(md, "utf8")).toContain("1/3 of a divided search: an intermediate result, ranked among its own parts alone; outfit gather with every shard's results directory gives the ranking of one run and adds the existing outlet routed and assessed, the moves that relax each candidate's binding check and each candidate's spread.");
      }
      return out;
    });
    const keys = shards.map(journalKeys);
    // The shards' shares do not overlap, each holds work, and together they are the single run's.
    expect(new Set(keys.flat()).size).toBe(keys.flat().length);
    for (const k of keys) expect(k.length).toBeGreaterThan(0);
    expect([...keys.flat()].sort()).toEqual([...journalKeys(single)].sort());
    const gathered = outfit("gather", CASE, ...shards, "--budget", budget, "--workers", "1", "--quiet", "--json");
    expect(gathered.code).toBe(0);
    const results = JSON.parse(gathered.stdout);
    expect(results.search.layoutsFitted).toBe(oneRun.search.layoutsFitted);
    expect(results.search.layoutsFromJournal).toBe(results.search.layoutsFitted);
    // Nor did it score a plan or a widening again: every routing it counts came from the shards'
    // journals (their fits and their scored chunks of layouts), and the count is the single run's.
    for (const out of shards) expect(journalScreens(out)).toBeGreaterThan(0);
    expect(results.search.routings).toBe(oneRun.search.routings);
    expect(results.search.routingsFromJournal).toBe(results.search.routings);
    expect(oneRun.search.routingsFromJournal).toBe(0);
    expect(ranking(results)).toEqual(ranking(oneRun));
    // The gather gives what the shards left to it, as the single run does.
    expect(results.search.leftToGather).toBeUndefined();
    expect(oneRun.baseline).toBeDefined();
    expect(results.baseline).toEqual(oneRun.baseline);
    expect(results.candidates.map((c: { explanation: string[] }) => c.explanation)).toEqual(oneRun.candidates.map((c: { explanation: string[] }) => c.explanation));
    expect(results.candidates.map((c: { spread: unknown }) => c.spread)).toEqual(oneRun.candidates.map((c: { spread: unknown }) => c.spread));
  });

  it("a gather fits what a missing shard would have, and nothing else", () => {
    const budget = "15000";
    const shards = [1, 3].map((k) => {
      const out = dir(`shard-${k}`);
      expect(outfit("design", CASE, "--budget", budget, "--shard", `${k}/3`, "--workers", "1", "--quiet", "--out", out).code).toBe(0);
      return out;
    });
    const held = shards.flatMap(journalKeys).length;
    const all = dir("gather");
    const gathered = outfit("gather", CASE, ...shards, "--budget", budget, "--workers", "1", "--quiet", "--json", "--out", all);
    expect(gathered.code).toBe(0);
    const search = JSON.parse(gathered.stdout).search;
    expect(search.layoutsFromJournal).toBe(held);
    const shard2 = dir("shard-2");
    expect(outfit("design", CASE, "--budget", budget, "--shard", "2/3", "--workers", "1", "--quiet", "--out", shard2).code).toBe(0);
    // What the gather fitted itself is exactly shard 2's share.
    expect(search.layoutsFitted - search.layoutsFromJournal).toBe(journalKeys(shard2).length);
  });

  it("removes the candidate files of an earlier run in the same --out directory", () => {
    const out = dir("stale");
    expect(outfit("design", CASE, "--budget", "1500", "--top", "3", "--quiet", "--out", out).code).toBe(0);
    expect(readdirSync(out).filter((f) => f.startsWith("candidate-")).length).toBe(3);
    const second = outfit("design", CASE, "--budget", "1500", "--top", "1", "--out", out);
    expect(second.code).toBe(0);
    expect(readdirSync(out).filter((f) => f.startsWith("candidate-")).sort()).toEqual(["candidate-01.json"]);
    expect(second.stderr).toMatch(/removed candidate-01\.json, candidate-02\.json, candidate-03\.json|removed .*candidate-03\.json/);
  });

  it("--check exits 1 when nothing is compliant; the closest candidates are shown with their failing checks", () => {
    const r = outfit("design", "cases/infeasible/case.json", "--budget", "2000", "--check", "--quiet");
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/No compliant design was found; the closest candidates, with the checks they fail:/);
    expect(r.stdout).toMatch(/^  fails: /m);
    const ok = outfit("design", CASE, "--budget", "1500", "--check", "--quiet");
    expect(ok.code).toBe(0);
  });

  it("refuses a bad budget, shard or worker count (exit 2, names the option)", () => {
    for (const [option, value] of [["--budget", "ten"], ["--budget", "5x"], ["--shard", "4/3"], ["--workers", "0"]]) {
      const r = outfit("design", CASE, option, value, "--out", dir("bad"));
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(new RegExp(`${option}: found "${value}"`));
    }
  });
});

describe("time budgets", () => {
  it("a time budget is spent: the run goes on widening until the time is used", () => {
    // The demo's catalogue is too large to list (over 5000 layouts), so it is never declared exhausted.
    const r = outfit("design", "cases/demo/case.json", "--budget", "4s", "--workers", "1", "--quiet", "--json");
    expect(r.code).toBe(0);
    const search = JSON.parse(r.stdout).search;
    expect(search.timeBudget).toBe(4);
    // No routing budget with a time budget: the key is left out (no null where a number belongs).
    expect(search).not.toHaveProperty("budget");
    expect(search.stoppedBecause).toBe("the time budget of 4 s was used");
    expect(search.seconds).toBeGreaterThanOrEqual(4);
  });

  it("stops early only on a catalogue it has exhausted, and says so", () => {
    const json = JSON.parse(readFileSync(CASE, "utf8"));
    json.name = "Tiny catalogue (invented)";
    json.catalogue = { orifice: { diameters: ["2 in", "3 in", "4 in"], maxCount: 1 }, riser: { diameters: [3] }, maxStages: 2, elevationStep: 0.05 };
    const file = join(dir("tiny"), "case.json");
    writeFileSync(file, JSON.stringify(json));
    const r = outfit("design", file, "--budget", "10m", "--workers", "1", "--quiet", "--json");
    expect(r.code).toBe(0);
    const search = JSON.parse(r.stdout).search;
    expect(search.stoppedBecause).toMatch(/^the catalogue is exhausted: all \d+ layouts it allows were fitted \(those found wanting again with up to 9 times the starts\) or bounded out by cost$/);
    expect(search.seconds).toBeLessThan(600);
    const total = Number(/all (\d+) layouts/.exec(search.stoppedBecause)![1]);
    expect(search.layoutsFitted + search.layoutsSkippedByCost).toBeGreaterThanOrEqual(total);
  });
});
