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
