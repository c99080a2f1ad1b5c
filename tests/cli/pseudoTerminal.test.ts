// Every command under a real pseudo-terminal at 80 and 120 columns, on every bundled case: what the
// terminal shows holds no literal escape text ("\u001b[1m" printed instead of done), no control
// character but outfit's own colour codes, and no line wider than the terminal; tables and verdicts
// reach it in colour. The design runs are in pseudoTerminalDesign.test.ts.
import { afterAll, describe, expect, it } from "vitest";
import { readFileSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { checkAtWidth, hasColour, haveScript, inTerminal, overwide, scratch, screenProblems, strayControls } from "./pseudoTerminal.js";
import { outfit, ROOT } from "./run.js";
import { caseCommands, otherCommands, WIDTHS } from "./terminalCommands.js";

describe("the pseudo-terminal", () => {
  it("is available (.ci/setup-terminal installs util-linux's script from Debian's packages)", () => {
    expect(haveScript(), "util-linux's `script` is missing: run .ci/setup-terminal").toBe(true);
  });
});

describe.skipIf(!haveScript())("every command under a pseudo-terminal", () => {
  for (const columns of WIDTHS) {
    it.each(caseCommands().map((c) => [c.label, c] as const))(`%s at ${columns} columns`, (_label, command) => {
      expect(checkAtWidth(command, columns).problems).toEqual([]);
    }, 120_000);

    it.each(otherCommands().map((c) => [c.label, c] as const))(`%s at ${columns} columns`, (_label, command) => {
      expect(checkAtWidth(command, columns).problems).toEqual([]);
    }, 120_000);
  }
});

/** cases/demo with its names in user text of the given kind, its inflow files by absolute path. */
function renamedDemo(dir: string, name: string, storms: string[]): string {
  const json = JSON.parse(readFileSync(join(ROOT, "cases/demo/case.json"), "utf8"));
  json.name = name;
  json.storms.forEach((s: { name: string; inflow: { file?: string } }, i: number) => {
    s.name = storms[i];
    if (s.inflow.file) s.inflow.file = join(ROOT, "cases/demo", s.inflow.file);
  });
  if (json.criteria?.freeboard?.storm) json.criteria.freeboard.storm = storms[storms.length - 1];
  return writeCase(join(dir, "case.json"), json);
}

/** A changed bundled case written to `file` (without its $schema, which is relative to cases/). */
function writeCase(file: string, json: { $schema?: string }): string {
  delete json.$schema;
  writeFileSync(file, JSON.stringify(json, null, 2));
  return file;
}

describe.skipIf(!haveScript())("colour and user text under a pseudo-terminal", () => {
  const dir = scratch();
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("colour on a terminal; none with NO_COLOR, with TERM=dumb, or through a pipe", () => {
    expect(hasColour(inTerminal(80, ["route", "cases/demo/case.json"]).screen)).toBe(true);
    for (const vars of [{ NO_COLOR: "1" }, { TERM: "dumb" }]) {
      const run = inTerminal(80, ["route", "cases/demo/case.json"], vars);
      expect(hasColour(run.screen)).toBe(false);
      expect(screenProblems(run, 80)).toEqual([]);
    }
    expect(outfit("route", "cases/demo/case.json").stdout).not.toMatch(/[\u001b\uFDD0-\uFDEF]/);
  });

  it("an escape in a case or storm name is shown escaped, while outfit's own colour is colour", () => {
    const file = renamedDemo(dir, "Pond \u001b[31mred\u001b[0m", ["2-yr\u001b[2J", "10-yr\u0007", "100-yr\u001b]0;title\u0007"]);
    const run = inTerminal(80, ["route", file]);
    expect(run.status).toBe(0);
    expect(run.screen).toContain("Pond \\u001b[31mred\\u001b[0m");
    expect(run.screen).toContain("2-yr\\u001b[2J");
    expect(run.screen).toContain("100-yr\\u001b]0;title\\u0007");
    expect(hasColour(run.screen)).toBe(true);
    expect(strayControls(run.screen)).toEqual([]);
    expect(overwide(run.screen, 80)).toEqual([]);
    // The user's own codes never reach the terminal as codes.
    expect(run.screen).not.toMatch(/\u001b\[2J|\u001b\[0m|\u001b\]0;|\u001b\[31mred/);
  });

  it.each([60, 80, 120])("names in wide characters (CJK, emoji) fit %i columns in route, volume and design", (columns) => {
    const file = renamedDemo(dir, "雨水調整池 北区 業務団地 調整池B (架空) 🌧️", ["2年確率 小雨 🌦️", "10年確率 中雨 🌧️", "100年確率 大雨 ⛈️"]);
    const commands = [["route", file], ["volume", file, "--type", "II"], ...(columns === 60 ? [] : [["design", file, "--budget", "600", "--top", "3", "--quiet"]])];
    for (const args of commands) {
      const run = inTerminal(columns, args);
      expect(run.status, run.screen).toBe(0);
      expect(run.screen).toContain("年確率");
      expect(screenProblems(run, columns), args[0]).toEqual([]);
    }
  }, 120_000);
});

/** cases/two-ponds with its ponds renamed (every reference to them too). */
function renamedSystem(dir: string, upper: string, lower: string): string {
  const json = JSON.parse(readFileSync(join(ROOT, "cases/two-ponds/case.json"), "utf8"));
  const rename = (name: string) => (name === "upper" ? upper : name === "lower" ? lower : name);
  for (const p of json.ponds) {
    p.name = rename(p.name);
    p.to = rename(p.to);
  }
  json.hydrology.ponds = Object.fromEntries(Object.entries(json.hydrology.ponds).map(([k, v]) => [rename(k), v]));
  return writeCase(join(dir, "system.json"), json);
}

describe.skipIf(!haveScript())("a system of ponds' names under a pseudo-terminal", () => {
  const dir = scratch();
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it.each([60, 80, 120])("pond names with escapes and in wide characters fit %i columns in route and volume, and rate and hydrograph from 80", (columns) => {
    const file = renamedSystem(dir, "上池 \u001b[31mnorth\u001b[0m 🌧️", "下池 south\u0007");
    // At 60 columns route and volume, as for a single pond (a rating's columns, and a hydrograph's
    // row of storm, area, peak and volume with a long area name, do not fit there).
    const narrow = columns === 60;
    for (const args of [["route", file], ["volume", file, "--type", "II"], ...(narrow ? [] : [["rate", file], ["hydrograph", file]])]) {
      const run = inTerminal(columns, args);
      expect(run.status, run.screen).toBe(0);
      expect(run.screen, args[0]).toContain("\\u001b[31mnorth\\u001b[0m");
      expect(run.screen, args[0]).not.toMatch(/\u001b\[31mnorth|\u0007/);
      // The escaped names are literal escape text by design: held to no stray control and the width.
      expect(strayControls(run.screen), args[0]).toEqual([]);
      expect(overwide(run.screen, columns), args[0]).toEqual([]);
    }
  }, 120_000);
});
