// The optimiser's figures for every bundled case: time and routings to the first compliant candidate,
// routings per second, the best cost found, side by side with plain random search given the same
// number of routings in the same run.
import { readdirSync, existsSync } from "node:fs";
import { join } from "node:path";
import { loadCase } from "../src/case/load.js";
import { buildProblem } from "../search/engine/problem.js";
import { runSearch } from "../search/engine/run.js";
import { randomSearch } from "../search/engine/randomSearch.js";
import type { BenchSection } from "./section.js";

/** Routings each case may spend in the bench (the design command's default budget). */
const BENCH_BUDGET = 20000;

export const searchSection: BenchSection = {
  name: "search",
  async run() {
    const rows = await benchSearch(join(process.cwd(), "cases"), BENCH_BUDGET);
    printSearchBench(rows, BENCH_BUDGET);
    await searchMemory(join(process.cwd(), "cases", "si-headwall", "case.json"));
  },
};

export interface SearchBenchRow {
  name: string;
  firstSeconds: number | null;
  firstRoutings: number | null;
  seconds: number;
  routings: number;
  perSecond: number;
  bestCost: number | null;
  /** The best compliant design has warnings (no unflagged one was found). */
  bestFlagged: boolean;
  randomFirstSeconds: number | null;
  randomBestCost: number | null;
  randomFlagged: boolean;
  randomSeconds: number;
}

export async function benchSearch(casesDir: string, budget: number): Promise<SearchBenchRow[]> {
  const rows: SearchBenchRow[] = [];
  for (const name of readdirSync(casesDir).sort()) {
    const file = join(casesDir, name, "case.json");
    if (!existsSync(file)) continue;
    const loaded = loadCase(file);
    if (!loaded.data.catalogue) continue;
    const problem = buildProblem(loaded.case, loaded.data);
    const run = await runSearch(problem, { seed: "bench", budget, top: 1, starts: 3, beam: 3 });
    const best = run.candidates.find((c) => c.assessment.compliant) ?? null;
    const random = randomSearch(problem, run.routings, "bench");
    rows.push({
      name,
      firstSeconds: run.secondsToFirstCompliant,
      firstRoutings: run.routingsToFirstCompliant,
      seconds: run.seconds,
      routings: run.routings,
      perSecond: run.routings / run.seconds,
      bestCost: best ? best.cost : null,
      bestFlagged: best ? best.assessment.warnings.length > 0 : false,
      randomFirstSeconds: random.secondsToFirstCompliant,
      randomBestCost: random.best ? random.best.cost : null,
      randomFlagged: random.best ? random.best.assessment.warnings.length > 0 : false,
      randomSeconds: random.seconds,
    });
  }
  return rows;
}

export function printSearchBench(rows: SearchBenchRow[], budget: number): void {
  const f = (x: number | null, digits = 2) => (x === null ? "none" : x.toFixed(digits));
  console.log(`\nOptimiser (budget ${budget} routings per case; random search gets the same number of routings)`);
  console.log("Both keep the same preference: compliant without warnings first, then cost; \"flagged\" = the best compliant one found has a part outside its formula's range.");
  const header = ["case", "first compliant", "routings to first", "routings/s", "search time", "best cost", "random: first", "random: best cost", "cost ratio random/search", "time to first, random/search"];
  const lines = rows.map((r) => [
    r.name,
    r.firstSeconds === null ? "none" : `${f(r.firstSeconds, 3)} s`,
    r.firstRoutings === null ? "-" : String(r.firstRoutings),
    Math.round(r.perSecond).toString(),
    `${f(r.seconds)} s`,
    `${f(r.bestCost, 1)}${r.bestFlagged ? " flagged" : ""}`,
    r.randomFirstSeconds === null ? "none" : `${f(r.randomFirstSeconds, 3)} s`,
    `${f(r.randomBestCost, 1)}${r.randomFlagged ? " flagged" : ""}`,
    r.bestCost === null ? "-" : r.randomBestCost === null ? "random found none" : r.randomFlagged && !r.bestFlagged ? "random: flagged only" : (r.randomBestCost / r.bestCost).toFixed(2),
    r.firstSeconds === null ? "-" : r.randomFirstSeconds === null ? "random found none" : (r.randomFirstSeconds / r.firstSeconds).toFixed(2),
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i].length)));
  console.log(header.map((h, i) => h.padEnd(widths[i])).join("  "));
  for (const l of lines) console.log(l.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join("  "));
}

/** Heap in use after longer and longer searches: it should level off (candidates kept are bounded). */
async function searchMemory(file: string): Promise<void> {
  const gc = (globalThis as { gc?: () => void }).gc;
  const heap = () => {
    gc?.();
    return process.memoryUsage().heapUsed / 1e6;
  };
  const loaded = loadCase(file);
  console.log(`\nSearch memory (si-headwall; heap in use${gc ? " after a full collection" : ", no --expose-gc: includes garbage"})`);
  for (const budget of [20000, 80000, 160000]) {
    const run = await runSearch(buildProblem(loaded.case, loaded.data), { seed: "memory", budget, top: 5, starts: 3, beam: 3 });
    console.log(`  budget ${String(budget).padStart(6)} routings: ${run.layoutsFitted} layouts fitted, ${run.candidatesRouted} designs routed, ${run.candidates.length} kept; heap ${heap().toFixed(1)} MB`);
  }
}
