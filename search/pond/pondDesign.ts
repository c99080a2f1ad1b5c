// Pond and outlet designed together: the depth (and a first footprint) from the site's trade-off of
// depths for the routed estimates (src/sizing/pondChoice.ts), then an outer loop over footprints at
// that depth (on the site's size step) around the outlet search. The size grows until the search finds
// a compliant outlet, then is trimmed one step at a time while a compliant outlet remains (the design
// of the size above, routed again, or a new search), so the pond is the smallest compliant one found
// at the chosen depth.
import { parseCase, type LoadedCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { pondOfSize, type PondLevels, type SizedPond } from "../../src/storage/sizing.js";
import { pondFile } from "../../src/report/pondFile.js";
import { choosePond, type PondChoice } from "../../src/sizing/pondChoice.js";
import { pondCost, pondCostWeights } from "../../src/sizing/pondCost.js";
import { buildProblem, type SearchProblem } from "../engine/problem.js";
import { runSearch, type RunOptions, type SearchRun } from "../engine/run.js";
import { finalizeCandidate, type Candidate } from "../engine/candidate.js";

export interface SizeTrial {
  steps: number;
  sized: SizedPond;
  /** The case file's JSON with this pond written in. */
  json: Record<string, unknown>;
  problem: SearchProblem;
  /** The search at this size (null when the design of the size above was routed again and passed). */
  run: SearchRun | null;
  /** The best compliant candidate at this size, or null. */
  best: Candidate | null;
  /** Outlet cost + pond cost of the best candidate. */
  totalCost: number | null;
  /** How this size was decided. */
  how: "search" | "routed again";
}

export interface PondDesign {
  /** The depths compared for the routed estimates (the trade-off), and the one chosen. */
  choice: PondChoice;
  /** Every size tried, in the order tried. */
  trials: SizeTrial[];
  /** The smallest compliant size, or null. */
  chosen: SizeTrial | null;
  /** The size one step smaller than the chosen one, tried and failed (null when the chosen is one step). */
  smaller: SizeTrial | null;
  /** Why the loop stopped. */
  stoppedBecause: string;
}

/** Most sizes tried by one run (each a search). */
const MAX_TRIALS = 40;

export async function designPondAndOutlet(loaded: LoadedCase, margin: number | undefined, run: Omit<RunOptions, "done" | "onLayout">): Promise<PondDesign> {
  const c = loaded.case;
  const label = c.file ? c.file.split(/[\\/]/).pop()! : "case";
  if (!c.site) {
    throw new CaseError([{ where: `${label}: site`, found: "nothing (the field is missing)", expected: "site limits to size the pond within (floor, maxDepth, ...), for --size-pond" }]);
  }
  const site = c.site;
  const weights = pondCostWeights(c.units, c.costs);
  const choice = choosePond({ site, criteria: c.criteria, spillway: c.outlet?.spillway, tailwater: c.tailwater, storms: c.storms, costs: weights });
  const depthOption = choice.chosen ?? choice.options.find((o) => o.blocked?.kind === "site limits" && o.blocked.largest) ?? null;
  if (!depthOption?.levels) {
    return { choice, trials: [], chosen: null, smaller: null, stoppedBecause: "no pond of any depth compared can be built within the site limits" };
  }
  const levels: PondLevels = depthOption.levels;
  const trials = new Map<number, SizeTrial>();
  const order: SizeTrial[] = [];

  const caseAt = (steps: number) => {
    const sized = pondOfSize(site, levels, steps);
    const json = JSON.parse(JSON.stringify(loaded.json)) as Record<string, unknown>;
    json.pond = pondFile(sized.pond, c.units);
    const at = parseCase(json, { file: c.file || undefined, label });
    return { sized, json, problem: buildProblem(at.case, at.data, { margin }) };
  };
  const record = (t: SizeTrial) => {
    trials.set(t.steps, t);
    order.push(t);
    return t;
  };
  const total = (t: { sized: SizedPond }, best: Candidate | null) => (best ? best.cost + pondCost(t.sized, weights) : null);
  const search = async (steps: number): Promise<SizeTrial> => {
    const known = trials.get(steps);
    if (known) return known;
    const at = caseAt(steps);
    const result = await runSearch(at.problem, run);
    const best = result.candidates.find((k) => k.assessment.compliant) ?? null;
    return record({ steps, ...at, run: result, best, totalCost: total(at, best), how: "search" });
  };
  /** The design of a larger size routed on this size; a new search when it fails here. */
  const trim = async (steps: number, from: Candidate): Promise<SizeTrial> => {
    const at = caseAt(steps);
    const again = finalizeCandidate(at.problem, from.layout, from.vars, from.file);
    if (again.assessment.compliant) return record({ steps, ...at, run: null, best: again, totalCost: total(at, again), how: "routed again" });
    return search(steps);
  };

  const seeded = depthOption.sized ?? (depthOption.blocked?.kind === "site limits" ? depthOption.blocked.largest : null);
  let steps = Math.max(1, seeded?.steps ?? 1);
  let stoppedBecause = "";
  // Grow from the estimate until a compliant outlet exists (10 % or one step at a time).
  let current = await search(steps);
  while (!current.best) {
    const next = Math.max(steps + 1, Math.ceil(steps * 1.1));
    if (pondOfSize(site, levels, next).exceeds !== null) {
      stoppedBecause = `no compliant outlet up to the largest pond within the site limits (${steps} steps)`;
      break;
    }
    if (order.length >= MAX_TRIALS) {
      stoppedBecause = `${MAX_TRIALS} sizes tried without a compliant outlet`;
      break;
    }
    steps = next;
    current = await search(steps);
  }
  if (!current.best) return { choice, trials: order, chosen: null, smaller: null, stoppedBecause };
  // Trim while a compliant outlet remains one step smaller.
  let smaller: SizeTrial | null = null;
  while (steps > 1 && order.length < MAX_TRIALS) {
    const below = trials.get(steps - 1) ?? (await trim(steps - 1, current.best!));
    if (!below.best) {
      smaller = below;
      break;
    }
    steps -= 1;
    current = below;
  }
  stoppedBecause = smaller ? "one step smaller no compliant outlet was found" : steps === 1 ? "the smallest size step is compliant" : `${MAX_TRIALS} sizes tried`;
  return { choice, trials: order, chosen: current, smaller, stoppedBecause };
}
