// A bench worker thread: one whole one-thread search (InlineFitter), warmed up first, then timed on
// the parent's signal. Several of these at once show what the machine gives for wholly independent
// work (no messages, no shared round), the most a pool of workers could hope for. With `bare`, the
// work is the bare routing loop instead (bench/bareLoop.ts: arithmetic on typed arrays, nothing
// allocated, so no collector work): several at once show what the cores themselves give.
import { parentPort, workerData } from "node:worker_threads";
import { loadCase } from "../src/case/load.js";
import { buildProblem } from "../search/engine/problem.js";
import { runSearch } from "../search/engine/run.js";
import { InlineFitter } from "../search/engine/fitter.js";
import { buildRatingTable } from "../src/routing/ratingTable.js";
import { bareLoop } from "./bareLoop.js";

const { file, budget, warmUps, bare } = workerData as { file: string; budget: number; warmUps: number; bare?: number };
const loaded = loadCase(file);

let work: (seed: string) => Promise<number>;
if (bare !== undefined) {
  // `bare` steps of the loop on the case's largest storm (1-min steps, started again at its end).
  const c = loaded.case;
  const table = buildRatingTable(c.pond, c.outlet!, c.tailwater);
  const storm = c.storms[c.storms.length - 1].inflow;
  const span = Math.floor((storm.times[storm.times.length - 1] - storm.times[0]) / 60);
  work = async () => {
    let sum = 0;
    for (let done = 0; done < bare; done += span) sum += bareLoop(table, storm, 60, Math.min(span, bare - done));
    return sum;
  };
} else {
  const problem = buildProblem(loaded.case, loaded.data);
  const fitter = new InlineFitter(problem, { seed: "bench", starts: 3 });
  work = async (seed) => (await runSearch(problem, { seed, budget, top: 5, starts: 3, beam: 3, fitter })).routings;
}

for (let i = 0; i < warmUps; i++) await work(`bench warm-up ${i}`);
parentPort!.postMessage({ ready: true });
parentPort!.once("message", async () => {
  const started = performance.now();
  const routings = await work("bench");
  parentPort!.postMessage({ seconds: (performance.now() - started) / 1000, routings });
});
