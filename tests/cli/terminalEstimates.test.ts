// The terminal form of volume, pond and hydrograph: at 80 and 60 columns no line is wider than the
// terminal (a single word longer than a line excepted), the values the compact rows leave out are on
// the lines below them with their units, and piped output, --out files and --wide keep the full tables.
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { outfitWith, type Run } from "./run.js";

const dir = mkdtempSync(join(tmpdir(), "outfit-terminal-estimates-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function at(columns: number | null, ...args: string[]): Run {
  return outfitWith({ COLUMNS: columns === null ? undefined : String(columns) }, ...args);
}

/** Lines wider than `width` that are more than one word (a longer word is left whole on its line). */
function overWidth(text: string, width: number): string[] {
  return text.split("\n").filter((line) => line.length > width && /\S\s+\S/.test(line.trim()));
}

const longest = (text: string) => Math.max(...text.split("\n").map((line) => line.length));

/** The row that starts with `start` and the detail lines below it (indented 4, continued at 6), as one line. */
function rowWithDetails(text: string, start: RegExp): { row: string; details: string } {
  const lines = text.split("\n");
  const at = lines.findIndex((line) => start.test(line));
  expect(at, `a line matching ${start}`).toBeGreaterThanOrEqual(0);
  const details: string[] = [];
  for (let i = at + 1; i < lines.length && /^( {4}| {6})\S/.test(lines[i]); i++) details.push(lines[i].trim());
  return { row: lines[at], details: details.join(" ") };
}

/** The cells of a whole table's row (columns are two or more spaces apart). */
const cells = (row: string) => row.trim().split(/\s{2,}/);

const COMMANDS: [string, string[]][] = [
  ["volume", ["volume", "cases/demo/case.json"]],
  ["volume (rainfall storms, TR-55 types)", ["volume", "cases/demo-rainfall/case.json"]],
  ["volume (SI)", ["volume", "cases/si-headwall/case.json", "--type", "II"]],
  ["pond", ["pond", "cases/site-only/case.json"]],
  ["hydrograph", ["hydrograph", "cases/demo-rainfall/case.json"]],
];

describe("volume, pond and hydrograph fit the terminal", () => {
  it.each(COMMANDS.flatMap(([name, args]) => [80, 60].map((width) => [name, width, args] as const)))("`%s` at COLUMNS=%d: no line wider than that", (_name, width, args) => {
    const run = at(width, ...args);
    expect(run.status).toBe(0);
    expect(longest(run.stdout)).toBeLessThanOrEqual(width);
    expect(run.stdout).toContain("licensed professional engineer");
  });

  it("the width check finds the wide lines of the whole tables (--wide at 80 columns)", () => {
    for (const [, args] of COMMANDS) {
      const wide = at(80, ...args, "--wide");
      expect(wide.status).toBe(0);
      expect(overWidth(wide.stdout, 80).length).toBeGreaterThan(0);
    }
  });

  it("a file name longer than the line is the only thing over the width (hydrograph --out DIR)", () => {
    const out = join(dir, "hydrographs-in-a-directory-whose-name-is-longer-than-a-narrow-terminal");
    const run = at(60, "hydrograph", "cases/demo-rainfall/case.json", "--out", out);
    expect(run.status).toBe(0);
    const long = run.stdout.split("\n").filter((line) => line.length > 60);
    expect(long).toContain(`  ${join(out, "2-yr-post.csv")}`);
    expect(overWidth(run.stdout, 60)).toEqual([]);
  });
});

describe("the compact rows keep the values below them", () => {
  it("volume at 80: each storm's target, peak inflow and note are below its first row, as in the whole table", () => {
    const whole = at(null, "volume", "cases/demo/case.json").stdout;
    const narrow = at(80, "volume", "cases/demo/case.json").stdout;
    for (const storm of ["2-yr", "10-yr", "100-yr"]) {
      const [, target, peakIn, method, volume, stage, , note] = cells(rowWithDetails(whole, new RegExp(`^${storm} `)).row);
      expect(target).toMatch(/^[\d.]+ cfs$/);
      const { row, details } = rowWithDetails(narrow, new RegExp(`^${storm} `));
      expect(cells(row)).toEqual([storm, target, method, volume, stage]);
      expect(details).toBe(`peak in: ${peakIn}; note: ${note}`);
    }
    expect(narrow).toContain("peak in: 22.00 cfs; note: storm type unknown");
  });

  it("volume at 60: the fit below the limit level moves below the row too", () => {
    const narrow = at(60, "volume", "cases/demo/case.json").stdout;
    const { row, details } = rowWithDetails(narrow, /^ +rising release /);
    expect(cells(row)).toEqual(["rising release (lower bound)", expect.stringMatching(/^[\d,]+ ft3$/)]);
    expect(details).toMatch(/^stage reached: \d+\.\d\d ft; below limit level: yes$/);
  });

  it("hydrograph at 80: the rainfall, Tc and step of each hydrograph are below its row, as in the whole table", () => {
    const whole = at(null, "hydrograph", "cases/demo-rainfall/case.json").stdout;
    const narrow = at(80, "hydrograph", "cases/demo-rainfall/case.json").stdout;
    for (const storm of ["2-yr", "10-yr", "100-yr"]) {
      for (const area of ["pre", "post"]) {
        const start = new RegExp(`^${storm} +(\\S.*? {2,})?${area} `);
        const [, rainfall, , runoff, peak, timeToPeak, volume, tc, step, usedAs, converged] = cells(rowWithDetails(whole, start).row);
        const { row, details } = rowWithDetails(narrow, start);
        expect(cells(row)).toEqual([storm, area, runoff, peak, timeToPeak, volume, usedAs]);
        expect(details).toBe(`rainfall: ${rainfall}; Tc used: ${tc}; step: ${step}; peak, converged: ${converged}`);
      }
    }
    expect(narrow).toContain("rainfall: 3.40 in, 24-h Type II; Tc used: 8.6 min; step: 1.1 min;");
    // The areas' Tc source is below each area's row.
    expect(rowWithDetails(narrow, /^post +\d/).details).toBe("Tc from: flow path (3 segments)");
  });

  it("pond at 60 and 80: every label and value of the whole table, wrapped within the width", () => {
    const table = (text: string) => {
      const lines = text.split("\n");
      const head = lines.findIndex((line) => /^ +Value$/.test(line));
      const valueAt = lines[head].indexOf("Value");
      const rows: [string, string][] = [];
      for (const line of lines.slice(head + 1)) {
        if (line === "") break;
        const label = line.slice(0, valueAt).trim();
        const value = line.slice(valueAt).trim();
        if (!line.startsWith(" ")) rows.push([label, value]);
        else rows[rows.length - 1] = [`${rows[rows.length - 1][0]} ${label}`.trim(), `${rows[rows.length - 1][1]} ${value}`.trim()];
      }
      return rows;
    };
    const whole = table(at(null, "pond", "cases/site-only/case.json").stdout);
    expect(whole.map(([label]) => label)).toContain("Excavation below the top of embankment");
    for (const width of [80, 60]) {
      const narrow = at(width, "pond", "cases/site-only/case.json").stdout;
      expect(narrow).toMatch(/^Excavation below the\b.* {2,}[\d,]+ ft3$/m);
      expect(table(narrow)).toEqual(whole);
    }
  });
});

describe("piped output, --out files, --wide and --json", () => {
  // Lines of the whole tables on the bundled cases, as they were before the tables could narrow (which
  // also dropped the spaces that ended some lines).
  const lines = (text: string) => text.split("\n").map((line) => line.trimEnd());
  const WHOLE: [string, string[], string][] = [
    ["volume", ["volume", "cases/demo/case.json"], "Storm      Target    Peak in  Method                               Volume  Stage reached  Below limit level  Note"],
    ["pond", ["pond", "cases/site-only/case.json"], "Pond                                    prismoid, floor 58.0 ft x 29.0 ft, side slopes 3 H : 1 V; floor 20.00 ft, top of embankment 23.70 ft"],
    ["hydrograph", ["hydrograph", "cases/demo-rainfall/case.json"], "Storm   Rainfall               Area   Runoff       Peak  Time to peak       Volume   Tc used     Step  Used as                         Peak, converged"],
  ];

  it.each(WHOLE)("`%s` piped without COLUMNS prints the whole table and unwrapped lines", (_name, args, line) => {
    const piped = at(null, ...args);
    expect(piped.status).toBe(0);
    expect(lines(piped.stdout)).toContain(line);
    expect(piped.stdout).toMatch(/^Caution: .*licensed professional engineer.*any design\.$/m);
  });

  it.each(WHOLE)("`%s --wide` at 80 columns keeps the whole table", (_name, args, line) => {
    const wide = at(80, ...args, "--wide");
    expect(lines(wide.stdout)).toContain(line);
    expect(lines(at(80, ...args).stdout)).not.toContain(line);
  });

  it.each(WHOLE.slice(0, 2))("`%s --out FILE` at 60 columns writes what piped output prints", (name, args) => {
    const file = join(dir, `${name}.txt`);
    const run = at(60, ...args, "--out", file);
    expect(run.status).toBe(0);
    expect(run.stdout).toBe("");
    expect(readFileSync(file, "utf8")).toBe(at(null, ...args).stdout);
  });

  it.each(WHOLE)("`%s --json` is the same at any width", (_name, args) => {
    const piped = at(null, ...args, "--json").stdout;
    expect(JSON.parse(piped)).toHaveProperty("caution");
    expect(at(60, ...args, "--json").stdout).toBe(piped);
  });

  it.each(["volume", "pond", "hydrograph"])("`%s --help` offers --wide", (command) => {
    expect(at(100, command, "--help").stdout).toMatch(/--wide +keep every table whole/);
  });
});
