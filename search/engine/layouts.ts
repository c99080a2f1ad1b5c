// Discrete layouts, generated in the order most likely to succeed: levels are chosen storm by storm
// (level k holds the k-th smallest storm), each option scored by routing that storm through the levels
// chosen so far, and only the best few are kept at each level (a beam). Options that cannot meet a
// target are pruned by a bound: openings only add flow, so if the first level alone already passes
// more than the smallest storm's upper band, no layout that starts with it can succeed.
import type { Storm } from "../../src/model.js";
import { elementFlow, outletDischarge } from "../../src/hydraulics/outlet.js";
import type { SearchProblem, Layout } from "./problem.js";
import type { PartOption, SizeOption } from "../../src/parts/part.js";
import { bottomOf, otherKinds } from "../../src/parts/registry.js";
import { riserPerimeter, riserToSI } from "../../src/parts/riser.js";
import { chordArc } from "../../src/parts/wall.js";
import { aimBand, pondLayoutAsGiven } from "./problem.js";
import { targetBand } from "../../src/assess/rules/band.js";
import { caseElevation, designOutlet, designOutletFile, familyOf, layoutKey, variableCount } from "./layout.js";
import { Evaluator } from "./evaluate.js";
import { layoutAt, layoutIndex } from "./fitJob.js";
import { chunked, stagedItem, type ScoreChunk, type ScoreItem, type ScoreOutcome, type ScoreValue, type Scored, type Scoring } from "./scoring.js";
import { pondGoal, stagedStart } from "./fit.js";
import { outletCost } from "./cost.js";
import { RULES } from "../../src/assess/rules/registry.js";
import type { Check } from "../../src/assess/rules/rule.js";
import type { Outlet } from "../../src/model.js";

export interface ScoredLayout {
  layout: Layout;
  /** Sum of squared distances of each staged storm's ratio from its aim (0 = every storm in aim). */
  score: number;
  /** Cost proxy of the layout (it does not depend on the elevations). */
  cost: number;
}

export interface PruneRecord {
  part: PartOption;
  storm: Storm;
  /** Peak through the first level alone (m3/s), a lower bound for any layout starting with it. */
  peak: number;
}

export interface LayoutPlan {
  layouts: ScoredLayout[];
  /** First-level options pruned by the bound, for explanations. */
  pruned: PruneRecord[];
  /** First-level options left out because alone they fail a rule's `boundFirstLevel` check (e.g. released too fast for extended detention). */
  bounded: PartOption[];
  /** First-level options that survived. */
  viableFirst: number;
  /** The surviving first-level options themselves. */
  firstOptions: PartOption[];
  /** A system of ponds: each designed pond's own plan (null for a pipe or a fixed pond), in the system's order. */
  ponds?: (LayoutPlan | null)[];
}

/**
 * Distance of a peak from the aim band, relative to the target (0 inside). While levels are still
 * being added, releasing too little is partly fixable (the next level can sit lower and add flow),
 * releasing too much is not (openings only add flow): `under` weighs the first.
 */
function aimDistance(p: SearchProblem, storm: Storm, peak: number, under = 1): number {
  const [low, high] = aimBand(p, storm.target!);
  if (peak > high) return (peak - high) / storm.target!;
  if (peak < low) return (under * (low - peak)) / storm.target!;
  return 0;
}

/** How far a drawdown time (s, null when not drained) exceeds the case's limit, as a fraction of it. */
function drawdownShortfall(p: SearchProblem, seconds: number | null): number {
  const hours = p.case.criteria.drawdownHours;
  if (hours === null) return seconds === null ? 1 : 0;
  if (seconds === null) return 1;
  return Math.max(0, seconds / 3600 / hours - 1);
}

/** Weight of under-release while a layout is being built level by level. */
const FIXABLE_UNDER = 0.3;

/** Whether a part fits the wall of the widest riser the case allows (or any wall without a riser). */
function fitsSomeRiser(p: SearchProblem, part: PartOption): boolean {
  const widest = p.keptRiser ? perimeterOf(p, p.keptRiser) : p.riserOptions.length ? Math.PI * p.riserOptions[p.riserOptions.length - 1].sizeM : Infinity;
  return part.width <= widest;
}

function perimeterOf(p: SearchProblem, r: NonNullable<SearchProblem["keptRiser"]>): number {
  return riserPerimeter(riserToSI(r, p.converter, "outlet.riser"));
}

/**
 * A riser size takes a set of levels when each level's openings fit its perimeter side by side with
 * the clear web after each (each opening the arc of its chord), and the barrel fits its wall with the
 * web at each side (the opening-web and barrel-fit rules, for a level alone: a bound, not the check).
 */
function riserFits(p: SearchProblem, levels: PartOption[], riser: SizeOption, barrel: SizeOption | null): boolean {
  const d = riser.sizeM;
  const web = p.case.criteria.buildability.web;
  const fits = levels.every((part) => part.count * (chordArc(d, part.width / part.count) + web) <= Math.PI * d + 1e-9);
  return fits && (!barrel || barrel.sizeM <= d - 2 * web + 1e-9);
}

/** Riser sizes for a set of levels: the smallest two whose perimeter takes every level's openings. */
export function riserChoices(p: SearchProblem, levels: PartOption[], barrel: SizeOption | null): (SizeOption | null)[] {
  if (p.keptRiser || p.riserOptions.length === 0) return [null];
  return p.riserOptions.filter((r) => riserFits(p, levels, r, barrel)).slice(0, 2);
}

/** Barrel sizes worth fitting: the smallest that can carry the largest target at the freeboard stage, and the next. */
export function barrelChoices(p: SearchProblem): (SizeOption | null)[] {
  // A pure function of the problem, asked for every layout the plan scores: solved once per problem.
  let choices = barrelChoicesOf.get(p);
  if (!choices) {
    choices = chooseBarrels(p);
    barrelChoicesOf.set(p, choices);
  }
  return choices;
}

const barrelChoicesOf = new WeakMap<SearchProblem, (SizeOption | null)[]>();

function chooseBarrels(p: SearchProblem): (SizeOption | null)[] {
  if (!p.barrel || p.barrelOptions.length === 0) return [null];
  // At a point of analysis the pond releases its share of the target (the bypass takes the rest).
  const need = Math.max(...p.targeted.map((s) => pondGoal(s, targetBand(s.target!, p.case.criteria)[1])));
  const index = p.barrelOptions.findIndex((b) => barrelCapacity(p, b) >= need);
  if (index < 0) return [p.barrelOptions[p.barrelOptions.length - 1]];
  return p.barrelOptions.slice(index, index + 2);
}

/** Flow the barrel passes at the freeboard stage when the openings are no limit. */
export function barrelCapacity(p: SearchProblem, size: SizeOption): number {
  const file = designOutletFile(p, { levels: [], riser: null, barrel: size }, []);
  const outlet = designOutlet(p, { ...file, elements: [], riser: { shape: "circular", diameter: 1000, crest: caseElevation(p, p.floor), coefficient: 3.0, orificeCoefficient: 0.6 }, spillway: undefined });
  return outletDischarge(outlet, p.case.tailwater, p.ceiling);
}

/**
 * Plans layouts with `beam` options kept per level, for every number of levels from 1 to the most
 * the catalogue allows (and no more than the storms to hold, plus the rim). Sorted best first.
 * Scored in this thread; the search scores the same plan on its workers (`planning`).
 */
export function planLayouts(p: SearchProblem, beam: number): LayoutPlan {
  return scoreHere(p, planning(p, beam)).result;
}

/** Chunk sizes of the plan's scoring: fixed, so that the plan does not depend on the workers. */
const FIRST_CHUNK = 4;
const LAYOUT_CHUNK = 4;

/**
 * The plan as a scoring generator: it asks for chunks of scores level by level. `families`: only
 * these first-level options (by key) start a layout (a part of the search widening its own plan).
 */
export function* planning(p: SearchProblem, beam: number, families?: ReadonlySet<string>, onScored?: (scored: ScoredLayout[]) => void): Scoring<LayoutPlan> {
  if (p.system) return yield* systemPlanning(p, beam, families, onScored);
  if (p.fixedLayout) {
    const layout = p.fixedLayout;
    const [own] = yield [{ items: [{ kind: "existing", layout: layoutIndex(p, layout) }] }];
    return { layouts: [{ layout, score: own.values[0].score, cost: own.values[0].cost }], pruned: [], bounded: [], viableFirst: 1, firstOptions: layout.levels.slice(0, 1) };
  }
  const storms = p.targeted;
  const barrels = barrelChoices(p);
  const options = p.parts.filter((part) => fitsSomeRiser(p, part));
  const at = (part: PartOption) => p.parts.indexOf(part);
  const pruned: PruneRecord[] = [];
  const maxLevels = Math.min(p.maxLevels, storms.length);
  const results = new Map<string, ScoredLayout>();

  // Layouts scored on every storm from the staged start, in order, each once.
  function* scoreLayouts(layouts: Layout[], size: number): Generator<ScoreChunk[], void, ScoreOutcome[]> {
    const fresh: Layout[] = [];
    const keys = new Set<string>();
    for (const layout of layouts) {
      const key = layoutKey(layout);
      if (results.has(key) || keys.has(key)) continue;
      keys.add(key);
      fresh.push(layout);
    }
    if (fresh.length === 0) return;
    const outcomes = yield chunked(fresh.map((l) => stagedItem(p, l)), size);
    const values = outcomes.flatMap((o) => o.values);
    fresh.forEach((layout, i) => results.set(layoutKey(layout), { layout, score: values[i].score, cost: values[i].cost }));
    onScored?.(fresh.map((layout) => results.get(layoutKey(layout))!));
  }

  // Level 1 (at the floor): route the smallest storm through each option alone.
  type Partial = { levels: PartOption[]; score: number };
  let frontier: Partial[] = [];
  let bounded: Partial[] = [];
  if (maxLevels === 0) frontier = [{ levels: [], score: 0 }];
  else {
    const firsts = families ? options.filter((part) => families.has(part.key)) : options;
    const outcomes = yield chunked(firsts.map((part) => ({ kind: "first", part: at(part) })), FIRST_CHUNK);
    const values = outcomes.flatMap((o) => o.values);
    firsts.forEach((part, i) => {
      const v = values[i];
      if (v.pruned) pruned.push({ part, storm: storms[0], peak: v.peak });
      else (v.bounded ? bounded : frontier).push({ levels: [part], score: v.score });
    });
    // When the rules' bounds would leave no first level, keep those options (the closest candidates are shown from them).
    if (frontier.length === 0) {
      frontier = bounded;
      bounded = [];
    }
  }
  const viableFirst = frontier.length;
  const firstOptions = frontier.map((f) => f.levels[0]).filter((x): x is PartOption => x !== undefined);
  // The best `beam` by score, and for variety the cheapest few whose score is still reasonable.
  const keep = (list: Partial[]) => {
    list.sort((a, b) => a.score - b.score || cost(a.levels) - cost(b.levels));
    const kept = list.slice(0, beam);
    const reasonable = Math.max(0.05, kept.length ? kept[kept.length - 1].score : 0);
    const cheap = list.slice(beam).filter((x) => x.score <= reasonable).sort((a, b) => cost(a.levels) - cost(b.levels));
    return [...kept, ...cheap.slice(0, Math.ceil(beam / 2))];
  };
  for (let count = 1; count <= Math.max(1, maxLevels); count++) {
    if (frontier.length === 0) break;
    // Layouts with `count` levels: score them on every storm from the staged start.
    const layouts: Layout[] = [];
    for (const partial of keep([...frontier])) {
      for (const barrel of barrels) for (const riser of riserChoices(p, partial.levels, barrel)) layouts.push({ levels: partial.levels, riser, barrel });
    }
    yield* scoreLayouts(layouts, LAYOUT_CHUNK);
    if (count === maxLevels) break;
    // Extend the best prefixes by one level, scored on the storm the new level must hold (one chunk
    // per prefix: the prefix's routing is shared by every option tried on it).
    const stormIndex = Math.min(count, storms.length - 1);
    const storm = storms[stormIndex];
    const last = count + 1 === maxLevels;
    const prefixes = keep(frontier);
    const outcomes = yield prefixes.map((partial) => ({
      items: options.map((part): ScoreItem => ({ kind: "extend", levels: [...partial.levels, part].map(at), storm: stormIndex })),
    }));
    const next: Partial[] = [];
    prefixes.forEach((partial, k) => {
      options.forEach((part, i) => {
        const peak = outcomes[k].values[i].peak;
        next.push({ levels: [...partial.levels, part], score: partial.score + aimDistance(p, storm, peak, last ? 1 : FIXABLE_UNDER) ** 2 });
      });
    });
    frontier = next;
  }

  function cost(levels: PartOption[]): number {
    return levels.reduce((sum, part) => sum + part.count * (1 + part.sizeM), 0);
  }

  // Value engineering: the existing layout (scored at its own elevations) and the layouts one step
  // from it are planned too, so that the smallest fixes and savings are among the layouts fitted.
  // Proposals keep to the catalogue's most control levels, even where the existing outlet has more.
  if (p.existing) {
    const existing = p.existing.layout;
    const key = layoutKey(existing);
    if (!results.has(key) && existing.levels.length <= p.maxLevels) {
      const [own] = yield [{ items: [{ kind: "existing", layout: layoutIndex(p, existing) }] }];
      results.set(key, { layout: existing, score: own.values[0].score, cost: own.values[0].cost });
    }
    yield* scoreLayouts(neighbourLayouts(p, existing).filter((layout) => layout.levels.length <= p.maxLevels), LAYOUT_CHUNK);
  }
  const layouts = [...results.values()].sort((a, b) => a.score - b.score);
  return { layouts, pruned, bounded: bounded.map((b) => b.levels[0]), viableFirst, firstOptions };
}

/**
 * A first-level option alone on the smallest storm, staged without the barrel: its peak, whether the
 * bound prunes it (confirmed with the most restrictive barrel), and its score as a first level.
 */
export function firstLevelScore(p: SearchProblem, part: PartOption, evaluator: Evaluator): { peak: number; pruned: boolean; bounded: boolean; score: number } {
  const first = p.targeted[0];
  const layout: Layout = { levels: [part], riser: null, barrel: barrelChoices(p)[0] };
  const vars = stagedStart(p, layout, evaluator, true);
  const outlet = designOutlet(p, designOutletFile(p, layout, vars, true));
  const result = evaluator.routeStorms(outlet, [first])[0].result;
  let peak = result.peakAtPoint;
  if (!p.lowestFloats && peak > targetBand(first.target!, p.case.criteria)[1]) {
    // The bound holds with the most restrictive barrel: confirm with it before pruning.
    if (p.barrel) peak = evaluator.routeStorms(designOutlet(p, designOutletFile(p, layout, vars)), [first])[0].result.peakAtPoint;
    if (peak > targetBand(first.target!, p.case.criteria)[1]) return { peak, pruned: true, bounded: false, score: Infinity };
  }
  // Checks that openings added above can only worsen, on this level alone with the most restrictive barrel.
  const bounded = !p.lowestFloats && !p.options.referencePath && failsFirstLevelBound(p, designOutlet(p, designOutletFile(p, layout, vars)));
  // The lowest level drains the pond's last stretch alone: a slow one fails the drawdown rule.
  return { peak, pruned: false, bounded, score: aimDistance(p, first, peak, FIXABLE_UNDER) ** 2 + drawdownShortfall(p, result.drawdownTime) ** 2 };
}

/**
 * Whether an outlet of one level at the floor fails a check that every layout starting with that
 * level fails too (the rules' `boundFirstLevel`; no storm is routed for them, so checks on a storm's
 * routing are left out).
 */
function failsFirstLevelBound(p: SearchProblem, outlet: Outlet): boolean {
  const checks: Check[] = [];
  for (const rule of RULES) rule.boundFirstLevel?.({ case: p.case, outlet, routings: { design: [] } }, checks);
  return checks.some((c) => !c.passed);
}

/** Peak of `storm` through `levels` (the last one just added) at their staged start, without the barrel. */
export function extensionPeak(p: SearchProblem, levels: PartOption[], storm: Storm, evaluator: Evaluator): number {
  const layout: Layout = { levels, riser: null, barrel: barrelChoices(p)[0] };
  const vars = stagedStart(p, layout, evaluator, true);
  const outlet = designOutlet(p, designOutletFile(p, layout, vars, true));
  return evaluator.routeStorms(outlet, [storm])[0].result.peakAtPoint;
}

/**
 * Random layouts from the catalogue (the first level from the options the bound left), kept when
 * they cost less than `bar` (the run scores them by the fit's objective at the staged start). Widens
 * the search beyond the planned and neighbouring layouts; seeded, so runs repeat.
 */
export function sampleLayouts(p: SearchProblem, plan: LayoutPlan, rng: () => number, count: number, bar: number): Layout[] {
  if (p.system) return sampleSystems(p, plan, rng, count, bar);
  const out: Layout[] = [];
  const maxLevels = Math.min(p.maxLevels, p.targeted.length);
  if (maxLevels === 0 || plan.firstOptions.length === 0 || p.fixedLayout) return out;
  const pick = <T>(list: T[]): T => list[Math.floor(rng() * list.length)];
  const options = p.parts.filter((part) => fitsSomeRiser(p, part));
  const barrels = barrelChoices(p);
  for (let i = 0; i < count; i++) {
    const n = 1 + Math.floor(rng() * maxLevels);
    const levels = [p.lowestFloats ? pick(options) : pick(plan.firstOptions)];
    while (levels.length < n) levels.push(pick(options));
    const barrel = pick(barrels);
    const risers = riserChoices(p, levels, barrel);
    if (risers.length === 0) continue;
    const layout: Layout = { levels, riser: pick(risers), barrel };
    if (layoutCost(p, layout) >= bar) continue;
    out.push(layout);
  }
  return out;
}

/** Layouts scored at their staged start (the fit's objective) in chunks of `size`, in order. */
export function* layoutScores(p: SearchProblem, layouts: Layout[], size: number): Scoring<ScoreValue[]> {
  if (layouts.length === 0) return [];
  const outcomes = yield chunked(layouts.map((l) => stagedItem(p, l)), size);
  return outcomes.flatMap((o) => o.values);
}

/** Score and cost of the existing layout at its own elevations. */
export function existingScore(p: SearchProblem, layout: Layout, evaluator: Evaluator): { score: number; cost: number } {
  const vars = p.existing && p.existing.vars.length === variableCount(p, layout) ? p.existing.vars : stagedStart(p, layout, evaluator, true);
  const e = evaluator.evaluate(layout, vars);
  return { score: e.objective, cost: p.system ? layoutCost(p, layout) : outletCost(e.outlet, p.costs, p.case.criteria.buildability.levelSpacing) };
}

/**
 * When the bound prunes every plan: the layouts nearest to passing, one level each, from the pruned
 * options that released least at the smallest storm, so the closest candidates can be shown.
 */
export function closestLayouts(p: SearchProblem, plan: LayoutPlan, count: number): Layout[] {
  // A system's plan prunes nothing by the first level's bound (its combinations are scored whole).
  if (p.system) return [];
  const barrel = barrelChoices(p)[0];
  const out: Layout[] = [];
  for (const record of [...plan.pruned].sort((a, b) => a.peak - b.peak)) {
    const riser = riserChoices(p, [record.part], barrel)[0];
    if (riser === undefined) continue;
    out.push({ levels: [record.part], riser, barrel });
    if (out.length >= count) break;
  }
  return out;
}

/**
 * Every layout of the space `sampleLayouts` draws from, or null when it holds more than `limit`
 * (then it is too large to list, and only sampled).
 */
export function layoutSpace(p: SearchProblem, plan: LayoutPlan, limit: number): Layout[] | null {
  // A system's space is the product of its ponds' spaces: sampled, not listed.
  if (p.system) return null;
  const out: Layout[] = [];
  const maxLevels = Math.min(p.maxLevels, p.targeted.length);
  if (maxLevels === 0 || plan.firstOptions.length === 0) return out;
  const options = p.parts.filter((part) => fitsSomeRiser(p, part));
  const barrels = barrelChoices(p);
  const grow = (levels: PartOption[]): boolean => {
    if (levels.length > 0) {
      for (const barrel of barrels) {
        for (const riser of riserChoices(p, levels, barrel)) {
          out.push({ levels, riser, barrel });
          if (out.length > limit) return false;
        }
      }
    }
    if (levels.length === maxLevels) return true;
    const next = levels.length === 0 && !p.floorTaken ? plan.firstOptions : options;
    for (const part of next) if (!grow([...levels, part])) return false;
    return true;
  };
  return grow([]) ? out : null;
}

/** Score of a full layout (the fit's own objective, every check, at the staged start) and its cost. */
export function stagedScore(p: SearchProblem, layout: Layout, evaluator: Evaluator): { score: number; cost: number } {
  // Staged without the barrel (fast), judged with it.
  const vars = variableCount(p, layout) > 0 ? stagedStart(p, layout, evaluator, true) : [];
  const e = evaluator.evaluate(layout, vars);
  return { score: e.objective, cost: p.system ? layoutCost(p, layout) : outletCost(e.outlet, p.costs, p.case.criteria.buildability.levelSpacing) };
}

/** Layout costs kept per problem, by the layout's places in its option lists (`layoutIndex`). */
const knownCosts = new WeakMap<SearchProblem, Map<string, number>>();
/** Most costs kept per problem (a long time budget samples without end; each is about 100 bytes). */
const KNOWN_COSTS = 50_000;

/**
 * Cost of a layout (elevations do not change it; placeholder elevations one step apart). Kept by the
 * layout's parts, so the sampler's draws, the neighbours and a replayed run do not build the same
 * outlet again.
 */
export function layoutCost(p: SearchProblem, layout: Layout): number {
  if (p.system) return p.system.ponds.reduce((sum, d, i) => sum + layoutCost(d.problem, layout.ponds![i]), 0);
  let known = knownCosts.get(p);
  if (!known) knownCosts.set(p, (known = new Map()));
  const index = layoutIndex(p, layout);
  const key = `${index.levels.join(",")}|${index.riser}|${index.barrel}`;
  const kept = known.get(key);
  if (kept !== undefined) return kept;
  const n = variableCount(p, layout);
  const vars = Array.from({ length: n }, (_, i) => p.floor + (i + 1) * p.levelGapM);
  const cost = outletCost(designOutlet(p, designOutletFile(p, layout, vars)), p.costs, p.case.criteria.buildability.levelSpacing);
  if (known.size >= KNOWN_COSTS) known.clear();
  known.set(key, cost);
  return cost;
}

/** Free flow of a part with its invert or crest at 0 under a head (m3/s), with the case's coefficients. */
function partFlowAt(p: SearchProblem, part: PartOption, head: number): number {
  const outlet = designOutlet(p, designOutletFile(p, { levels: [part], riser: null, barrel: null }, [0]));
  const e = outlet.elements[outlet.elements.length - 1];
  return elementFlow(e, bottomOf(e) + head, -Infinity);
}

/** Head (m) at which parts of different kinds are compared as neighbours: one foot, whatever the case's units. */
const NEIGHBOUR_HEAD = 0.3048;

/**
 * Parts one catalogue step away: for each other kind of part the one passing the nearest flow at a
 * head of NEIGHBOUR_HEAD, then the kind's own steps (the next size down or up, one opening more or
 * fewer).
 */
function partNeighbours(p: SearchProblem, part: PartOption): PartOption[] {
  const out: PartOption[] = [];
  const flow = partFlowAt(p, part, NEIGHBOUR_HEAD);
  for (const kind of otherKinds(part.part)) {
    let nearest: PartOption | undefined;
    let gap = Infinity;
    for (const o of p.parts) {
      if (o.part !== kind) continue;
      const d = Math.abs(Math.log(partFlowAt(p, o, NEIGHBOUR_HEAD) / flow));
      if (d < gap) {
        gap = d;
        nearest = o;
      }
    }
    if (nearest) out.push(nearest);
  }
  out.push(...part.part.catalogue!.neighbours(part, p.parts.filter((o) => o.part === part.part)));
  return out;
}

/**
 * Layouts one step from a good one: one level's part a catalogue step smaller or larger (or one
 * opening fewer or more), one level dropped, the riser or barrel one size down or up. The search
 * fits the cheaper of these after it has found compliant designs, to spend effort where they are.
 */
export function neighbourLayouts(p: SearchProblem, layout: Layout): Layout[] {
  const out: Layout[] = [];
  if (p.fixedLayout) return out;
  if (p.system) {
    // A system: one pond's layout one step away (a pipe one size up or down), the others as they are.
    p.system.ponds.forEach((d, i) => {
      const own = layout.ponds![i];
      const near = d.kind === "designed" ? neighbourLayouts(d.problem, own) : d.kind === "pipe" ? pipeSizesNear(d.problem, own) : [];
      for (const n of near) out.push({ ...layout, ponds: layout.ponds!.map((l, k) => (k === i ? n : l)) });
    });
    return out;
  }
  layout.levels.forEach((part, i) => {
    for (const other of partNeighbours(p, part)) {
      const levels = [...layout.levels];
      levels[i] = other;
      out.push({ ...layout, levels });
    }
    if (layout.levels.length > 1) out.push({ ...layout, levels: layout.levels.filter((_, j) => j !== i) });
  });
  const step = <T extends { sizeM: number }>(list: T[], current: T | null) => {
    if (!current) return [];
    const at = list.findIndex((o) => o.sizeM === current.sizeM);
    return [list[at - 1], list[at + 1]].filter((o): o is T => o !== undefined);
  };
  for (const riser of step(p.riserOptions, layout.riser)) {
    if (riserFits(p, layout.levels, riser, layout.barrel)) out.push({ ...layout, riser });
  }
  for (const barrel of step(p.barrelOptions, layout.barrel)) {
    if (!layout.riser || riserFits(p, [], layout.riser, barrel)) out.push({ ...layout, barrel });
  }
  return out;
}

/** Scores a chunk with a fresh evaluator. */
export function scoreChunk(p: SearchProblem, chunk: ScoreChunk): ScoreOutcome {
  const evaluator = new Evaluator(p);
  const values = chunk.items.map((item) => scoreItem(p, item, evaluator));
  return { values, routings: evaluator.routings, evaluations: evaluator.evaluations };
}

function scoreItem(p: SearchProblem, item: ScoreItem, evaluator: Evaluator): ScoreValue {
  const none = { score: 0, cost: 0, peak: 0, drawdown: null, pruned: false, bounded: false };
  switch (item.kind) {
    case "first":
      return { ...none, ...firstLevelScore(p, p.parts[item.part], evaluator) };
    case "extend":
      return { ...none, peak: extensionPeak(p, item.levels.map((i) => p.parts[i]), p.targeted[item.storm], evaluator) };
    case "staged":
      return { ...none, ...stagedScore(p, layoutAt(p, item.layout), evaluator) };
    case "existing":
      return { ...none, ...existingScore(p, layoutAt(p, item.layout), evaluator) };
    case "pond":
      // A system's pond, on its own view of the case (its routings counted in this chunk's).
      return scoreItem(p.system!.ponds[item.pond].problem, item.item, evaluator.pond(item.pond));
  }
}

/** Answers a scoring generator in this thread. */
export function scoreHere<T>(p: SearchProblem, scoring: Scoring<T>): Scored<T> {
  let routings = 0;
  let evaluations = 0;
  let step = scoring.next([]);
  while (!step.done) {
    const outcomes = step.value.map((chunk) => scoreChunk(p, chunk));
    for (const o of outcomes) {
      routings += o.routings;
      evaluations += o.evaluations;
    }
    step = scoring.next(outcomes);
  }
  return { result: step.value, routings, evaluations };
}


// A system of ponds (`SearchProblem.system`): its plan, random layouts and pipe sizes.

/** Most combinations of the ponds' choices a system's plan scores whole. */
const SYSTEM_COMBINATIONS = 64;
/** Most combinations listed before the best are chosen (beyond it the ponds' choices are cut). */
const COMBINATIONS_LISTED = 5000;

/** A pipe's sizes one step from its size now. */
function pipeSizesNear(p: SearchProblem, layout: Layout): Layout[] {
  const at = p.barrelOptions.findIndex((o) => o === layout.barrel);
  return [p.barrelOptions[at - 1], p.barrelOptions[at + 1]].filter((b) => b !== undefined).map((barrel) => ({ levels: [], riser: null, barrel }));
}

/** Each pond's choices for the system's plan, best first, with their own scores: a designed pond's planned layouts, a pipe's sizes, a fixed pond's outlet as given. */
function pondChoices(p: SearchProblem, plans: readonly (LayoutPlan | null)[], beam: number): { layout: Layout; score: number }[][] {
  return p.system!.ponds.map((d, i) => {
    if (d.kind === "designed") return plans[i]!.layouts.slice(0, 2 * beam).map((s) => ({ layout: s.layout, score: s.score }));
    if (d.kind === "pipe") return d.problem.barrelOptions.map((barrel) => ({ layout: { levels: [], riser: null, barrel }, score: 0 }));
    return [{ layout: pondLayoutAsGiven(d).layout, score: 0 }];
  });
}

/** The best combinations of the ponds' choices by the sum of their scores (at most `limit`), in that order. */
function bestCombinations(choices: { layout: Layout; score: number }[][], limit: number): Layout[][] {
  // Each pond's list cut to its best few when the product is too long to list.
  const lists = choices.map((list) => [...list]);
  const product = () => lists.reduce((n, list) => n * list.length, 1);
  while (product() > COMBINATIONS_LISTED) {
    const longest = lists.reduce((a, list, i) => (list.length > lists[a].length ? i : a), 0);
    lists[longest].pop();
  }
  let combos: { layouts: Layout[]; score: number }[] = [{ layouts: [], score: 0 }];
  for (const list of lists) combos = combos.flatMap((c) => list.map((x) => ({ layouts: [...c.layouts, x.layout], score: c.score + x.score })));
  return combos
    .map((c, order) => ({ ...c, order }))
    .sort((a, b) => a.score - b.score || a.order - b.order)
    .slice(0, limit)
    .map((c) => c.layouts);
}

/** A pond's scoring requests as the system's: each item wrapped with the pond's place, the outcomes handed back. */
function* forPond<T>(index: number, scoring: Scoring<T>): Scoring<T> {
  let step = scoring.next([]);
  while (!step.done) {
    const outcomes: ScoreOutcome[] = yield step.value.map((chunk) => ({ items: chunk.items.map((item): ScoreItem => ({ kind: "pond", pond: index, item })) }));
    step = scoring.next(outcomes);
  }
  return step.value;
}

/**
 * A system's plan: each designed pond's own plan on its view of the case (the storms reaching it, its
 * share of the target), then the best combinations of the ponds' choices (a pipe's every size) scored
 * whole: the system routed together at each pond's staged start, every check of the system.
 * Value engineering adds the system as given and the layouts one step from it.
 */
function* systemPlanning(p: SearchProblem, beam: number, families?: ReadonlySet<string>, onScored?: (scored: ScoredLayout[]) => void): Scoring<LayoutPlan> {
  const ponds = p.system!.ponds;
  const results = new Map<string, ScoredLayout>();
  function* scoreLayouts(layouts: Layout[], kind: "staged" | "existing"): Generator<ScoreChunk[], void, ScoreOutcome[]> {
    const keys = layouts.map(layoutKey);
    const fresh = layouts.filter((l, i) => !results.has(keys[i]) && keys.indexOf(keys[i]) === i && (!families || families.has(familyOf(l))));
    if (fresh.length === 0) return;
    const items = fresh.map((l): ScoreItem => (kind === "existing" ? { kind: "existing", layout: layoutIndex(p, l) } : stagedItem(p, l)));
    const outcomes = yield chunked(items, LAYOUT_CHUNK);
    const values = outcomes.flatMap((o) => o.values);
    fresh.forEach((layout, i) => results.set(layoutKey(layout), { layout, score: values[i].score, cost: values[i].cost }));
    onScored?.(fresh.map((layout) => results.get(layoutKey(layout))!));
  }
  const plans: (LayoutPlan | null)[] = [];
  if (!p.fixedLayout) {
    for (const [i, d] of ponds.entries()) plans.push(d.kind === "designed" ? yield* forPond(i, planning(d.problem, beam)) : null);
    const combos = bestCombinations(pondChoices(p, plans, beam), SYSTEM_COMBINATIONS);
    yield* scoreLayouts(
      combos.map((layouts) => ({ levels: [], riser: null, barrel: null, ponds: layouts })),
      "staged",
    );
  }
  if (p.existing) {
    yield* scoreLayouts([p.existing.layout], "existing");
    if (!p.fixedLayout) yield* scoreLayouts(neighbourLayouts(p, p.existing.layout), "staged");
  }
  const layouts = [...results.values()].sort((a, b) => a.score - b.score);
  return { layouts, pruned: [], bounded: [], viableFirst: layouts.length, firstOptions: [], ponds: plans };
}

/** Random system layouts: each pond's own random layout (a pipe's size at random), kept when they cost less than `bar`. */
function sampleSystems(p: SearchProblem, plan: LayoutPlan, rng: () => number, count: number, bar: number): Layout[] {
  const ponds = p.system!.ponds;
  if (p.fixedLayout || !plan.ponds) return [];
  const out: Layout[] = [];
  for (let k = 0; k < count; k++) {
    const layouts: Layout[] = [];
    for (const [i, d] of ponds.entries()) {
      if (d.kind === "designed") {
        const own = plan.ponds[i] ? sampleLayouts(d.problem, plan.ponds[i]!, rng, 1, Infinity)[0] : undefined;
        if (own) layouts.push(own);
      } else if (d.kind === "pipe") layouts.push({ levels: [], riser: null, barrel: d.problem.barrelOptions[Math.floor(rng() * d.problem.barrelOptions.length)] });
      else layouts.push(pondLayoutAsGiven(d).layout);
    }
    if (layouts.length !== ponds.length) continue;
    const layout: Layout = { levels: [], riser: null, barrel: null, ponds: layouts };
    if (layoutCost(p, layout) < bar) out.push(layout);
  }
  return out;
}
