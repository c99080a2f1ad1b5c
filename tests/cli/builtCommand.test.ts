// The built command line can be run as a program, as `npx outfit` and the README's cluster recipe
// run it. npx links a project it has run before from its own cache and then executes
// dist/src/cli.js directly, without setting its mode again; a fresh build from tsc is not
// executable, so a checkout rebuilt in a folder npx already knew failed every job with
// "outfit: Permission denied" (seen on a clean CI run of the Slurm recipe). `npm run build` (and
// so `npm ci`, `npm test`, `npm run bench`) now marks it executable.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { ROOT } from "./run.js";

const CLI = join(ROOT, "dist/src/cli.js");

describe("the built command line", () => {
  it("is executable by everyone who may read it, and starts with a node shebang", () => {
    const mode = statSync(CLI).mode;
    expect((mode & 0o111).toString(8), `dist/src/cli.js has mode ${(mode & 0o777).toString(8)}`).toBe("111");
    expect(readFileSync(CLI, "utf8").split("\n")[0]).toBe("#!/usr/bin/env node");
  });

  it("runs as a program on its own (no node in front), as npx runs it", () => {
    const r = spawnSync(CLI, ["--version"], { cwd: ROOT, encoding: "utf8" });
    expect(r.error, String(r.error)).toBeUndefined();
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout.trim()).toBe(JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")).version);
  });
});
