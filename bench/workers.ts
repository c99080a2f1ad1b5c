// The search on one worker thread and on all cores, same case, seed and routing budget: the times,
// their ratio, and whether the two rankings are identical (they must be: rounds are merged in order).
import { availableParallelism, loadavg } from "node:os";
import { join } from "node:path";
import { loadCase } from "../src/case/load.js";
import { buildProblem } from "../search/problem.js";
import { runSearch, type SearchRun } from "../search/run.js";
import { InlineFitter, WorkerFitter } from "../search/pool.js";
import type { BenchSection } from "./section.js";

const BUDGET = 20000;
const CASE = join("cases", "demo", "case.json");

async function timed(workers: number): Promise<SearchRun> {
  const loaded = loadCase(CASE);
  const problem = buildProblem(loaded.case, loaded.data);
  const settings = { seed: "bench", starts: 3 };
  const fitter = workers > 1 ? new WorkerFitter(problem, { path: CASE }, settings, workers) : new InlineFitter(problem, settings);
  try {
    return await runSearch(problem, { seed: "bench", budget: BUDGET, top: 5, starts: 3, beam: 3, fitter });
  } finally {
    await fitter.close();
  }
}

const ranking = (run: SearchRun) => run.candidates.map((c) => JSON.stringify(c.file) + c.cost).join("\n");

export const workersSection: BenchSection = {
  name: "workers",
  async run() {
    const cores = availableParallelism();
    const load = loadavg().map((x) => x.toFixed(2)).join(" ");
    console.log(`\nWorkers (${CASE}, budget ${BUDGET} routings, seed "bench"; load average before: ${load})`);
    const one = await timed(1);
    const all = await timed(cores);
    console.log(`  --workers 1: ${one.seconds.toFixed(2)} s, ${one.layoutsFitted} layouts, ${one.routings} routings`);
    console.log(`  --workers ${cores}: ${all.seconds.toFixed(2)} s, ${all.layoutsFitted} layouts, ${all.routings} routings`);
    console.log(`  speed-up ${(one.seconds / all.seconds).toFixed(2)}x; rankings ${ranking(one) === ranking(all) ? "identical" : "DIFFERENT"} (${one.candidates.length} candidates); load average after: ${loadavg().map((x) => x.toFixed(2)).join(" ")}`);
  },
};
