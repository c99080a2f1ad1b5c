// The explanation's "relax" lines: a move is offered only when it changes the binding check's slack
// as printed ("slack -22.6 % -> -22.6 %" is no remedy), and an elevation check's slack reads in
// feet or metres beside the percentage.
import { describe, expect, it } from "vitest";
import { relaxesVisibly } from "../../search/engine/explain.js";
import { makeCheck } from "../../src/assess/rules/rule.js";
import { outfit } from "../cli/run.js";

const FT = 0.3048;

/** A freeboard check (an elevation, "at most") with its slack on the depth above a floor at 800 ft. */
function freeboard(stageFt: number, limitFt = 817) {
  const slack = (limitFt - stageFt) / (limitFt - 800);
  return makeCheck("freeboard", "100-yr", "100-yr freeboard", stageFt * FT, limitFt * FT, slack);
}

describe("relaxesVisibly", () => {
  it("refuses a move whose slack reads the same before and after, and one that does not relax", () => {
    const before = freeboard(816.48);
    // 0.0004 ft lower: slack 3.0588 % -> 3.0612 %, both "0.52 ft (3.1 %)".
    expect(relaxesVisibly("US", before, freeboard(816.4796))).toBe(false);
    // Tighter is never a relaxation, whatever it reads.
    expect(relaxesVisibly("US", before, freeboard(816.6))).toBe(false);
  });

  it("takes a move that changes the printed slack, in feet or in percent", () => {
    const before = freeboard(816.48);
    expect(relaxesVisibly("US", before, freeboard(816.43))).toBe(true);
    // A flow check reads in percent only: 72.40 % -> 72.46 % reads 72.4 % -> 72.5 %.
    const flow = (slack: number) => makeCheck("peak-upper", "2-yr", "2-yr peak within upper band", 1.769, 6.4, slack);
    expect(relaxesVisibly("US", flow(0.724), flow(0.7246))).toBe(true);
    expect(relaxesVisibly("US", flow(0.724), flow(0.7241))).toBe(false);
  });
});

describe("design's relax lines on the bundled cases", () => {
  // Before the filter these runs offered, among others, "lower 1 x 6 in orifice by 0.05 ft to
  // 21.45 ft: 25-yr -0.00 ft, slack 3.4 % -> 3.4 %" (small-compliant) and "raise 1 x 6 in orifice by
  // 0.05 ft to 100.05 ft: 2-yr peak +0.1 %, slack -78.2 % -> -78.2 %" (demo-rainfall).
  it.each(["small-compliant", "demo-rainfall", "wet-value"])("%s: every relax line changes the slack it names", (name) => {
    const run = outfit("design", `cases/${name}/case.json`, "--budget", "4000", "--quiet");
    expect(run.status).toBe(0);
    const moves = [...run.stdout.matchAll(/relax: .*?, slack (.+?) -> (.+?)(?:;|$)/gm)];
    expect(moves.length).toBeGreaterThan(0);
    for (const [line, before, after] of moves) expect(after, line).not.toBe(before);
  });
});
