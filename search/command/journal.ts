// The design run's journal (journal.jsonl): a header line naming the run, then one line per fitted
// layout (its designs and what the ranking needs of each), appended as soon as it is fitted, and one
// line per chunk of layouts scored for a plan or a widening (its scores). A resumed run or a gather
// replays both and neither fits, scores nor routes again what a journal holds. Reading it never fails
// on damage: a torn or corrupt line (a run killed mid-write) is reported and skipped, and that layout
// is simply fitted (or that chunk scored) again.
import { appendFileSync, closeSync, existsSync, fstatSync, openSync, readFileSync, readSync } from "node:fs";
import { writeFileAtomic } from "../../src/io.js";
import { UsageError } from "../../src/commands/common.js";
import type { JournalEntry } from "../engine/run.js";
import { readVerdict, type Verdict } from "../engine/candidate.js";
import { readScreen, writtenValues, type ScoreOutcome } from "../engine/scoring.js";

/**
 * Format of the entries. 3: a design's variables are elevations in m (2 held them in case units, so a
 * version-2 journal is refused, never read as metres). The version is hashed into the run's signature
 * too, so an older entry whose header was lost is refused as well.
 */
export const JOURNAL_VERSION = 3;
const VERSION = JOURNAL_VERSION;

export interface JournalRead {
  entries: Map<string, JournalEntry>;
  /** Scored chunks of layouts, by their screenKey. */
  screens: Map<string, ScoreOutcome>;
  warnings: string[];
}

function isEntry(value: unknown, signature: string): value is JournalEntry & { signature: string } {
  if (typeof value !== "object" || value === null) return false;
  const v = value as Record<string, unknown>;
  const count = (x: unknown) => typeof x === "number" && Number.isInteger(x) && x >= 0;
  return (
    v.signature === signature &&
    typeof v.key === "string" &&
    count(v.routings) &&
    count(v.evaluations) &&
    Array.isArray(v.designs) &&
    v.designs.every((d) => Array.isArray(d) && d.every((x) => typeof x === "number" && Number.isFinite(x)))
  );
}

/**
 * Reads a journal of the run named by `signature`. A readable header of another run is a usage error
 * (`option` names the option that pointed here); every damaged line is a warning.
 */
export function readJournal(path: string, signature: string, option: string): JournalRead {
  const entries = new Map<string, JournalEntry>();
  const screens = new Map<string, ScoreOutcome>();
  const warnings: string[] = [];
  const lines = readFileSync(path, "utf8").split("\n");
  lines.forEach((line, i) => {
    if (line.trim() === "") return;
    let value: unknown;
    try {
      value = JSON.parse(line);
    } catch {
      warnings.push(`${path}: line ${i + 1} is torn or corrupt (not JSON); skipped${i === 0 ? " (the header)" : ", what it held is fitted or scored again"}`);
      return;
    }
    const v = value as Record<string, unknown> | null;
    if (i === 0 && v !== null && typeof v === "object" && "journal" in v) {
      if (v.version !== VERSION) {
        const older = typeof v.version === "number" && v.version < VERSION;
        throw new UsageError(option, path, `a journal of format version ${VERSION} (this one is version ${String(v.version)}${older ? ", written before the search held elevations in m; its entries cannot be read: run again without --resume, or into a new --out directory" : ", written by another version of outfit"})`);
      }
      if (v.signature !== signature) {
        throw new UsageError(option, path, "a journal of a run of the same case, seed, margin and starts (the case or the options have changed, or it was written by another version)");
      }
      return;
    }
    if (v !== null && typeof v === "object" && typeof v.signature === "string" && v.signature !== signature) {
      throw new UsageError(option, path, "a journal of a run of the same case, seed, margin and starts (the case or the options have changed)");
    }
    if (v !== null && typeof v === "object" && typeof v.screen === "string" && v.signature === signature) {
      const outcome = readScreen(v);
      if (outcome) screens.set(v.screen, outcome);
      else warnings.push(`${path}: line ${i + 1} is not a scored chunk of this run; skipped, that chunk is scored again`);
      return;
    }
    if (!isEntry(value, signature)) {
      warnings.push(`${path}: line ${i + 1} is not a journal entry of this run; skipped${i === 0 ? " (the header)" : ", that layout is fitted again"}`);
      return;
    }
    const { key, designs, routings, evaluations } = value;
    // The designs' verdicts, when the entry has one for each (else they are routed again).
    const verdicts = Array.isArray(value.verdicts) && value.verdicts.length === designs.length ? value.verdicts.map(readVerdict) : [];
    const entry: JournalEntry = { key, designs, routings, evaluations };
    if (verdicts.length > 0 && verdicts.every((v) => v !== null)) entry.verdicts = verdicts as Verdict[];
    entries.set(key, entry);
  });
  return { entries, screens, warnings };
}

/** A journal open for appending: written whole first (header, the given entries and chunks), then one line per layout or chunk. */
export class Journal {
  constructor(private readonly path: string, private readonly signature: string, entries: Iterable<JournalEntry>, screens: Iterable<[string, ScoreOutcome]> = []) {
    const lines = [JSON.stringify({ journal: "outfit design", version: VERSION, signature })];
    for (const e of entries) lines.push(this.line(e));
    for (const [key, outcome] of screens) lines.push(this.screenLine(key, outcome));
    writeFileAtomic(path, lines.join("\n") + "\n");
  }

  private line(e: JournalEntry): string {
    return JSON.stringify({ signature: this.signature, key: e.key, designs: e.designs, routings: e.routings, evaluations: e.evaluations, verdicts: e.verdicts });
  }

  private screenLine(key: string, o: ScoreOutcome): string {
    return JSON.stringify({ signature: this.signature, screen: key, values: writtenValues(o.values), routings: o.routings, evaluations: o.evaluations });
  }

  append(e: JournalEntry): void {
    this.appendLine(this.line(e));
  }

  appendScreen(key: string, outcome: ScoreOutcome): void {
    this.appendLine(this.screenLine(key, outcome));
  }

  private appendLine(line: string): void {
    // Each entry on its own line, even if something left the file without its last newline.
    const content = readLastByte(this.path) === "\n" ? "" : "\n";
    appendFileSync(this.path, content + line + "\n");
  }
}

function readLastByte(path: string): string {
  if (!existsSync(path)) return "\n";
  const fd = openSync(path, "r");
  try {
    const size = fstatSync(fd).size;
    if (size === 0) return "\n";
    const byte = Buffer.alloc(1);
    readSync(fd, byte, 0, 1, size - 1);
    return byte.toString("latin1");
  } finally {
    closeSync(fd);
  }
}
