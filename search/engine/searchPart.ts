// One part of the search: the layouts of its families, fitted in rounds within its share of the
// budget and widened while it lasts, adaptive inside itself (its own cost bar, its own neighbours of
// compliant designs, its own random layouts) and independent of every other part. A state machine:
//
//   round ──(a round chosen and fitted)──> round
//   round ──(nothing left in the queue)──> widen ──(more to fit)──> round
//   round | widen ──(budget, limit, interrupt, nothing within reach)──> done
//
// Determinism: a part's rounds are chosen from its own queue before they start; each layout's fit
// depends only on the layout and the seed (search/engine/fitJob.ts); outcomes enter its ranking and queue in
// the round's order. So a part gives the same candidates whether it runs alone (a shard), beside the
// others in one run, or replayed from a journal (a resume or a gather), on any number of workers.
import type { SearchProblem, Layout } from "./problem.js";
import type { OutletFile } from "../../src/case/schema.js";
import { closestLayouts, layoutCost, layoutScores, layoutSpace, neighbourLayouts, planning, sampleLayouts, type LayoutPlan, type ScoredLayout } from "./layouts.js";
import type { Scored, Scoring } from "./scoring.js";
import seedrandom from "seedrandom";
import { createHash } from "node:crypto";
import { designOutletFile, designText, layoutKey } from "./layout.js";
import { candidateFrom, compareVerdicts, finalizeCandidate, unpackRoute, verdictOf, type Candidate, type PackedRoute, type Verdict } from "./candidate.js";
import type { FitJobRequest, LayoutFitter } from "./fitter.js";
import type { Partition } from "./partition.js";
import type { JournalEntry, RunOptions } from "./runOptions.js";
import type { FitOutcome } from "./fitJob.js";

/** Layouts per round: chosen before the round, merged in this order after it. */
export const ROUND = 8;
/** Candidates kept in the ranking (per part while it runs, and for the run). */
export const KEPT = 40;
/** A layout costing at least as much as this many compliant, unflagged candidates is skipped. */
export const BAR_RANK = 5;
const MAX_BEAM = 64;
/** Beam from which the search widens by screened random layouts instead of a wider plan. */
const SAMPLING_BEAM = 3;
/** Random layouts screened per widening of a run (one batch of scores for the workers), shared out
 * over its parts, each screening at least MIN_SAMPLE_BATCH. */
const SAMPLE_BATCH = 160;
const MIN_SAMPLE_BATCH = 20;
/** Sampled layouts scored per chunk (a unit of work for a worker; fixed, whatever the workers). */
const SAMPLE_CHUNK = 5;
/** A sampled layout is fitted when its objective at the staged start is at most this. */
const PROMISING = 0.02;
/** Rounds of sampling in a row without anything worth fitting before the part stops (or widens). */
const MAX_SAMPLING_ROUNDS = 50;
/** Largest layout space enumerated whole, so that a time budget can prove it exhausted. */
const ENUMERABLE = 5000;
/** A time budget fits a layout found wanting again with 3, then 9 times the starts, no more. */
export const MAX_STARTS_FACTOR = 9;

/** The words for a catalogue every layout of which was fitted or bounded out (a part's, or all parts' together). */
export function exhaustedWords(layouts: number): string {
  return `the catalogue is exhausted: all ${layouts} layouts it allows were fitted (those found wanting again with up to ${MAX_STARTS_FACTOR} times the starts) or bounded out by cost`;
}

/** Why a part stopped: a kind the run combines over its parts, and the words for one part. */
export interface PartStop {
  kind: "budget" | "time limit" | "interrupted" | "fixed" | "reach" | "sampling" | "exhausted";
  words: string;
  /** Layouts of the part's space ("exhausted"). */
  layouts?: number;
}

/** What the parts of one run share: the problem, the fitter, the clock and the run's tallies. */
export interface RunContext {
  p: SearchProblem;
  options: RunOptions;
  fitter: LayoutFitter;
  partition: Partition;
  /** The first plan (beam of the options). */
  firstPlan: LayoutPlan;
  timed: boolean;
  seconds(): number;
  /** Answers a scoring generator on the fitter (sampling's screens), counted in the run's tallies. */
  scored<T>(scoring: Scoring<T>): Promise<Scored<T>>;
  /** Routings and evaluations done (each counted once, wherever it ran). */
  tally: { routings: number; evaluations: number; replayed: number };
  /** Layouts fitted ahead while the first plan was scored (by key): the part that fits one takes it. */
  prefit: Map<string, FitOutcome>;
  /** Called when a part holds its first compliant design (the run keeps the earliest). */
  compliantInHand(extraRoutings: number): void;
  /** Called after each of a part's rounds. */
  progress(): void;
}

type Entry = { layout: Layout; cost: number; score: number; starts?: number };

/**
 * A design in a part's ranking: what the ranking needs (its verdict) and, when it was routed in this
 * run, the routed candidate. A design replayed from a journal carries its verdict only; the run
 * routes it when it ends in the kept ranking.
 */
export interface RankedDesign {
  layout: Layout;
  vars: number[];
  verdict: Verdict;
  candidate: Candidate | null;
  /** The run's routings when the design entered the ranking (what finding it took). */
  foundAt: number;
}
type State = "round" | "widen" | "done";

export class SearchPart {
  /** Ranked designs of this part (at most 2 * KEPT between trims), by a short hash of their outlet. */
  readonly candidates = new Map<string, RankedDesign>();
  private readonly seenDesigns = new Set<string>();
  private readonly tried = new Set<string>();
  private readonly queue: Entry[] = [];
  private readonly queued = new Set<string>();
  /** With a time budget: layouts fitted without a compliant design, to fit again with more starts. */
  private readonly missed: Entry[] = [];
  private readonly rng: () => number;
  /** The first plan's first-level options of this part's families (random layouts start from them). */
  private readonly ownPlan: LayoutPlan;
  private readonly existingKey: string | null;
  /** The first-level options (by key) of this part's families. */
  private readonly familySet: ReadonlySet<string>;
  /** Random layouts screened per widening: the run's batch shared out over the parts. */
  private readonly sampleBatch: number;
  beam: number;
  /** Routings charged to this part (its fits, its screens, its share of wider plans). */
  routings = 0;
  evaluations = 0;
  fitted = 0;
  fromJournal = 0;
  planned = 0;
  skipped = 0;
  routedCandidates = 0;
  compliantFound = 0;
  bestCost: number | null = null;
  stop: PartStop | null = null;
  private samplingRounds = 0;
  private promising = PROMISING;
  private closestTried = false;
  private space: Layout[] | null | undefined;
  private roundRoutings = 0;

  constructor(
    private readonly ctx: RunContext,
    readonly index: number,
    /** This part's share of the budget of routings (Infinity with a time budget). */
    readonly budget: number,
  ) {
    const { p, options, firstPlan, partition } = ctx;
    this.beam = options.beam;
    this.rng = seedrandom(partition.count === 1 ? `${options.seed}|layouts` : `${options.seed}|layouts|part ${index + 1}`);
    this.familySet = new Set(partition.families[index]);
    this.ownPlan = { ...firstPlan, firstOptions: firstPlan.firstOptions.filter((o) => this.familySet.has(o.key)) };
    this.sampleBatch = Math.max(MIN_SAMPLE_BATCH, Math.ceil(SAMPLE_BATCH / partition.count));
    this.existingKey = p.existing && p.limits.rankBy === "change" ? layoutKey(p.existing.layout) : null;
    this.enqueue(this.own(firstPlan.layouts));
  }

  /** Runs the part to its end. */
  async run(): Promise<void> {
    let state: State = "round";
    while (state !== "done") state = state === "round" ? await this.round() : await this.widen();
  }

  private own(layouts: ScoredLayout[]): Entry[] {
    return layouts.filter((s) => this.ctx.partition.partOf(s.layout) === this.index);
  }

  private entryKey(e: Entry): string {
    return layoutKey(e.layout) + (e.starts ? ` | starts ${e.starts}` : "");
  }

  private enqueue(entries: Entry[]): void {
    for (const e of entries) {
      if (this.ctx.partition.partOf(e.layout) !== this.index) continue;
      const key = this.entryKey(e);
      if (this.tried.has(key) || this.queued.has(key)) continue;
      this.queued.add(key);
      this.queue.push(e);
      this.planned++;
    }
  }

  /**
   * The place in `list` of the entry to fit next. Until a compliant design exists the most promising
   * (lowest staged score) goes first; after that the cheapest, so effort goes where cheaper compliant
   * designs may be. Ranked by change, the existing layout goes first (refitting its elevations is the
   * smallest fix), then the most promising throughout.
   */
  private pick(list: Entry[]): number {
    const own = this.existingKey === null ? -1 : list.findIndex((e) => layoutKey(e.layout) === this.existingKey);
    if (own >= 0) return own;
    let best = 0;
    const byCost = this.compliantFound > 0 && this.ctx.p.limits.rankBy !== "change";
    for (let i = 1; i < list.length; i++) {
      const a = list[i];
      const b = list[best];
      if (byCost ? a.cost < b.cost || (a.cost === b.cost && a.score < b.score) : a.score < b.score || (a.score === b.score && a.cost < b.cost)) best = i;
    }
    return best;
  }

  private take(): Entry | undefined {
    return this.queue.length === 0 ? undefined : this.queue.splice(this.pick(this.queue), 1)[0];
  }

  /**
   * Cost does not depend on elevations, so a layout that costs at least as much as the BAR_RANK-th
   * compliant, unflagged candidate of this part cannot improve the part's head: it is skipped. Ranked
   * by change (or by robustness), a costlier layout may still be a smaller change (or keep more
   * reserve): nothing is bounded out.
   */
  private costBar(): number {
    if (this.ctx.p.limits.rankBy !== "cost") return Infinity;
    const costs = [...this.candidates.values()]
      .filter((c) => c.verdict.compliant && c.verdict.warnings === 0)
      .map((c) => c.verdict.cost)
      .sort((a, b) => a - b);
    return costs.length >= BAR_RANK ? costs[BAR_RANK - 1] : Infinity;
  }

  private spent(): boolean {
    const { ctx } = this;
    return ctx.timed ? ctx.seconds() >= ctx.options.timeBudget! : this.routings >= this.budget;
  }

  private budgetStop(): PartStop {
    const { options } = this.ctx;
    return this.ctx.timed
      ? { kind: "budget", words: `the time budget of ${options.timeBudget} s was used` }
      : { kind: "budget", words: `the budget of ${options.budget} routings was used` };
  }

  private designKey(layout: Layout, vars: number[]): { file: OutletFile; key: string } {
    const file = designOutletFile(this.ctx.p, layout, vars);
    // A system's design is every pond's outlet.
    return { file, key: createHash("sha1").update(designText(this.ctx.p, layout, vars)).digest("base64") };
  }

  /**
   * A fitted design into the part's ranking (null when it was ranked before): routed by the fitter
   * (here or on a worker), or replayed from a journal with its verdict, or (a journal written before
   * verdicts were kept) routed here.
   */
  private accept(layout: Layout, vars: number[], routed?: PackedRoute, verdict?: Verdict): RankedDesign | null {
    const { p } = this.ctx;
    const { file, key } = this.designKey(layout, vars);
    if (this.seenDesigns.has(key)) return null;
    this.seenDesigns.add(key);
    this.routedCandidates++;
    const candidate = routed ? candidateFrom(p, layout, vars, unpackRoute(p, routed)) : verdict ? null : finalizeCandidate(p, layout, vars, file);
    const ranked: RankedDesign = { layout, vars, verdict: verdict ?? verdictOf(candidate!), candidate, foundAt: this.ctx.tally.routings };
    this.candidates.set(key, ranked);
    // Memory stays bounded however long the run: only the best designs are kept.
    if (this.candidates.size > 2 * KEPT) {
      const best = [...this.candidates.entries()].sort((a, b) => compareVerdicts(a[1].verdict, b[1].verdict)).slice(0, KEPT);
      this.candidates.clear();
      for (const [k, c] of best) this.candidates.set(k, c);
    }
    if (ranked.verdict.compliant) {
      this.compliantFound++;
      this.ctx.compliantInHand(0);
      if (this.bestCost === null || ranked.verdict.cost < this.bestCost) this.bestCost = ranked.verdict.cost;
    }
    return ranked;
  }

  /** The jobs this part's next round would hold if nothing entered its queue meanwhile (fitted ahead by idle workers). */
  private nextRound(bar: number): FitJobRequest[] {
    const rest = [...this.queue];
    const out: FitJobRequest[] = [];
    while (out.length < ROUND && rest.length > 0) {
      const entry = rest.splice(this.pick(rest), 1)[0];
      const key = this.entryKey(entry);
      if (entry.cost >= bar || this.ctx.options.done?.has(key) || this.ctx.prefit.has(key)) continue;
      out.push({ key, layout: entry.layout, starts: entry.starts });
    }
    return out;
  }

  /** State "round": stop, or choose a round against the cost bar as it stands and fit it. */
  private async round(): Promise<State> {
    const { ctx } = this;
    const { options } = ctx;
    const reason = options.interrupt?.();
    if (reason) return this.done({ kind: "interrupted", words: reason });
    // The first part fits at least one round whatever the budget, so that something can be reported.
    if ((this.fitted > 0 || this.index > 0) && this.spent()) return this.done(this.budgetStop());
    if (options.timeLimit !== undefined && ctx.seconds() >= options.timeLimit) return this.done({ kind: "time limit", words: `the time limit of ${options.timeLimit} s was reached` });
    const bar = this.costBar();
    const round: (Entry & { key: string })[] = [];
    // No more layouts than the part's budget is likely to pay for, at its routings per layout so far
    // (the run overshoots its budget by less than a round, however many parts it holds).
    const size = this.fitted === 0 || ctx.timed ? ROUND : Math.max(1, Math.min(ROUND, Math.ceil((this.budget - this.routings) / (this.routings / this.fitted))));
    while (round.length < size) {
      const entry = this.take();
      if (!entry) break;
      const key = this.entryKey(entry);
      this.tried.add(key);
      if (entry.cost >= bar) this.skipped++;
      else round.push({ ...entry, key });
    }
    if (round.length === 0) return "widen";
    const jobs = round.filter((e) => !options.done?.has(e.key) && !ctx.prefit.has(e.key));
    const outcomes = await ctx.fitter.fit(
      jobs.map((e) => ({ key: e.key, layout: e.layout, starts: e.starts })),
      (i, outcome) => {
        const { routed, ...fitted } = outcome;
        options.onLayout?.({ key: jobs[i].key, ...fitted } as JournalEntry);
        this.roundRoutings += outcome.routings;
        // The fitter routed the designs: the first compliant one is in hand now, not after the round.
        if (this.compliantFound === 0 && outcome.verdicts?.some((v) => v.compliant)) ctx.compliantInHand(this.roundRoutings);
      },
      () => options.interrupt?.() != null,
      // Guessed only for workers (in this thread nothing is idle to fit ahead).
      ctx.fitter.workers > 1 ? this.nextRound(bar) : [],
    );
    const byKey = new Map(jobs.map((e, i) => [e.key, outcomes[i]]));
    for (const entry of round) {
      const previous = options.done?.get(entry.key);
      // A layout scouted while the plan was scored: fitted then, taken (and journalled) now.
      const scouted = previous ? undefined : ctx.prefit.get(entry.key);
      if (scouted) {
        ctx.prefit.delete(entry.key);
        const { routed: _routed, ...fitted } = scouted;
        options.onLayout?.({ key: entry.key, ...fitted } as JournalEntry);
      }
      const outcome = previous ?? scouted ?? byKey.get(entry.key);
      // Abandoned when the run was interrupted: a resumed run fits it.
      if (!outcome) continue;
      if (previous) {
        this.fromJournal++;
        ctx.tally.replayed += outcome.routings;
      }
      this.fitted++;
      this.routings += outcome.routings;
      this.evaluations += outcome.evaluations;
      ctx.tally.routings += outcome.routings;
      ctx.tally.evaluations += outcome.evaluations;
      // The neighbours of a compliant design without flags (with a time budget, of every compliant one).
      let expand = false;
      for (const [d, vars] of outcome.designs.entries()) {
        const c = this.accept(entry.layout, vars, outcome.routed?.[d], outcome.verdicts?.[d]);
        if (c && c.verdict.compliant && (ctx.timed || c.verdict.warnings === 0)) expand = true;
      }
      if (ctx.timed && !outcome.designs.some((vars) => this.candidates.get(this.designKey(entry.layout, vars).key)?.verdict.compliant)) this.missed.push(entry);
      if (expand) this.enqueue(neighbourLayouts(ctx.p, entry.layout).map((n) => ({ layout: n, cost: layoutCost(ctx.p, n), score: entry.score })));
    }
    this.roundRoutings = 0;
    ctx.progress();
    return "round";
  }

  /** Nothing passed the bound: queue the nearest misses once, so the closest candidates can be shown. */
  private closest(): boolean {
    if (this.candidates.size > 0 || this.closestTried) return false;
    this.closestTried = true;
    const before = this.planned;
    this.enqueue(closestLayouts(this.ctx.p, this.ctx.firstPlan, ROUND).map((l) => ({ layout: l, cost: layoutCost(this.ctx.p, l), score: 0 })));
    return this.planned > before;
  }

  /** Screens a batch of scores on the fitter, charged to this part. */
  private async screened<T>(scoring: Scoring<T>): Promise<T> {
    const done = await this.ctx.scored(scoring);
    this.routings += done.routings;
    this.evaluations += done.evaluations;
    return done.result;
  }

  /** State "widen": the queue is dry; widen the part's search, or stop with the reason. */
  private async widen(): Promise<State> {
    const { ctx } = this;
    const { p, options, timed } = ctx;
    if (p.fixedLayout) return this.done({ kind: "fixed", words: "the one layout the limits allow (the existing parts, only their elevations varied) was fitted" });
    if (this.spent()) return this.done(this.budgetStop());
    if (this.beam < MAX_BEAM && (timed || this.beam < SAMPLING_BEAM || this.compliantFound === 0)) {
      this.beam = Math.min(2 * this.beam, MAX_BEAM);
      // The wider plan of this part's own families.
      const plan = await this.screened(planning(p, this.beam, this.familySet));
      const before = this.planned;
      this.enqueue(this.own(plan.layouts));
      // A wider plan may hold nothing new for this part's families: widen again (up to the widest beam, then by sampling).
      return this.planned > before || timed || this.closest() ? "round" : "widen";
    }
    if (!timed && this.beam >= MAX_BEAM && this.compliantFound === 0) {
      if (this.closest()) return "round";
      return this.done({ kind: "reach", words: `every layout within reach was fitted or bounded out by cost (beam of ${this.beam} options per level)` });
    }
    const bar = this.costBar();
    // A time budget on a space small enough to list goes through the list instead of sampling it.
    if (timed && this.space === undefined) this.space = layoutSpace(p, this.ownPlan, ENUMERABLE)?.filter((l) => ctx.partition.partOf(l) === this.index) ?? null;
    // Past a moderate beam, widen by screened random layouts cheaper than the part's head.
    if (!(timed && this.space)) {
      const drawn = sampleLayouts(p, this.ownPlan, this.rng, this.sampleBatch, bar).filter((l) => ctx.partition.partOf(l) === this.index);
      const values = await this.screened(layoutScores(p, drawn, SAMPLE_CHUNK));
      const before = this.planned;
      this.enqueue(drawn.map((layout, i) => ({ layout, score: values[i].score, cost: values[i].cost })).filter((s) => s.score <= this.promising));
      this.samplingRounds = this.planned > before ? 0 : this.samplingRounds + 1;
      if (this.samplingRounds <= MAX_SAMPLING_ROUNDS) return "round";
    }
    if (!timed) return this.done({ kind: "sampling", words: `${MAX_SAMPLING_ROUNDS} rounds of random layouts found nothing more to fit` });
    // A time budget is spent: fit every layout of a small space, fit again with more starts the
    // cheapest layouts whose fit found nothing compliant, and screen with a looser threshold.
    this.samplingRounds = 0;
    const left = this.space ? this.space.filter((l) => !this.tried.has(layoutKey(l))) : [];
    this.enqueue(left.map((l) => ({ layout: l, cost: layoutCost(p, l), score: Infinity })));
    const again = this.missed.filter((e) => e.cost < bar && (e.starts ?? options.starts) < MAX_STARTS_FACTOR * options.starts);
    again.sort((a, b) => a.cost - b.cost).splice(ROUND);
    for (const e of again) this.missed.splice(this.missed.indexOf(e), 1);
    this.enqueue(again.map((e) => ({ ...e, starts: (e.starts ?? options.starts) * 3 })));
    if (this.space && left.length === 0 && again.length === 0) {
      return this.done({
        kind: "exhausted",
        layouts: this.space.length,
        words: exhaustedWords(this.space.length),
      });
    }
    this.promising *= 4;
    return "round";
  }

  private done(stop: PartStop): State {
    this.stop = stop;
    return "done";
  }
}
