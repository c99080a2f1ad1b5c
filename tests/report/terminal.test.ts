// The console layout: width from COLUMNS or the terminal, none when piped; colour only on a
// terminal and never with NO_COLOR (https://no-color.org); tables that do not fit keep their
// leading columns and move the rest below each row.
import { describe, expect, it } from "vitest";
import { layoutFor, renderTable, visibleWidth, wrap, type Column } from "../../src/report/terminal.js";
import { forTerminal } from "../../src/terminalText.js";

const tty = { isTTY: true, columns: 100 };
const pipe = { isTTY: false };

describe("layoutFor", () => {
  it("takes COLUMNS first, then the terminal's width; piped output without COLUMNS has no limit", () => {
    expect(layoutFor({}, { COLUMNS: "80" }, pipe).width).toBe(80);
    expect(layoutFor({}, {}, tty).width).toBe(100);
    expect(layoutFor({}, { COLUMNS: "132" }, tty).width).toBe(132);
    expect(layoutFor({}, {}, pipe).width).toBeNull();
    expect(layoutFor({}, { COLUMNS: "wide" }, pipe).width).toBeNull();
    expect(layoutFor({ toFile: true }, { COLUMNS: "80" }, tty)).toEqual({ width: null, wide: true, colour: false });
  });

  it("colours only a terminal, and not when NO_COLOR is set to anything but the empty string", () => {
    expect(layoutFor({}, {}, tty).colour).toBe(true);
    expect(layoutFor({}, {}, pipe).colour).toBe(false);
    expect(layoutFor({}, { NO_COLOR: "1" }, tty).colour).toBe(false);
    expect(layoutFor({}, { NO_COLOR: "" }, tty).colour).toBe(true);
    expect(layoutFor({}, { TERM: "dumb" }, tty).colour).toBe(false);
  });
});

describe("renderTable", () => {
  const columns: Column[] = [
    { head: "Storm" },
    { head: "Peak\n(cfs)", align: "right" },
    { head: "Freeboard left\n(ft)", align: "right", narrow: "detail" },
    { head: "Limited by", narrow: "detail", unit: "" },
  ];
  const rows = [["100-yr", "19.64", "0.90", "barrel, outlet control"], ["2-yr", "1.769", "3.65", "openings"]];

  it("keeps the whole table when it fits, units on the heading's second line", () => {
    const text = renderTable({ width: 80, wide: false, colour: false }, columns, rows).text;
    const lines = text.split("\n");
    expect(lines).toHaveLength(4);
    expect(lines[1]).toMatch(/^Storm\s+\(cfs\)\s+\(ft\)\s+Limited by$/);
    expect(lines[2]).toMatch(/^100-yr\s+19\.64\s+0\.90\s+barrel, outlet control$/);
  });

  it("moves columns that do not fit below each row, with their units, and keeps every line within the width", () => {
    const table = renderTable({ width: 26, wide: false, colour: false }, columns, rows);
    const lines = table.text.split("\n");
    expect(table.compact).toBe(true);
    for (const l of lines) expect(visibleWidth(l)).toBeLessThanOrEqual(26);
    const row = lines.findIndex((l) => l.startsWith("100-yr"));
    const next = lines.findIndex((l) => l.startsWith("2-yr"));
    expect(lines[row]).toMatch(/^100-yr\s+19\.64$/);
    for (const l of lines.slice(row + 1, next)) expect(l).toMatch(/^ {4}/);
    expect(lines.slice(row + 1, next).join(" ").replace(/\s+/g, " ").trim()).toBe("freeboard left: 0.90 ft; limited by: barrel, outlet control");
  });

  it("offers the room left to the lowest-ranked columns first, and shows them in their own order", () => {
    const ranked: Column[] = [
      { head: "Storm" },
      { head: "Target\n(cfs)", align: "right", narrow: "detail", rank: 2 },
      { head: "Peak\n(cfs)", align: "right" },
      { head: "Stage\n(ft)", align: "right", narrow: "detail", rank: 1 },
    ];
    const wide = [["100-yr", "30.00", "19.64", "102.85"]];
    // Storm, Peak and one more column fit in 22 characters: Stage (rank 1), not Target (first in order).
    const lines = renderTable({ width: 22, wide: false, colour: false }, ranked, wide).text.split("\n");
    expect(lines[2]).toMatch(/^100-yr\s+19\.64\s+102\.85$/);
    expect(lines[3]).toBe("    target: 30.00 cfs");
    // Without ranks the first column in order takes the room.
    const plain = renderTable({ width: 22, wide: false, colour: false }, ranked.map(({ rank: _rank, ...c }) => c), wide).text.split("\n");
    expect(plain[2]).toMatch(/^100-yr\s+30\.00\s+19\.64$/);
    expect(plain[3]).toBe("    stage: 102.85 ft");
  });

  it("names a detail by its label when it has one, and never breaks a label across lines", () => {
    const timed: Column[] = [
      { head: "Storm" },
      { head: "Tc used", align: "right", narrow: "detail", label: "Tc used" },
      { head: "Time to peak", align: "right", narrow: "detail" },
    ];
    const rows = [["100-yr storm of record", "8.6 min (given)", "12.02 h"]];
    const lines = renderTable({ width: 34, wide: false, colour: false }, timed, rows).text.split("\n");
    expect(lines.slice(1)).toEqual(["100-yr storm of record", "    Tc used: 8.6 min (given);", "      time to peak: 12.02 h"]);
    // Control: the same words wrapped as prose break inside the label at this width.
    expect(wrap("    Tc used: 8.6 min (given); time to peak: 12.02 h", 34, 6).split("\n")[0]).toMatch(/time$/);
  });

  it("--wide keeps the whole table at any width", () => {
    const table = renderTable({ width: 30, wide: true, colour: false }, columns, rows);
    expect(table.compact).toBe(false);
    expect(table.text.split("\n")[2]).toContain("barrel, outlet control");
  });

  it("colour codes take no room in the layout", () => {
    const coloured = renderTable({ width: 80, wide: false, colour: true }, columns, [[{ text: "2-yr", tone: "fail" }, "1.769", "3.65", "openings"]]).text;
    const plain = renderTable({ width: 80, wide: false, colour: false }, columns, [["2-yr", "1.769", "3.65", "openings"]]).text;
    // Styled as markers in the text, as SGR codes only when printed to a colour terminal.
    expect(coloured).not.toMatch(/\u001b/);
    expect(forTerminal(coloured, true)).toMatch(/\u001b\[31m\u001b\[1m2-yr\u001b\[22m\u001b\[39m/);
    expect(forTerminal(coloured, false)).toBe(plain);
    expect(coloured.split("\n").map((l) => visibleWidth(l))).toEqual(plain.split("\n").map((l) => l.length));
  });
});

describe("wrap", () => {
  it("breaks at spaces within the width, never between a number and its unit", () => {
    const text = wrap("Caution: the chamber cuts the flow by more than 1 % at 104.50 ft here", 20);
    for (const l of text.split("\n")) expect(l.length).toBeLessThanOrEqual(20);
    expect(text).toContain("1 %");
    expect(text).toContain("104.50 ft");
  });

  it("keeps minutes, seconds and areas with their numbers", () => {
    for (const unit of ["min", "s", "ac", "ha", "ft2", "m2"]) {
      expect(wrap(`step is 0.3 ${unit}`, 12).split("\n")).toEqual(["step is", `  0.3 ${unit}`]);
    }
    // Control: a word that is not a unit breaks from its number.
    expect(wrap("step is 0.3 of", 12).split("\n")).toEqual(["step is 0.3", "  of"]);
  });

  it("keeps a slope ratio on one line", () => {
    expect(wrap("side slopes 3 H : 1 V", 16).split("\n")).toEqual(["side slopes", "  3 H : 1 V"]);
    // Control: text that is not a ratio breaks at the same width after "3 H".
    expect(wrap("side slopes 3 H ; 1 V", 16).split("\n")).toEqual(["side slopes 3 H", "  ; 1 V"]);
  });
});

describe("niceStep", () => {
  it("gives the depth / 24 rounded up to 1, 2, 2.5 or 5 x 10^n, also for a depth a rounding error off", async () => {
    const { niceStep } = await import("../../src/report/rating.js");
    expect(niceStep(6)).toBeCloseTo(0.25, 12);
    expect(niceStep((106 * 0.3048 - 100 * 0.3048) / 0.3048)).toBeCloseTo(0.25, 12);
    expect(niceStep(4)).toBeCloseTo(0.2, 12);
    expect(niceStep(2.5)).toBeCloseTo(0.2, 12);
    expect(niceStep(10)).toBeCloseTo(0.5, 12);
  });
});
