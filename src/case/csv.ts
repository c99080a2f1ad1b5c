// Reads an inflow hydrograph CSV: a header row, then `time,flow` rows (minutes, or hours when the
// header's first column is `hours`). Reports bad rows with file:line.
import type { Problem } from "./errors.js";
import { show } from "./errors.js";

export interface CsvSeries {
  /** Minutes. */
  times: number[];
  flows: number[];
}

export function parseInflowCsv(text: string, fileLabel: string): CsvSeries | Problem {
  const lines = text.split(/\r?\n/);
  let headerLine = -1;
  for (let i = 0; i < lines.length; i++) {
    if (lines[i].trim() !== "") {
      headerLine = i;
      break;
    }
  }
  if (headerLine < 0) return { where: fileLabel, found: "an empty file", expected: "a header row, then time,flow rows" };
  const split = (line: string) => line.split(/[,;\t]/).map((cell) => cell.trim());
  const header = split(lines[headerLine]);
  const firstHeader = header[0].toLowerCase().replace(/^"|"$/g, "");
  if (header.length < 2 || /^[-+.\d]/.test(firstHeader)) {
    return {
      where: `${fileLabel}:${headerLine + 1}`,
      found: show(lines[headerLine]),
      expected: 'a header row such as "minutes,flow" or "hours,flow"',
    };
  }
  const scale = firstHeader.startsWith("hour") ? 60 : 1;
  const times: number[] = [];
  const flows: number[] = [];
  for (let i = headerLine + 1; i < lines.length; i++) {
    const line = lines[i];
    if (line.trim() === "") continue;
    const where = `${fileLabel}:${i + 1}`;
    const cells = split(line);
    if (cells.length < 2) return { where, found: show(line), expected: "a row of two numbers: time,flow" };
    const time = Number(cells[0]);
    const flow = Number(cells[1]);
    if (cells[0] === "" || !Number.isFinite(time)) return { where, found: show(cells[0]), expected: "a time (number)" };
    if (cells[1] === "" || !Number.isFinite(flow)) return { where, found: show(cells[1]), expected: "a flow (number)" };
    if (flow < 0) return { where, found: show(flow), expected: "a flow of zero or more" };
    if (times.length > 0 && !(time * scale > times[times.length - 1])) {
      return { where, found: show(time), expected: `a time later than the row before (${times[times.length - 1] / scale})` };
    }
    times.push(time * scale);
    flows.push(flow);
  }
  if (times.length < 2) return { where: fileLabel, found: `${times.length} data rows`, expected: "at least two time,flow rows" };
  return { times, flows };
}
