// The flow at a point of analysis: the pond's outflow (spillway included) plus the runoff that bypasses
// the pond, summed at each instant (case-format contract, "Bypass and the point of analysis"). The
// router feeds each routing step to a tracker, which keeps the largest sum without allocating.
import type { Hydrograph } from "../model.js";

/** The largest flow at a point and when it occurred. */
export interface PointPeak {
  /** m3/s. */
  peak: number;
  /** Seconds. */
  time: number;
  /** The bypass's share of the peak (m3/s): the peak less the pond's outflow at that instant. */
  bypass: number;
}

/**
 * Tracks max(outflow + bypass) over a routing. The router's outflow is linear between step ends (its
 * own series) and the bypass is linear between its points and zero outside them, so the sum is linear
 * between the union of both sets of times and its maximum lies on one of them: each step is checked at
 * its end and at every bypass point inside it, which gives the exact maximum of the two series.
 */
export class PointTracker {
  peak = 0;
  time = 0;
  bypassAtPeak = 0;
  /** Next bypass point not yet compared. */
  private next = 0;
  /** Cursor of `at` (segment times[j] <= t < times[j + 1]). */
  private j = 0;
  readonly first: number;
  readonly last: number;

  constructor(readonly bypass: Hydrograph) {
    this.first = bypass.times[0];
    this.last = bypass.times[bypass.times.length - 1];
  }

  /** Bypass flow at time t (s): linear between points, zero before the first and after the last. */
  at(t: number): number {
    const { times, flows } = this.bypass;
    if (t < this.first || t > this.last) return 0;
    if (times.length < 2) return flows[0];
    if (t < times[this.j]) this.j = 0;
    const end = times.length - 2;
    while (this.j < end && times[this.j + 1] < t) this.j++;
    const t0 = times[this.j];
    const t1 = times[this.j + 1];
    return flows[this.j] + ((flows[this.j + 1] - flows[this.j]) * (t - t0)) / (t1 - t0);
  }

  /** The routing starts at time t with outflow o. */
  start(t: number, o: number): void {
    this.peak = -Infinity;
    this.next = 0;
    this.j = 0;
    const { times } = this.bypass;
    while (this.next < times.length && times[this.next] <= t) this.next++;
    this.compare(t, o, this.at(t));
  }

  /** A routing step from (t1, o1) to (t2, o2), the outflow linear between. */
  step(t1: number, o1: number, t2: number, o2: number): void {
    const { times, flows } = this.bypass;
    const n = times.length;
    while (this.next < n && times[this.next] < t2) {
      const tb = times[this.next];
      this.compare(tb, o1 + ((o2 - o1) * (tb - t1)) / (t2 - t1), flows[this.next]);
      this.next++;
    }
    this.compare(t2, o2, this.at(t2));
  }

  /**
   * After the routing ends at time t with outflow o: the bypass points still to come, with the pond's
   * outflow held at o (the outflow only falls once the inflow has ended, so this errs high, by little).
   */
  finish(o: number): void {
    const { times, flows } = this.bypass;
    for (; this.next < times.length; this.next++) this.compare(times[this.next], o, flows[this.next]);
  }

  private compare(t: number, o: number, b: number): void {
    if (o + b > this.peak) {
      this.peak = o + b;
      this.time = t;
      this.bypassAtPeak = b;
    }
  }

  result(): PointPeak {
    return { peak: this.peak, time: this.time, bypass: this.bypassAtPeak };
  }
}

/** A router's results at the points (the fields of its result of the same names). */
export interface PointsResult {
  /** Largest flow at the point of analysis (the routed flow's own peak without a bypass), when (s), and the bypass's share of it. */
  peakAtPoint: number;
  timeOfPeakAtPoint: number;
  bypassAtPeak: number;
  /** The largest flow at each further point, when there are any. */
  downstream: PointPeak[] | undefined;
}

/**
 * The point of analysis (with a bypass) and the further points a routed flow reaches, tracked together
 * by a router: a pond's outflow, or the flow reaching a system's outfall.
 */
export class PointsOfAnalysis {
  readonly point: PointTracker | null;
  readonly others: PointTracker[] | null;
  /** The last time (s) any of them has a point (-Infinity with none): the routing goes on at least to it. */
  readonly last: number;
  /** Whether there is any point to track (a router skips `step` without: its arguments would be boxed for nothing). */
  readonly active: boolean;

  constructor(bypass: Hydrograph | undefined, downstream: readonly Hydrograph[] | undefined) {
    this.point = bypass ? new PointTracker(bypass) : null;
    this.others = downstream?.map((h) => new PointTracker(h)) ?? null;
    let last = this.point ? this.point.last : -Infinity;
    if (this.others) for (const o of this.others) if (o.last > last) last = o.last;
    this.last = last;
    this.active = this.point !== null || this.others !== null;
  }

  start(t: number, o: number): void {
    this.point?.start(t, o);
    if (this.others) for (const p of this.others) p.start(t, o);
  }

  step(t1: number, o1: number, t2: number, o2: number): void {
    if (this.point) this.point.step(t1, o1, t2, o2);
    if (this.others) for (const p of this.others) p.step(t1, o1, t2, o2);
  }

  finish(o: number): void {
    this.point?.finish(o);
    if (this.others) for (const p of this.others) p.finish(o);
  }

  /** The flow at the point of analysis at time t when the routed flow is o there (o alone without a bypass). */
  atPoint(t: number, o: number): number {
    return this.point ? o + this.point.at(t) : o;
  }

  /** A router's result fields at the points, given the routed flow's own peak and its time. */
  result(peak: number, time: number): PointsResult {
    const point = this.point;
    return {
      peakAtPoint: point ? point.peak : peak,
      timeOfPeakAtPoint: point ? point.time : time,
      bypassAtPeak: point ? point.bypassAtPeak : 0,
      downstream: this.others?.map((o) => o.result()),
    };
  }
}
