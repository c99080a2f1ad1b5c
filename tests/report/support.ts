// Shared pieces of the report's tests: paths, running the built command line, temporary folders.
import { spawnSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

export const ROOT = fileURLToPath(new URL("../..", import.meta.url));
export const DEMO = join(ROOT, "cases/demo/case.json");
export const DESIGN_RUN = join(ROOT, "tests/report/fixtures/design-run");

export interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Runs the built CLI (`npm test` builds it first). */
export function outfit(...args: string[]): Run {
  const result = spawnSync(process.execPath, [join(ROOT, "dist/src/cli.js"), ...args], { encoding: "utf8", cwd: ROOT });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

export function temporaryDirectory(): string {
  return mkdtempSync(join(tmpdir(), "outfit-report-"));
}
