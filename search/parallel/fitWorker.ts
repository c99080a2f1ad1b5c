// A worker thread of the search: builds the same problem as the main thread from the case, then does
// the tasks it is sent, one at a time: fits a layout (and routes its designs again through the
// `route` path, so the main thread need not), or scores a chunk of layouts for the plan. Each result
// is posted back with the task's number.
import { parentPort, workerData } from "node:worker_threads";
import { loadCase, parseCase } from "../../src/case/load.js";
import { buildProblem } from "../engine/problem.js";
import { fitAndRoute, layoutAt, type FitSettings } from "../engine/fitJob.js";
import { scoreChunk } from "../engine/layouts.js";
import type { ProblemSource, WorkerTask } from "./pool.js";
import { explainDesign } from "../engine/fitter.js";

const { source, settings } = workerData as { source: ProblemSource; settings: FitSettings };
const loaded = source.path !== undefined ? loadCase(source.path, { hydrographs: source.hydrographs }) : parseCase(source.json, { hydrographs: source.hydrographs });
const problem = buildProblem(loaded.case, loaded.data, { margin: source.margin }, source.limits);

parentPort!.on("message", (task: WorkerTask) => {
  const started = performance.now();
  const ms = () => performance.now() - started;
  try {
    if (task.type === "score") {
      const scored = scoreChunk(problem, task.chunk);
      parentPort!.postMessage({ id: task.id, scored, ms: ms() });
      return;
    }
    if (task.type === "explain") {
      const explanation = explainDesign(problem, layoutAt(problem, task.layout), task.vars);
      parentPort!.postMessage({ id: task.id, explanation, ms: ms() });
      return;
    }
    const layout = layoutAt(problem, task.layout);
    const outcome = fitAndRoute(problem, layout, task.key, { ...settings, starts: task.starts ?? settings.starts });
    parentPort!.postMessage({ id: task.id, outcome, ms: ms() });
  } catch (error) {
    parentPort!.postMessage({ id: task.id, error: error instanceof Error ? error.message : String(error) });
  }
});
