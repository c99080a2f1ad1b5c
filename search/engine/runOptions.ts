// What a search run is given (budget, seed, the journal's fits, callbacks) and what it reports as it
// goes: shared by the run and its parts.
import type { FitOutcome } from "./fitJob.js";
import type { LayoutFitter } from "./fitter.js";
import type { ScoreOutcome } from "./scoring.js";

export interface RunOptions {
  seed: string;
  /** Most routings (one storm through one rating) the run may spend (Infinity with a time budget). */
  budget: number;
  /** A time budget in seconds: spent, widening the search while time remains (not reproducible). */
  timeBudget?: number;
  /** Safety stop in seconds (breaks reproducibility when it triggers). */
  timeLimit?: number;
  /** Candidates explained (the ranking itself does not depend on it). */
  top: number;
  /** Seeded starts of the fit per layout. */
  starts: number;
  /** Options kept per level when planning layouts; doubled while a part's budget remains. */
  beam: number;
  /** Layouts already fitted (from journals): not fitted again, their outcomes replayed. */
  done?: Map<string, JournalEntry>;
  /** Called as soon as a layout is fitted (the journal), in any order. */
  onLayout?: (entry: JournalEntry) => void;
  /** Chunks of layouts already scored (from journals), by screenKey: answered from here, not scored again. */
  screens?: Map<string, ScoreOutcome>;
  /** Called as soon as a chunk is scored (the journal). */
  onScreen?: (key: string, outcome: ScoreOutcome) => void;
  /** Called after each round (progress). */
  onProgress?: (progress: Progress) => void;
  /** Fits the rounds' layouts (default: in this thread). */
  fitter?: LayoutFitter;
  /** Fit only this share of the layouts (shard `index` of `count`, from 1). */
  shard?: { index: number; count: number };
  /** Called once, when the first compliant design is in hand (its fit ended and it was routed). */
  onFirstCompliant?: () => void;
  /** Asked between layouts: a reason to stop now (e.g. a signal), or null. */
  interrupt?: () => string | null;
}

/** One fitted layout as the journal keeps it. */
export interface JournalEntry extends FitOutcome {
  key: string;
}

export interface Progress {
  layoutsFitted: number;
  layoutsPlanned: number;
  routings: number;
  compliant: number;
  bestCost: number | null;
  seconds: number;
  /** Routings the parts still running may spend (Infinity with a time budget). */
  routingsLeft: number;
}
