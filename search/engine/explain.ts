// Explanations: which check binds each candidate, which elevation relaxes it and by how much (each
// floating elevation moved one step, the candidate routed again), and, when nothing is compliant, why
// in engineering terms.
import type { Hydrograph, Outlet } from "../../src/model.js";
import { storageShortfall } from "../../src/assess/storageShortfall.js";
import { shortfallLines } from "../../src/report/shortfall.js";
import type { Check } from "../../src/assess/checks.js";
import { formatter, quantityText } from "../../src/format.js";
import { ruleOf, whyNothingComplies } from "../../src/assess/rules/registry.js";
import { targetBand } from "../../src/assess/rules/band.js";
import { baseLength, type UnitSystem } from "../../src/units.js";
import { outletDischarge } from "../../src/hydraulics/outlet.js";
import type { SearchProblem } from "./problem.js";
import { caseElevation, designOutlet, designOutletFile, variableNames } from "./layout.js";
import { finalizeCandidate, routeOutlet, routeSystemOutlets, type Candidate, type RoutedOutlet } from "./candidate.js";
import type { OutletFile } from "../../src/case/schema.js";
import { fileBottom, placed } from "../../src/parts/registry.js";
import { describeElement } from "../../src/report/describe.js";
import { pondGoal, snap, variableBounds } from "./fit.js";
import { slackText } from "../../src/report/console.js";
import type { LayoutPlan } from "./layouts.js";

function checkText(p: SearchProblem, check: Check): string {
  const f = formatter(p.case.units);
  const rule = ruleOf(check);
  const source = check.label === null ? "" : ` (${check.label})`;
  return `${check.name}${source}: ${quantityText(f, rule.quantity, check.value)} against ${rule.comparison} ${quantityText(f, rule.quantity, check.limit)}, slack ${slackText(p.case.units, check)}`;
}

/** How a check's value moved, in words: "-3.1 %" for flows, "+0.04 ft" for stages. */
function change(p: SearchProblem, before: Check, after: Check): string {
  if (before.value === null || after.value === null) return after.value === null ? "no longer drains" : "now drains";
  const quantity = ruleOf(before).quantity;
  if (quantity === "flow") return `${after.value >= before.value ? "+" : ""}${((100 * (after.value - before.value)) / before.value).toFixed(1)} %`;
  if (quantity === "hours") return `${after.value >= before.value ? "+" : ""}${(after.value - before.value).toFixed(1)} h`;
  const L = baseLength(p.case.units);
  return `${after.value >= before.value ? "+" : ""}${((after.value - before.value) / L).toFixed(2)} ${p.case.units === "US" ? "ft" : "m"}`;
}

/**
 * Whether a move relaxes a check by something its words show: the slack grows and its text changes
 * (a step that takes "slack -22.6 %" to "-22.6 %", or "0.52 ft (10.5 %)" to itself, is no remedy).
 */
export function relaxesVisibly(units: UnitSystem, before: Check, after: Check): boolean {
  return after.slack - before.slack > 1e-6 && slackText(units, after) !== slackText(units, before);
}

/** A floating elevation of an outlet (m) and the outlet routed again with it moved. */
interface Movable {
  name: string;
  value: number;
  min: number;
  max: number;
  moved(value: number): RoutedOutlet;
}

/** Fills `explanation` of a candidate: binding check, and the single-step moves that relax it. */
export function explainCandidate(p: SearchProblem, c: Candidate): string[] {
  const names = variableNames(p, c.layout);
  const { min, max } = variableBounds(p, c.layout);
  const lines = explainMoves(p, c, c.vars.map((value, i) => ({
    name: names[i],
    value,
    min: min[i],
    max: max[i],
    moved: (x) => {
      const vars = [...c.vars];
      vars[i] = x;
      return finalizeCandidate(p, c.layout, vars, designOutletFile(p, c.layout, vars));
    },
  })));
  return p.system ? [...lines, ...pipeMoves(p, c)] : lines;
}

/**
 * A system: the pipes one catalogue size up or down that relax its binding check (routed again with
 * that pipe), the best first, at most two; nothing when the design has no pipe or no such size helps.
 */
function pipeMoves(p: SearchProblem, c: Candidate): string[] {
  const binding = c.assessment.binding;
  if (!binding) return [];
  const f = formatter(p.case.units);
  const moves: { text: string; gain: number; breaks: boolean }[] = [];
  p.system!.ponds.forEach((d, i) => {
    const own = c.layout.ponds![i];
    if (d.kind !== "pipe" || !own.barrel) return;
    const at = d.problem.barrelOptions.indexOf(own.barrel);
    for (const barrel of [d.problem.barrelOptions[at - 1], d.problem.barrelOptions[at + 1]]) {
      if (!barrel) continue;
      const layout = { ...c.layout, ponds: c.layout.ponds!.map((l, k) => (k === i ? { ...l, barrel } : l)) };
      const moved = finalizeCandidate(p, layout, c.vars, designOutletFile(p, layout, c.vars));
      const after = moved.assessment.checks.find((check) => check.key === binding.key)!;
      if (!relaxesVisibly(p.case.units, binding, after)) continue;
      const breaks = c.assessment.compliant && !moved.assessment.compliant;
      const next = moved.assessment.binding!;
      const cost = breaks ? `; but then ${next.name} fails, slack ${slackText(p.case.units, next)}` : "";
      moves.push({
        gain: after.slack - binding.slack,
        breaks,
        text: `the pipe of pond ${d.name} one size ${barrel.sizeM > own.barrel.sizeM ? "larger" : "smaller"}, ${f.size(barrel.sizeM)}: ${ruleOf(binding).subject(binding)} ${change(p, binding, after)}, slack ${slackText(p.case.units, binding)} -> ${slackText(p.case.units, after)}${cost}`,
      });
    }
  });
  moves.sort((a, b) => Number(a.breaks) - Number(b.breaks) || b.gain - a.gain);
  return moves.slice(0, 2).map((m) => `relax: ${m.text}`);
}

/** The existing outlet's explanation: its binding check and the single-step moves of its parts that relax it. */
export function explainExisting(p: SearchProblem, existing: RoutedOutlet): string[] {
  if (p.system) {
    // A system: every pond's parts moved in turn, the system routed again with that pond's outlet changed.
    const system = existing.system!;
    const movables = p.system.ponds.flatMap((d, i) =>
      outletMovables(d.problem, system.files[i], system.outlets[i], (changed) => {
        const files = system.files.map((file, k) => (k === i ? changed : file));
        return routeSystemOutlets(p, files, files.map((file, k) => (k === i ? designOutlet(d.problem, file) : system.outlets[k])));
      }).map((m) => ({ ...m, name: `${m.name} of pond ${d.name}` })),
    );
    return explainMoves(p, existing, movables);
  }
  return explainMoves(p, existing, outletMovables(p, existing.file, existing.outlet, (changed) => routeOutlet(p, changed, designOutlet(p, changed))));
}

/** The elevations of an outlet's parts that may move (not kept, not held by the limits), each routed again by `routedWith`. */
function outletMovables(p: SearchProblem, file: OutletFile, outlet: Outlet, routedWith: (changed: OutletFile) => RoutedOutlet): Movable[] {
  const f = formatter(p.case.units);
  const movables: Movable[] = [];
  // Parts that stay as they are (kept, or held by the limits) are not moved.
  (file.elements ?? []).forEach((e, i) => {
    if (p.keptElements.includes(e)) return;
    const value = p.converter.length(fileBottom(e), "outlet.elements");
    movables.push({
      name: describeElement(outlet.elements[i], f).replace(/ at [^ ]+ \S+$/, ""),
      value,
      min: p.floor,
      max: p.ceiling,
      moved: (x) => {
        const elements = [...(file.elements ?? [])];
        const at = caseElevation(p, x);
        elements[i] = placed(e, at);
        return routedWith({ ...file, elements });
      },
    });
  });
  const riser = file.riser;
  if (riser && !p.keptRiser) {
    movables.push({
      name: "riser rim",
      value: p.converter.length(riser.crest, "outlet.riser.crest"),
      min: p.floor + p.stepM,
      max: p.case.pond.top,
      moved: (x) => routedWith({ ...file, riser: { ...riser, crest: caseElevation(p, x) } }),
    });
  }
  return movables;
}

/**
 * The head of an explanation: the binding check and why it binds, from the routed design alone (no
 * routing; the moves that relax it follow in a full explanation). Empty when no check applies.
 */
export function bindingLines(p: SearchProblem, c: RoutedOutlet): string[] {
  const binding = c.assessment.binding;
  if (!binding) return [];
  const failing = c.assessment.checks.filter((check) => !check.passed);
  return [
    `binding: ${checkText(p, binding)}${c.assessment.compliant ? "" : ` (${failing.length} check${failing.length > 1 ? "s" : ""} fail)`}`,
    `why: ${ruleOf(binding).why(binding)}`,
  ];
}

/** An explanation without the moves (what a shard gives; the gather explains in full). */
export function explainBriefly(p: SearchProblem, c: RoutedOutlet): string[] {
  return c.assessment.binding ? bindingLines(p, c) : ["no checks apply"];
}

function explainMoves(p: SearchProblem, c: RoutedOutlet, movables: Movable[]): string[] {
  const binding = c.assessment.binding;
  if (!binding) return explainBriefly(p, c);
  const lines = bindingLines(p, c);
  const unit = p.case.units === "US" ? "ft" : "m";
  const moves: { text: string; gain: number; breaks: boolean }[] = [];
  for (const m of movables) {
    for (const direction of [-1, 1]) {
      const to = snap(p, m.value + direction * p.stepM);
      if (to < m.min - 1e-9 || to > m.max + 1e-9) continue;
      const moved = m.moved(to);
      const after = moved.assessment.checks.find((check) => check.key === binding.key)!;
      if (!relaxesVisibly(p.case.units, binding, after)) continue;
      const gain = after.slack - binding.slack;
      const before = slackText(p.case.units, binding);
      const now = slackText(p.case.units, after);
      const next = moved.assessment.binding!;
      const breaks = c.assessment.compliant && !moved.assessment.compliant;
      const cost = breaks ? `; but then ${next.name} fails, slack ${slackText(p.case.units, next)}` : next.key !== binding.key ? `; then ${next.name} binds at ${slackText(p.case.units, next)}` : "";
      const by = Number((Math.abs(to - m.value) / baseLength(p.case.units)).toFixed(6));
      moves.push({
        gain,
        breaks,
        text: `${direction > 0 ? "raise" : "lower"} ${m.name} by ${by} ${unit} to ${formatter(p.case.units).elevation(to)}: ${ruleOf(binding).subject(binding)} ${change(p, binding, after)}, slack ${before} -> ${now}${cost}`,
      });
    }
  }
  // Moves that keep a compliant design compliant first, then by how much they relax the binding check.
  moves.sort((a, b) => Number(a.breaks) - Number(b.breaks) || b.gain - a.gain);
  if (moves.length > 0) lines.push(...moves.slice(0, 2).map((m) => `relax: ${m.text}`));
  // A system's check names its pond (or the outfall): so does the remedy.
  else lines.push(`relax: ${binding.pond === undefined ? "" : binding.pond === "outfall" ? "at the outfall, " : `in pond ${binding.pond}, `}${ruleOf(binding).remedy(binding)}`);
  return lines;
}

/** Volume of a hydrograph above a constant outflow q (m3): the least storage any outlet that keeps its peak at q needs. */
export function volumeAbove(h: Hydrograph, q: number): number {
  let v = 0;
  for (let i = 1; i < h.times.length; i++) {
    const a = h.flows[i - 1] - q;
    const b = h.flows[i] - q;
    const dt = h.times[i] - h.times[i - 1];
    if (a >= 0 && b >= 0) v += 0.5 * (a + b) * dt;
    else if (a > 0 || b > 0) {
      const positive = Math.max(a, b);
      v += 0.5 * positive * dt * (positive / (Math.abs(a) + Math.abs(b)));
    }
  }
  return v;
}

/** Stage at which the pond holds a volume (m), by the search grid. */
function stageAtStorage(p: SearchProblem, volume: number): number {
  const { stage, storage } = p.grid;
  for (let i = 1; i < stage.length; i++) {
    if (storage[i] >= volume) return stage[i - 1] + ((stage[i] - stage[i - 1]) * (volume - storage[i - 1])) / (storage[i] - storage[i - 1]);
  }
  return stage[stage.length - 1];
}

/** Why nothing is compliant, in engineering terms, from the bounds and the closest candidates. */
export function explainInfeasible(p: SearchProblem, plan: LayoutPlan, closest: Candidate[]): string[] {
  const f = formatter(p.case.units);
  const lines: string[] = [];
  if (plan.viableFirst === 0 && plan.pruned.length > 0) {
    const smallest = [...plan.pruned].sort((a, b) => a.peak - b.peak)[0];
    const storm = smallest.storm;
    // At a point of analysis the pond may release only its share of the allowable peak.
    const limit = pondGoal(storm, targetBand(storm.target!, p.case.criteria)[1]);
    const held = volumeAbove(storm.inflow, limit);
    const stage = stageAtStorage(p, held);
    const file = designOutletFile(p, { levels: [smallest.part], riser: null, barrel: null }, []);
    const flowThere = outletDischarge(designOutlet(p, { ...file, spillway: undefined }), p.case.tailwater, stage);
    lines.push(
      `The smallest catalogue opening at the pond floor (${smallest.part.words}) already passes ${f.flow(flowThere)} at ${f.elevation(stage)}, ` +
        `the stage where the ${storm.name} storm's volume above its allowable ${storm.bypass ? "release from the pond" : "peak"} (${f.volume(held)} above ${f.flow(limit)}) must be held; ` +
        `routed alone it ${storm.bypass ? "gives, with the bypass, at the point of analysis" : "releases"} ${f.flow(smallest.peak)}. Allow a smaller opening or a flow regulator, or add storage below that stage.`,
    );
  }
  const routings = closest.map((c) => c.routing.storms);
  if (p.system) {
    // A system: the checks its closest candidates fail, pond by pond and at the outfall.
    const failing = [...new Set(closest.flatMap((c) => c.assessment.checks.filter((k) => !k.passed).map((k) => k.name)))];
    if (failing.length > 0) lines.push(`The closest systems tried fail: ${failing.slice(0, 6).join("; ")}${failing.length > 6 ? "; ..." : ""}. Allow other sizes in the catalogue, more storage in the pond that binds, or a larger budget.`);
    else lines.push("No layout tried met every check; see the closest candidates and their binding checks.");
    return lines;
  }
  lines.push(...whyNothingComplies({ case: p.case, closest: routings, firstLevelBound: plan.viableFirst === 0 }, closest.map((c) => c.assessment.checks)));
  if (lines.length === 0) lines.push("No layout tried met every check; see the closest candidates and their binding checks.");
  lines.push(...shortfallLines(p.case, storageShortfall(p.case, routings[0] ?? null)));
  return lines;
}
