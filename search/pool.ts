// Fits a round of layouts, in this thread or spread over worker threads. Either way the outcomes come
// back in the order of the round's layouts, so what enters the ranking does not depend on the number
// of workers or on which finished first.
import { Worker } from "node:worker_threads";
import type { Layout } from "./layout.js";
import type { DesignLimits, SearchProblem } from "./problem.js";
import type { Hydrograph } from "../src/case/model.js";
import { fitJob, layoutIndex, type FitOutcome, type FitSettings, type LayoutIndex } from "./fitJob.js";
import type { ChunkScorer, ScoreChunk, ScoreOutcome } from "./scoring.js";
import { scoreChunk } from "./layouts.js";
import { finalizeCandidate } from "./candidate.js";
import { explainCandidate } from "./explain.js";
import { designOutletFile } from "./layout.js";

/** Where a worker finds the case, to build the very problem the main thread has. */
export interface ProblemSource {
  /** Case file path (as loaded by the command). */
  path?: string;
  /** Or the case's JSON itself (inflow series inline). */
  json?: unknown;
  margin?: number;
  /** What the search may change (value engineering), as the command built the problem with. */
  limits?: DesignLimits;
  /** The inflow files the main thread read (`LoadedCase.hydrographs`): the workers do not read them
   * again (on a million-row record, seconds of parsing each), and share their memory. */
  hydrographs?: Map<string, Hydrograph>;
}

/** The hydrographs in shared memory, so that every worker reads the main thread's copy. */
function shared(hydrographs: Map<string, Hydrograph> | undefined): Map<string, Hydrograph> | undefined {
  if (!hydrographs) return undefined;
  const copy = (a: Float64Array) => {
    const out = new Float64Array(new SharedArrayBuffer(a.byteLength));
    out.set(a);
    return out;
  };
  return new Map([...hydrographs].map(([path, h]) => [path, { times: copy(h.times), flows: copy(h.flows) }]));
}

export interface FitJobRequest {
  key: string;
  layout: Layout;
  /** Starts of this fit, when not the run's. */
  starts?: number;
}

export interface LayoutFitter extends ChunkScorer {
  readonly workers: number;
  /** Seconds spent on tasks (fits and scores), summed over the workers: their busy time. */
  readonly taskSeconds: number;
  /**
   * Fits the jobs; `onDone` hears each outcome as soon as it is ready (for the journal), in any
   * order. Stops handing out jobs once `stop()` is true; the outcomes of jobs not fitted are null.
   */
  fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean): Promise<(FitOutcome | null)[]>;
  /** Explanations of designs (binding check, the moves that relax it), in the order given. */
  explain(designs: ExplainRequest[]): Promise<string[][]>;
  close(): Promise<void>;
}

export interface ExplainRequest {
  layout: Layout;
  vars: number[];
}

/** A design's explanation: a pure function of the problem, the layout and its elevations. */
export function explainDesign(p: SearchProblem, layout: Layout, vars: number[]): string[] {
  return explainCandidate(p, finalizeCandidate(p, layout, vars, designOutletFile(p, layout, vars)));
}

/** Fits in this thread, yielding to the event loop between layouts (so a signal is heard). */
export class InlineFitter implements LayoutFitter {
  readonly workers = 1;
  taskSeconds = 0;
  constructor(private readonly problem: SearchProblem, private readonly settings: FitSettings) {}

  async fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean): Promise<(FitOutcome | null)[]> {
    const out: (FitOutcome | null)[] = jobs.map(() => null);
    for (let i = 0; i < jobs.length; i++) {
      await new Promise((resolve) => setImmediate(resolve));
      if (stop()) break;
      const started = performance.now();
      out[i] = fitJob(this.problem, jobs[i].layout, jobs[i].key, { ...this.settings, starts: jobs[i].starts ?? this.settings.starts });
      this.taskSeconds += (performance.now() - started) / 1000;
      onDone(i, out[i]!);
    }
    return out;
  }

  async score(chunks: ScoreChunk[]): Promise<ScoreOutcome[]> {
    await new Promise((resolve) => setImmediate(resolve));
    const started = performance.now();
    const out = chunks.map((chunk) => scoreChunk(this.problem, chunk));
    this.taskSeconds += (performance.now() - started) / 1000;
    return out;
  }

  async explain(designs: ExplainRequest[]): Promise<string[][]> {
    return designs.map((d) => explainDesign(this.problem, d.layout, d.vars));
  }

  async close(): Promise<void> {}
}

/** A task as a worker receives it. */
export type WorkerTask =
  | { type: "fit"; id: number; key: string; starts?: number; layout: LayoutIndex }
  | { type: "score"; id: number; chunk: ScoreChunk }
  | { type: "explain"; id: number; layout: LayoutIndex; vars: number[] };

type WorkerReply = { id: number; outcome?: FitOutcome; scored?: ScoreOutcome; explanation?: string[]; error?: string; ms?: number };

/** Tasks a worker holds at once: the one it works on and the next, waiting in its port. */
const IN_FLIGHT = 2;

/**
 * Fits and scores on `count` worker threads, each holding its own copy of the problem. Tasks are
 * handed out in order to the workers, each holding up to IN_FLIGHT; results are placed by task number.
 */
export class WorkerFitter implements LayoutFitter {
  private readonly pool: Worker[];
  taskSeconds = 0;
  constructor(private readonly problem: SearchProblem, source: ProblemSource, settings: FitSettings, readonly workers: number) {
    const script = new URL("./fitWorker.js", import.meta.url);
    const data = { source: { ...source, hydrographs: shared(source.hydrographs) }, settings };
    this.pool = Array.from({ length: workers }, () => new Worker(script, { workerData: data }));
  }

  fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean): Promise<(FitOutcome | null)[]> {
    // Handed out longest first (more elevations to fit, longer fit), so the round ends sooner; the
    // outcomes are placed by job number, so the order of handing out changes nothing else.
    const size = (j: FitJobRequest) => j.layout.levels.length + (j.layout.riser ? 1 : 0);
    const order = jobs.map((_, i) => i).sort((a, b) => size(jobs[b]) - size(jobs[a]) || a - b);
    return this.run(
      order.map((id): WorkerTask => ({ type: "fit", id, key: jobs[id].key, starts: jobs[id].starts, layout: layoutIndex(this.problem, jobs[id].layout) })),
      jobs.length,
      (reply) => {
        onDone(reply.id, reply.outcome!);
        return reply.outcome!;
      },
      stop,
    );
  }

  async score(chunks: ScoreChunk[]): Promise<ScoreOutcome[]> {
    const out = await this.run(
      chunks.map((chunk, id): WorkerTask => ({ type: "score", id, chunk })),
      chunks.length,
      (reply) => reply.scored!,
      () => false,
    );
    return out as ScoreOutcome[];
  }

  async explain(designs: ExplainRequest[]): Promise<string[][]> {
    const out = await this.run(
      designs.map((d, id): WorkerTask => ({ type: "explain", id, layout: layoutIndex(this.problem, d.layout), vars: d.vars })),
      designs.length,
      (reply) => reply.explanation!,
      () => false,
    );
    return out as string[][];
  }

  /**
   * Runs the tasks on the pool; `take` turns each reply into its result. A worker is given its next
   * task while it still works on one (up to IN_FLIGHT), so it never waits for this thread to hear
   * its reply and answer with the next: a short task (a chunk of scores) would otherwise idle it for
   * a message's round trip each time. Near the end (no more tasks left than workers) a task goes
   * only to a worker with nothing in hand, so the last ones are not queued behind a long one.
   */
  private run<T>(tasks: WorkerTask[], count: number, take: (reply: WorkerReply) => T, stop: () => boolean): Promise<(T | null)[]> {
    const out: (T | null)[] = Array.from({ length: count }, () => null);
    let next = 0;
    let busy = 0;
    return new Promise((resolve, reject) => {
      let failed = false;
      let finished = false;
      const inHand = new Map<Worker, number>();
      const listeners: [Worker, (reply: WorkerReply) => void, (error: Error) => void][] = [];
      const detach = () => {
        for (const [worker, onMessage, onError] of listeners) {
          worker.off("message", onMessage);
          worker.off("error", onError);
        }
      };
      const finish = () => {
        if (!finished) {
          finished = true;
          detach();
          resolve(out);
        }
      };
      const fail = (error: Error) => {
        if (failed) return;
        failed = true;
        detach();
        reject(error);
      };
      const give = (worker: Worker) => {
        while (!failed && next < tasks.length && !stop()) {
          const held = inHand.get(worker)!;
          if (held >= IN_FLIGHT || (held > 0 && tasks.length - next <= this.pool.length)) break;
          inHand.set(worker, held + 1);
          busy++;
          worker.postMessage(tasks[next++]);
        }
        if (busy === 0 && !failed) finish();
      };
      for (const worker of this.pool) {
        inHand.set(worker, 0);
        const onMessage = (reply: WorkerReply) => {
          inHand.set(worker, inHand.get(worker)! - 1);
          busy--;
          this.taskSeconds += (reply.ms ?? 0) / 1000;
          if (reply.error !== undefined) return fail(new Error(reply.error));
          // Its result is placed before more tasks are handed out (a `finish` resolves with `out`).
          out[reply.id] = take(reply);
          give(worker);
        };
        const onError = (error: Error) => fail(error);
        worker.on("message", onMessage);
        worker.on("error", onError);
        listeners.push([worker, onMessage, onError]);
      }
      if (tasks.length === 0) return finish();
      for (const worker of this.pool) give(worker);
    });
  }

  async close(): Promise<void> {
    await Promise.all(this.pool.map((w) => w.terminate()));
  }
}
