// The chamber solve of a rating that sweeps the stages upwards (outletRating.ts): the same equation
// and bracket as chamber.ts (g(Q) = openingsFlow(WS, inlet + HW(Q)) - Q on the barrel's curve), but
// the openings come from an OpeningsSweep set to the stage and the root is started from the previous
// stage's: the chamber flow does not fall as the stage rises (the openings pass no less at a higher
// stage for the same chamber level), so the previous root bounds it from below, and its linear
// extrapolation over the last two stages, with the previous slope of g, is usually within a part in
// a million of the root. Accepted within SWEEP_TOLERANCE of the flow.
import type { Barrel } from "../case/model.js";
import { barrelCurve, curveFlow, curveHeadwater, type BarrelCurve } from "./barrelCurve.js";
import { lowestOpening } from "./openings.js";
import type { OpeningsSweep } from "./openingsSweep.js";
import { warmRoot, type WarmStart } from "./roots.js";

/** Relative tolerance of the sweep's chamber flow (the direct solve's is CHAMBER_TOLERANCE). */
export const SWEEP_TOLERANCE = 1e-9;

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

  /** Flow through the openings and the barrel at a stage above the previous one (m3/s). */
  flow(ws: number): number {
    const q = this.solve(ws);
    this.earlierRoot = this.state.root;
    this.earlierStage = this.previousStage;
    this.state.root = q;
    this.previousStage = ws;
    return q;
  }

  private solve(ws: number): number {
    const openings = this.openings;
    const free = openings.setStage(ws);
    if (!(free > 0)) return 0;
    const inlet = this.barrel.inletInvert;
    const curve = this.curve;
    const freeLevel = inlet + curveHeadwater(curve, free);
    if (freeLevel <= this.lowest) return free;
    const freeExcess = freeLevel < ws ? openings.flow(freeLevel) - free : -free;
    if (freeExcess >= 0) return free;
    // The bracket: nothing is throttled below the flow that lifts the chamber to the lowest opening
    // (as in chamber.ts), nor below the previous stage's flow; g(free) < 0 above.
    let low = Math.min(this.unthrottled, free);
    const high = free;
    const fHigh = freeExcess;
    const previous = this.state.root;
    if (previous > low && previous < high) low = previous;
    let guess = previous;
    const span = this.previousStage - this.earlierStage;
    if (span > 0 && this.earlierRoot >= 0) guess = previous + ((previous - this.earlierRoot) * (ws - this.previousStage)) / span;
    return warmRoot(this.excess, low, high, fHigh, guess, this.state, SWEEP_TOLERANCE * free);
  }
}
