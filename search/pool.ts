// Fits a round of layouts, in this thread or spread over worker threads. Either way the outcomes come
// back in the order of the round's layouts, so what enters the ranking does not depend on the number
// of workers or on which finished first.
import { Worker } from "node:worker_threads";
import type { Layout } from "./layout.js";
import type { DesignLimits, SearchProblem } from "./problem.js";
import { fitJob, layoutIndex, type FitOutcome, type FitSettings } from "./fitJob.js";

/** Where a worker finds the case, to build the very problem the main thread has. */
export interface ProblemSource {
  /** Case file path (as loaded by the command). */
  path?: string;
  /** Or the case's JSON itself (inflow series inline). */
  json?: unknown;
  margin?: number;
  /** What the search may change (value engineering), as the command built the problem with. */
  limits?: DesignLimits;
}

export interface FitJobRequest {
  key: string;
  layout: Layout;
  /** Starts of this fit, when not the run's. */
  starts?: number;
}

export interface LayoutFitter {
  readonly workers: number;
  /**
   * Fits the jobs; `onDone` hears each outcome as soon as it is ready (for the journal), in any
   * order. Stops handing out jobs once `stop()` is true; the outcomes of jobs not fitted are null.
   */
  fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean): Promise<(FitOutcome | null)[]>;
  close(): Promise<void>;
}

/** Fits in this thread, yielding to the event loop between layouts (so a signal is heard). */
export class InlineFitter implements LayoutFitter {
  readonly workers = 1;
  constructor(private readonly problem: SearchProblem, private readonly settings: FitSettings) {}

  async fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean): Promise<(FitOutcome | null)[]> {
    const out: (FitOutcome | null)[] = jobs.map(() => null);
    for (let i = 0; i < jobs.length; i++) {
      await new Promise((resolve) => setImmediate(resolve));
      if (stop()) break;
      out[i] = fitJob(this.problem, jobs[i].layout, jobs[i].key, { ...this.settings, starts: jobs[i].starts ?? this.settings.starts });
      onDone(i, out[i]!);
    }
    return out;
  }

  async close(): Promise<void> {}
}

/** Fits on `count` worker threads, each holding its own copy of the problem. */
export class WorkerFitter implements LayoutFitter {
  private readonly pool: Worker[];
  constructor(private readonly problem: SearchProblem, source: ProblemSource, settings: FitSettings, readonly workers: number) {
    const script = new URL("./fitWorker.js", import.meta.url);
    this.pool = Array.from({ length: workers }, () => new Worker(script, { workerData: { source, settings } }));
  }

  fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean): Promise<(FitOutcome | null)[]> {
    const out: (FitOutcome | null)[] = jobs.map(() => null);
    // Handed out longest first (more elevations to fit, longer fit), so the round ends sooner; the
    // outcomes are placed by job number, so the order of handing out changes nothing else.
    const size = (j: FitJobRequest) => j.layout.levels.length + (j.layout.riser ? 1 : 0);
    const order = jobs.map((_, i) => i).sort((a, b) => size(jobs[b]) - size(jobs[a]) || a - b);
    let next = 0;
    let busy = 0;
    return new Promise((resolve, reject) => {
      let failed = false;
      const give = (worker: Worker) => {
        if (failed) return;
        if (next >= jobs.length || stop()) {
          if (busy === 0) finish();
          return;
        }
        const id = order[next++];
        busy++;
        const onMessage = (message: { id: number; outcome?: FitOutcome; error?: string }) => {
          worker.off("message", onMessage);
          worker.off("error", onError);
          busy--;
          if (message.error !== undefined) return fail(new Error(message.error));
          out[message.id] = message.outcome!;
          // The worker gets its next job before the outcome is handled here.
          give(worker);
          onDone(message.id, message.outcome!);
        };
        const onError = (error: Error) => {
          worker.off("message", onMessage);
          fail(error);
        };
        worker.on("message", onMessage);
        worker.on("error", onError);
        worker.postMessage({ id, key: jobs[id].key, starts: jobs[id].starts, layout: layoutIndex(this.problem, jobs[id].layout) });
      };
      let finished = false;
      const finish = () => {
        if (!finished) {
          finished = true;
          resolve(out);
        }
      };
      const fail = (error: Error) => {
        failed = true;
        reject(error);
      };
      if (jobs.length === 0) return finish();
      for (const worker of this.pool) give(worker);
    });
  }

  async close(): Promise<void> {
    await Promise.all(this.pool.map((w) => w.terminate()));
  }
}
