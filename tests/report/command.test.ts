// `outfit report` on the command line: help, default outputs, Markdown with its SVG files, and bad
// input reported with exit code 2, no stack trace and nothing written.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { copyFileSync, cpSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { CAUTION } from "../../src/report/caution.js";
import { DEMO, DESIGN_RUN, outfit, temporaryDirectory } from "./support.js";

let dir: string;

/** A copy of the demo case (with its inflow files) in a folder of its own. */
function demoCopy(folder: string, edit: (json: Record<string, unknown>) => void = () => {}): string {
  mkdirSync(folder, { recursive: true });
  const json = JSON.parse(readFileSync(DEMO, "utf8"));
  for (const storm of json.storms) copyFileSync(join(dirname(DEMO), storm.inflow.file), join(folder, storm.inflow.file));
  edit(json);
  const file = join(folder, "case.json");
  writeFileSync(file, JSON.stringify(json));
  return file;
}

beforeAll(() => {
  dir = temporaryDirectory();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("outfit report", () => {
  it("has help with its options and an example", () => {
    const run = outfit("report", "--help");
    expect(run.status).toBe(0);
    for (const text of ["--out <file>", "--format <format>", "--step <minutes>", "Examples:", "outfit report cases/demo/case.json"]) expect(run.stdout).toContain(text);
  });

  it("writes CASE.report.html beside a case file by default, with the caution", () => {
    const file = demoCopy(join(dir, "default"));
    const run = outfit("report", file);
    expect(run.status, run.stderr).toBe(0);
    const html = readFileSync(join(dir, "default", "case.report.html"), "utf8");
    expect(html.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(html).toContain(CAUTION);
    expect(html).toContain("@page");
    expect(html).toMatch(/break-inside: avoid/);
  });

  it("writes DIR/report.html for a design run's results directory", () => {
    const copy = join(dir, "run");
    cpSync(DESIGN_RUN, copy, { recursive: true });
    const run = outfit("report", copy);
    expect(run.status, run.stderr).toBe(0);
    expect(readFileSync(join(copy, "report.html"), "utf8")).toContain("Candidates compared");
  });

  it("writes Markdown with every plot as an SVG file beside it, linked, and no PNG", () => {
    const out = join(dir, "md", "review.md");
    const run = outfit("report", DEMO, "--format", "md", "--out", out);
    expect(run.status, run.stderr).toBe(0);
    const md = readFileSync(out, "utf8");
    const links = Array.from(md.matchAll(/!\[Figure (\d+): [^\]]*\]\(([^)]+)\)/g), (m) => decodeURIComponent(m[2]));
    const files = readdirSync(join(dir, "md")).filter((f) => f !== "review.md");
    // As many figures as the HTML report of the same case holds.
    const html = join(dir, "md-twin.html");
    expect(outfit("report", DEMO, "--out", html).status).toBe(0);
    expect(links.length).toBe((readFileSync(html, "utf8").match(/<figure /g) ?? []).length);
    expect(links.length).toBeGreaterThanOrEqual(8);
    expect(files.sort()).toEqual([...links].sort());
    for (const file of files) {
      expect(file).toMatch(/^review\.fig-\d\d-[a-z0-9-]+\.svg$/);
      const svg = readFileSync(join(dir, "md", file), "utf8");
      expect(svg).toMatch(/^<\?xml version="1.0" encoding="UTF-8"\?>\n<svg xmlns="http:\/\/www.w3.org\/2000\/svg" /);
      expect(svg).toMatch(/data-plot=|data-drawing="outlet"/);
    }
    expect(md).not.toMatch(/\.png/i);
    expect(md).toContain("| Check | Value | Limit | Slack | Result |");
    expect(md).toContain(CAUTION);
  });

  const bad: [string, () => string[], RegExp][] = [
    ["a missing input", () => [join(dir, "nowhere.json")], /nowhere\.json: found no such file or directory, expected a case file \(JSON\) or a design run's results directory/],
    ["an unknown format", () => [DEMO, "--format", "pdf"], /--format: found "pdf", expected html or md/],
    ["a bad step", () => [DEMO, "--step", "-5"], /--step: found "-5", expected a number greater than zero/],
    ["a case without an outlet", () => [demoCopy(join(dir, "no-outlet"), (json) => delete json.outlet)], /case\.json: outlet: found nothing \(the field is missing\), expected an outlet to report/],
    ["a folder without results.json", () => [join(dir, "empty-run")], /results\.json: found no readable file, expected the design run's results\.json/],
    ["a results.json with a bad field", () => {
      const copy = join(dir, "bad-field");
      cpSync(DESIGN_RUN, copy, { recursive: true });
      const json = JSON.parse(readFileSync(join(copy, "results.json"), "utf8"));
      json.candidates[1].rank = "second";
      writeFileSync(join(copy, "results.json"), JSON.stringify(json));
      return [copy];
    }, /results\.json: candidates\[1\]\.rank: found "second", expected/],
    ["a missing candidate file", () => {
      const copy = join(dir, "missing-candidate");
      cpSync(DESIGN_RUN, copy, { recursive: true });
      rmSync(join(copy, "candidate-02.json"));
      return [copy];
    }, /candidates\[1\]\.caseFile: found "candidate-02\.json", expected a readable candidate case file/],
  ];

  it.each(bad)("reports %s with exit code 2, no stack trace and nothing written", (_, args, message) => {
    mkdirSync(join(dir, "empty-run"), { recursive: true });
    const out = join(dir, "bad-out", "report.html");
    const run = outfit("report", ...args(), "--out", out);
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(run.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(dirname(out))).toBe(false);
  });
});
