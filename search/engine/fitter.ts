// Fitting a round of layouts: what the search asks of a fitter, and the fitter of this thread. The
// worker threads' fitters (search/parallel/pool.ts) answer the same interface with the same outcomes.
import type { SearchProblem, Layout } from "./problem.js";
import { fitAndRoute, type FitOutcome, type FitSettings } from "./fitJob.js";
import type { ChunkScorer, ScoreChunk, ScoreOutcome } from "./scoring.js";
import { scoreChunk } from "./layouts.js";
import { finalizeCandidate } from "./candidate.js";
import { explainCandidate } from "./explain.js";
import { designOutletFile } from "./layout.js";

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
   * `ahead`: jobs a later round is likely to hold, which a worker with nothing else to do may fit
   * meanwhile (kept by key; a later `fit` of the same key takes the outcome, the same as fitting it
   * then: a fit is a pure function of its layout, key and starts). In this thread: ignored.
   */
  fit(jobs: FitJobRequest[], onDone: (index: number, outcome: FitOutcome) => void, stop: () => boolean, ahead?: FitJobRequest[]): Promise<(FitOutcome | null)[]>;
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
      out[i] = fitAndRoute(this.problem, jobs[i].layout, jobs[i].key, { ...this.settings, starts: jobs[i].starts ?? this.settings.starts });
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
