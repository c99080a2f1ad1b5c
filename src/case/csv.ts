// Reads an inflow hydrograph CSV as spreadsheets export it: a header row, then `time,flow` rows.
// - Separator: a tab or ";" when the header holds one, else ",". With ";" or a tab, a decimal comma
//   ("0,26") is a decimal point; with "," a cell holding a comma is an error (decimal or thousands?).
// - Time unit from the first header cell: minutes by default (the case format), hours when it names
//   h, hr, hrs, hour(s), seconds when it names s, sec, second(s), minutes for min, mins, minute(s)
//   (e.g. `hours`, `Time (h)`, `time_min`). Times may also be written hh:mm or hh:mm:ss.
// - Flow unit from the second header cell when it names one (`Flow (cfs)`, `Q [L/s]`), else the
//   case's flow unit.
// - A row with more non-empty cells than the header has columns is an error, as is any cell that is
//   not a number; every problem names file:line. At most MAX_ROWS data rows.
import type { Problem } from "./errors.js";
import { show } from "./errors.js";
import { FLOW_UNITS, parseNumber } from "../units.js";
import { own } from "../own.js";

export interface CsvSeries {
  /** Minutes. */
  times: number[];
  /** In the case's flow unit, or in the header's unit when `flowFactor` is given. */
  flows: number[];
  /** m3/s per flow value when the header names a flow unit; null: the case's unit. */
  flowFactor: number | null;
  /** How the file was read, for a note: separator, decimal mark, time and flow units. */
  reading: string;
}

/** Most data rows of an inflow file (a 10-day, 1-second record has 864,000). */
export const MAX_ROWS = 2_000_000;

const TIME_UNITS: Readonly<Record<string, { minutes: number; name: string }>> = {
  h: { minutes: 60, name: "hours" },
  hr: { minutes: 60, name: "hours" },
  hrs: { minutes: 60, name: "hours" },
  hour: { minutes: 60, name: "hours" },
  hours: { minutes: 60, name: "hours" },
  min: { minutes: 1, name: "minutes" },
  mins: { minutes: 1, name: "minutes" },
  minute: { minutes: 1, name: "minutes" },
  minutes: { minutes: 1, name: "minutes" },
  s: { minutes: 1 / 60, name: "seconds" },
  sec: { minutes: 1 / 60, name: "seconds" },
  secs: { minutes: 1 / 60, name: "seconds" },
  second: { minutes: 1 / 60, name: "seconds" },
  seconds: { minutes: 1 / 60, name: "seconds" },
};

const SEPARATOR_NAMES: Readonly<Record<string, string>> = { ",": "comma", ";": "semicolon", "\t": "tab" };

export function parseInflowCsv(text: string, fileLabel: string): CsvSeries | Problem {
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/);
  let headerLine = -1;
  for (let i = 0; i < lines.length; i++) {
    if (lines[i].trim() !== "") {
      headerLine = i;
      break;
    }
  }
  if (headerLine < 0) return { where: fileLabel, found: "an empty file", expected: "a header row, then time,flow rows" };
  const headerText = lines[headerLine];
  const separator = headerText.includes("\t") ? "\t" : headerText.includes(";") ? ";" : ",";
  const decimalComma = separator !== ",";
  const header = splitCells(headerText, separator);
  const headerWhere = `${fileLabel}:${headerLine + 1}`;
  if (header.length < 2 || parseCell(header[0], decimalComma) !== null) {
    return { where: headerWhere, found: show(headerText), expected: 'a header row such as "minutes,flow", "hours,flow" or "Time (h);Flow (cfs)"' };
  }
  const timeUnit = unitIn(header[0]);
  let timeScale = 1;
  let timeName = "minutes (no unit in the header)";
  if (timeUnit !== null) {
    const known = own(TIME_UNITS, timeUnit);
    if (!known) {
      return { where: headerWhere, found: show(header[0]), expected: `a time column named in minutes, hours or seconds (${Object.keys(TIME_UNITS).join(", ")}), e.g. "Time (h)"` };
    }
    timeScale = known.minutes;
    timeName = known.name;
  }
  const flowUnit = unitIn(header[1]);
  const flowFactor = flowUnit === null ? null : (own(FLOW_UNITS, flowUnit) ?? null);
  if (flowUnit !== null && flowFactor === null) {
    return { where: headerWhere, found: show(header[1]), expected: `a flow unit among ${Object.keys(FLOW_UNITS).join(", ")}, or none (the case's unit)` };
  }
  const times: number[] = [];
  const flows: number[] = [];
  let clock = false;
  for (let i = headerLine + 1; i < lines.length; i++) {
    const line = lines[i];
    if (line.trim() === "") continue;
    const where = `${fileLabel}:${i + 1}`; // (cheap: a rope, flattened only when reported)
    if (times.length >= MAX_ROWS) return { where, found: `more than ${MAX_ROWS} data rows`, expected: `an inflow of at most ${MAX_ROWS} rows (resample it coarser)` };
    const cells = splitCells(line, separator);
    while (cells.length > header.length && cells[cells.length - 1] === "") cells.pop();
    if (cells.length < 2) return { where, found: show(line), expected: `a row of two numbers: time${separator}flow` };
    if (cells.length > header.length) {
      return { where, found: `${cells.length} cells (${show(line)})`, expected: `a row of ${header.length} cells like the header (separator ${SEPARATOR_NAMES[separator]}${decimalComma ? ", decimal comma" : ""})` };
    }
    const clockTime = cells[0].includes(":") ? parseClock(cells[0]) : null;
    if (clockTime !== null) clock = true;
    const time = clockTime ?? mapNumber(parseCell(cells[0], decimalComma), (t) => t * timeScale);
    const flow = parseCell(cells[1], decimalComma);
    if (time === null) return { where, found: show(cells[0]), expected: `a time (number, or hh:mm)${decimalComma ? "" : '; a decimal comma needs ";" as the separator'}` };
    if (flow === null) return { where, found: show(cells[1]), expected: `a flow (number)${decimalComma ? "" : '; a decimal comma needs ";" as the separator'}` };
    if (flow < 0) return { where, found: show(flow), expected: "a flow of zero or more" };
    if (times.length > 0 && !(time > times[times.length - 1])) {
      return { where, found: show(cells[0]), expected: `a time later than the row before (${show(lines[lastDataLine(lines, i)].trim())})` };
    }
    times.push(time);
    flows.push(flow);
  }
  if (times.length < 2) return { where: fileLabel, found: `${times.length} data rows`, expected: "at least two time,flow rows" };
  const reading = [
    `separator ${SEPARATOR_NAMES[separator]}`,
    decimalComma ? "decimal comma or point" : "decimal point",
    `times in ${clock ? "hh:mm" + (timeUnit !== null ? ` or ${timeName}` : "") : timeName}`,
    `flows in ${flowFactor !== null ? flowUnit : "the case's unit"}`,
  ].join(", ");
  return { times, flows, flowFactor, reading };
}

/** Splits a line at the separator, honouring double quotes ("0,26" stays one cell). */
function splitCells(line: string, separator: string): string[] {
  if (!line.includes('"')) return line.split(separator).map((cell) => cell.trim());
  const cells: string[] = [];
  let cell = "";
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (ch === '"') {
      if (quoted && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else quoted = !quoted;
    } else if (ch === separator && !quoted) {
      cells.push(cell.trim());
      cell = "";
    } else cell += ch;
  }
  cells.push(cell.trim());
  return cells;
}

/** A numeric cell (the one number parser of units.ts), with a decimal comma where the separator
 * allows one (in a comma-separated file a quoted "1,234" could be a thousands mark: an error). */
function parseCell(cell: string, decimalComma: boolean): number | null {
  if (decimalComma && /^[-+]?\d*,\d+(?:[eE][-+]?\d+)?$/.test(cell)) return parseNumber(cell.replace(",", "."));
  return parseNumber(cell);
}

/** "01:30" or "01:30:15" (hours:minutes[:seconds]) as minutes, else null. */
function parseClock(cell: string): number | null {
  const match = /^(\d{1,3}):([0-5]\d)(?::([0-5]\d(?:[.,]\d+)?))?$/.exec(cell);
  if (!match) return null;
  const seconds = match[3] === undefined ? 0 : Number(match[3].replace(",", "."));
  return Number(match[1]) * 60 + Number(match[2]) + seconds / 60;
}

/** The unit a header cell names: in brackets ("Time (h)", "Q [cfs]") or after the last space or
 * underscore ("time_min", "flow cfs"), or the whole cell when it is a unit ("hours"); lower case. */
function unitIn(cell: string): string | null {
  const text = cell.trim().toLowerCase();
  const bracket = /[([]\s*([^)\]]+?)\s*[)\]]\s*$/.exec(text);
  if (bracket) return bracket[1];
  if (own(TIME_UNITS, text) || own(FLOW_UNITS, text)) return text;
  const tail = /[\s_]([a-z0-9/]+)$/.exec(text);
  if (tail && (own(TIME_UNITS, tail[1]) || own(FLOW_UNITS, tail[1]))) return tail[1];
  return null;
}

function mapNumber(value: number | null, f: (v: number) => number): number | null {
  return value === null ? null : f(value);
}

function lastDataLine(lines: string[], before: number): number {
  for (let i = before - 1; i >= 0; i--) if (lines[i].trim() !== "") return i;
  return before;
}
