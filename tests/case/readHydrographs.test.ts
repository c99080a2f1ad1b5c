// The inflow files a load read are handed on (a design run's worker threads take the main thread's
// series instead of parsing a long CSV again): a given series is used as read, not the file.
import { describe, expect, it } from "vitest";
import { copyFileSync, mkdtempSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { loadCase } from "../../src/case/load.js";

describe("inflow files read once", () => {
  it("lists every CSV read by absolute path, in SI, and a later load takes them instead of the files", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-read-"));
    for (const f of readdirSync("cases/demo")) copyFileSync(join("cases/demo", f), join(dir, f));
    const first = loadCase(join(dir, "case.json"));
    const csv = resolve(dir, "inflow-2yr.csv");
    expect([...first.hydrographs.keys()].sort()).toEqual(["inflow-100yr.csv", "inflow-10yr.csv", "inflow-2yr.csv"].map((f) => resolve(dir, f)).sort());
    const storm = first.case.storms.find((s) => s.name === "2-yr")!;
    expect(first.hydrographs.get(csv)).toBe(storm.inflow);
    // The file is now garbled: a load given the series read before does not read it.
    writeFileSync(csv, "not,a,hydrograph\n");
    const again = loadCase(join(dir, "case.json"), { hydrographs: first.hydrographs });
    expect(again.case.storms.find((s) => s.name === "2-yr")!.inflow.flows).toEqual(storm.inflow.flows);
    // Without them, the garbled file is a user error naming it.
    expect(() => loadCase(join(dir, "case.json"))).toThrow(/inflow-2yr\.csv/);
  });
});
