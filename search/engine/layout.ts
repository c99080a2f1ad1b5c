// A layout is the discrete part of a design (which parts, counts, sizes); its variables are the
// elevations (m) of the levels that float and the riser's rim. Together they make an outlet in the
// case file's own form, so that every candidate is exactly what a case file would give: the only
// place the search converts elevations to case units (`caseElevation`).
import type { ElementFile, OutletFile } from "../../src/case/schema.js";
import type { Outlet } from "../../src/model.js";
import { CaseError } from "../../src/case/errors.js";
import { normalizeOutlet } from "../../src/case/normalize.js";
import { baseLength } from "../../src/units.js";
import type { PartOption } from "../../src/parts/part.js";
import { explicit, placed } from "../../src/parts/registry.js";
import { designedRiser, explicitRiser } from "../../src/parts/riser.js";
import { barrelRise, barrelToSI, resizedBarrel } from "../../src/parts/barrel.js";
import { explicitSpillway } from "../../src/parts/spillway.js";
import type { Layout, SearchProblem } from "./problem.js";

export function layoutKey(l: Layout): string {
  // A system of ponds: each pond's layout by its place in the system.
  if (l.ponds) return l.ponds.map((pond, i) => `${i + 1}: ${layoutKey(pond)}`).join(" || ");
  return [...l.levels.map((p) => p.key), `riser ${l.riser ? String(l.riser.size) : "-"}`, `barrel ${l.barrel ? String(l.barrel.size) : "-"}`].join(" | ");
}

/**
 * A layout's family: the part at its first level ("" for a layout without levels; a pipe's: its size);
 * a system's: its ponds' families together.
 */
export function familyOf(layout: Layout): string {
  if (layout.ponds) return layout.ponds.map((l) => l.levels[0]?.key ?? (l.barrel ? `pipe ${String(l.barrel.size)}` : "")).join(" + ");
  return layout.levels[0]?.key ?? "";
}

/**
 * Whether the first designed level is fixed at the floor or pool (a dry pond must drain through it,
 * and a wet pond's pool is held by it unless a tailwater holds the pool).
 */
export function firstLevelFixed(p: SearchProblem, l: Layout): boolean {
  return l.levels.length > 0 && !p.lowestFloats;
}

/** Number of floating elevations: the free levels, then the rim when the riser is designed. */
export function variableCount(p: SearchProblem, l: Layout): number {
  if (p.system) return p.system.ponds.reduce((n, d, i) => n + variableCount(d.problem, l.ponds![i]), 0);
  return l.levels.length - (firstLevelFixed(p, l) ? 1 : 0) + (l.riser ? 1 : 0);
}

/** Names of the variables, for explanations. */
export function variableNames(p: SearchProblem, l: Layout): string[] {
  if (p.system) return p.system.ponds.flatMap((d, i) => variableNames(d.problem, l.ponds![i]).map((name) => `${name} of pond ${d.name}`));
  const names: string[] = [];
  const first = firstLevelFixed(p, l) ? 1 : 0;
  for (let i = first; i < l.levels.length; i++) names.push(`level ${i + 1} (${l.levels[i].words})`);
  if (l.riser) names.push("riser rim");
  return names;
}

/** A system of ponds: the variables of a system layout split by pond (each pond's own, in order). */
export function pondVariables(p: SearchProblem, l: Layout, vars: readonly number[]): number[][] {
  let at = 0;
  return p.system!.ponds.map((d, i) => {
    const n = variableCount(d.problem, l.ponds![i]);
    at += n;
    return vars.slice(at - n, at);
  });
}

/** A system of ponds: every pond's outlet in case-file form (a pipe's resized, a fixed pond's as given), in the system's order. */
export function designFiles(p: SearchProblem, l: Layout, vars: readonly number[]): OutletFile[] {
  const split = pondVariables(p, l, vars);
  return p.system!.ponds.map((d, i) => designOutletFile(d.problem, l.ponds![i], split[i]));
}

/** What identifies a design's outlets: the outlet file, or a system's files of every pond. */
export function designText(p: SearchProblem, l: Layout, vars: readonly number[]): string {
  return JSON.stringify(p.system ? designFiles(p, l, vars) : designOutletFile(p, l, vars));
}

/**
 * How far below the rim a part's level must sit: a closed opening's height and, for any part, the
 * rim clearance (`buildability.rimClearance`), at least one elevation step (a notch, open above, has
 * height 0).
 */
export function reachAboveLevel(part: PartOption, p: SearchProblem): number {
  return Math.max(part.height + p.rimClearanceM, p.stepM);
}

/** The crown of the layout's barrel where it leaves the riser (m), null without a barrel. */
export function barrelCrown(p: SearchProblem, l: Layout): number | null {
  if (!p.barrel) return null;
  const b = barrelToSI(l.barrel ? resizedBarrel(p.barrel, l.barrel.size) : p.barrel, p.converter, "outlet.barrel");
  return b.inletInvert + barrelRise(b);
}

/** Elevation of the floor in the file's own form (so that it normalizes to exactly pond.pool). */
function floorValue(p: SearchProblem): number | string {
  // A case sized from its site has no pond in the file: its floor is then the pool in case units.
  return p.file.pond?.permanentPool ?? p.file.pond?.bottom ?? p.case.pond.pool / baseLength(p.case.units);
}

/**
 * An elevation (m) as the case file writes it: a level on the step's lattice (k * stepM) as exactly k
 * steps in case units, rounded as the step is written (so 1668 steps of 0.05 ft is 83.4, not
 * 83.39999999999999); any other elevation (a fit's trial point, a bound) converted as it is.
 */
export function caseElevation(p: SearchProblem, z: number): number {
  const L = baseLength(p.case.units);
  const k = Math.round(z / p.stepM);
  if (Math.abs(z - k * p.stepM) > LATTICE_TOLERANCE * p.stepM) return z / L;
  const step = p.stepM / L;
  const decimals = Math.max(0, Math.ceil(-Math.log10(step)) + 3);
  return Number((k * step).toFixed(decimals));
}

/** How close (a fraction of the step) an elevation must be to the lattice to be written as whole steps. */
const LATTICE_TOLERANCE = 1e-9;

/** Elevations (m) of every designed level and the rim, from the variables. */
export function elevations(p: SearchProblem, l: Layout, vars: readonly number[]): { levels: number[]; rim: number | null } {
  const levels: number[] = [];
  let v = 0;
  l.levels.forEach((_, i) => {
    if (i === 0 && firstLevelFixed(p, l)) levels.push(p.floor);
    else levels.push(vars[v++]);
  });
  return { levels, rim: l.riser ? vars[v] : null };
}

/**
 * The outlet in case-file form, every coefficient written out. `plain` leaves the barrel out: the
 * planner's quick scoring of options (the openings govern at the small storms it scores on).
 */
export function designOutletFile(p: SearchProblem, l: Layout, vars: readonly number[], plain = false): OutletFile {
  if (p.system) {
    // A system: the pond at the outfall's outlet stands for the design (`designFiles` holds them all).
    const main = p.case.system!.ponds.findIndex((q) => q.to < 0);
    return designFiles(p, l, vars)[main];
  }
  const units = p.case.units;
  const z = elevations(p, l, vars);
  const kept = p.keptElements.map((e) => explicit(e, units));
  const designed: ElementFile[] = l.levels.map((part, i) => placed(part.file as ElementFile, i === 0 && firstLevelFixed(p, l) ? floorValue(p) : caseElevation(p, z.levels[i])));
  const file: OutletFile = { elements: [...kept, ...designed] };
  if (p.keptRiser) file.riser = explicitRiser(p.keptRiser, units);
  else if (l.riser) file.riser = designedRiser(l.riser.size, caseElevation(p, z.rim!), units);
  if (p.barrel && !plain) file.barrel = l.barrel ? resizedBarrel(p.barrel, l.barrel.size) : { ...p.barrel };
  if (p.spillway) file.spillway = explicitSpillway(p.spillway, units);
  return file;
}

/** The outlet in SI, converted exactly as a case file's outlet is. */
export function designOutlet(p: SearchProblem, file: OutletFile): Outlet {
  const outlet = normalizeOutlet(file, p.converter, "outlet");
  if (p.converter.problems.length > 0) {
    const problems = p.converter.problems.splice(0);
    throw new CaseError(problems);
  }
  return outlet;
}
