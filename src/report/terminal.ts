// Console layout: how wide the output may be, whether to colour it, and tables that fit the width.
// Tables are laid out by cli-table3 (cells, wrapping within a column, alignment); what is outfit's own
// is the narrow-terminal policy: which columns stay on the row, which go to indented detail lines below
// it, which are dropped, and how narrow a wrapping column may become.
import Table from "cli-table3";
import { ansiAsStyle, colourAllowed, streamWidth, styleAsAnsi, styled, terminalSafe, visibleWidth, type Tone } from "../terminalText.js";

export { visibleWidth, type Tone };

/** How the console output is laid out. */
export interface Layout {
  /** Characters per line; null: no limit (piped output without COLUMNS: a stable, full layout). */
  width: number | null;
  /** Keep every table whole whatever the width (`--wide`). */
  wide: boolean;
  /** ANSI colour (only on a terminal, never with NO_COLOR). */
  colour: boolean;
}

/** The full layout with no width limit and no colour: what files and pipes get. */
export const PLAIN: Layout = { width: null, wide: true, colour: false };

/** Narrowest width the layout accepts; a smaller COLUMNS is taken as this. */
export const MIN_WIDTH = 60;

export interface LayoutRequest {
  wide?: boolean;
  /** Output goes to a file (--out): plain full layout. */
  toFile?: boolean;
}

/**
 * The width comes from COLUMNS when it is set to a number (so `COLUMNS=80 outfit ... | less` works),
 * else from the terminal; piped output without COLUMNS has no width limit. Colour needs a terminal
 * and no NO_COLOR (https://no-color.org: any non-empty value turns colour off).
 */
export function layoutFor(request: LayoutRequest, env: NodeJS.ProcessEnv = process.env, stream: { isTTY?: boolean; columns?: number } = process.stdout): Layout {
  if (request.toFile) return PLAIN;
  const raw = streamWidth(stream, env);
  const width = raw === null ? null : Math.max(MIN_WIDTH, raw);
  return { width, wide: request.wide === true, colour: colourAllowed(stream, env) };
}

/** Text in a tone when the layout allows colour, else unchanged. */
export function paint(layout: Layout, tone: Tone, text: string): string {
  return layout.colour ? styled(tone, text) : text;
}

// A number and its unit ("1 %", "3.0 ft") stay on one line, and so does a slope ("3 H : 1 V"): the
// spaces between them become no-break spaces.
function keepTogether(text: string): string {
  return text
    .replace(/(\d) H : (\d+(?:\.\d+)?) V\b/g, "$1\u00a0H\u00a0:\u00a0$2\u00a0V")
    .replace(/(\d) (%|ft|in|m|mm|h|min|s|ac|ha|cfs|m3\/s|ft2|ft3|m2|m3|yr)\b/g, "$1\u00a0$2")
    .replace(/(\d) %/g, "$1\u00a0%");
}

/**
 * Wraps prose to the layout's width at spaces, continuation lines indented by `indent` spaces (or
 * the given prefix). A word longer than a line is left whole. No width: the text as it is.
 */
export function wrap(text: string, width: number | null, indent: number | string = 2): string {
  if (width === null) return text;
  const pad = typeof indent === "number" ? " ".repeat(indent) : indent;
  return keepTogether(text)
    .split("\n")
    .map((paragraph) => {
      const lead = /^\s*/.exec(paragraph)![0];
      const words = paragraph.slice(lead.length).split(/ +/);
      const lines: string[] = [];
      let line = lead;
      for (const word of words) {
        const start = lines.length === 0 ? lead : pad;
        if (line.trim() === "") line = start + word;
        else if (visibleWidth(line) + 1 + visibleWidth(word) <= width) line += ` ${word}`;
        else {
          lines.push(line);
          line = pad + word;
        }
      }
      lines.push(line);
      return lines.join("\n");
    })
    .join("\n")
    .replace(/\u00a0/g, " ");
}

export interface Column {
  /** Heading; a second line (usually the unit) after "\n". */
  head: string;
  align?: "left" | "right";
  /**
   * When the table is too wide: "keep" stays in the compact row, "detail" moves to the lines below
   * the row (as "heading: value unit"), "drop" is left out (the table says where to find it).
   * Columns leave the compact row from the last one back (or by `rank`).
   */
  narrow?: "keep" | "detail" | "drop";
  /**
   * For "detail" and "drop" columns: the order in which they are offered the room the "keep"
   * columns leave, lowest first (default: the column's position), so a table can keep its main
   * numbers in the compact row before the columns that precede them.
   */
  rank?: number;
  /** Unit appended to a detail value ("22.0 cfs"); defaults to the heading's second line without parentheses. */
  unit?: string;
  /** How a detail line names the column ("Tc used"); defaults to the heading's first line in lower case. */
  label?: string;
  /**
   * A column of words (a check's name and source) that may be narrowed to this many cells (or its
   * longest word, if wider) when the table is too wide, its cells wrapped at spaces within it.
   */
  wrap?: number;
}

export interface Cell {
  text: string;
  tone?: Tone;
}

export type Row = (string | Cell)[];

export interface RenderedTable {
  text: string;
  /** Whether the table was narrowed to the width (columns wrapped, moved below the rows or dropped). */
  compact: boolean;
  /** Headings of dropped columns. */
  dropped: string[];
}

/** The narrowest a column of storm names becomes in a narrowed table (its longest word if wider):
 * a user's storm names may be long, or hold wide characters. */
export const STORM_NAME_WIDTH = 8;

/** Between two columns. */
const GAP = "  ";
/** A space that must not break inside a wrapping cell (cli-table3 breaks at any white space, no-break spaces too). */
const GLUE = "\uFDEF";

/** cli-table3 without borders: columns apart by GAP, no padding, no colours of its own. */
const CHARS = {
  top: "", "top-mid": "", "top-left": "", "top-right": "",
  bottom: "", "bottom-mid": "", "bottom-left": "", "bottom-right": "",
  left: "", "left-mid": "", mid: "", "mid-mid": "",
  right: "", "right-mid": "", middle: GAP,
};

function cellText(c: string | Cell | undefined): string {
  return c === undefined ? "" : typeof c === "string" ? c : c.text;
}

function headLines(column: Column): string[] {
  return column.head.split("\n");
}

/** What cli-table3 is given for a cell: control characters escaped (so widths are what the terminal
 * shows), a number and its unit glued, outfit's styling as the SGR codes cli-table3 knows. */
function content(layout: Layout, text: string, tone: Tone | undefined): string {
  const glued = keepTogether(terminalSafe(text)).replace(/\u00a0/g, GLUE);
  return styleAsAnsi(tone ? paint(layout, tone, glued) : glued);
}

/** Widest unbreakable word of a wrapping column (its heading and cells). */
function longestWord(column: Column, rows: readonly Row[], index: number): number {
  const texts = [column.head, ...rows.map((row) => cellText(row[index]))];
  let widest = 0;
  for (const text of texts) for (const word of keepTogether(text).split(/[ \n]+/)) widest = Math.max(widest, visibleWidth(word));
  return widest;
}

interface Drawn {
  lines: string[];
  /** Lines of each row, the heading's first. */
  heights: number[];
  /** Cells of each column, as cli-table3 measured them (no width given: its natural width). */
  widths: number[];
}

/** The heading and the rows of the given columns, drawn by cli-table3 (widths given for some columns: those wrap). */
function draw(layout: Layout, columns: readonly Column[], indices: readonly number[], rows: readonly Row[], fixed: ReadonlyMap<number, number> = new Map()): Drawn {
  const table = new Table({
    chars: CHARS,
    style: { "padding-left": 0, "padding-right": 0, head: [], border: [] },
    colAligns: indices.map((i) => columns[i].align ?? "left"),
    colWidths: indices.map((i) => fixed.get(i) ?? null),
    // The heading's lines sit at the bottom: a one-line heading beside two-line ones is on the second.
    rowAligns: ["bottom"],
  });
  const cell = (i: number, text: string) => (fixed.has(i) ? { content: text, wordWrap: true } : text);
  table.push(indices.map((i) => cell(i, content(layout, columns[i].head, "strong"))));
  for (const row of rows) {
    table.push(indices.map((i) => {
      const c = row[i];
      return cell(i, content(layout, cellText(c), typeof c === "string" ? undefined : c?.tone));
    }));
  }
  const text = table.toString();
  const glue = new RegExp(GLUE, "g");
  const lines = text.split("\n").map((line) => ansiAsStyle(line).replace(glue, " ").trimEnd());
  return { lines, heights: table.options.rowHeights.map(Number), widths: table.options.colWidths.map(Number) };
}

function spanOf(widths: readonly number[]): number {
  return widths.reduce((sum, w) => sum + w, 0) + GAP.length * Math.max(0, widths.length - 1);
}

function unitOf(column: Column): string {
  if (column.unit !== undefined) return column.unit;
  const second = headLines(column)[1];
  return second ? second.replace(/^\(|\)$/g, "") : "";
}

/**
 * A table in the layout: whole when it fits (or with `--wide`, or without a width); otherwise the
 * compact row holds the "keep" columns, wrapping columns at their narrowest, and as many of the
 * others, in order of rank, as fit (shown in their own order); the rest go to the detail lines (or
 * are dropped), and the wrapping columns share the room left, up to their whole width.
 */
export function renderTable(layout: Layout, columns: readonly Column[], rows: readonly Row[]): RenderedTable {
  const all = columns.map((_, i) => i);
  const whole = draw(layout, columns, all, rows);
  if (layout.wide || layout.width === null || spanOf(whole.widths) <= layout.width) {
    return { text: whole.lines.join("\n"), compact: false, dropped: [] };
  }
  const width = layout.width;
  const natural = whole.widths;
  const narrowest = all.map((i) => (columns[i].wrap === undefined ? natural[i] : Math.min(natural[i], Math.max(columns[i].wrap!, longestWord(columns[i], rows, i)))));
  const span = (indices: readonly number[]) => spanOf(indices.map((i) => narrowest[i]));
  const shown = all.filter((i) => (columns[i].narrow ?? "keep") === "keep");
  const offered = [...all].sort((a, b) => (columns[a].rank ?? a) - (columns[b].rank ?? b));
  for (const i of offered) {
    if (shown.includes(i)) continue;
    const trial = [...shown, i].sort((a, b) => a - b);
    if (span(trial) <= width) shown.splice(0, shown.length, ...trial);
  }
  // The room left makes whole first the wrapping columns that lack least (a slack on two lines
  // for a few cells more is a poor trade), then widens the others, each up to its whole width.
  const fixed = new Map<number, number>();
  let room = Math.max(0, width - span(shown));
  const wrapping = shown.filter((i) => columns[i].wrap !== undefined).sort((a, b) => natural[a] - narrowest[a] - (natural[b] - narrowest[b]) || a - b);
  for (const i of wrapping) {
    const w = Math.min(natural[i], narrowest[i] + room);
    room -= w - narrowest[i];
    if (w < natural[i]) fixed.set(i, w);
  }
  const hidden = all.filter((i) => !shown.includes(i));
  const details = hidden.filter((i) => columns[i].narrow === "detail");
  const dropped = hidden.filter((i) => columns[i].narrow === "drop").map((i) => headLines(columns[i]).join(" "));
  const detail = (row: Row): string[] => {
    if (details.length === 0) return [];
    const items = details
      .map((i) => {
        const value = cellText(row[i]).replace(/\n/g, " ").trim();
        if (value === "" || value === "-") return "";
        const unit = unitOf(columns[i]);
        const numeric = /^-?[\d.,]+( %)?$/.test(value);
        // The label's words stay on one line ("time to peak:").
        const label = (columns[i].label ?? headLines(columns[i])[0].toLowerCase()).replace(/ /g, "\u00a0");
        return `${label}: ${value}${unit && numeric ? ` ${unit}` : ""}`;
      })
      .filter((s) => s !== "");
    return items.length ? [wrap(`    ${items.join("; ")}`, width, 6)] : [];
  };
  const drawn = draw(layout, columns, shown, rows, fixed);
  const lines: string[] = [];
  let at = 0;
  drawn.heights.forEach((height, r) => {
    lines.push(...drawn.lines.slice(at, at + height));
    at += height;
    if (r > 0) lines.push(...detail(rows[r - 1]));
  });
  return { text: lines.join("\n"), compact: true, dropped };
}

/** Each line too wide wrapped on its own, continuation lines indented two more than it (messages: notes, errors). */
export function wrapLines(text: string, width: number): string {
  return text
    .split("\n")
    .map((line) => (visibleWidth(line) <= width ? line : wrap(line, width, `${/^ */.exec(line)![0]}  `)))
    .join("\n");
}

/** A shell command too wide for a line, continued with backslashes (an option stays with its value). */
function wrapCommand(line: string, width: number): string {
  const lead = /^\s*/.exec(line)![0];
  const tokens = line.trim().split(/ +/);
  const words: string[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const withValue = tokens[i].startsWith("-") && i + 1 < tokens.length && !tokens[i + 1].startsWith("-");
    words.push(withValue ? `${tokens[i]} ${tokens[++i]}` : tokens[i]);
  }
  const lines: string[] = [];
  let current = lead + words[0];
  for (const word of words.slice(1)) {
    // Room for the " \\" that continues the line.
    if (visibleWidth(current) + 1 + visibleWidth(word) + 2 <= width) current += ` ${word}`;
    else {
      lines.push(`${current} \\`);
      current = `${lead}    ${word}`;
    }
  }
  lines.push(current);
  return lines.join("\n");
}

/**
 * Help text (commands' --help) to a width: prose lines run together into paragraphs and wrap;
 * indented lines (examples) stay as written when they fit, else an example's "# comment" goes on
 * the line below it, and what is still too wide wraps with a deeper indent.
 */
export function formatHelpText(text: string, width: number): string {
  const out: string[] = [];
  let paragraph: string[] = [];
  const flush = () => {
    if (paragraph.length) out.push(wrap(paragraph.join(" "), width, 0));
    paragraph = [];
  };
  for (const line of text.split("\n")) {
    if (line.trim() === "" || /^\s/.test(line)) {
      flush();
      if (line.trim() === "" || visibleWidth(line) <= width) {
        out.push(line);
        continue;
      }
      const lead = /^\s*/.exec(line)![0];
      const comment = /^(.*?\S)\s+(# .*)$/.exec(line);
      const pieces = comment ? [comment[1], `${lead}    ${comment[2]}`] : [line];
      for (const piece of pieces) out.push(visibleWidth(piece) <= width ? piece : /^\s*outfit /.test(piece) ? wrapCommand(piece, width) : wrap(piece, width, `${lead}    `));
    } else paragraph.push(line);
  }
  flush();
  return out.join("\n");
}
