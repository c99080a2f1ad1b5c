// The README's Slurm recipe, run for real: its job array of shards and its gather, taken from the
// README's own code blocks and submitted with sbatch to the cluster on this machine
// (`.ci/setup-slurm` starts a single-node one), end with exactly the ranking of one `design` run
// with the same seed and budget. Only the case, the budget, the shard count, the CPUs per task (the
// node has 2) and the places of the files are substituted. Where no cluster answers, the test is
// skipped and says why; under CI (CI=true) that is a failure instead, so CI always runs it.
import { afterAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { ROOT, outfit } from "../cli/run.js";
import { journalKeys } from "./helpers.js";

const CASE = "cases/small-compliant/case.json";
// Three parts of the search (one per 5,000 routings): one for each of the three shards.
const BUDGET = "15000";
const SHARDS = 3;
const SEED = "night";
/** How long the jobs may take before the test gives up and cancels them (they take well under a minute). */
const WAIT_MS = 8 * 60_000;
/** sinfo retries for up to a minute when it cannot read its configuration. */
const SINFO_MS = 20_000;
const UNDER_CI = process.env.CI === "true" || process.env.CI === "1";
const SETUP_HINT = "`bash .ci/setup-slurm` (as root) installs Debian's slurm-wlm and munge and starts a single-node cluster";

function run(command: string, args: string[], timeout = 60_000) {
  const r = spawnSync(command, args, { cwd: ROOT, encoding: "utf8", timeout });
  return { status: r.status, stdout: r.stdout ?? "", stderr: r.stderr ?? "", error: r.error };
}

/** Why no Slurm cluster can take the test's jobs here, or null when one can. */
function clusterProblem(): string | null {
  const missing = ["sbatch", "sinfo", "scontrol", "scancel"].filter((tool) => run("sh", ["-c", `command -v ${tool}`]).status !== 0);
  if (missing.length > 0) return `Slurm is not installed here (${missing.join(", ")} not on PATH); ${SETUP_HINT}`;
  const info = run("sinfo", ["-h", "-o", "%T"], SINFO_MS);
  if (info.status !== 0) {
    const timedOut = (info.error as NodeJS.ErrnoException | undefined)?.code === "ETIMEDOUT";
    const said = [timedOut ? `no answer within ${SINFO_MS / 1000} s` : "", info.stderr.trim().split("\n")[0] || `exit code ${info.status}`]
      .filter((s) => s !== "")
      .join(": ");
    return `sinfo fails, so no Slurm controller answers (${said}); ${SETUP_HINT}`;
  }
  const states = info.stdout.split(/\s+/).filter((s) => s !== "");
  if (!states.some((s) => ["idle", "mixed", "allocated", "completing"].includes(s))) {
    return `no node of the Slurm cluster takes jobs (sinfo: ${states.join(", ") || "no nodes"}); ${SETUP_HINT}`;
  }
  return null;
}

/** The two code blocks of the README's Slurm recipe: the job array's script and its submission. */
function readmeRecipe(): { script: string; submit: string } {
  const readme = readFileSync(join(ROOT, "README.md"), "utf8");
  const start = readme.indexOf("A Slurm job array");
  if (start < 0) throw new Error('README.md no longer has its Slurm recipe ("A Slurm job array ...")');
  const blocks = [...readme.slice(start).matchAll(/```sh\n([\s\S]*?)```/g)].slice(0, 2).map((m) => m[1]!);
  const [script, submit] = blocks;
  if (!script?.startsWith("#!/bin/bash\n") || !script.includes("#SBATCH --array=")) {
    throw new Error("the first block after the README's \"A Slurm job array\" is not the job array's script");
  }
  if (!submit?.includes("sbatch --dependency=afterok:$jobid")) {
    throw new Error("the second block after the README's \"A Slurm job array\" does not submit the gather after the array");
  }
  return { script, submit };
}

/** Replaces every `from` by `to`; a `from` the text does not hold means the README changed under the test. */
function substitute(text: string, replacements: [string, string][]): string {
  for (const [from, to] of replacements) {
    if (!text.includes(from)) throw new Error(`the README's Slurm recipe no longer holds "${from}": update this test's substitutions`);
    text = text.split(from).join(to);
  }
  return text;
}

interface JobRecord {
  task: string;
  state: string;
  reason: string;
  exitCode: string;
  /** Local times as scontrol prints them (2026-12-05T09:50:20), so they compare as strings. */
  start: string;
  end: string;
}

const field = (line: string, name: string) => new RegExp(`(?:^| )${name}=(\\S*)`).exec(line)?.[1] ?? "";

/** Every record scontrol holds for a job (one per array task); none once the job is forgotten. */
function jobRecords(id: string): JobRecord[] {
  const r = run("scontrol", ["show", "job", "-o", id]);
  if (r.status !== 0) return [];
  return r.stdout
    .split("\n")
    .filter((line) => line.startsWith("JobId="))
    .map((line) => ({
      task: field(line, "ArrayTaskId"),
      state: field(line, "JobState"),
      reason: field(line, "Reason"),
      exitCode: field(line, "ExitCode"),
      start: field(line, "StartTime"),
      end: field(line, "EndTime"),
    }));
}

const FINAL = new Set(["COMPLETED", "FAILED", "CANCELLED", "TIMEOUT", "NODE_FAIL", "OUT_OF_MEMORY", "BOOT_FAIL", "DEADLINE", "PREEMPTED"]);
const ended = (records: JobRecord[]) => records.length > 0 && records.every((r) => FINAL.has(r.state) || r.reason === "DependencyNeverSatisfied");
const describeJob = (records: JobRecord[]) =>
  records.map((r) => `${r.task && r.task !== "N/A" ? `task ${r.task}: ` : ""}${r.state} (exit ${r.exitCode}${r.reason && r.reason !== "None" ? `, ${r.reason}` : ""})`).join("; ") || "no record";

/** The jobs' output files, for a failure's message. */
function jobOutputs(runs: string): string {
  if (!existsSync(runs)) return "";
  return readdirSync(runs)
    .filter((f) => f.startsWith("slurm-"))
    .map((f) => `--- ${f} ---\n${readFileSync(join(runs, f), "utf8").slice(-3000)}`)
    .join("\n");
}

type Results = { search: Record<string, unknown>; candidates: Record<string, unknown>[] };
const readResults = (dir: string) => JSON.parse(readFileSync(join(dir, "results.json"), "utf8")) as Results;

const submitted: string[] = [];
let work: string | undefined;
let passed = false;

afterAll(() => {
  // Only the jobs this test submitted; scancel of a finished job is harmless.
  if (submitted.length > 0) run("scancel", submitted);
  if (work && passed) rmSync(work, { recursive: true, force: true });
});

describe("the README's Slurm recipe on a cluster", () => {
  it(`a job array of ${SHARDS} shards and the gather, submitted with sbatch, rank exactly as one design run`, async (ctx) => {
    const problem = clusterProblem();
    if (problem) {
      if (UNDER_CI) throw new Error(`CI must run the Slurm test, but ${problem}`);
      console.warn(`Slurm test skipped: ${problem}`);
      ctx.skip(problem);
    }
    const { script, submit } = readmeRecipe();
    work = mkdtempSync(join(tmpdir(), "outfit-slurm-"));
    const runs = join(work, "runs");
    const scriptFile = join(work, "shards.sh");
    // The jobs run in the project directory (where the README says to submit), where `npx outfit`
    // finds the built command; the case path is relative to it, the outputs go to the work folder.
    const common: [string, string][] = [
      ["site/case.json", CASE],
      ["--budget 800000", `--budget ${BUDGET}`],
      ["runs/", `${runs}/`],
    ];
    writeFileSync(
      scriptFile,
      substitute(script, [
        ...common,
        ["--array=1-8", `--array=1-${SHARDS}`],
        ['/8"', `/${SHARDS}"`],
        ["--cpus-per-task=4", "--cpus-per-task=1"],
      ]),
    );
    const submission = substitute(submit, [...common, ["mkdir -p runs\n", `mkdir -p ${runs}\n`], ["shards.sh", scriptFile]]);
    const sent = run("bash", ["-e", "-c", `${submission}\necho "shards: job $jobid"`]);
    expect(sent.status, `the submission failed:\n${sent.stdout}${sent.stderr}`).toBe(0);
    const shardsJob = /^shards: job (\d+)$/m.exec(sent.stdout)?.[1];
    const gatherJob = /^Submitted batch job (\d+)$/m.exec(sent.stdout)?.[1];
    expect(shardsJob, sent.stdout).toBeDefined();
    expect(gatherJob, sent.stdout).toBeDefined();
    submitted.push(shardsJob!, gatherJob!);

    // The single run to compare with, while the cluster works.
    const oneDir = join(work, "one");
    const one = outfit("design", CASE, "--budget", BUDGET, "--seed", SEED, "--workers", "1", "--quiet", "--json", "--out", oneDir);
    expect(one.status, one.stderr).toBe(0);
    const single = JSON.parse(one.stdout) as Results;

    // Wait for the gather to end (or to be held for good by a failed shard); scontrol keeps ended
    // jobs for MinJobAge (300 s by default), far longer than the one-second poll.
    const deadline = Date.now() + WAIT_MS;
    let shards = jobRecords(shardsJob!);
    let gather = jobRecords(gatherJob!);
    while (!ended(gather) && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 1000));
      shards = jobRecords(shardsJob!);
      gather = jobRecords(gatherJob!);
    }
    const story = `shards (job ${shardsJob}): ${describeJob(shards)}\ngather (job ${gatherJob}): ${describeJob(gather)}\n${jobOutputs(runs)}`;
    expect(ended(gather), `the jobs did not end within ${WAIT_MS / 60_000} min\n${story}`).toBe(true);
    expect(shards.map((r) => r.task).sort(), story).toEqual(Array.from({ length: SHARDS }, (_, i) => String(i + 1)));
    for (const record of shards) expect(`${record.state} ${record.exitCode}`, story).toBe("COMPLETED 0:0");
    expect(gather.map((r) => `${r.state} ${r.exitCode}`), story).toEqual(["COMPLETED 0:0"]);
    // The dependency held the gather until every task had ended.
    const lastShardEnd = shards.map((r) => r.end).sort().at(-1)!;
    expect(gather[0]!.start >= lastShardEnd, story).toBe(true);

    // Each task ran its own share of the same search.
    for (let k = 1; k <= SHARDS; k++) {
      const shard = readResults(join(runs, `shard-${k}`));
      expect(shard.search.shard).toBe(`${k}/${SHARDS}`);
      expect(shard.search.seed).toBe(SEED);
      expect(shard.search.budget).toBe(Number(BUDGET));
      expect(shard.search.parts).toBe(SHARDS);
      expect(shard.search.partsRun).toBe(1);
    }
    const gathered = readResults(join(runs, "all"));
    expect(gathered.search.seed).toBe(SEED);
    expect(gathered.search.budget).toBe(Number(BUDGET));
    // The shards did the single run's work between them, no more and no less, and the gather took
    // all of it from their journals, fitting nothing itself (a gather that ran early, or on the
    // wrong folders, would fit them itself).
    const inShards = Array.from({ length: SHARDS }, (_, i) => journalKeys(join(runs, `shard-${i + 1}`))).flat();
    expect([...inShards].sort()).toEqual([...journalKeys(oneDir)].sort());
    expect(gathered.search.layoutsFromJournal).toBe(inShards.length);
    expect(gathered.search.layoutsFitted).toBe(inShards.length);
    // The ranking is that of one run: the same candidates, in the same order, with the same
    // outlets, peaks, checks, costs and explanations.
    expect(single.candidates.length).toBeGreaterThan(0);
    expect(gathered.candidates).toEqual(single.candidates);
    passed = true;
  }, SINFO_MS + WAIT_MS + 120_000);
});
