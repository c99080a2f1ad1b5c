// The search's division into parts, measured through the built command line as a cluster runs it:
// one `design` on one worker against two shards side by side (one worker each, the two cores) plus
// the gather, on the bundled system of two ponds (cases/two-ponds: both outlets designed together, a
// problem that takes well over 30 s on one worker): wall clock, the speed-up, the layouts the gather
// had to fit itself, and whether the rankings agree. Then what a longer budget buys at 1x, 10x and
// 100x the default budget, on a wider catalogue on the demo pond: ranked by
// cost, the best compliant cost (the cost bar ends this search early); ranked by robustness, the
// largest least reserve over the spread (no cost bar: the budget is spent); and when the first-ranked
// design was found.
import { spawn } from "node:child_process";
import { copyFileSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { BenchSection } from "./section.js";
import { rankingText } from "./measure.js";

const CLI = join(process.cwd(), "dist", "src", "cli.js");
/** Routings of the divided search of the system of two ponds (each storm through the system counts
 * one routing per pond): enough that one worker needs well over 30 s on it. */
const SHARD_BUDGET = 100000;
/** The design command's default budget, and the multiples of it the ladder runs. */
const DEFAULT_BUDGET = 20000;
const LADDER = [1, 10, 100];

interface Ran {
  seconds: number;
  json: { search: Record<string, number | string | null>; candidates: { outlet?: unknown; ponds?: unknown; cost: number; compliant: boolean; spread?: { reserve: number } }[] };
}

/** Runs the command line; its --json output and wall seconds. */
function outfit(args: string[]): Promise<Ran> {
  const started = performance.now();
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [CLI, ...args], { stdio: ["ignore", "pipe", "pipe"] });
    let out = "";
    let err = "";
    child.stdout.on("data", (d) => (out += d));
    child.stderr.on("data", (d) => (err += d));
    child.on("exit", (code) => {
      if (code !== 0 && code !== 1) return reject(new Error(`outfit ${args.join(" ")} exited ${code}: ${err}`));
      resolve({ seconds: (performance.now() - started) / 1000, json: JSON.parse(out) });
    });
  });
}

/**
 * An invented wider catalogue on the demo pond: 11 orifice diameters, up to 4 per level, every
 * weir of the demo, so that the search has real work (written beside copies of the demo's inflows).
 */
function wideCase(): string {
  const dir = mkdtempSync(join(tmpdir(), "outfit-bench-wide-"));
  const demo = join(process.cwd(), "cases", "demo");
  for (const name of readdirSync(demo)) if (name.endsWith(".csv")) copyFileSync(join(demo, name), join(dir, name));
  const c = JSON.parse(readFileSync(join(demo, "case.json"), "utf8")) as Record<string, unknown>;
  delete c.$schema;
  c.name = "Wide catalogue on the demo pond (invented)";
  const catalogue = c.catalogue as Record<string, Record<string, unknown>>;
  catalogue.orifice.diameters = ["3 in", "4 in", "5 in", "6 in", "8 in", "10 in", "12 in", "15 in", "18 in", "21 in", "24 in"];
  catalogue.orifice.maxCount = 4;
  const file = join(dir, "case.json");
  writeFileSync(file, JSON.stringify(c, null, 2));
  return file;
}

const ranking = (r: Ran) => rankingText(r.json.candidates);

async function shardsAgainstOne(file: string): Promise<void> {
  const work = mkdtempSync(join(tmpdir(), "outfit-bench-shards-"));
  const common = ["--budget", String(SHARD_BUDGET), "--seed", "bench", "--workers", "1", "--quiet", "--json"];
  console.log(`\nShards (the system of two ponds, cases/two-ponds, both outlets designed; budget ${SHARD_BUDGET} routings, one worker per process)`);
  const one = await outfit(["design", file, ...common, "--out", join(work, "one")]);
  const shardRuns = await (async () => {
    const started = performance.now();
    const runs = await Promise.all([1, 2].map((k) => outfit(["design", file, ...common, "--shard", `${k}/2`, "--out", join(work, `shard-${k}`)])));
    return { runs, wall: (performance.now() - started) / 1000 };
  })();
  const gather = await outfit(["gather", file, join(work, "shard-1"), join(work, "shard-2"), ...common, "--out", join(work, "all")]);
  const s = one.json.search;
  const g = gather.json.search;
  const gatherFitted = Number(g.layoutsFitted) - Number(g.layoutsFromJournal);
  const divided = shardRuns.wall + gather.seconds;
  console.log(`  one run:            ${one.seconds.toFixed(1)} s, ${s.layoutsFitted} layouts, ${s.routings} routings in ${s.parts} parts`);
  shardRuns.runs.forEach((r, i) => console.log(`  shard ${i + 1}/2:          ${r.seconds.toFixed(1)} s, ${r.json.search.layoutsFitted} layouts, ${r.json.search.partsRun} parts`));
  console.log(`  shards side by side: ${shardRuns.wall.toFixed(1)} s wall; gather ${gather.seconds.toFixed(1)} s, fitted ${gatherFitted} of ${g.layoutsFitted} layouts itself (${((100 * gatherFitted) / Math.max(1, Number(g.layoutsFitted))).toFixed(1)} %)`);
  console.log(`  speed-up, one run / (shards + gather): ${(one.seconds / divided).toFixed(2)}x (aim: at least 1.7x on two cores); rankings ${ranking(one) === ranking(gather) ? "identical" : "DIFFER"}`);
}

async function ladder(file: string): Promise<void> {
  for (const rank of ["cost", "robust"] as const) {
    console.log(`\nWhat a longer budget buys, ranked by ${rank} (wide catalogue on the demo pond, all cores)`);
    for (const times of LADDER) {
      const budget = DEFAULT_BUDGET * times;
      const r = await outfit(["design", file, "--budget", String(budget), "--seed", "bench", "--rank", rank, "--quiet", "--json"]);
      const best = r.json.candidates.find((c) => c.compliant);
      const s = r.json.search;
      const value = !best ? "nothing compliant" : rank === "cost" ? `best compliant cost ${best.cost.toFixed(2)} units` : `largest least reserve ${best.spread!.reserve.toFixed(3)} ft (cost ${best.cost.toFixed(2)})`;
      const found = s.bestFoundAfter != null ? `, first-ranked found after ${s.bestFoundAfter} routings` : "";
      console.log(`  ${String(times).padStart(3)}x (${String(budget).padStart(7)} routings): ${value}; ${s.layoutsFitted} layouts, ${s.routings} routings${found}, ${r.seconds.toFixed(1)} s; stopped because ${s.stoppedBecause}`);
    }
  }
}

export const shardsSection: BenchSection = {
  name: "shards",
  async run() {
    await shardsAgainstOne(join(process.cwd(), "cases", "two-ponds", "case.json"));
    await ladder(wideCase());
  },
};
