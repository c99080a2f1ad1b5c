// Discrete layouts, generated in the order most likely to succeed: levels are chosen storm by storm
// (level k holds the k-th smallest storm), each option scored by routing that storm through the levels
// chosen so far, and only the best few are kept at each level (a beam). Options that cannot meet a
// target are pruned by a bound: openings only add flow, so if the first level alone already passes
// more than the smallest storm's upper band, no layout that starts with it can succeed.
import type { Storm } from "../src/case/model.js";
import { baseLength } from "../src/units.js";
import { outletDischarge } from "../src/hydraulics/outlet.js";
import type { PartOption, SearchProblem, SizeOption } from "./problem.js";
import { aimBand } from "./problem.js";
import { designOutlet, designOutletFile, layoutKey, variableCount, type Layout } from "./layout.js";
import type { Evaluator } from "./evaluate.js";
import { stagedStart } from "./fit.js";

export interface ScoredLayout {
  layout: Layout;
  /** Sum of squared distances of each staged storm's ratio from its aim (0 = every storm in aim). */
  score: number;
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
}

/** Distance of a peak from the aim band, relative to the target (0 inside). */
function aimDistance(p: SearchProblem, storm: Storm, peak: number): number {
  const [low, high] = aimBand(p, storm.target!);
  if (peak > high) return (peak - high) / storm.target!;
  if (peak < low) return (low - peak) / storm.target!;
  return 0;
}

/** Whether a part fits the wall of the widest riser the case allows (or any wall without a riser). */
function fitsSomeRiser(p: SearchProblem, part: PartOption): boolean {
  const widest = p.keptRiser ? perimeterOf(p, p.keptRiser) : p.riserOptions.length ? Math.PI * p.riserOptions[p.riserOptions.length - 1].sizeM : Infinity;
  return part.width <= widest;
}

function perimeterOf(p: SearchProblem, r: NonNullable<SearchProblem["keptRiser"]>): number {
  const L = (x: Parameters<SearchProblem["converter"]["length"]>[0]) => p.converter.length(x, "outlet.riser");
  return r.shape === "circular" ? Math.PI * L(r.diameter) : 2 * (L(r.length) + L(r.width));
}

/** Riser sizes for a set of levels: the smallest two whose perimeter takes every level's openings. */
export function riserChoices(p: SearchProblem, levels: PartOption[], barrel: SizeOption | null): (SizeOption | null)[] {
  if (p.keptRiser || p.riserOptions.length === 0) return [null];
  const widest = Math.max(0, ...levels.map((part) => part.width));
  // Common practice: the riser is wider than the barrel it sits on.
  const fitting = p.riserOptions.filter((r) => Math.PI * r.sizeM >= widest && (!barrel || r.sizeM > barrel.sizeM));
  return fitting.slice(0, 2);
}

/** Barrel sizes worth fitting: the smallest that can carry the largest target at the freeboard stage, and the next. */
export function barrelChoices(p: SearchProblem): (SizeOption | null)[] {
  if (!p.barrel || p.barrelOptions.length === 0) return [null];
  const need = Math.max(...p.targeted.map((s) => s.target! * (1 + p.case.criteria.over)));
  const index = p.barrelOptions.findIndex((b) => barrelCapacity(p, b) >= need);
  if (index < 0) return [p.barrelOptions[p.barrelOptions.length - 1]];
  return p.barrelOptions.slice(index, index + 2);
}

/** Flow the barrel passes at the freeboard stage when the openings are no limit. */
export function barrelCapacity(p: SearchProblem, size: SizeOption): number {
  const file = designOutletFile(p, { levels: [], riser: null, barrel: size }, []);
  const outlet = designOutlet(p, { ...file, elements: [], riser: { shape: "circular", diameter: 1000, crest: p.floor / baseLength(p.case.units), coefficient: 3.0, orificeCoefficient: 0.6 }, spillway: undefined });
  return outletDischarge(outlet, p.case.tailwater, p.ceiling);
}

/**
 * Plans layouts with `beam` options kept per level, for every number of levels from 1 to the most
 * the catalogue allows (and no more than the storms to hold, plus the rim). Sorted best first.
 */
export function planLayouts(p: SearchProblem, evaluator: Evaluator, beam: number): LayoutPlan {
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
      const vars = stagedStart(p, layout, evaluator);
      const outlet = designOutlet(p, designOutletFile(p, layout, vars));
      const peak = evaluator.routeStorms(outlet, [first])[0].result.peakOutflow;
      if (!p.floorTaken && peak > first.target! * (1 + p.case.criteria.over)) {
        pruned.push({ part, storm: first, peak });
        continue;
      }
      frontier.push({ levels: [part], score: aimDistance(p, first, peak) ** 2 });
    }
  }
  const viableFirst = frontier.length;
  const keep = (list: Partial[]) => list.sort((a, b) => a.score - b.score || cost(a.levels) - cost(b.levels)).slice(0, beam);
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
        const vars = stagedStart(p, layout, evaluator);
        const outlet = designOutlet(p, designOutletFile(p, layout, vars));
        const peak = evaluator.routeStorms(outlet, [storm])[0].result.peakOutflow;
        next.push({ levels: layout.levels, score: partial.score + aimDistance(p, storm, peak) ** 2 });
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
        results.set(key, { layout, score: stagedScore(p, layout, evaluator) });
      }
    }
  }

  function cost(levels: PartOption[]): number {
    return levels.reduce((sum, part) => sum + part.count * (1 + part.sizeM), 0);
  }

  const layouts = [...results.values()].sort((a, b) => a.score - b.score);
  return { layouts, pruned, viableFirst };
}

/** Score of a full layout: every targeted storm's distance from its aim at the staged start. */
function stagedScore(p: SearchProblem, layout: Layout, evaluator: Evaluator): number {
  const vars = variableCount(p, layout) > 0 ? stagedStart(p, layout, evaluator) : [];
  const outlet = designOutlet(p, designOutletFile(p, layout, vars));
  const routed = evaluator.routeStorms(outlet, p.targeted);
  let score = 0;
  for (const { storm, result } of routed) score += aimDistance(p, storm, result.peakOutflow) ** 2;
  return score;
}
