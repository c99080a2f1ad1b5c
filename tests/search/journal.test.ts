// The journal's format version: entries hold elevations in m since version 3, so an older journal
// (elevations in case units) is refused with a message naming both versions, never read as metres.
import { describe, expect, it } from "vitest";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Journal, JOURNAL_VERSION, readJournal } from "../../search/command/journal.js";

const file = (lines: object[]) => {
  const path = join(mkdtempSync(join(tmpdir(), "outfit-journal-")), "journal.jsonl");
  writeFileSync(path, lines.map((l) => JSON.stringify(l)).join("\n") + "\n");
  return path;
};

describe("journal format version", () => {
  it("refuses a version-2 journal (elevations in case units) with a usage error naming both versions", () => {
    const path = file([
      { journal: "outfit design", version: 2, signature: "abc" },
      { signature: "abc", key: "orifice 1 x 4 in | riser 3 | barrel -", designs: [[83.4, 85.1]], routings: 12, evaluations: 4 },
    ]);
    expect(JOURNAL_VERSION).toBe(3);
    expect(() => readJournal(path, "abc", "--resume")).toThrow(/--resume: found ".*journal\.jsonl", expected a journal of format version 3 \(this one is version 2, written before the search held elevations in m/);
  });

  it("reads back what it wrote, elevations in m unchanged", () => {
    const path = file([]);
    const entry = { key: "orifice 1 x 0.1 | riser 0.9 | barrel -", designs: [[25.419999999999998, 25.9]], routings: 30, evaluations: 9 };
    const journal = new Journal(path, "sig", [entry]);
    journal.append({ ...entry, key: "other" });
    const read = readJournal(path, "sig", "--resume");
    expect(read.warnings).toEqual([]);
    expect(read.entries.get(entry.key)).toEqual(entry);
    expect(read.entries.get("other")!.designs).toEqual(entry.designs);
  });
});

describe("journal: what the ranking needs, and the scored chunks of layouts", () => {
  const verdict = { compliant: true, warnings: 1, shortfall: 0, cost: 21.58, error: 0.0123, change: null, reserve: 0.127 };
  const entry = { key: "orifice 1 x 0.1 | riser 0.9 | barrel -", designs: [[25.42, 25.9]], routings: 30, evaluations: 9, verdicts: [verdict] };
  const outcome = {
    values: [
      { score: Infinity, cost: 3.5, peak: 0.42, drawdown: null, pruned: true, bounded: false },
      { score: 0.013, cost: 4.25, peak: 0.38, drawdown: 86400, pruned: false, bounded: true },
    ],
    routings: 6,
    evaluations: 2,
  };

  it("reads back a layout's verdicts and a chunk's scores exactly, an infinite score included", () => {
    const path = file([]);
    const journal = new Journal(path, "sig", [entry], [["chunk-a", outcome]]);
    journal.appendScreen("chunk-b", { ...outcome, routings: 7 });
    const read = readJournal(path, "sig", "gather");
    expect(read.warnings).toEqual([]);
    expect(read.entries.get(entry.key)).toEqual(entry);
    expect(read.screens.get("chunk-a")).toEqual(outcome);
    expect(read.screens.get("chunk-b")!.routings).toBe(7);
    expect(read.screens.get("chunk-b")!.values[0].score).toBe(Infinity);
  });

  it("reads a layout written without verdicts (its designs are routed again), and skips a damaged chunk with a warning", () => {
    const { verdicts: _verdicts, ...bare } = entry;
    const path = file([
      { journal: "outfit design", version: 3, signature: "sig" },
      { signature: "sig", ...bare },
      { signature: "sig", ...entry, key: "half", verdicts: [{ ...verdict, cost: "cheap" }] },
      { signature: "sig", screen: "broken", values: [{ score: "lots" }], routings: 1, evaluations: 1 },
    ]);
    const read = readJournal(path, "sig", "--resume");
    expect(read.entries.get(entry.key)).toEqual(bare);
    // A verdict that is not one is dropped whole: that layout's designs are routed again.
    expect(read.entries.get("half")!.verdicts).toBeUndefined();
    expect(read.screens.size).toBe(0);
    expect(read.warnings).toEqual([expect.stringMatching(/line 4 is not a scored chunk of this run; skipped, that chunk is scored again/)]);
  });
});
