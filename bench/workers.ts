// The search on one worker thread and on all cores, same case, seed and routing budget: the times,
// their ratio, how busy the workers were, and whether the two rankings are identical (they must be:
// rounds are merged in order and every unit of work is a pure function of its inputs).
import { availableParallelism, loadavg } from "node:os";
import { Worker } from "node:worker_threads";
import { join } from "node:path";
import { loadCase } from "../src/case/load.js";
import { buildProblem } from "../search/engine/problem.js";
import { runSearch, type SearchRun } from "../search/engine/run.js";
import { WorkerFitter } from "../search/parallel/pool.js";
import { InlineFitter, type LayoutFitter } from "../search/engine/fitter.js";
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
/** Searches with other seeds before a warm one is timed: after one, the workers' compiled code is
 * still settling (the next search is 10-20 % slower on two workers than the ones after it). */
const WARM_UPS = 2;
/** Steps of the bare routing loop per thread in the cores' measurement (about 2 s on one core). */
const BARE_STEPS = 2e8;

/**
 * One search, cold (a fresh process state: the threads start and compile their code during the run,
 * as a short run does) or warm (the same threads first run WARM_UPS searches with other seeds: the
 * steady state of a long run, where each thread's compiled code is long since ready).
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
    for (let i = 0; i < WARM_UPS; i++) await runSearch(problem, { seed: `bench warm-up ${i}`, budget, top: 5, starts: 3, beam: 3, fitter });
    const busyBefore = fitter.taskSeconds;
    cpu = process.cpuUsage();
    const t = performance.now();
    const run = await search();
    return { run, wall: (performance.now() - t) / 1000, busy: fitter.taskSeconds - busyBefore, processor: processor() };
  } finally {
    await fitter.close();
  }
}

/**
 * `count` wholly independent one-thread searches at once, each in its own worker thread, warmed up
 * like the warm runs; the wall seconds from the common start to the last one's end. With count 1,
 * the same search alone: count × alone / together is what the machine gives for independent work,
 * the ceiling of any pool of workers on it (the collector and compiler threads of every thread
 * share the same cores). With `bare` (a number of steps), the bare routing loop instead of the search.
 */
async function sideBySide(file: string, budget: number, count: number, bare?: number): Promise<number> {
  const script = new URL("./sideBySideWorker.js", import.meta.url);
  const threads = Array.from({ length: count }, () => new Worker(script, { workerData: { file, budget, warmUps: WARM_UPS, bare } }));
  try {
    const next = (w: Worker) =>
      new Promise<{ seconds?: number }>((resolve, reject) => {
        w.once("message", resolve);
        w.once("error", reject);
      });
    await Promise.all(threads.map(next));
    const started = performance.now();
    const done = threads.map(next);
    for (const w of threads) w.postMessage("go");
    await Promise.all(done);
    return (performance.now() - started) / 1000;
  } finally {
    await Promise.all(threads.map((w) => w.terminate()));
  }
}

const ranking = (run: SearchRun) => run.candidates.map((c) => JSON.stringify(c.file) + c.cost).join("\n");
const load = () => loadavg().map((x) => x.toFixed(2)).join(" ");

export const workersSection: BenchSection = {
  name: "workers",
  async run() {
    const cores = availableParallelism();
    console.log(`\nWorkers: the same search on 1 worker and on ${cores} (seed "bench"). Cold: a fresh start, from loading the case to the explained ranking (threads started and their code compiled during the run, as in a short run). Warm: the same threads after ${WARM_UPS} searches with other seeds (the steady state of a long run). Ceiling: the one-thread search alone, then ${cores} of them at once in their own threads (what the machine gives for wholly independent work). Busy: time on fits and scores over the workers' wall time. Load average before: ${load()}; on a loaded machine the ratio says little.`);
    // The cores themselves: the bare routing loop (nothing allocated, so no collector work) alone in a
    // worker thread, then on every core at once. What the searches side by side give below that is
    // what their own collector and compiler threads take.
    const bare: number[] = [];
    const bareTogether: number[] = [];
    for (let r = 0; r < WARM_REPEATS; r++) {
      bare.push(await sideBySide(join("cases", "demo", "case.json"), 0, 1, BARE_STEPS));
      bareTogether.push(await sideBySide(join("cases", "demo", "case.json"), 0, cores, BARE_STEPS));
    }
    const bareAlone = Math.min(...bare);
    const bareAll = Math.min(...bareTogether);
    console.log(`the cores (fastest of ${WARM_REPEATS} alternated): the bare routing loop (bench/bareLoop.ts, nothing allocated), ${BARE_STEPS.toExponential(0)} steps alone in a worker thread ${bareAlone.toFixed(2)} s; ${cores} at once ${bareAll.toFixed(2)} s: ${cores} cores give ${((cores * bareAlone) / bareAll).toFixed(2)}x one on work that leaves the collector idle`);
    for (const { name, budget } of CASES) {
      const file = join("cases", name, "case.json");
      console.log(`${name}, budget ${budget} routings:`);
      let warmSpeedUp = NaN;
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
        if (warm) warmSpeedUp = one.wall / all.wall;
        const same = [...ones, ...alls].every((t) => ranking(t.run) === ranking(one.run));
        // One thread already keeps the engine's collector and compiler threads busy on the other cores:
        // the most all cores can give is the cores over what one thread's run uses.
        console.log(`    speed-up ${(one.wall / all.wall).toFixed(2)}x (at most ${(cores / Math.max(1, one.processor / one.wall)).toFixed(2)}x: ${cores} cores over the ${(one.processor / one.wall).toFixed(2)} the one-thread run used); rankings ${same ? "identical" : "DIFFERENT"} (${one.run.candidates.length} candidates); load average after: ${load()}`);
      }
      // The machine's ceiling for this search: independent one-thread searches side by side.
      const alone: number[] = [];
      const together: number[] = [];
      for (let r = 0; r < WARM_REPEATS; r++) {
        alone.push(await sideBySide(file, budget, 1));
        together.push(await sideBySide(file, budget, cores));
      }
      const a = Math.min(...alone);
      const t = Math.min(...together);
      console.log(`  ceiling (warm, fastest of ${WARM_REPEATS} alternated): the one-thread search alone in a worker thread ${a.toFixed(2)} s; ${cores} of them at once, each in its own thread, no messages: ${t.toFixed(2)} s, so ${cores} cores give ${((cores * a) / t).toFixed(2)}x the work of one on wholly independent searches; the pool's warm ${warmSpeedUp.toFixed(2)}x is ${((100 * warmSpeedUp * t) / (cores * a)).toFixed(0)} % of that`);
    }
  },
};
