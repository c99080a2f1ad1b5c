// Runs the built command line (dist/src/cli.js; `npm test` builds it first) as a user would.
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { resolve } from "node:path";

export const ROOT = resolve(fileURLToPath(new URL("../..", import.meta.url)));
const CLI = resolve(ROOT, "dist/src/cli.js");

export interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

export function outfit(...args: string[]): Run {
  return outfitWith({}, ...args);
}

/**
 * The command line with these environment variables set (undefined: unset). COLUMNS is unset unless
 * given, so what the tests see does not depend on the terminal they run in.
 */
export function outfitWith(vars: Record<string, string | undefined>, ...args: string[]): Run {
  const env = { ...process.env };
  delete env.OUTFIT_DEBUG;
  delete env.COLUMNS;
  for (const [name, value] of Object.entries(vars)) {
    if (value === undefined) delete env[name];
    else env[name] = value;
  }
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: "utf8", env, timeout: 120_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** A stack trace line ("    at load (file.js:1:2)") or a raw error name in the output. */
export function looksLikeStackTrace(text: string): boolean {
  return /^\s+at .+:\d+:\d+\)?$/m.test(text) || /\b(TypeError|ReferenceError|RangeError|SyntaxError|ZodError)\b/.test(text);
}
