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
  const env = { ...process.env };
  delete env.OUTFIT_DEBUG;
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: "utf8", env, timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** A stack trace line ("    at load (file.js:1:2)") or a raw error name in the output. */
export function looksLikeStackTrace(text: string): boolean {
  return /^\s+at .+:\d+:\d+\)?$/m.test(text) || /\b(TypeError|ReferenceError|RangeError|SyntaxError|ZodError)\b/.test(text);
}
