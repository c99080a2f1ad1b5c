// The terminal form of design, route and rate: at 80 columns no line is longer than 80 characters
// (tables turn into compact rows with details below them); at 160 columns, with --wide and when
// piped without COLUMNS the tables are whole, one row per storm or stage.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { outfit, outfitWith, ROOT, type Run } from "./run.js";

function outfitAt(columns: number | null, ...args: string[]): Run {
  return outfitWith({ COLUMNS: columns === null ? undefined : String(columns) }, ...args);
}

const longest = (text: string) => Math.max(...text.split("\n").map((l) => l.length));
const DEMO = "cases/demo/case.json";
const COMMANDS: [string, string[]][] = [
  ["route", ["route", DEMO]],
  ["rate", ["rate", DEMO]],
  ["design", ["design", DEMO, "--budget", "1500", "--top", "3"]],
];

describe("terminal width", () => {
  it.each(COMMANDS)("`%s` at COLUMNS=80: no line longer than 80 characters, no colour when piped", (_name, args) => {
    const run = outfitAt(80, ...args);
    expect(run.status).toBe(0);
    expect(longest(run.stdout)).toBeLessThanOrEqual(80);
    expect(run.stdout).not.toMatch(/\u001b\[/);
    expect(run.stdout).toContain("Caution:");
  });

  it("`route` at 80 columns keeps one compact row per storm with the other values below it", () => {
    const run = outfitAt(80, "route", DEMO);
    const lines = run.stdout.split("\n");
    for (const storm of ["2-yr", "10-yr", "100-yr"]) {
      const row = lines.findIndex((l) => l.startsWith(`${storm} `));
      expect(row).toBeGreaterThan(0);
      // The detail line under the row names what the compact row leaves out.
      expect(lines[row + 1]).toMatch(/^ {4}.*freeboard left: \d+\.\d\d ft; limited by: (openings|barrel, (inlet|outlet) control)$/);
    }
    // Units are in the headings, not in the cells.
    expect(run.stdout).toMatch(/\(cfs\)/);
    expect(lines.find((l) => l.startsWith("2-yr "))).not.toContain("cfs");
  });

  it("`route` and `rate` at COLUMNS=160 print the whole table: every column on the storm's or stage's own line", () => {
    const route = outfitAt(160, "route", DEMO);
    expect(route.status).toBe(0);
    const heads = route.stdout.split("\n").filter((l) => /Peak out/.test(l) || /^Storm /.test(l)).join("\n");
    for (const head of ["Peak in", "Freeboard left", "Limited by", "Return"]) expect(heads).toContain(head);
    const row = route.stdout.split("\n").find((l) => l.startsWith("100-yr "))!;
    expect(row).toMatch(/barrel, (inlet|outlet) control/);
    expect(longest(route.stdout)).toBeLessThanOrEqual(160);
    expect(longest(route.stdout)).toBeGreaterThan(80);

    const rate = outfitAt(160, "rate", DEMO);
    expect(rate.stdout).toMatch(/E1 orifice/);
    expect(rate.stdout).toMatch(/Chamber/);
    expect(rate.stdout).not.toContain("Not shown at this width");
  });

  it("`design --wide` at 80 columns and piped output without COLUMNS keep the whole table, identically", () => {
    const wide = outfitAt(80, "design", DEMO, "--budget", "1500", "--top", "2", "--wide");
    const piped = outfitAt(null, "design", DEMO, "--budget", "1500", "--top", "2");
    const table = (text: string) => text.split("\n").slice(0, 8).join("\n");
    expect(table(wide.stdout)).toContain("Binding check");
    expect(table(wide.stdout)).toContain("Outlet");
    expect(longest(table(wide.stdout))).toBeGreaterThan(80);
    expect(table(piped.stdout)).toBe(table(wide.stdout));
  });
});

describe("help", () => {
  it.each(["route", "rate", "design", "report", "hydrograph", "starter", "volume", "pond"])("`%s --help` lists its exit codes and prints its defaults as numbers", (command) => {
    const run = outfitAt(100, command, "--help");
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/Exit codes: 0 (done|written|a pond fits);/);
    expect(run.stdout).toMatch(/2 bad input/);
    expect(run.stdout).not.toMatch(/\(default: "/);
  });

  it("--step is a time in minutes everywhere; a stage interval is --stage-step", () => {
    for (const command of ["route", "report"]) expect(outfitAt(100, command, "--help").stdout).toMatch(/--step <minutes>/);
    for (const command of ["rate", "report"]) expect(outfitAt(100, command, "--help").stdout).toMatch(/--stage-step <length>/);
    expect(outfitAt(100, "rate", "--help").stdout).not.toMatch(/--step </);
  });
});

describe("a reader that closes the pipe early", () => {
  it("`design --help | head -1` and `rate | head -1`: exit 0, no stack trace on stderr", () => {
    for (const args of [["design", "--help"], ["rate", DEMO]]) {
      // The shell's own pipe: head reads one line and closes it while outfit is still writing.
      const r = spawnSync("sh", ["-c", `"${process.execPath}" dist/src/cli.js ${args.join(" ")} | head -1 >/dev/null`], { cwd: ROOT, encoding: "utf8", timeout: 120_000 });
      expect(r.stderr).not.toMatch(/EPIPE|at .*\(node:|Unhandled/);
      expect(r.status).toBe(0);
    }
  });
});

describe("route's checks table at 80 and 60 columns (cases/ordinance-mix: every rule form, source labels)", () => {
  /** The checks table's rows: each row's name (its wrapped lines joined) and its first line; detail lines apart. */
  function checkRows(text: string): { name: string; first: string; details: string[] }[] {
    const lines = text.split("\n");
    const start = lines.findIndex((l) => /^Check {2,}/.test(l));
    const rows: { name: string; first: string; details: string[] }[] = [];
    for (const line of lines.slice(start + 1)) {
      if (line === "") break;
      if (/ {2}(pass|FAIL)$/.test(line)) rows.push({ name: line.split(/ {2,}/)[0], first: line, details: [] });
      else if (line.startsWith("    ")) rows[rows.length - 1].details.push(line.trim());
      else rows[rows.length - 1].name += ` ${line.trim()}`;
    }
    return rows;
  }

  it.each([80, 60])("at %i columns: every check whole, with its source label, its value, limit, slack and result", (columns) => {
    const json = JSON.parse(outfit("route", "cases/ordinance-mix/case.json", "--json").stdout);
    const run = outfitAt(columns, "route", "cases/ordinance-mix/case.json");
    expect(longest(run.stdout)).toBeLessThanOrEqual(columns);
    const rows = checkRows(run.stdout);
    // Every rule form of the case is there (release limits by rate per area and by share of the
    // pre-development peak, the smallest opening, clogging, the blocked outlet, extended detention).
    const titles = json.checks.map((c: { name: string; label: string | null }) => (c.label === null ? c.name : `${c.name} [${c.label}]`));
    expect(rows.map((r) => r.name)).toEqual(titles);
    for (const kind of ["peak-upper", "minimum-opening-release", "freeboard", "spillway-dry", "drawdown", "overtopping", "blocked-outlet", "extended-detention", "minimum-opening"]) {
      expect(json.checks.some((c: { kind: string }) => c.kind === kind), kind).toBe(true);
    }
    expect(json.checks.some((c: { condition: string }) => c.condition === "clogged")).toBe(true);
    json.checks.forEach((check: { passed: boolean; value: number; unit: string }, i: number) => {
      const row = rows[i];
      expect(row.first).toMatch(check.passed ? / {2}pass$/ : / {2}FAIL$/);
      const everything = [row.first, ...row.details].join(" ");
      expect(everything).toMatch(/(<=|>=) \d/);
      // At 80 columns the value and limit are on the row; at 60 the limit goes below it.
      if (columns === 80) expect(row.details).toEqual([]);
      else expect(row.details).toEqual([expect.stringMatching(/^limit: (<=|>=) \d/)]);
    });
  });

  it("route's whole output fits 60 columns on every bundled case with an outlet", () => {
    for (const name of ["demo", "demo-rainfall", "infeasible", "ordinance-mix", "si-wet-barrel", "site-only", "small-compliant", "underground", "wet-value"]) {
      const run = outfitAt(60, "route", `cases/${name}/case.json`);
      expect(run.status, name).toBe(0);
      expect(longest(run.stdout), name).toBeLessThanOrEqual(60);
    }
  });
});
