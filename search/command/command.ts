// `outfit design` and `outfit gather`: load, search (on worker threads, in rounds, journalled), print,
// and write results and candidate case files whole. Signals stop the run gracefully.
import { existsSync, readdirSync, rmSync, statSync } from "node:fs";
import { join, resolve } from "node:path";
import { availableParallelism } from "node:os";
import { emit, load, positiveNumber, UsageError } from "../../src/commands/common.js";
import { makeDirectory, printErr, writeFileAtomic } from "../../src/io.js";
import { buildProblem, type DesignLimits } from "../engine/problem.js";
import { KEPT, runSearch, type JournalEntry } from "../engine/run.js";
import { candidateCase, candidateCaseName, designJson, designText } from "../report/report.js";
import { createHash } from "node:crypto";
import { Journal, JOURNAL_VERSION, readJournal } from "./journal.js";
import type { ScoreOutcome } from "../engine/scoring.js";
import { ProgressReporter } from "../report/progress.js";
import { AdaptiveFitter, SPREAD_SECONDS, SYSTEM_SPREAD_SECONDS, WorkerFitter, worthSpreading, type RunSoFar } from "../parallel/pool.js";
import { InlineFitter, type LayoutFitter } from "../engine/fitter.js";

/** Exit code of a run stopped by SIGINT or SIGTERM (results of the work done are written). */
export const EXIT_INTERRUPTED = 3;
/** Exit code of `--check` when no compliant design was found. */
export const EXIT_NOT_COMPLIANT = 1;
import { layoutFor } from "../../src/report/terminal.js";
import { pondDesignCommand } from "./pondCommand.js";
import type { DesignCommandOptions } from "./commandOptions.js";

/** The value-engineering options: what may change in the existing outlet, and the ranking. */
export function designLimits(options: DesignCommandOptions): DesignLimits {
  const vary = options.vary ?? "all";
  if (vary !== "all" && vary !== "openings" && vary !== "elevations") throw new UsageError("--vary", vary, '"all", "openings" or "elevations"');
  const rankBy = options.rank ?? "cost";
  if (rankBy !== "cost" && rankBy !== "change" && rankBy !== "robust") throw new UsageError("--rank", rankBy, '"cost", "change" or "robust"');
  return { vary, keepRiser: options.keepRiser === true, keepBarrel: options.keepBarrel === true, rankBy };
}

/** `--budget`: a number of routings, or a time such as 90s, 20m or 8h (seconds). */
export function parseBudget(text: string): { routings: number; seconds?: number } {
  const time = /^(\d+(?:\.\d+)?)\s*(s|m|h)$/.exec(text.trim());
  if (time) {
    const seconds = Number(time[1]) * { s: 1, m: 60, h: 3600 }[time[2] as "s" | "m" | "h"];
    if (seconds > 0) return { routings: Infinity, seconds };
  }
  const routings = Number(text);
  if (/^\d+$/.test(text.trim()) && routings > 0) return { routings };
  throw new UsageError("--budget", text, "a number of routings greater than zero (e.g. 20000) or a time such as 90s, 20m or 8h");
}

/** `--shard k/n`: shard k (from 1) of n. */
export function parseShard(text: string): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || count < 1 || index < 1 || index > count) throw new UsageError("--shard", text, "k/n with 1 <= k <= n, e.g. 2/3 for the second of three shards");
  return { index, count };
}

/** The files of an earlier run's output that this run replaces: candidate-NN.json above `keep`, and (keep 0) its results. */
function removeStale(dir: string, keep: number): string[] {
  if (!existsSync(dir)) return [];
  const removed: string[] = [];
  for (const name of readdirSync(dir)) {
    const m = /^candidate-(\d+)\.json$/.exec(name);
    if ((m && Number(m[1]) > keep) || (keep === 0 && (name === "results.json" || name === "summary.txt"))) {
      rmSync(join(dir, name), { force: true });
      removed.push(name);
    }
  }
  return removed;
}

export async function designCommand(path: string, options: DesignCommandOptions): Promise<number> {
  if (options.sizePond) return pondDesignCommand(path, options);
  const loaded = load(path, options.quiet === true);
  const c = loaded.case;
  const margin = positiveNumber("--margin", options.margin);
  const limits = designLimits(options);
  const problem = buildProblem(c, loaded.data, { margin: margin === undefined ? undefined : margin / 100 }, limits);
  if (limits.rankBy === "change" && !problem.existing) throw new UsageError("--rank", "change", "a case with an existing outlet (openings or a riser) to measure changes against");
  const top = Math.round(positiveNumber("--top", options.top) ?? 5);
  if (top > KEPT) throw new UsageError("--top", String(options.top), `at most ${KEPT} (the candidates the ranking keeps)`);
  const seed = options.seed ?? "outfit";
  const budget = parseBudget(options.budget ?? "20000");
  const starts = Math.round(positiveNumber("--starts", options.starts) ?? 3);
  // Without --workers: all cores once the rest of the run is long enough to gain from them (AdaptiveFitter).
  const chosenWorkers = positiveNumber("--workers", options.workers);
  const workers = Math.round(chosenWorkers ?? availableParallelism());
  const shard = options.shard === undefined ? undefined : parseShard(options.shard);
  if (options.out && existsSync(options.out) && !statSync(options.out).isDirectory()) {
    throw new UsageError("--out", options.out, "a directory for the results (this is a file)");
  }
  if (options.resume && !options.out) throw new UsageError("--resume", "without --out", "--out DIR naming the directory of the run to resume");
  if (shard && !options.out) throw new UsageError("--shard", options.shard!, "--out DIR too: a shard's journal is what `outfit gather` combines");
  const journalPath = options.out ? join(options.out, "journal.jsonl") : undefined;
  const signature = createHash("sha256").update(JSON.stringify({ journal: JOURNAL_VERSION, json: loaded.json, seed, margin: problem.options.margin, starts, ...(limits.vary !== "all" || limits.keepRiser || limits.keepBarrel || limits.rankBy !== "cost" ? { limits } : {}) })).digest("hex").slice(0, 16);
  const done = new Map<string, JournalEntry>();
  const screens = new Map<string, ScoreOutcome>();
  const warn = (text: string) => printErr(`outfit: warning: ${text}\n`);
  const sources: [string, string][] = [];
  if (options.resume && journalPath && existsSync(journalPath)) sources.push([journalPath, "--resume"]);
  for (const dir of options.gather ?? []) {
    const file = join(dir, "journal.jsonl");
    if (!existsSync(file)) throw new UsageError("gather", dir, "the output directory of a shard run (outfit design --shard k/n --out DIR), holding journal.jsonl");
    sources.push([file, "gather"]);
  }
  for (const [file, option] of sources) {
    const read = readJournal(file, signature, option);
    read.warnings.forEach(warn);
    for (const [key, entry] of read.entries) if (!done.has(key)) done.set(key, entry);
    for (const [key, outcome] of read.screens) if (!screens.has(key)) screens.set(key, outcome);
  }
  let journal: Journal | undefined;
  if (options.out && journalPath) {
    makeDirectory(options.out);
    if (!options.resume) {
      const removed = removeStale(options.out, 0);
      if (removed.length > 0) warn(`removed ${removed.join(", ")} of an earlier run in ${options.out}`);
    }
    // Written whole (the entries read, none damaged), so appending starts on a clean line.
    journal = new Journal(journalPath, signature, done.values(), screens);
  }

  let stopReason: string | null = null;
  const onSignal = (signal: NodeJS.Signals) => {
    if (stopReason !== null) process.exit(EXIT_INTERRUPTED);
    stopReason = `it was interrupted by ${signal}`;
    if (!options.quiet) printErr(`\noutfit: ${signal}: finishing the layouts in flight, then writing the results (again to stop at once)\n`);
  };
  process.on("SIGINT", onSignal);
  process.on("SIGTERM", onSignal);
  const progress = options.quiet ? undefined : new ProgressReporter(process.stderr, budget);
  const settings = { seed, starts };
  const source = { path: resolve(path), margin: problem.options.margin, limits, hydrographs: loaded.hydrographs };
  let soFar: RunSoFar = { routings: 0, seconds: 0 };
  // A shard runs its share of the search's parts, each with the part's share of the whole budget.
  const runBudget = { routings: budget.routings, seconds: budget.seconds };
  const fitter: LayoutFitter =
    chosenWorkers === undefined
      ? new AdaptiveFitter(problem, source, settings, workers, () => worthSpreading(soFar, runBudget, problem.system ? SYSTEM_SPREAD_SECONDS : SPREAD_SECONDS))
      : workers > 1
        ? new WorkerFitter(problem, source, settings, workers)
        : new InlineFitter(problem, settings);
  let run;
  try {
    run = await runSearch(problem, {
      seed,
      budget: runBudget.routings,
      timeBudget: budget.seconds,
      timeLimit: positiveNumber("--time", options.time),
      top,
      starts,
      beam: Math.round(positiveNumber("--beam", options.beam) ?? 3),
      done,
      screens,
      fitter,
      shard,
      interrupt: () => stopReason,
      // Finished work is kept: each fitted layout is appended to the journal as soon as it is done.
      onLayout: (entry) => journal?.append(entry),
      onScreen: (key, outcome) => journal?.appendScreen(key, outcome),
      onProgress: (p) => {
        soFar = p;
        progress?.update(p);
      },
    });
  } finally {
    await fitter.close();
    process.off("SIGINT", onSignal);
    process.off("SIGTERM", onSignal);
    progress?.finish();
  }
  const json = designJson(problem, run, top);
  const text = designText(problem, run, top);
  if (options.out) {
    for (let i = 0; i < json.candidates.length; i++) {
      const file = join(options.out, candidateCaseName(i + 1));
      writeFileAtomic(file, JSON.stringify(candidateCase(problem, loaded.json, run.candidates[i], options.out), null, 2) + "\n");
    }
    removeStale(options.out, json.candidates.length);
    writeFileAtomic(join(options.out, "results.json"), JSON.stringify(json, null, 2) + "\n");
    writeFileAtomic(join(options.out, "summary.txt"), text + "\n");
  }
  emit(options.json ? JSON.stringify(json, null, 2) : designText(problem, run, top, layoutFor({ wide: options.wide })), undefined);
  if (options.out && !options.quiet) printErr(`outfit: wrote ${options.out}/results.json, summary.txt and ${json.candidates.length} candidate case files\n`);
  if (run.interrupted) return EXIT_INTERRUPTED;
  return options.check && !run.success ? EXIT_NOT_COMPLIANT : 0;
}
