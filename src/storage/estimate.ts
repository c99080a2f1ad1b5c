// Storage a storm needs before any outlet exists, by published preliminary-sizing methods:
// - TR-55 ch. 6 (NRCS 1986), Figure 6-1: Vs/Vr = C0 + C1 a + C2 a^2 + C3 a^3, a = qo/qi, with the
//   coefficients of TR-55 App. F Table F-2 (references.md sec. 5.1 marks them read in the source; the
//   author's memory agrees). Vr is the runoff volume (the inflow hydrograph's volume), qi its peak, qo
//   the allowable release. The figure is drawn for qo/qi from 0.1 to 0.8 (from memory): outside it the
//   estimate is flagged.
// - Hydrograph difference: the inflow above a release that rises linearly from zero at the start of
//   runoff to the target at the inflow's peak and holds it there; and the same with the release at the
//   target from the start (constant release), which releases more early and so holds less.
// - Modified rational critical duration for rational-method storms (hydrology/rational.ts).
import type { Hydrograph } from "../model.js";
import type { DistributionType } from "../hydrology/distributions.js";

export type Tr55Group = "I/IA" | "II/III";

/** TR-55 App. F Table F-2 (coefficients of Figure 6-1): C0, C1, C2, C3. */
export const TR55_STORAGE_COEFFICIENTS: Readonly<Record<Tr55Group, readonly [number, number, number, number]>> = {
  "I/IA": [0.66, -1.76, 1.96, -0.73],
  "II/III": [0.682, -1.43, 1.64, -0.804],
};

/** The range of qo/qi the figure is drawn for (from memory). */
export const TR55_RATIO_RANGE: readonly [number, number] = [0.1, 0.8];

export function tr55Group(distribution: DistributionType): Tr55Group {
  return distribution === "I" || distribution === "IA" ? "I/IA" : "II/III";
}

/** Vs/Vr of TR-55 Figure 6-1 for a release ratio qo/qi. */
export function tr55StorageRatio(ratio: number, group: Tr55Group): number {
  const [c0, c1, c2, c3] = TR55_STORAGE_COEFFICIENTS[group];
  return c0 + ratio * (c1 + ratio * (c2 + ratio * c3));
}

export interface HydrographFacts {
  /** m3/s. */
  peak: number;
  /** s. */
  timeOfPeak: number;
  /** Start of runoff (s): the last time before the peak with zero inflow, or the first point. */
  start: number;
  /** m3. */
  volume: number;
}

export function hydrographFacts(h: Hydrograph): HydrographFacts {
  let k = 0;
  for (let i = 1; i < h.flows.length; i++) if (h.flows[i] > h.flows[k]) k = i;
  let s = 0;
  for (let i = 0; i < k; i++) if (h.flows[i] <= 0) s = i;
  let volume = 0;
  for (let i = 1; i < h.times.length; i++) volume += 0.5 * (h.flows[i] + h.flows[i - 1]) * (h.times[i] - h.times[i - 1]);
  return { peak: h.flows[k], timeOfPeak: h.times[k], start: h.times[s], volume };
}

export type ReleaseForm = "rising" | "constant";

/**
 * Volume (m3) of the inflow above the release: `rising` goes linearly from zero at the start of runoff
 * to `release` at the inflow's peak and holds it; `constant` is `release` throughout. Both are linear
 * between the inflow's points and the peak, so the positive part is integrated exactly.
 */
export function hydrographDifference(h: Hydrograph, release: number, form: ReleaseForm): number {
  const facts = hydrographFacts(h);
  const releaseAt = (t: number) => {
    if (form === "constant" || t >= facts.timeOfPeak) return release;
    if (t <= facts.start) return 0;
    return (release * (t - facts.start)) / (facts.timeOfPeak - facts.start);
  };
  // The start and the peak are points of the inflow, so the release is linear between its points too.
  // One pass over the points (the inflow at a point is its value there): a long record costs its length.
  const { times, flows } = h;
  let volume = 0;
  for (let i = 1; i < times.length; i++) {
    const t0 = times[i - 1];
    const t1 = times[i];
    volume += positivePart(flows[i - 1] - releaseAt(t0), flows[i] - releaseAt(t1), t1 - t0);
  }
  return volume;
}

/** Integral over dt of the positive part of a quantity linear from a to b. */
function positivePart(a: number, b: number, dt: number): number {
  if (a >= 0 && b >= 0) return 0.5 * (a + b) * dt;
  if (a <= 0 && b <= 0) return 0;
  const p = Math.max(a, b);
  return 0.5 * p * dt * (p / (Math.abs(a) + Math.abs(b)));
}
