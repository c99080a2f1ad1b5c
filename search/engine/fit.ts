// Fits the floating elevations of one layout: a start from the stage each storm reaches, then
// Levenberg-Marquardt (ml-levenberg-marquardt) on the check residuals from several seeded starts,
// snapped to the catalogue's elevation step and polished one step at a time.
// One layout in, candidates out: a self-contained unit of work.
import { levenbergMarquardt } from "ml-levenberg-marquardt";
import seedrandom from "seedrandom";
import type { Storm, Tailwater } from "../../src/model.js";
import type { RouteResult } from "../../src/routing/router.js";
import { outletDischarge } from "../../src/hydraulics/outlet.js";
import { hydrographDifference } from "../../src/storage/estimate.js";
import { stageAtVolume } from "../../src/storage/stageAtVolume.js";
import { aimBand, type SearchProblem, type Layout } from "./problem.js";
import { barrelCrown, caseElevation, designOutlet, designOutletFile, elevations, firstLevelFixed, layoutKey, reachAboveLevel, variableCount } from "./layout.js";
import { geometryViolations, type Evaluation, type Evaluator } from "./evaluate.js";
import { fileBottom } from "../../src/parts/registry.js";

export interface FitOptions {
  /** Seeded starts of the fit (the first is the staged start). */
  starts: number;
  /** Levenberg-Marquardt iterations per start. */
  iterations: number;
  seed: string;
  /** Stop early once a compliant design is found. */
  firstCompliant: boolean;
}

export interface FitResult {
  /** Distinct snapped designs, best first. */
  designs: Evaluation[];
  evaluations: number;
}

/** Lower and upper bounds of each variable (m). */
export function variableBounds(p: SearchProblem, l: Layout): { min: number[]; max: number[] } {
  if (p.system) {
    // A system: each pond's bounds, one pond after the other.
    const bounds = p.system.ponds.map((d, i) => variableBounds(d.problem, l.ponds![i]));
    return { min: bounds.flatMap((b) => b.min), max: bounds.flatMap((b) => b.max) };
  }
  const min: number[] = [];
  const max: number[] = [];
  const n = variableCount(p, l) - (l.riser ? 1 : 0);
  for (let i = 0; i < n; i++) {
    min.push(p.floor + (p.lowestFloats ? 0 : p.levelGapM));
    max.push(p.ceiling);
  }
  if (l.riser) {
    // The rim keeps the rim clearance above the barrel's crown (the rim-clearance rule), on the lattice.
    const crown = barrelCrown(p, l);
    const aboveCrown = crown === null ? -Infinity : Math.ceil((crown + p.rimClearanceM) / p.stepM - 1e-9) * p.stepM;
    min.push(Math.max(p.floor + p.stepM, aboveCrown));
    max.push(p.case.pond.top);
  }
  return { min, max };
}

/**
 * The staged start: level k+1 sits at the highest stage the k-th smallest storm reaches through
 * levels 1..k, so each storm is held mostly by the levels below its stage. When those levels release
 * too little for that storm, level k+1 is lowered until the storm's peak reaches the middle of its
 * aim: first to the storage-needed estimate (where the levels pass the goal at the stage holding the
 * storm's inflow above it, `goalStage`, no routing), then by regula falsi in the bracket that routing
 * leaves (the peak only rises as a level is lowered). The rim is placed the same way for the largest
 * storm.
 */
export function stagedStart(p: SearchProblem, l: Layout, evaluator: Evaluator, plain = false): number[] {
  // A system: each designed pond staged on its own view of the case (the storms that reach it).
  if (p.system) return p.system.ponds.flatMap((d, i) => (variableCount(d.problem, l.ponds![i]) > 0 ? stagedStart(d.problem, l.ponds![i], evaluator.pond(i), plain) : []));
  const { min, max } = variableBounds(p, l);
  const storms = p.targeted;
  const vars: number[] = [];
  const fixed = firstLevelFixed(p, l);
  const z = (level: number) => (fixed && level === 0 ? p.floor : vars[fixed ? level - 1 : level]);
  // Placeholder elevations above everything while levels are staged one by one.
  const high = p.case.pond.top + 10 * (p.case.pond.top - p.case.pond.bottom);
  const count = variableCount(p, l);
  const trial = () => Array.from({ length: count }, (_, i) => (i < vars.length ? vars[i] : high));
  const routed = (storm: Storm) => {
    const file = designOutletFile(p, l, trial(), plain);
    // Parts still at the placeholder pass nothing at any stage of the grid: routings that differ
    // only by them (the first one of every option the planner tries on a prefix) are the same.
    const placeholder = caseElevation(p, high);
    const key = `${storm.name} ${JSON.stringify({ ...file, elements: file.elements?.filter((e) => fileBottom(e) !== placeholder), riser: file.riser?.crest === placeholder ? null : file.riser })}`;
    const memo = p.options.referencePath ? null : stagedRoutings(evaluator);
    const known = memo?.get(key);
    if (known) return known;
    const result = evaluator.routeStorms(designOutlet(p, file), [storm])[0].result;
    if (memo) {
      if (memo.size >= STAGED_MEMO_SIZE) memo.clear();
      memo.set(key, result);
    }
    return result;
  };

  /** Places variable `index` between `low` and `stage` so that the storm's peak reaches its aim. */
  const place = (index: number, storm: Storm | undefined, low: number) => {
    // A floating lowest level starts just above a kept element at the floor, or at a held pool.
    let stage = p.poolHeldByTailwater ? p.case.pond.pool + (p.floorTaken ? p.levelGapM : 0) : p.floor + p.levelGapM;
    let peak = Infinity;
    if (storm) {
      vars[index] = high;
      const r = routed(storm);
      stage = r.maxStage;
      peak = r.peakAtPoint;
    }
    let at = clamp(Math.max(stage, low), min[index], max[index]);
    vars[index] = at;
    if (storm?.target && peak < aimBand(p, storm.target)[0] && stage > low) {
      const [aimLow, aimHigh] = aimBand(p, storm.target);
      const goal = 0.5 * (aimLow + aimHigh);
      let zLow = clamp(low, min[index], max[index]);
      let zHigh = at;
      let fHigh = peak - goal;
      let fLow = NaN;
      let tries = 5;
      // The storage-needed estimate first: the elevation at which the levels pass the goal at the
      // stage holding the storm's inflow above the goal; then regula falsi in what it leaves.
      // The pond's own share of the goal: at the point of analysis the bypass takes part of it.
      const own = pondGoal(storm, goal);
      const z0 = levelPassing(p, l, trial, vars, index, zLow, zHigh, goalStage(p, storm, own), own);
      vars[index] = z0;
      const f0 = routed(storm).peakAtPoint - goal;
      at = z0;
      if (Math.abs(f0) < 0.01 * goal) tries = 0;
      else if (f0 > 0) {
        zLow = z0;
        fLow = f0;
      } else {
        zHigh = z0;
        fHigh = f0;
      }
      if (tries > 0 && Number.isNaN(fLow)) {
        vars[index] = zLow;
        fLow = routed(storm).peakAtPoint - goal;
        if (fLow <= 0) {
          at = zLow;
          tries = 0;
        }
      }
      if (tries > 0) {
        for (let i = 0; i < tries; i++) {
          const zt = zHigh - (fHigh * (zHigh - zLow)) / (fHigh - fLow);
          vars[index] = zt;
          const f = routed(storm).peakAtPoint - goal;
          at = zt;
          if (Math.abs(f) < 0.01 * goal) break;
          if (f > 0) {
            zLow = zt;
            fLow = f;
          } else {
            zHigh = zt;
            fHigh = f;
          }
        }
      }
      vars[index] = at;
    }
    return at;
  };

  for (let level = fixed ? 1 : 0; level < l.levels.length; level++) {
    const storm = level > 0 ? storms[Math.min(level - 1, storms.length - 1)] : undefined;
    const previous = level > 0 ? z(level - 1) : -Infinity;
    const index = vars.length;
    vars.push(high);
    place(index, storm, previous + p.levelGapM);
  }
  if (l.riser) {
    const index = vars.length;
    vars.push(high);
    const tops = elevations(p, l, trial()).levels.map((e, i) => e + reachAboveLevel(l.levels[i], p));
    place(index, storms[Math.min(l.levels.length, storms.length - 1)], Math.max(p.floor + p.stepM, ...tops));
  }
  return vars;
}

/**
 * The stage that holds the storm's inflow above a release rising linearly to `goal` at the inflow's
 * peak (`hydrographDifference`, "rising"): about where a storm released at `goal` peaks.
 */
export function goalStage(p: SearchProblem, storm: Storm, goal: number): number {
  let byGoal = goalStages.get(storm);
  if (!byGoal) {
    byGoal = new Map();
    goalStages.set(storm, byGoal);
  }
  const key = `${goal} ${JSON.stringify(p.case.pond)}`;
  let stage = byGoal.get(key);
  if (stage === undefined) {
    stage = stageAtVolume(p.case.pond, hydrographDifference(storm.inflow, goal, "rising"));
    // More than an underground system holds: the top is as high as its storage goes.
    if (!Number.isFinite(stage)) stage = p.case.pond.top;
    byGoal.set(key, stage);
  }
  return stage;
}

const FREE: Tailwater = { kind: "free" };

/**
 * The pond's share of a release goal set at the point of analysis: the goal less the bypass at the time
 * of the inflow's peak (about when the bypass of a quicker area has passed its own peak and the pond is
 * rising to its own), at least a tenth of the goal. An estimate for the staged start only; the routing
 * that follows judges the sum.
 */
export function pondGoal(storm: Storm, goal: number): number {
  const b = storm.bypass;
  if (!b) return goal;
  let at = 0;
  for (let i = 1; i < storm.inflow.flows.length; i++) if (storm.inflow.flows[i] > storm.inflow.flows[at]) at = i;
  const t = storm.inflow.times[at];
  let q = 0;
  for (let i = 1; i < b.times.length; i++) {
    if (b.times[i - 1] <= t && t <= b.times[i]) q = b.flows[i - 1] + ((b.flows[i] - b.flows[i - 1]) * (t - b.times[i - 1])) / (b.times[i] - b.times[i - 1]);
  }
  return Math.max(goal - q, 0.1 * goal);
}

/** Goal stages by storm, then goal and pond (a pure function's memo: the goal is fixed per storm in a search). */
const goalStages = new WeakMap<Storm, Map<string, number>>();

/**
 * The elevation of variable `index` in [low, high] at which the trial outlet passes `goal` at
 * `stage` (its flow there falls as the level rises), by bisection to half the step; `low` when
 * even there it passes less, `high` when even there it passes more.
 */
function levelPassing(p: SearchProblem, l: Layout, trial: () => number[], vars: number[], index: number, low: number, high: number, stage: number, goal: number): number {
  // Without the barrel and with a free outfall: an estimate, cheap to evaluate (the routing that
  // follows judges it with the outlet as staged).
  const flowAt = (z: number) => {
    vars[index] = z;
    return outletDischarge(designOutlet(p, designOutletFile(p, l, trial(), true)), FREE, stage);
  };
  if (flowAt(low) <= goal) return low;
  if (flowAt(high) >= goal) return high;
  let a = low;
  let b = high;
  while (b - a > 0.5 * p.stepM) {
    const mid = 0.5 * (a + b);
    if (flowAt(mid) > goal) a = mid;
    else b = mid;
  }
  return 0.5 * (a + b);
}

/** Routings of the staged start kept per evaluator (cleared when full). */
const STAGED_MEMO_SIZE = 4096;
const stagedMemos = new WeakMap<Evaluator, Map<string, RouteResult>>();

function stagedRoutings(evaluator: Evaluator): Map<string, RouteResult> {
  let memo = stagedMemos.get(evaluator);
  if (!memo) {
    memo = new Map();
    stagedMemos.set(evaluator, memo);
  }
  return memo;
}

function clamp(x: number, low: number, high: number): number {
  return Math.min(Math.max(x, low), high);
}

/** Rounds an elevation (m) to the lattice of the elevation step: k * stepM (written as k steps, `caseElevation`). */
export function snap(p: SearchProblem, x: number): number {
  return Math.round(x / p.stepM) * p.stepM;
}

/** Total order on evaluations: compliant first, then fewer broken rules, then the objective. */
export function better(a: Evaluation, b: Evaluation): boolean {
  if (a.compliant !== b.compliant) return a.compliant;
  if (a.violations !== b.violations) return a.violations < b.violations;
  return a.objective < b.objective;
}

/** Polishes snapped variables by single steps while that improves the design (`screen` false: every step routed, the tests' reference). */
export function polish(p: SearchProblem, l: Layout, start: Evaluation, evaluator: Evaluator, maxPasses = 6, screen = true): Evaluation {
  let best = start;
  const { min, max } = variableBounds(p, l);
  for (let pass = 0; pass < maxPasses; pass++) {
    let improved = false;
    for (let i = 0; i < best.vars.length; i++) {
      for (const direction of [-1, 1]) {
        const vars = [...best.vars];
        vars[i] = snap(p, vars[i] + direction * p.stepM);
        if (vars[i] < min[i] - 1e-9 || vars[i] > max[i] + 1e-9) continue;
        // A step breaking more geometric rules than the best cannot be better (`better`): not routed.
        if (screen && geometryViolations(p, l, vars) > best.violations) continue;
        const trial = evaluator.evaluate(l, vars);
        if (better(trial, best)) {
          best = trial;
          improved = true;
        }
      }
    }
    if (!improved || best.objective === 0) break;
  }
  return best;
}

/** Objective beyond which a fitted layout is abandoned (a check about 20 % short or more). */
const HOPELESS = 0.04;

/** Fits one layout. */
export function fitLayout(p: SearchProblem, l: Layout, evaluator: Evaluator, options: FitOptions): FitResult {
  const before = evaluator.evaluations;
  const n = variableCount(p, l);
  if (n === 0) return { designs: [evaluator.evaluate(l, [])], evaluations: evaluator.evaluations - before };
  const { min, max } = variableBounds(p, l);
  const rng = seedrandom(options.seed);
  const start = stagedStart(p, l, evaluator);
  // The existing layout also starts from its own elevations (value engineering: the smallest moves).
  const own = p.existing && p.existing.vars.length === n && layoutKey(l) === layoutKey(p.existing.layout) ? [p.existing.vars.map((x, i) => clamp(x, min[i], max[i]))] : [];
  const firsts = [...own, start];
  const designs: Evaluation[] = [];
  const seen = new Set<string>();
  for (let s = 0; s < options.starts + own.length; s++) {
    const initial = s < firsts.length ? firsts[s] : start.map((x, i) => clamp(x + (rng() - 0.5) * 0.3 * (max[i] - min[i]), min[i], max[i]));
    const fitted = levenbergFit(p, l, evaluator, initial, min, max, options.iterations);
    const snapped = evaluator.evaluate(l, fitted.map((x) => snap(p, x)));
    // Far from every aim after a full fit: polishing and further starts would not rescue it.
    if (snapped.objective > HOPELESS) {
      designs.push(snapped);
      break;
    }
    const polished = polish(p, l, snapped, evaluator);
    const key = polished.vars.join(",");
    if (!seen.has(key)) {
      seen.add(key);
      designs.push(polished);
    }
    if (options.firstCompliant && polished.compliant) break;
  }
  designs.sort((a, b) => (better(a, b) ? -1 : better(b, a) ? 1 : 0));
  return { designs, evaluations: evaluator.evaluations - before };
}

/**
 * Initial damping of Levenberg-Marquardt. The residuals are dimensionless and the variables are
 * elevations, so the damping is per square metre: 1e-2 per square foot, the value the fit was tuned
 * with when it worked in feet on the US cases (LM with damping scaled by the square of the length
 * unit takes the same steps in either unit, so those cases fit exactly as they did).
 */
const DAMPING = 1e-2 / (0.3048 * 0.3048);

/** Levenberg-Marquardt on the residual vector (its "data" are zeros; the model is the residuals). */
function levenbergFit(p: SearchProblem, l: Layout, evaluator: Evaluator, initial: number[], min: number[], max: number[], iterations: number): number[] {
  let lastKey = "";
  let lastResiduals: number[] = [];
  let best: Evaluation | null = null;
  const residualsAt = (params: number[]) => {
    const key = params.join(",");
    if (key !== lastKey) {
      const e = evaluator.evaluate(l, params);
      lastKey = key;
      lastResiduals = e.residuals;
      if (!best || e.objective < best.objective) best = e;
    }
    return lastResiduals;
  };
  const m = residualsAt(initial).length;
  if (best!.objective === 0) return initial;
  const data = { x: Array.from({ length: m }, (_, i) => i), y: new Array<number>(m).fill(0) };
  levenbergMarquardt(
    data,
    (params: number[]) => {
      const r = residualsAt(params);
      return (i: number) => r[i];
    },
    {
      initialValues: initial,
      minValues: min,
      maxValues: max,
      gradientDifference: p.stepM / 2,
      damping: DAMPING,
      maxIterations: iterations,
      errorTolerance: 1e-12,
    },
  );
  return (best as Evaluation | null)?.vars ?? initial;
}
