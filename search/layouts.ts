// Discrete layouts, generated in the order most likely to succeed: levels are chosen storm by storm
// (level k holds the k-th smallest storm), each option scored by routing that storm through the levels
// chosen so far, and only the best few are kept at each level (a beam). Options that cannot meet a
// target are pruned by a bound: openings only add flow, so if the first level alone already passes
// more than the smallest storm's upper band, no layout that starts with it can succeed.
import type { Storm } from "../src/case/model.js";
import { elementFlow, outletDischarge } from "../src/hydraulics/outlet.js";
import type { PartOption, SearchProblem, SizeOption } from "./problem.js";
import { aimBand } from "./problem.js";
import { targetBand } from "../src/assess/rules/band.js";
import { caseElevation, designOutlet, designOutletFile, layoutKey, variableCount, type Layout } from "./layout.js";
import type { Evaluator } from "./evaluate.js";
import { stagedStart } from "./fit.js";
import { outletCost } from "./cost.js";

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
  /** First-level options that survived. */
  viableFirst: number;
  /** The surviving first-level options themselves. */
  firstOptions: PartOption[];
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
  const L = (x: Parameters<SearchProblem["converter"]["length"]>[0]) => p.converter.length(x, "outlet.riser");
  return r.shape === "circular" ? Math.PI * L(r.diameter) : 2 * (L(r.length) + L(r.width));
}

/**
 * A riser size takes a set of levels when every level's openings fit its perimeter side by side and
 * it is wider than the barrel it sits on (common practice).
 */
function riserFits(levels: PartOption[], riser: SizeOption, barrel: SizeOption | null): boolean {
  const widest = Math.max(0, ...levels.map((part) => part.width));
  return Math.PI * riser.sizeM >= widest && (!barrel || riser.sizeM > barrel.sizeM);
}

/** Riser sizes for a set of levels: the smallest two whose perimeter takes every level's openings. */
export function riserChoices(p: SearchProblem, levels: PartOption[], barrel: SizeOption | null): (SizeOption | null)[] {
  if (p.keptRiser || p.riserOptions.length === 0) return [null];
  return p.riserOptions.filter((r) => riserFits(levels, r, barrel)).slice(0, 2);
}

/** Barrel sizes worth fitting: the smallest that can carry the largest target at the freeboard stage, and the next. */
export function barrelChoices(p: SearchProblem): (SizeOption | null)[] {
  if (!p.barrel || p.barrelOptions.length === 0) return [null];
  const need = Math.max(...p.targeted.map((s) => targetBand(s.target!, p.case.criteria)[1]));
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
 */
export function planLayouts(p: SearchProblem, evaluator: Evaluator, beam: number): LayoutPlan {
  if (p.fixedLayout) {
    const layout = p.fixedLayout;
    return { layouts: [{ layout, ...existingScore(p, layout, evaluator) }], pruned: [], viableFirst: 1, firstOptions: layout.levels.slice(0, 1) };
  }
  const storms = p.targeted;
  const barrels = barrelChoices(p);
  const stagingBarrel = barrels[0];
  const options = p.parts.filter((part) => fitsSomeRiser(p, part));
  const pruned: PruneRecord[] = [];
  const maxLevels = Math.min(p.maxLevels, storms.length);
  const results = new Map<string, ScoredLayout>();

  // Level 1 (at the floor): route the smallest storm through each option alone.
  type Partial = { levels: PartOption[]; score: number };
  let frontier: Partial[] = [];
  if (maxLevels === 0) frontier = [{ levels: [], score: 0 }];
  else {
    const first = storms[0];
    for (const part of options) {
      const layout: Layout = { levels: [part], riser: null, barrel: stagingBarrel };
      const vars = stagedStart(p, layout, evaluator, true);
      const outlet = designOutlet(p, designOutletFile(p, layout, vars, true));
      const result = evaluator.routeStorms(outlet, [first])[0].result;
      let peak = result.peakOutflow;
      if (!p.lowestFloats && peak > targetBand(first.target!, p.case.criteria)[1]) {
        // The bound holds with the most restrictive barrel: confirm with it before pruning.
        if (p.barrel) peak = evaluator.routeStorms(designOutlet(p, designOutletFile(p, layout, vars)), [first])[0].result.peakOutflow;
        if (peak > targetBand(first.target!, p.case.criteria)[1]) {
          pruned.push({ part, storm: first, peak });
          continue;
        }
      }
      // The lowest level drains the pond's last stretch alone: a slow one fails the drawdown rule.
      frontier.push({ levels: [part], score: aimDistance(p, first, peak, FIXABLE_UNDER) ** 2 + drawdownShortfall(p, result.drawdownTime) ** 2 });
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
    for (const partial of keep([...frontier])) addLayouts(partial.levels);
    if (count === maxLevels) break;
    // Extend the best prefixes by one level, scored on the storm the new level must hold.
    const next: Partial[] = [];
    for (const partial of keep(frontier)) {
      const storm = storms[Math.min(count, storms.length - 1)];
      for (const part of options) {
        const layout: Layout = { levels: [...partial.levels, part], riser: null, barrel: stagingBarrel };
        const vars = stagedStart(p, layout, evaluator, true);
        const outlet = designOutlet(p, designOutletFile(p, layout, vars, true));
        const peak = evaluator.routeStorms(outlet, [storm])[0].result.peakOutflow;
        const last = count + 1 === maxLevels;
        next.push({ levels: layout.levels, score: partial.score + aimDistance(p, storm, peak, last ? 1 : FIXABLE_UNDER) ** 2 });
      }
    }
    frontier = next;
  }

  function addLayouts(levels: PartOption[]) {
    for (const barrel of barrels) {
      for (const riser of riserChoices(p, levels, barrel)) {
        const layout: Layout = { levels, riser, barrel };
        const key = layoutKey(layout);
        if (results.has(key)) continue;
        results.set(key, { layout, ...stagedScore(p, layout, evaluator) });
      }
    }
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
    if (!results.has(key) && existing.levels.length <= p.maxLevels) results.set(key, { layout: existing, ...existingScore(p, existing, evaluator) });
    for (const layout of neighbourLayouts(p, existing)) {
      const k = layoutKey(layout);
      if (!results.has(k) && layout.levels.length <= p.maxLevels) results.set(k, { layout, ...stagedScore(p, layout, evaluator) });
    }
  }
  const layouts = [...results.values()].sort((a, b) => a.score - b.score);
  return { layouts, pruned, viableFirst, firstOptions };
}

/**
 * Random layouts from the catalogue (the first level from the options the bound left), kept when
 * they cost less than `bar`, scored by the fit's objective at the staged start. Widens the search
 * beyond the planned and neighbouring layouts; seeded, so runs repeat.
 */
export function sampleLayouts(p: SearchProblem, plan: LayoutPlan, evaluator: Evaluator, rng: () => number, count: number, bar: number): ScoredLayout[] {
  const out: ScoredLayout[] = [];
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
    out.push({ layout, ...stagedScore(p, layout, evaluator) });
  }
  return out;
}

/** Score and cost of the existing layout at its own elevations. */
function existingScore(p: SearchProblem, layout: Layout, evaluator: Evaluator): { score: number; cost: number } {
  const vars = p.existing && p.existing.vars.length === variableCount(p, layout) ? p.existing.vars : stagedStart(p, layout, evaluator, true);
  const e = evaluator.evaluate(layout, vars);
  return { score: e.objective, cost: outletCost(e.outlet, p.costs) };
}

/**
 * When the bound prunes every plan: the layouts nearest to passing, one level each, from the pruned
 * options that released least at the smallest storm, so the closest candidates can be shown.
 */
export function closestLayouts(p: SearchProblem, plan: LayoutPlan, count: number): Layout[] {
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
function stagedScore(p: SearchProblem, layout: Layout, evaluator: Evaluator): { score: number; cost: number } {
  // Staged without the barrel (fast), judged with it.
  const vars = variableCount(p, layout) > 0 ? stagedStart(p, layout, evaluator, true) : [];
  const e = evaluator.evaluate(layout, vars);
  return { score: e.objective, cost: outletCost(e.outlet, p.costs) };
}

/** Cost of a layout (elevations do not change it; placeholder elevations one step apart). */
export function layoutCost(p: SearchProblem, layout: Layout): number {
  const n = variableCount(p, layout);
  const vars = Array.from({ length: n }, (_, i) => p.floor + (i + 1) * p.stepM);
  return outletCost(designOutlet(p, designOutletFile(p, layout, vars)), p.costs);
}

/** Free flow of a part with its invert or crest at 0 under a head (m3/s), with the case's coefficients. */
function partFlowAt(p: SearchProblem, part: PartOption, head: number): number {
  const outlet = designOutlet(p, designOutletFile(p, { levels: [part], riser: null, barrel: null }, [0]));
  const e = outlet.elements[outlet.elements.length - 1];
  const bottom = e.type === "weir" ? e.crest : e.invert;
  return elementFlow(e, bottom + head, -Infinity);
}

/** Head (m) at which parts of different kinds are compared as neighbours: one foot, whatever the case's units. */
const NEIGHBOUR_HEAD = 0.3048;

/**
 * Parts one catalogue step away: the next size down or up, one opening more or fewer, and for each
 * other kind of part the one passing the nearest flow at a head of NEIGHBOUR_HEAD.
 */
function partNeighbours(p: SearchProblem, part: PartOption): PartOption[] {
  const same = p.parts.filter((o) => o.kind === part.kind);
  const out: PartOption[] = [];
  const head = NEIGHBOUR_HEAD;
  const flow = partFlowAt(p, part, head);
  for (const kind of ["orifice", "rectangular", "v-notch"] as const) {
    if (kind === part.kind) continue;
    let nearest: PartOption | undefined;
    let gap = Infinity;
    for (const o of p.parts) {
      if (o.kind !== kind) continue;
      const d = Math.abs(Math.log(partFlowAt(p, o, head) / flow));
      if (d < gap) {
        gap = d;
        nearest = o;
      }
    }
    if (nearest) out.push(nearest);
  }
  if (part.kind === "orifice") {
    const sizes = [...new Set(same.map((o) => o.sizeM))].sort((a, b) => a - b);
    const at = sizes.indexOf(part.sizeM);
    for (const size of [sizes[at - 1], sizes[at + 1]]) {
      const o = same.find((x) => x.sizeM === size && x.count === part.count);
      if (o) out.push(o);
    }
    for (const count of [part.count - 1, part.count + 1]) {
      const o = same.find((x) => x.sizeM === part.sizeM && x.count === count);
      if (o) out.push(o);
    }
  } else {
    const key = (o: PartOption) => (o.kind === "v-notch" ? o.angle : o.sizeM);
    const sorted = [...same].sort((a, b) => key(a) - key(b));
    const at = sorted.findIndex((o) => o.key === part.key);
    for (const o of [sorted[at - 1], sorted[at + 1]]) if (o) out.push(o);
  }
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
    if (riserFits(layout.levels, riser, layout.barrel)) out.push({ ...layout, riser });
  }
  for (const barrel of step(p.barrelOptions, layout.barrel)) {
    if (!layout.riser || layout.riser.sizeM > barrel.sizeM) out.push({ ...layout, barrel });
  }
  return out;
}
