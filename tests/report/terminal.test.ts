// The console layout: width from COLUMNS or the terminal, none when piped; colour only on a
// terminal and never with NO_COLOR (https://no-color.org); tables that do not fit keep their
// leading columns and move the rest below each row.
import { describe, expect, it } from "vitest";
import { formatHelpText, layoutFor, paint, renderTable, visibleWidth, wrap, wrapLines, type Column } from "../../src/report/terminal.js";
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

describe("renderTable with columns of words (cli-table3 wraps them)", () => {
  const columns: Column[] = [
    { head: "Check", wrap: 12 },
    { head: "Value", align: "right", narrow: "detail", unit: "" },
    { head: "Slack", align: "right" },
    { head: "Result" },
  ];
  const name = "10-yr target reachable with the minimum opening (75 % of the given pre-development peak 19 cfs) [county ordinance 5.5]";
  const rows = [[name, "0.482 cfs", "96.6 %", "pass"], ["2-yr drawdown", "37.7 h", "47.7 %", "pass"]];

  it("wraps the name within the width; the row's numbers stay on its first line; a number keeps its unit", () => {
    const table = renderTable({ width: 60, wide: false, colour: false }, columns, rows);
    const lines = table.text.split("\n");
    expect(table.compact).toBe(true);
    for (const l of lines) expect(visibleWidth(l)).toBeLessThanOrEqual(60);
    expect(lines[1]).toMatch(/^10-yr target reachable with the\s+0\.482 cfs\s+96\.6 %\s+pass$/);
    const next = lines.findIndex((l) => l.startsWith("2-yr drawdown"));
    // The name's other lines hold nothing but its words, which read as the name again.
    const continued = lines.slice(2, next);
    for (const l of continued) expect(l).not.toMatch(/ {2}\S/);
    expect([lines[1].split(/ {2,}/)[0], ...continued].join(" ")).toBe(name);
    expect(continued.some((l) => l.endsWith(" 19") || l.startsWith("cfs"))).toBe(false);
    expect(lines[next]).toMatch(/^2-yr drawdown\s+37\.7 h\s+47\.7 %\s+pass$/);
  });

  it("narrows a column of words no further than its wrap width or longest word: the others go below the row first", () => {
    const lines = renderTable({ width: 38, wide: false, colour: false }, columns, rows).text.split("\n");
    expect(lines[1]).toBe("10-yr target reachable  96.6 %  pass");
    expect(lines).toContain("    value: 0.482 cfs");
    // "pre-development" (15) is wider than the wrap width (12): at 31 columns the name is 15 wide.
    const narrowest = renderTable({ width: 31, wide: false, colour: false }, columns, rows).text.split("\n");
    expect(narrowest).toContain("pre-development");
    expect(Math.max(...narrowest.map((l) => visibleWidth(l)))).toBe(31);
  });

  it("is the whole table, unwrapped, when it fits", () => {
    const text = renderTable({ width: 200, wide: false, colour: false }, columns, rows).text;
    expect(text.split("\n")[1]).toBe(`${name}  0.482 cfs  96.6 %  pass`);
  });
});

describe("widths as a terminal shows them", () => {
  const columns: Column[] = [{ head: "Storm", wrap: 8 }, { head: "Peak\n(cfs)", align: "right" }, { head: "Note" }];

  it("counts wide characters (CJK, emoji) as two cells, so the columns line up on the screen", () => {
    const rows = [["2年確率 🌧️", "1.769", "x"], ["100-yr", "19.64", "y"], ["洪水 100年", "20.10", "z"]];
    const lines = renderTable({ width: 80, wide: false, colour: false }, columns, rows).text.split("\n");
    // The peak ends in the same screen column on every line.
    const ends = lines.slice(1).map((l) => visibleWidth(l.replace(/ {2}\S+$/, "")));
    expect(new Set(ends).size).toBe(1);
    expect(visibleWidth("2年確率 🌧️")).toBe(10);
  });

  it("measures a control character in user text as the escape the terminal will show", () => {
    const rows = [["2-yr\u001b[2J", "1.769", "x"], ["100-yr", "19.64", "y"]];
    const lines = renderTable({ width: 80, wide: false, colour: false }, columns, rows).text.split("\n");
    expect(lines[2]).toBe("2-yr\\u001b[2J  1.769  x");
    expect(lines[3]).toBe("100-yr         19.64  y");
  });
});

describe("text for the terminal", () => {
  it("escapes the user's control characters and turns only outfit's own styling into colour codes", () => {
    const text = `${paint({ width: null, wide: false, colour: true }, "pass", "pass")} storm "2-yr\u001b[31m"`;
    expect(forTerminal(text, true)).toBe('\u001b[32mpass\u001b[39m storm "2-yr\\u001b[31m"');
    expect(forTerminal(text, false)).toBe('pass storm "2-yr\\u001b[31m"');
    expect(visibleWidth(text)).toBe('pass storm "2-yr\\u001b[31m"'.length);
  });

  it("wraps messages line by line to the width, continuation lines two deeper, lines that fit as they are", () => {
    const text = "outfit: note: inflow-100yr.csv: read with separator comma, decimal point, times in minutes, flows in cfs\n  a   short line";
    expect(wrapLines(text, 60).split("\n")).toEqual([
      "outfit: note: inflow-100yr.csv: read with separator comma,",
      "  decimal point, times in minutes, flows in cfs",
      "  a   short line",
    ]);
  });

  it("fits help to the width: prose runs together and wraps, a long example keeps its options whole and continues with a backslash", () => {
    const help = [
      "Narrow terminals keep each method's volume on its row, and the stage and the fit as room allows;",
      "the rest go on indented lines below the row.",
      "",
      "Examples:",
      "  outfit design cases/demo/case.json --budget 90000 --shard 2/3 --out out/shard-2",
      "  outfit design cases/wet-value/case.json --rank change         # fixes of the existing outlet, smallest first",
      "  outfit route cases/demo/case.json",
    ].join("\n");
    const lines = formatHelpText(help, 60).split("\n");
    for (const l of lines) expect(l.length).toBeLessThanOrEqual(60);
    expect(lines.slice(0, 3).join(" ")).toBe(help.split("\n").slice(0, 2).join(" "));
    expect(lines).toContain("  outfit design cases/demo/case.json --budget 90000 \\");
    expect(lines).toContain("      --shard 2/3 --out out/shard-2");
    expect(lines).toContain("  outfit design cases/wet-value/case.json --rank change");
    expect(lines).toContain("      # fixes of the existing outlet, smallest first");
    expect(lines[lines.length - 1]).toBe("  outfit route cases/demo/case.json");
  });
});
