// Console layout: how wide the output may be, whether to colour it, and tables that fit the width.
// A table that does not fit keeps its leading columns in a compact row and moves the rest to indented
// detail lines below the row (or drops them, for columns a table names as droppable).

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
  const fromEnv = env.COLUMNS !== undefined && /^\s*\d+\s*$/.test(env.COLUMNS) ? Number(env.COLUMNS) : null;
  const fromTerminal = stream.isTTY && stream.columns ? stream.columns : null;
  const raw = fromEnv ?? fromTerminal;
  const width = raw === null ? null : Math.max(MIN_WIDTH, raw);
  const colour = stream.isTTY === true && !(env.NO_COLOR !== undefined && env.NO_COLOR !== "") && env.TERM !== "dumb";
  return { width, wide: request.wide === true, colour };
}

const ANSI = /\u001b\[[0-9;]*m/g;

/** Visible length of a string (ANSI colour codes take no room). */
export function visibleLength(text: string): number {
  return text.replace(ANSI, "").length;
}

export type Tone = "pass" | "fail" | "strong" | "muted";

const CODES: Record<Tone, [string, string]> = {
  pass: ["\u001b[32m", "\u001b[39m"],
  fail: ["\u001b[31;1m", "\u001b[39;22m"],
  strong: ["\u001b[1m", "\u001b[22m"],
  muted: ["\u001b[2m", "\u001b[22m"],
};

/** Text in a tone when the layout allows colour, else unchanged. */
export function paint(layout: Layout, tone: Tone, text: string): string {
  if (!layout.colour || text === "") return text;
  const [on, off] = CODES[tone];
  return `${on}${text}${off}`;
}

/**
 * Wraps prose to the layout's width at spaces, continuation lines indented by `indent` spaces (or
 * the given prefix). A word longer than a line is left whole. No width: the text as it is.
 */
export function wrap(text: string, width: number | null, indent: number | string = 2): string {
  if (width === null) return text;
  const pad = typeof indent === "number" ? " ".repeat(indent) : indent;
  // A number and its unit ("1 %", "3.0 ft") stay on one line, and so does a slope ("3 H : 1 V").
  return text
    .replace(/(\d) H : (\d+(?:\.\d+)?) V\b/g, "$1\u00a0H\u00a0:\u00a0$2\u00a0V")
    .replace(/(\d) (%|ft|in|m|mm|h|min|s|ac|ha|cfs|m3\/s|ft2|ft3|m2|m3|yr)\b/g, "$1\u00a0$2")
    .replace(/(\d) %/g, "$1\u00a0%")
    .split("\n")
    .map((paragraph) => {
      const lead = /^\s*/.exec(paragraph)![0];
      const words = paragraph.slice(lead.length).split(/ +/);
      const lines: string[] = [];
      let line = lead;
      for (const word of words) {
        const start = lines.length === 0 ? lead : pad;
        if (line.trim() === "") line = start + word;
        else if (visibleLength(line) + 1 + visibleLength(word) <= width) line += ` ${word}`;
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
}

export interface Cell {
  text: string;
  tone?: Tone;
}

export type Row = (string | Cell)[];

export interface RenderedTable {
  text: string;
  /** Whether columns were moved below the rows or dropped. */
  compact: boolean;
  /** Headings of dropped columns. */
  dropped: string[];
}

const GAP = "  ";

function cellText(c: string | Cell): string {
  return typeof c === "string" ? c : c.text;
}

function headLines(column: Column): string[] {
  return column.head.split("\n");
}

/** Width of a column over its heading lines and the lines of its cells. */
function columnWidth(column: Column, rows: readonly Row[], index: number): number {
  let w = 0;
  for (const line of headLines(column)) w = Math.max(w, line.length);
  for (const row of rows) for (const line of cellText(row[index] ?? "").split("\n")) w = Math.max(w, line.length);
  return w;
}

function pad(text: string, width: number, align: "left" | "right"): string {
  const room = width - visibleLength(text);
  if (room <= 0) return text;
  return align === "right" ? " ".repeat(room) + text : text + " ".repeat(room);
}

function renderColumns(layout: Layout, columns: readonly Column[], indices: readonly number[], rows: readonly Row[], detail: (row: Row) => string[]): string {
  const widths = indices.map((i) => columnWidth(columns[i], rows, i));
  const headHeight = Math.max(...indices.map((i) => headLines(columns[i]).length));
  const lines: string[] = [];
  for (let h = 0; h < headHeight; h++) {
    const cells = indices.map((i, k) => {
      const parts = headLines(columns[i]);
      // Headings sit at the bottom: a one-line heading beside two-line ones is on the second line.
      const line = parts[h - (headHeight - parts.length)] ?? "";
      return pad(line, widths[k], columns[i].align ?? "left");
    });
    lines.push(paint(layout, "strong", cells.join(GAP).trimEnd()));
  }
  for (const row of rows) {
    const cellLines = indices.map((i) => cellText(row[i] ?? "").split("\n"));
    const height = Math.max(...cellLines.map((l) => l.length));
    for (let h = 0; h < height; h++) {
      const cells = indices.map((i, k) => {
        const raw = cellLines[k][h] ?? "";
        const c = row[i];
        const toned = typeof c !== "string" && c?.tone ? paint(layout, c.tone, raw) : raw;
        return pad(toned, widths[k], columns[i].align ?? "left");
      });
      lines.push(cells.join(GAP).trimEnd());
    }
    lines.push(...detail(row));
  }
  return lines.join("\n");
}

function tableWidth(columns: readonly Column[], indices: readonly number[], rows: readonly Row[]): number {
  return indices.reduce((sum, i) => sum + columnWidth(columns[i], rows, i), 0) + GAP.length * Math.max(0, indices.length - 1);
}

function unitOf(column: Column): string {
  if (column.unit !== undefined) return column.unit;
  const second = headLines(column)[1];
  return second ? second.replace(/^\(|\)$/g, "") : "";
}

/**
 * A table in the layout: whole when it fits (or with `--wide`, or without a width); otherwise the
 * compact row holds the "keep" columns and as many of the others, in order of rank, as fit (shown
 * in their own order), and the rest go to the detail lines (or are dropped).
 */
export function renderTable(layout: Layout, columns: readonly Column[], rows: readonly Row[]): RenderedTable {
  const all = columns.map((_, i) => i);
  if (layout.wide || layout.width === null || tableWidth(columns, all, rows) <= layout.width) {
    return { text: renderColumns(layout, columns, all, rows, () => []), compact: false, dropped: [] };
  }
  const width = layout.width;
  const shown = all.filter((i) => (columns[i].narrow ?? "keep") === "keep");
  const offered = [...all].sort((a, b) => (columns[a].rank ?? a) - (columns[b].rank ?? b));
  for (const i of offered) {
    if (shown.includes(i)) continue;
    const trial = [...shown, i].sort((a, b) => a - b);
    if (tableWidth(columns, trial, rows) <= width) shown.splice(0, shown.length, ...trial);
  }
  const hidden = all.filter((i) => !shown.includes(i));
  const details = hidden.filter((i) => columns[i].narrow === "detail");
  const dropped = hidden.filter((i) => columns[i].narrow === "drop").map((i) => headLines(columns[i]).join(" "));
  const detail = (row: Row): string[] => {
    if (details.length === 0) return [];
    const items = details
      .map((i) => {
        const value = cellText(row[i] ?? "").replace(/\n/g, " ").trim();
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
  return { text: renderColumns(layout, columns, shown, rows, detail), compact: true, dropped };
}
