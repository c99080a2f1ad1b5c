// A worker thread of the search: builds the same problem as the main thread from the case, then fits
// the layouts it is sent, one at a time, and posts each outcome back with the job's number.
import { parentPort, workerData } from "node:worker_threads";
import { loadCase, parseCase } from "../src/case/load.js";
import { buildProblem } from "./problem.js";
import { fitJob, layoutAt, type FitSettings, type LayoutIndex } from "./fitJob.js";
import type { ProblemSource } from "./pool.js";

const { source, settings } = workerData as { source: ProblemSource; settings: FitSettings };
const loaded = source.path !== undefined ? loadCase(source.path) : parseCase(source.json);
const problem = buildProblem(loaded.case, loaded.data, { margin: source.margin }, source.limits);

parentPort!.on("message", (job: { id: number; key: string; starts?: number; layout: LayoutIndex }) => {
  try {
    const outcome = fitJob(problem, layoutAt(problem, job.layout), job.key, { ...settings, starts: job.starts ?? settings.starts });
    parentPort!.postMessage({ id: job.id, outcome });
  } catch (error) {
    parentPort!.postMessage({ id: job.id, error: error instanceof Error ? error.message : String(error) });
  }
});
