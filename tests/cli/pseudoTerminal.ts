// Runs the built command line under a real pseudo-terminal (util-linux `script`), as an engineer's
// terminal runs it: standard output and error are a terminal of a given width, COLUMNS is unset (the
// width comes from the terminal itself), colour is allowed. Then reads what the terminal was sent:
// literal escape text, control characters other than outfit's own colour codes, and lines wider than
// the terminal (measured in terminal cells, wide characters counted twice, by string-width).
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import stringWidth from "string-width";
import { ROOT } from "./run.js";

const CLI = resolve(ROOT, "dist/src/cli.js");

export interface TerminalRun {
  /** Exit code of outfit (script -e passes it on). */
  status: number | null;
  /** Everything the terminal was sent (stdout and stderr together), line ends as "\n". */
  screen: string;
}

/** Whether util-linux's `script` is on this machine (.ci/setup-terminal installs it). */
export function haveScript(): boolean {
  return spawnSync("script", ["--version"], { encoding: "utf8" }).status === 0;
}

function quoted(word: string): string {
  return `'${word.replace(/'/g, `'\\''`)}'`;
}

/** A fresh directory for the files a command writes. */
export function scratch(): string {
  return mkdtempSync(join(tmpdir(), "outfit-pty-"));
}

/**
 * Runs `outfit ...args` in a pseudo-terminal `columns` wide. `vars` set (or, undefined, unset)
 * environment variables on top of a terminal's usual ones (TERM=xterm-256color, no NO_COLOR, no COLUMNS).
 */
export function inTerminal(columns: number, args: readonly string[], vars: Record<string, string | undefined> = {}): TerminalRun {
  // script runs the command with $SHELL -c: a POSIX shell, whatever the caller's login shell.
  const env: NodeJS.ProcessEnv = { ...process.env, TERM: "xterm-256color", SHELL: "/bin/sh" };
  for (const name of ["COLUMNS", "LINES", "NO_COLOR", "FORCE_COLOR", "OUTFIT_DEBUG"]) delete env[name];
  for (const [name, value] of Object.entries(vars)) {
    if (value === undefined) delete env[name];
    else env[name] = value;
  }
  // The terminal's size is set inside it (stty), then outfit replaces the shell.
  const command = `stty cols ${columns} rows 50 && exec ${[process.execPath, CLI, ...args].map(quoted).join(" ")}`;
  const r = spawnSync("script", ["-q", "-e", "-f", "-c", command, "/dev/null"], {
    cwd: ROOT,
    env,
    encoding: "utf8",
    stdio: ["ignore", "pipe", "pipe"],
    timeout: 300_000,
    maxBuffer: 64 * 1024 * 1024,
  });
  if (r.error) throw r.error;
  return { status: r.status, screen: r.stdout.replace(/\r\n/g, "\n") };
}

/** Text that shows an escape instead of doing it: "\u001b", "\x1b", "\e[", "\033[". */
export function literalEscapes(screen: string): string[] {
  return [...screen.matchAll(/\\u00[0-9a-fA-F]{2}|\\x1[bB]|\\e\[|\\033\[/g)].map((m) => lineAround(screen, m.index!));
}

/** Control characters other than newline, the carriage return of a line rewritten in place, and SGR colour codes. */
export function strayControls(screen: string): string[] {
  const withoutColour = screen.replace(/\u001b\[[0-9;]*m/g, "");
  // eslint-disable-next-line no-control-regex
  return [...withoutColour.matchAll(/[\u0000-\u0009\u000b-\u000c\u000e-\u001f\u007f-\u009f]/g)].map(
    (m) => `U+${m[0].charCodeAt(0).toString(16).padStart(4, "0")} in ${JSON.stringify(lineAround(withoutColour, m.index!))}`,
  );
}

/** Whether outfit's colour reached the terminal (SGR codes as codes). */
export function hasColour(screen: string): boolean {
  return /\u001b\[[0-9;]*m/.test(screen);
}

/**
 * Lines the terminal would show wider than `columns` cells, with their widths. A line rewritten in
 * place ("\r") is measured piece by piece, as each piece is drawn from the first column.
 */
export function overwide(screen: string, columns: number): string[] {
  return screen.split("\n").flatMap((line) =>
    line.split("\r").flatMap((piece) => {
      const width = stringWidth(piece);
      return width > columns ? [`${width}: ${piece.replace(/\u001b\[[0-9;]*m/g, "")}`] : [];
    }),
  );
}

function lineAround(text: string, index: number): string {
  const start = text.lastIndexOf("\n", index) + 1;
  const end = text.indexOf("\n", index);
  return text.slice(start, end === -1 ? undefined : end);
}

/** Every problem of a run at a width, one string each (empty: the terminal shows it cleanly). */
export function screenProblems(run: TerminalRun, columns: number): string[] {
  return [
    ...literalEscapes(run.screen).map((line) => `literal escape text: ${line}`),
    ...strayControls(run.screen).map((what) => `control character ${what}`),
    ...overwide(run.screen, columns).map((line) => `wider than ${columns} columns (${line})`),
  ];
}

/** What a command is held to at a width: its problems on the screen, an exit code that is no answer, colour missing. */
export function checkAtWidth(command: { args: string[]; codes: number[]; coloured: boolean; then?: string[][] }, columns: number): { problems: string[]; screen: string } {
  const dir = scratch();
  try {
    const run = inTerminal(columns, command.args.map((a) => a.replace("<tmp>", dir)));
    const problems = screenProblems(run, columns);
    if (!command.codes.includes(run.status ?? -1)) problems.push(`exit code ${run.status}:\n${run.screen}`);
    if (command.coloured && !hasColour(run.screen)) problems.push("no colour on a colour terminal");
    let screen = run.screen;
    for (const next of command.then ?? []) {
      const after = inTerminal(columns, next.map((a) => a.replace("<tmp>", dir)));
      problems.push(...screenProblems(after, columns).map((p) => `${next[0]}: ${p}`));
      if (after.status !== 0) problems.push(`${next[0]}: exit code ${after.status}:\n${after.screen}`);
      screen += after.screen;
    }
    return { problems, screen };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
