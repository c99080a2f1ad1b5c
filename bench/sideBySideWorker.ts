// A bench worker thread: one whole one-thread search (InlineFitter), warmed up first, then timed on
// the parent's signal. Several of these at once show what the machine gives for wholly independent
// work (no messages, no shared round), the most a pool of workers could hope for.
import { parentPort, workerData } from "node:worker_threads";
import { loadCase } from "../src/case/load.js";
import { buildProblem } from "../search/engine/problem.js";
import { runSearch } from "../search/engine/run.js";
import { InlineFitter } from "../search/engine/fitter.js";

const { file, budget, warmUps } = workerData as { file: string; budget: number; warmUps: number };
const loaded = loadCase(file);
const problem = buildProblem(loaded.case, loaded.data);
const fitter = new InlineFitter(problem, { seed: "bench", starts: 3 });
const search = (seed: string) => runSearch(problem, { seed, budget, top: 5, starts: 3, beam: 3, fitter });

for (let i = 0; i < warmUps; i++) await search(`bench warm-up ${i}`);
parentPort!.postMessage({ ready: true });
parentPort!.once("message", async () => {
  const started = performance.now();
  const run = await search("bench");
  parentPort!.postMessage({ seconds: (performance.now() - started) / 1000, routings: run.routings });
});
