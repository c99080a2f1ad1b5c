// `outfit design`: load, search, print, and write results and candidate case files whole.
import { appendFileSync, existsSync, mkdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { emit, load, positiveNumber, UsageError } from "../src/commands/common.js";
import { writeFileAtomic } from "../src/io.js";
import { buildProblem } from "./problem.js";
import { runSearch, type JournalEntry } from "./run.js";
import { candidateCase, candidateCaseName, designJson, designText } from "./report.js";
import { createHash } from "node:crypto";
import { layoutFor } from "../src/report/terminal.js";
import { pondDesignCommand } from "./pondCommand.js";

export interface DesignCommandOptions {
  seed?: string;
  budget?: string;
  time?: string;
  top?: string;
  margin?: string;
  starts?: string;
  beam?: string;
  json?: boolean;
  out?: string;
  resume?: boolean;
  progress?: boolean;
  wide?: boolean;
  sizePond?: boolean;
}

export function designCommand(path: string, options: DesignCommandOptions): number {
  if (options.sizePond) return pondDesignCommand(path, options);
  const loaded = load(path);
  const c = loaded.case;
  const margin = positiveNumber("--margin", options.margin);
  const problem = buildProblem(c, loaded.data, { margin: margin === undefined ? undefined : margin / 100 });
  const top = Math.round(positiveNumber("--top", options.top) ?? 5);
  const seed = options.seed ?? "outfit";
  const budget = Math.round(positiveNumber("--budget", options.budget) ?? 20000);
  if (options.out && existsSync(options.out) && !statSync(options.out).isDirectory()) {
    throw new UsageError("--out", options.out, "a directory for the results (this is a file)");
  }
  const journalPath = options.out ? join(options.out, "journal.jsonl") : undefined;
  const signature = createHash("sha256").update(JSON.stringify({ json: loaded.json, seed, margin: problem.options.margin })).digest("hex").slice(0, 16);
  const done = new Map<string, JournalEntry>();
  if (options.resume) {
    if (!journalPath) throw new UsageError("--resume", "without --out", "--out DIR naming the directory of the run to resume");
    if (existsSync(journalPath)) readJournal(journalPath, signature, done);
  }
  if (journalPath) {
    mkdirSync(options.out!, { recursive: true });
    if (!options.resume || !existsSync(journalPath)) writeFileAtomic(journalPath, JSON.stringify({ signature }) + "\n");
  }
  const run = runSearch(problem, {
    seed,
    budget,
    timeLimit: positiveNumber("--time", options.time),
    top,
    starts: Math.round(positiveNumber("--starts", options.starts) ?? 3),
    beam: Math.round(positiveNumber("--beam", options.beam) ?? 3),
    done,
    onLayout: (entry, progress) => {
      // Finished work is kept: each fitted layout is appended to the journal as soon as it is done.
      if (journalPath) appendFileSync(journalPath, JSON.stringify(entry) + "\n");
      if (options.progress) {
        process.stderr.write(
          `\routfit: ${progress.layoutsFitted} layouts fitted, ${progress.routings} routings, ${progress.compliant} compliant, best cost ${progress.bestCost === null ? "-" : progress.bestCost.toFixed(1)}, ${progress.seconds.toFixed(1)} s   `,
        );
      }
    },
  });
  if (options.progress) process.stderr.write("\n");
  const json = designJson(problem, run, top);
  const text = designText(problem, run, top);
  if (options.out) {
    for (let i = 0; i < json.candidates.length; i++) {
      const file = join(options.out, candidateCaseName(i + 1));
      writeFileAtomic(file, JSON.stringify(candidateCase(problem, loaded.json, run.candidates[i], options.out), null, 2) + "\n");
    }
    writeFileAtomic(join(options.out, "results.json"), JSON.stringify(json, null, 2) + "\n");
    writeFileAtomic(join(options.out, "summary.txt"), text + "\n");
  }
  emit(options.json ? JSON.stringify(json, null, 2) : designText(problem, run, top, layoutFor({ wide: options.wide })), undefined);
  if (options.out) process.stderr.write(`outfit: wrote ${options.out}/results.json, summary.txt and ${json.candidates.length} candidate case files\n`);
  return 0;
}

function readJournal(path: string, signature: string, done: Map<string, JournalEntry>): void {
  const lines = readFileSync(path, "utf8").split("\n").filter((l) => l.trim() !== "");
  if (lines.length === 0) return;
  const header = JSON.parse(lines[0]) as { signature?: string };
  if (header.signature !== signature) {
    throw new UsageError("--resume", path, "a journal of a run of the same case, seed and margin (the case or the options have changed)");
  }
  for (const line of lines.slice(1)) {
    try {
      const entry = JSON.parse(line) as JournalEntry;
      done.set(entry.key, entry);
    } catch {
      // A line cut short by an interrupted run: that layout is simply fitted again.
    }
  }
}
