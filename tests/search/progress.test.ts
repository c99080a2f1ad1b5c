// The design run's progress line: on a terminal one line rewritten in place, never wider than 79
// columns; elsewhere plain lines at an interval, without carriage returns; and through the CLI,
// nothing on stderr with --quiet and nothing but JSON on stdout with --json.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { ProgressReporter, formatDuration, progressText } from "../../search/report/progress.js";
import type { Progress } from "../../search/engine/run.js";

function stream(isTTY: boolean, columns?: number) {
  const writes: string[] = [];
  return { isTTY, columns, writes, write: (t: string) => writes.push(t) };
}

const progress = (over: Partial<Progress>): Progress => ({ layoutsFitted: 12, layoutsPlanned: 40, routings: 5000, compliant: 3, bestCost: 21.63, seconds: 10, routingsLeft: 15000, ...over });

describe("progress", () => {
  it("says the share of the budget, routings per second, layouts, best cost and time left", () => {
    expect(progressText(progress({}), { routings: 20000 })).toBe("outfit: 25% of budget, 500 routings/s, 12 layouts, best cost 21.6, 30s left");
    expect(progressText(progress({ bestCost: null, seconds: 600 }), { routings: Infinity, seconds: 3600 })).toBe(
      "outfit: 16% of budget, 8 routings/s, 12 layouts, best cost none yet, 50m00s left",
    );
    expect(formatDuration(8 * 3600 + 61)).toBe("8h01m");
  });

  it("on a terminal: one line, rewritten after a carriage return, at most 79 columns, cleared at the end", () => {
    let now = 0;
    const s = stream(true, 200);
    const r = new ProgressReporter(s, { routings: 20000 }, () => now);
    r.update(progress({ layoutsFitted: 123456789012, routings: 123456789, bestCost: 123456.7 }));
    now = 0.1;
    r.update(progress({})); // too soon: not drawn
    now = 1;
    r.update(progress({}));
    expect(s.writes.length).toBe(2);
    for (const w of s.writes) {
      expect(w.startsWith("\r")).toBe(true);
      expect(w).not.toMatch(/\n/);
      expect(w.length - 1).toBe(79);
    }
    expect(s.writes[1]).toMatch(/^\routfit: 25% of budget/);
    r.finish();
    expect(s.writes[2]).toBe(`\r${" ".repeat(79)}\r`);
  });

  it("on a narrow terminal the line fits its width", () => {
    const s = stream(true, 40);
    new ProgressReporter(s, { routings: 20000 }, () => 0).update(progress({}));
    expect(s.writes[0].length - 1).toBe(39);
  });

  it("elsewhere: plain lines every few seconds, no carriage return, nothing to clear", () => {
    let now = 0;
    const s = stream(false);
    const r = new ProgressReporter(s, { routings: 20000 }, () => now, 5);
    r.update(progress({}));
    now = 2;
    r.update(progress({}));
    now = 5.5;
    r.update(progress({ layoutsFitted: 20 }));
    r.finish();
    expect(s.writes).toEqual(["outfit: 25% of budget, 500 routings/s, 12 layouts, best cost 21.6, 30s left\n", "outfit: 25% of budget, 500 routings/s, 20 layouts, best cost 21.6, 30s left\n"]);
  });

  it("through the CLI: progress lines on stderr by default, none with --quiet, stdout pure JSON with --json", () => {
    const cli = join(process.cwd(), "dist/src/cli.js");
    const run = (...args: string[]) => spawnSync(process.execPath, [cli, "design", "cases/small-compliant/case.json", "--budget", "800", "--workers", "1", ...args], { encoding: "utf8" });
    const loud = run("--json");
    expect(loud.status).toBe(0);
    expect(JSON.parse(loud.stdout).command).toBe("design");
    expect(loud.stderr).toMatch(/^outfit: \d+% of budget, \d+ routings\/s, \d+ layouts, best cost/m);
    expect(loud.stderr).not.toMatch(/\r/);
    const quiet = run("--json", "--quiet");
    expect(quiet.status).toBe(0);
    expect(quiet.stderr).toBe("");
    expect(JSON.parse(quiet.stdout).command).toBe("design");
  });
});
