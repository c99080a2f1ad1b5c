// Fits a round of layouts spread over worker threads (search/engine/fitter.ts holds the interface and this
// thread's fitter). Either way the outcomes come back in the order of the round's layouts, so what enters the ranking does not depend on the number
// of workers or on which finished first.
import { Worker } from "node:worker_threads";
import type { DesignLimits, SearchProblem } from "../engine/problem.js";
import type { Hydrograph } from "../../src/model.js";
import { layoutIndex, type FitOutcome, type FitSettings, type LayoutIndex } from "../engine/fitJob.js";
import type { ScoreChunk, ScoreOutcome } from "../engine/scoring.js";
import { InlineFitter, type ExplainRequest, type FitJobRequest, type LayoutFitter } from "../engine/fitter.js";

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

/** A task as a worker receives it. */
export type WorkerTask =
  | { type: "fit"; id: number; key: string; starts?: number; layout: LayoutIndex }
  | { type: "score"; id: number; chunk: ScoreChunk }
  | { type: "explain"; id: number; layout: LayoutIndex; vars: number[] };

type WorkerReply = { id: number; outcome?: FitOutcome; scored?: ScoreOutcome; explanation?: string[]; error?: string; ms?: number };

/** Tasks a worker holds at once: the one it works on and the next, waiting in its port. */
const IN_FLIGHT = 2;
/** Outcomes of fits done ahead kept for a later round (oldest dropped). */
const AHEAD_KEPT = 64;

/** A task queued for the pool, with what to do with its reply. */
interface Queued {
  task: WorkerTask;
  /** Whether its run has stopped handing out tasks. */
  stop: () => boolean;
  done: (reply: WorkerReply) => void;
  /** Not handed out (its run stopped), or the pool failed. */
  dropped: (error?: Error) => void;
}

/**
 * Fits and scores on `count` worker threads, each holding its own copy of the problem. Tasks are
 * handed out in order to the workers, each holding up to IN_FLIGHT; results are placed by task
 * number. One dispatcher for the pool's life (every reply is heard by its task number), so a fit
 * done ahead (`fit`'s `ahead`) may still run while the next round starts.
 */
export class WorkerFitter implements LayoutFitter {
  private readonly pool: Worker[];
  taskSeconds = 0;
  /** Fits started ahead (or done), by key, oldest first. */
  private readonly aheadFits = new Map<string, Promise<FitOutcome | null>>();
  /** Jobs a worker with nothing in hand may fit ahead, in order. */
  private aheadJobs: FitJobRequest[] = [];
  /** Fits done ahead that a round then took, and all fits started ahead (statistics). */
  aheadUsed = 0;
  aheadStarted = 0;
  private readonly queue: Queued[] = [];
  private readonly waiting = new Map<number, Queued>();
  private readonly inHand = new Map<Worker, number>();
  private nextId = 0;
  private failure: Error | null = null;

  constructor(private readonly problem: SearchProblem, source: ProblemSource, settings: FitSettings, readonly workers: number) {
    const script = new URL("./fitWorker.js", import.meta.url);
    const data = { source: { ...source, hydrographs: shared(source.hydrographs) }, settings };
    this.pool = Array.from({ length: workers }, () => new Worker(script, { workerData: data }));
    for (const worker of this.pool) {
      this.inHand.set(worker, 0);
      worker.on("message", (reply: WorkerReply) => {
        this.inHand.set(worker, this.inHand.get(worker)! - 1);
        this.taskSeconds += (reply.ms ?? 0) / 1000;
        const queued = this.waiting.get(reply.id);
        this.waiting.delete(reply.id);
        if (reply.error !== undefined) this.fail(new Error(reply.error));
        else queued?.done(reply);
        this.pump();
      });
      worker.on("error", (error: Error) => this.fail(error));
    }
  }

  private fail(error: Error): void {
    if (this.failure) return;
    this.failure = error;
    for (const q of [...this.queue, ...this.waiting.values()]) q.dropped(error);
    this.queue.length = 0;
    this.waiting.clear();
    this.aheadJobs = [];
  }

  /** Hands out queued tasks: up to IN_FLIGHT per worker; when no more are queued than there are
   * workers, only to a worker with nothing in hand (so the last ones do not queue behind a long one);
   * with nothing queued, a fit ahead to a worker with nothing in hand. */
  private pump(): void {
    if (this.failure) return;
    for (const worker of this.pool) {
      for (;;) {
        while (this.queue.length > 0 && this.queue[0].stop()) this.queue.shift()!.dropped();
        const held = this.inHand.get(worker)!;
        if (this.queue.length > 0) {
          if (held >= IN_FLIGHT || (held > 0 && this.queue.length <= this.pool.length)) break;
          this.send(worker, this.queue.shift()!);
          continue;
        }
        if (held > 0 || !this.startAhead(worker)) break;
      }
    }
  }

  private send(worker: Worker, queued: Queued): void {
    this.inHand.set(worker, this.inHand.get(worker)! + 1);
    this.waiting.set(queued.task.id, queued);
    worker.postMessage(queued.task);
  }

  /** Starts the next fit ahead on an idle worker; false when there is none to start. */
  private startAhead(worker: Worker): boolean {
    let job: FitJobRequest | undefined;
    while ((job = this.aheadJobs.shift()) && this.aheadFits.has(job.key));
    if (!job) return false;
    const request = job;
    const promise = new Promise<FitOutcome | null>((resolve) => {
      this.send(worker, {
        task: { type: "fit", id: this.nextId++, key: request.key, starts: request.starts, layout: layoutIndex(this.problem, request.layout) },
        stop: () => false,
        done: (reply) => resolve(reply.outcome!),
        dropped: () => resolve(null),
      });
    });
    this.aheadFits.set(request.key, promise);
    this.aheadStarted++;
    while (this.aheadFits.size > AHEAD_KEPT) this.aheadFits.delete(this.aheadFits.keys().next().value!);
    return true;
  }

  /** Queues the tasks (numbered here) and resolves with their results by position, null for those
   * its `stop` kept from being handed out. */
  private run<T>(tasks: Omit<WorkerTask, "id">[], take: (reply: WorkerReply, index: number) => T, stop: () => boolean): Promise<(T | null)[]> {
    const out: (T | null)[] = tasks.map(() => null);
    if (this.failure) return Promise.reject(this.failure);
    return new Promise((resolve, reject) => {
      let left = tasks.length;
      let failed = false;
      const settle = () => {
        if (--left === 0 && !failed) resolve(out);
      };
      if (left === 0) return resolve(out);
      tasks.forEach((task, index) => {
        this.queue.push({
          task: { ...task, id: this.nextId++ } as WorkerTask,
          stop,
          done: (reply) => {
            // Placed before more tasks are handed out.
            out[index] = take(reply, index);
            settle();
          },
          dropped: (error) => {
            if (error) {
              failed = true;
              return reject(error);
            }
            settle();
          },
        });
      });
      this.pump();
    });
  }

  async fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean, ahead: FitJobRequest[] = []): Promise<(FitOutcome | null)[]> {
    const out: (FitOutcome | null)[] = jobs.map(() => null);
    // Jobs fitted (or being fitted) ahead are taken from there; the others go to the workers,
    // handed out longest first (more elevations to fit, longer fit), so the round ends sooner; the
    // outcomes are placed by job number, so the order of handing out changes nothing else.
    const fresh: number[] = [];
    const early: Promise<void>[] = [];
    jobs.forEach((job, i) => {
      const known = this.aheadFits.get(job.key);
      if (!known) return fresh.push(i);
      this.aheadFits.delete(job.key);
      early.push(
        known.then((outcome) => {
          if (outcome === null) throw new Error(`internal: a fit done ahead for ${job.key} was lost`);
          this.aheadUsed++;
          out[i] = outcome;
          onDone(i, outcome);
        }),
      );
    });
    const planned = new Set(jobs.map((j) => j.key));
    this.aheadJobs = stop() ? [] : ahead.filter((j) => !planned.has(j.key));
    const size = (j: FitJobRequest) => j.layout.levels.length + (j.layout.riser ? 1 : 0);
    fresh.sort((a, b) => size(jobs[b]) - size(jobs[a]) || a - b);
    const fitted = this.run(
      fresh.map((i) => ({ type: "fit" as const, key: jobs[i].key, starts: jobs[i].starts, layout: layoutIndex(this.problem, jobs[i].layout) })),
      (reply, k) => {
        out[fresh[k]] = reply.outcome!;
        onDone(fresh[k], reply.outcome!);
        return reply.outcome!;
      },
      stop,
    );
    await Promise.all([fitted, ...early]);
    if (stop()) this.aheadJobs = [];
    return out;
  }

  async score(chunks: ScoreChunk[]): Promise<ScoreOutcome[]> {
    const out = await this.run(
      chunks.map((chunk) => ({ type: "score" as const, chunk })),
      (reply) => reply.scored!,
      () => false,
    );
    return out as ScoreOutcome[];
  }

  async explain(designs: ExplainRequest[]): Promise<string[][]> {
    const out = await this.run(
      designs.map((d) => ({ type: "explain" as const, layout: layoutIndex(this.problem, d.layout), vars: d.vars })),
      (reply) => reply.explanation!,
      () => false,
    );
    return out as string[][];
  }

  async close(): Promise<void> {
    await Promise.all(this.pool.map((w) => w.terminate()));
  }
}

/** A run is spread over worker threads when it has at least this many seconds left (each worker
 * starts, builds its problem and compiles its code: about a second of slower work on a 2-core
 * machine, and two workers there give about 1.4x one thread, so a rest shorter than this is done
 * sooner in one thread). */
export const SPREAD_SECONDS = 6;
/**
 * The same for a system of ponds, whose search gains less from workers: each worker tabulates its
 * own links and routes whole systems, and two workers gave 1.19x one thread on a 60,000-routing design
 * of the two-ponds demo (18.1 s against 15.2 s) and nothing on the default 20,000 (8.4 against 8.8 s),
 * where the default spread and took 9.6 s against 7.7 s (`npm run bench defaults`, this 2-core
 * machine, idle, 5 December 2026). At 1.2x, spreading pays back its start of about 2 s only on a
 * rest of 12 s or more; and the rate of a system's first seconds (its plan, its links tabulated, its
 * code compiling) projects about three times the rest (17 s against 5 s left on the default two-ponds
 * run): so 30 s projected.
 */
export const SYSTEM_SPREAD_SECONDS = 30;
/** Seconds a run stays in one thread whatever it projects: until it spreads the default does exactly
 * what one thread does (its first compliant design is never later), and the rate measured before
 * then, while the code is still compiling, projects far too long a rest (the bench's default against
 * --workers 1 spread runs of 2 s that had found a compliant design after 0.2 s). */
export const SETTLE_SECONDS = 2;

/** Where a run stands, as its progress reports it. */
export interface RunSoFar {
  routings: number;
  seconds: number;
  /** Routings its running parts may still spend (their shares of the budget not yet used). */
  routingsLeft?: number;
  /** Compliant designs found so far. */
  compliant?: number;
}

/**
 * Whether the rest of a run is worth the workers' start: not before SETTLE_SECONDS; then, with a
 * time budget, its time left; with a routing budget, the routings its parts may still spend (else the
 * budget's) at the rate so far (unknown before any is counted: not yet), at least `rest` seconds
 * (SPREAD_SECONDS; SYSTEM_SPREAD_SECONDS for a system of ponds).
 */
export function worthSpreading(so: RunSoFar, budget: { routings: number; seconds?: number }, rest = SPREAD_SECONDS): boolean {
  if (so.seconds < SETTLE_SECONDS) return false;
  if (budget.seconds !== undefined) return budget.seconds - so.seconds >= rest;
  if (!(so.routings > 0) || !(so.seconds > 0)) return false;
  const left = so.routingsLeft ?? budget.routings - so.routings;
  return (left * so.seconds) / so.routings >= rest;
}

/**
 * The default of `design`: fits in this thread while the run is short, and on `workers` threads from
 * the first call after `spread()` says the rest is worth it (checked at every call until then). The
 * outcomes are the same either way (pure functions of their tasks, merged in the round's order), so
 * the ranking does not depend on when, or whether, it spread.
 */
export class AdaptiveFitter implements LayoutFitter {
  private readonly inline: InlineFitter;
  private pool: WorkerFitter | null = null;
  constructor(
    private readonly problem: SearchProblem,
    private readonly source: ProblemSource,
    private readonly settings: FitSettings,
    private readonly most: number,
    private readonly spread: () => boolean,
  ) {
    this.inline = new InlineFitter(problem, settings);
  }

  /** The threads fitting now (1 until the run spread). */
  get workers(): number {
    return this.pool ? this.pool.workers : 1;
  }

  get taskSeconds(): number {
    return this.inline.taskSeconds + (this.pool?.taskSeconds ?? 0);
  }

  private current(): LayoutFitter {
    if (!this.pool && this.most > 1 && this.spread()) this.pool = new WorkerFitter(this.problem, this.source, this.settings, this.most);
    return this.pool ?? this.inline;
  }

  fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean, ahead?: FitJobRequest[]): Promise<(FitOutcome | null)[]> {
    return this.current().fit(jobs, onDone, stop, ahead);
  }

  score(chunks: ScoreChunk[]): Promise<ScoreOutcome[]> {
    return this.current().score(chunks);
  }

  explain(designs: ExplainRequest[]): Promise<string[][]> {
    return this.current().explain(designs);
  }

  async close(): Promise<void> {
    await this.pool?.close();
  }
}
