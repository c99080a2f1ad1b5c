// Output files are written whole or not at all: a temporary file beside the target, then a rename.
// A path that cannot be written (a directory, a path through a file, no permission, a read-only or
// special file system) is the user's error: a CaseError naming the path, never an internal error.
import { appendFileSync, mkdirSync, renameSync, rmSync, statSync, writeFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { CaseError, describeIoError } from "./case/errors.js";
import { colourAllowed, forTerminal, streamWidth } from "./terminalText.js";
import { MIN_WIDTH, wrapLines } from "./report/terminal.js";

export { terminalSafe } from "./terminalText.js";

export function writeFileAtomic(path: string, content: string): void {
  makeDirectory(dirname(path));
  if (isDirectory(path)) throw unwritable(path, "a directory", "a file name to write (this is a directory)");
  const temporary = `${path}.${process.pid}.tmp`;
  try {
    writeFileSync(temporary, content);
    renameSync(temporary, path);
  } catch (error) {
    rmSync(temporary, { force: true });
    throw unwritable(path, describeIoError(error));
  }
}

/** Appends a line to a file (the design journal), as a user error when it cannot be written. */
export function appendLine(path: string, line: string): void {
  try {
    appendFileSync(path, line.endsWith("\n") ? line : line + "\n");
  } catch (error) {
    throw unwritable(path, describeIoError(error));
  }
}

/** Creates a directory and its parents, as a user error when it cannot be made. One level at a
 * time, at most once per part of the path: Node's recursive mkdir never returns on some special
 * file systems (`/proc/x` spun for hours). */
export function makeDirectory(path: string): void {
  const missing: string[] = [];
  let at = resolve(path);
  while (!isDirectory(at)) {
    missing.push(at);
    const parent = dirname(at);
    if (parent === at) break;
    at = parent;
  }
  for (let i = missing.length - 1; i >= 0; i--) {
    try {
      mkdirSync(missing[i]);
    } catch (error) {
      if ((error as { code?: string }).code === "EEXIST" && isDirectory(missing[i])) continue;
      throw unwritable(path, describeIoError(error), "a directory that can be created and written");
    }
  }
}

function isDirectory(path: string): boolean {
  try {
    return statSync(path).isDirectory();
  } catch {
    return false;
  }
}

function unwritable(path: string, found: string, expected = "a path where a file can be written"): CaseError {
  return new CaseError([{ where: path, found, expected }]);
}

/** Writes to standard output: control characters in user text escaped, outfit's styling as colour
 * only where colour is allowed (terminalText.ts). */
export function printOut(text: string): void {
  process.stdout.write(forTerminal(text, colourAllowed(process.stdout)));
}

/** Writes to standard error like printOut; on a terminal each line is wrapped to its width
 * (continuation lines indented two more than the line), piped messages stay whole. */
export function printErr(text: string): void {
  const width = process.stderr.isTTY ? streamWidth(process.stderr) : null;
  process.stderr.write(forTerminal(width === null ? text : wrapLines(text, Math.max(MIN_WIDTH, width)), colourAllowed(process.stderr)));
}
