// The chamber solve of a rating that sweeps the stages upwards (outletRating.ts): the same equation
// and bracket as chamber.ts (g(Q) = openingsFlow(WS, inlet + HW(Q)) - Q on the barrel's curve), but
// the openings come from an OpeningsSweep set to the stage and the root is started from the previous
// stage's: the chamber flow does not fall as the stage rises (the openings pass no less at a higher
// stage for the same chamber level), so the previous root bounds it from below, and its linear
// extrapolation over the last three stages, with the previous slope of g, is usually within the
// tolerance after one evaluation. Accepted within SWEEP_TOLERANCE of the flow.
import type { Barrel } from "../model.js";
import { barrelCurve, curveFlow, curveHeadwater, type BarrelCurve } from "./barrelCurve.js";
import { lowestOpening } from "./openings.js";
import type { OpeningsSweep } from "./openingsSweep.js";
import { warmRoot, type WarmStart } from "./roots.js";

/** Relative tolerance of the sweep's chamber flow (the direct solve's is CHAMBER_TOLERANCE). */
export const SWEEP_TOLERANCE = 1e-6;

export class ChamberSweep {
  private readonly barrel: Barrel;
  private readonly curve: BarrelCurve;
  private readonly lowest: number;
  /** The barrel flow that lifts the chamber to the lowest opening (nothing is throttled below it). */
  private readonly unthrottled: number;
  private readonly state: WarmStart = { root: NaN, slope: NaN };
  private previousStage = NaN;
  private earlierRoot = NaN;
  private earlierStage = NaN;
  private evenEarlierRoot = NaN;
  private evenEarlierStage = NaN;
  private previousFree = NaN;
  private readonly excess: (q: number) => number;

  constructor(private readonly openings: OpeningsSweep, tailwater: number) {
    this.barrel = openings.outlet.barrel as Barrel;
    this.curve = barrelCurve(this.barrel, tailwater);
    this.lowest = lowestOpening(openings.outlet);
    const inlet = this.barrel.inletInvert;
    const curve = this.curve;
    this.unthrottled = inlet + curve.headwater[0] > this.lowest ? 0 : curveFlow(curve, this.lowest - inlet);
    this.excess = (q: number) => openings.flow(inlet + curveHeadwater(curve, q)) - q;
  }

  /** The slope of g the next stage's root search starts from (see `WarmStart`). */
  get slope(): number {
    return this.state.slope;
  }

  /**
   * Takes up the sweep at stage `index` of the openings' grid as if it had swept every stage below:
   * `flows` and `slopes` hold what `flow` and `slope` gave at the stages below `index` (for these
   * openings, or for openings that agree with them there). The stages from `index` on then come out
   * exactly as in a sweep from the bottom.
   */
  resume(stages: Float64Array, flows: Float64Array, slopes: Float64Array, index: number): void {
    if (index <= 0) return;
    const at = (k: number, column: Float64Array) => (k >= 0 ? column[k] : NaN);
    this.state.root = flows[index - 1];
    this.state.slope = slopes[index - 1];
    this.previousStage = stages[index - 1];
    this.earlierRoot = at(index - 2, flows);
    this.earlierStage = at(index - 2, stages);
    this.evenEarlierRoot = at(index - 3, flows);
    this.evenEarlierStage = at(index - 3, stages);
    this.previousFree = this.openings.setGridStage(index - 1);
  }

  /** Flow through the openings and the barrel at stage `index` of the openings' grid, above the
   * previous one (m3/s). */
  flow(ws: number, index: number): number {
    const q = this.solve(ws, index);
    this.evenEarlierRoot = this.earlierRoot;
    this.evenEarlierStage = this.earlierStage;
    this.earlierRoot = this.state.root;
    this.earlierStage = this.previousStage;
    this.state.root = q;
    this.previousStage = ws;
    return q;
  }

  private solve(ws: number, index: number): number {
    const openings = this.openings;
    const free = openings.setGridStage(index);
    // Once the barrel throttles, it mostly stays throttled as the stage rises: then the root search
    // evaluates g(free) only if it must (and returns the free flow if g(free) >= 0 after all).
    const throttled = this.state.root < this.previousFree;
    this.previousFree = free;
    if (!(free > 0)) return 0;
    let freeExcess = NaN;
    if (!throttled) {
      // Up to the flow that lifts the chamber to the lowest opening nothing is throttled (one
      // comparison instead of a look-up on the curve).
      if (free < this.unthrottled) return free;
      const freeLevel = this.barrel.inletInvert + curveHeadwater(this.curve, free);
      if (freeLevel <= this.lowest) return free;
      freeExcess = freeLevel >= ws ? -free : openings.flow(freeLevel) - free;
      if (freeExcess >= 0) return free;
    }
    // The bracket: nothing is throttled below the flow that lifts the chamber to the lowest opening
    // (as in chamber.ts), nor below the previous stage's flow; g(free) < 0 above.
    let low = Math.min(this.unthrottled, free);
    const high = free;
    const fHigh = freeExcess;
    const previous = this.state.root;
    if (previous > low && previous < high) low = previous;
    const guess = extrapolate(ws, this.previousStage, previous, this.earlierStage, this.earlierRoot, this.evenEarlierStage, this.evenEarlierRoot);
    return warmRoot(this.excess, low, high, fHigh, guess, this.state, sweepTolerance(guess, free));
  }
}

/** Tolerance on a root near `guess` whose bracket ends at `free`: SWEEP_TOLERANCE of the root, but
 * of no less than 1e-4 of the free flow (below that, the direct solve's relative 1e-11 of it). */
export function sweepTolerance(guess: number, free: number): number {
  return SWEEP_TOLERANCE * Math.max(guess > 0 ? guess : 0, 1e-4 * free);
}

/** The root at stage z from the last three stages' roots: a parabola through them (Newton's divided
 * differences), a line through two, the last one alone while fewer are known. */
export function extrapolate(z: number, z1: number, q1: number, z2: number, q2: number, z3: number, q3: number): number {
  if (!(q2 >= 0) || !(z1 > z2)) return q1;
  const d12 = (q1 - q2) / (z1 - z2);
  const line = q1 + d12 * (z - z1);
  if (!(q3 >= 0) || !(z2 > z3)) return line;
  const d23 = (q2 - q3) / (z2 - z3);
  return line + ((d12 - d23) / (z1 - z3)) * (z - z1) * (z - z2);
}
