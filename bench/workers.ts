// The search on one worker thread and on all cores, same case, seed and routing budget: the times,
// their ratio, how busy the workers were, and whether the two rankings are identical (they must be:
// rounds are merged in order and every unit of work is a pure function of its inputs).
import { availableParallelism, loadavg } from "node:os";
import { join } from "node:path";
import { loadCase } from "../src/case/load.js";
import { buildProblem } from "../search/problem.js";
import { runSearch, type SearchRun } from "../search/run.js";
import { InlineFitter, WorkerFitter, type LayoutFitter } from "../search/pool.js";
import type { BenchSection } from "./section.js";

/** Budgets long enough that the run is mostly search, as an overnight run is (a few seconds each). */
const CASES: { name: string; budget: number }[] = [
  { name: "demo", budget: 30000 },
  { name: "ordinance-mix", budget: 40000 },
];

interface Timed {
  run: SearchRun;
  /** Wall seconds of the timed search (cold: from loading the case, starting the workers included). */
  wall: number;
  /** Seconds the fitter's threads spent on tasks during the timed search. */
  busy: number;
  /** Processor seconds of the whole process (every thread: main, workers, the engine's collector
   * and compiler threads) during the timed search. */
  processor: number;
}

/** Warm searches per configuration, alternated; the fastest of each counts (the least disturbed). */
const WARM_REPEATS = 3;

/**
 * One search, cold (a fresh process state: the threads start and compile their code during the run,
 * as a short run does) or warm (the same threads first run a search with another seed: the steady
 * state of a long run, where each thread's compiled code is long since ready).
 */
async function timed(file: string, budget: number, workers: number, warm: boolean): Promise<Timed> {
  const started = performance.now();
  let cpu = process.cpuUsage();
  const processor = () => {
    const used = process.cpuUsage(cpu);
    return (used.user + used.system) / 1e6;
  };
  const loaded = loadCase(file);
  const problem = buildProblem(loaded.case, loaded.data);
  const settings = { seed: "bench", starts: 3 };
  const fitter: LayoutFitter = workers > 1 ? new WorkerFitter(problem, { path: file, hydrographs: loaded.hydrographs }, settings, workers) : new InlineFitter(problem, settings);
  try {
    const search = () => runSearch(problem, { seed: "bench", budget, top: 5, starts: 3, beam: 3, fitter });
    if (!warm) {
      const run = await search();
      return { run, wall: (performance.now() - started) / 1000, busy: fitter.taskSeconds, processor: processor() };
    }
    await runSearch(problem, { seed: "bench warm-up", budget, top: 5, starts: 3, beam: 3, fitter });
    const busyBefore = fitter.taskSeconds;
    cpu = process.cpuUsage();
    const t = performance.now();
    const run = await search();
    return { run, wall: (performance.now() - t) / 1000, busy: fitter.taskSeconds - busyBefore, processor: processor() };
  } finally {
    await fitter.close();
  }
}

const ranking = (run: SearchRun) => run.candidates.map((c) => JSON.stringify(c.file) + c.cost).join("\n");
const load = () => loadavg().map((x) => x.toFixed(2)).join(" ");

export const workersSection: BenchSection = {
  name: "workers",
  async run() {
    const cores = availableParallelism();
    console.log(`\nWorkers: the same search on 1 worker and on ${cores} (seed "bench"). Cold: a fresh start, from loading the case to the explained ranking (threads started and their code compiled during the run, as in a short run). Warm: the same threads after a search with another seed (the steady state of a long run). Busy: time on fits and scores over the workers' wall time. Load average before: ${load()}; on a loaded machine the ratio says little.`);
    for (const { name, budget } of CASES) {
      const file = join("cases", name, "case.json");
      console.log(`${name}, budget ${budget} routings:`);
      for (const warm of [false, true]) {
        const ones: Timed[] = [];
        const alls: Timed[] = [];
        for (let r = 0; r < (warm ? WARM_REPEATS : 1); r++) {
          ones.push(await timed(file, budget, 1, warm));
          alls.push(await timed(file, budget, cores, warm));
        }
        const fastest = (ts: Timed[]) => ts.reduce((a, b) => (b.wall < a.wall ? b : a));
        const one = fastest(ones);
        const all = fastest(alls);
        const line = (n: number, t: Timed) =>
          `    --workers ${n}: ${t.wall.toFixed(2)} s, ${t.run.layoutsFitted} layouts, ${t.run.routings} routings, busy ${((100 * t.busy) / (n * t.wall)).toFixed(0)} %, processor ${t.processor.toFixed(2)} s (${(t.processor / t.wall).toFixed(2)} cores)`;
        console.log(`  ${warm ? `warm, fastest of ${WARM_REPEATS} alternated` : "cold"}:`);
        console.log(line(1, one));
        console.log(line(cores, all));
        const same = [...ones, ...alls].every((t) => ranking(t.run) === ranking(one.run));
        // One thread already keeps the engine's collector and compiler threads busy on the other cores:
        // the most all cores can give is the cores over what one thread's run uses.
        console.log(`    speed-up ${(one.wall / all.wall).toFixed(2)}x (at most ${(cores / Math.max(1, one.processor / one.wall)).toFixed(2)}x: ${cores} cores over the ${(one.processor / one.wall).toFixed(2)} the one-thread run used); rankings ${same ? "identical" : "DIFFERENT"} (${one.run.candidates.length} candidates); load average after: ${load()}`);
      }
    }
  },
};
