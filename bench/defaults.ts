// `design`'s default (no --workers: one thread until the rest of the run is worth the workers' start)
// against `--workers 1`, on every bundled case with a catalogue, through the built command line as a
// user runs it: wall seconds, the first compliant design's time, and whether the rankings agree.
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import type { BenchSection } from "./section.js";
import { rankingText } from "./measure.js";

const CLI = join(process.cwd(), "dist", "src", "cli.js");
/** Runs of each configuration, alternated; the fastest counts (the least disturbed). */
const REPEATS = 2;

interface Ran {
  wall: number;
  first: number | null;
  ranking: string;
}

function design(file: string, extra: string[]): Ran {
  const started = performance.now();
  const r = spawnSync(process.execPath, [CLI, "design", file, "--quiet", "--json", ...extra], { encoding: "utf8", maxBuffer: 1 << 28 });
  const wall = (performance.now() - started) / 1000;
  const json = JSON.parse(r.stdout) as { search: { secondsToFirstCompliant?: number | null }; candidates: { outlet?: unknown; ponds?: unknown; cost: number }[] };
  return { wall, first: json.search.secondsToFirstCompliant ?? null, ranking: rankingText(json.candidates) };
}

export const defaultsSection: BenchSection = {
  name: "defaults",
  run() {
    const dir = join(process.cwd(), "cases");
    console.log(`\nDefault design against --workers 1 (every bundled case with a catalogue, default budget; wall seconds of the whole command, fastest of ${REPEATS} alternated; first compliant in the search's own seconds)`);
    const header = ["case", "default", "--workers 1", "ratio", "first (default)", "first (1)", "rankings"];
    const rows: string[][] = [];
    for (const name of readdirSync(dir).sort()) {
      const file = join(dir, name, "case.json");
      if (!existsSync(file) || !("catalogue" in JSON.parse(readFileSync(file, "utf8")))) continue;
      const defaults: Ran[] = [];
      const ones: Ran[] = [];
      for (let i = 0; i < REPEATS; i++) {
        defaults.push(design(file, []));
        ones.push(design(file, ["--workers", "1"]));
      }
      const best = (runs: Ran[]) => runs.reduce((a, b) => (b.wall < a.wall ? b : a));
      const d = best(defaults);
      const o = best(ones);
      const first = (x: number | null | undefined) => (x == null ? "none" : `${x.toFixed(2)} s`);
      rows.push([name, `${d.wall.toFixed(2)} s`, `${o.wall.toFixed(2)} s`, (d.wall / o.wall).toFixed(2), first(d.first), first(o.first), [...defaults, ...ones].every((r) => r.ranking === o.ranking) ? "identical" : "DIFFER"]);
    }
    const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
    console.log(header.map((h, i) => h.padEnd(widths[i])).join("  "));
    for (const r of rows) console.log(r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join("  "));
  },
};
