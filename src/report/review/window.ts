// The time windows the report shows a routed storm in: the event (from the rise of the inflow to the
// recession of the outflow, leaving out the long empty tails a 24-hour storm's simulation has on both
// sides) and the peak detail (where the peaks are, wide enough to read their shape).
import type { StormRouting } from "../../routing/routeCase.js";
import { routedInflow } from "../../routing/durations.js";

export interface TimeWindow {
  /** Hours from the start of the storm. */
  start: number;
  end: number;
  /** Hours simulated. */
  simulated: number;
}

/** An inflow or bypass counts as running while above this share of its peak. */
const RUNNING = 0.01;
/** The outflow's recession is shown until it falls below this share of its peak. */
const RECEDED = 0.05;

/** First and last times (s) a series is above `share` of its peak; null when it never is. */
function above(times: ArrayLike<number>, values: ArrayLike<number>, share: number): [number, number] | null {
  let peak = 0;
  for (let i = 0; i < values.length; i++) peak = Math.max(peak, values[i]);
  if (!(peak > 0)) return null;
  let first = -1;
  let last = -1;
  for (let i = 0; i < values.length; i++) {
    if (values[i] > share * peak) {
      if (first < 0) first = i;
      last = i;
    }
  }
  // The edges reach the neighbouring points, where the series is still below the share.
  return [times[Math.max(0, first - 1)], times[Math.min(values.length - 1, last + 1)]];
}

/** Rounds a window outward to a readable step: 0.25 h below 6 h wide, 1 h below 48 h, else 6 h. */
function rounded(start: number, end: number, simulated: number): TimeWindow {
  const width = end - start;
  const step = width < 6 ? 0.25 : width < 48 ? 1 : 6;
  return { start: Math.max(0, Math.floor(start / step) * step), end: Math.min(simulated, Math.ceil(end / step) * step), simulated };
}

/**
 * The event: from the first time the inflow (or the bypass) runs above 1 % of its peak to the last
 * time the inflow or bypass does, or the outflow is above 5 % of its peak, whichever is later; padded
 * by 5 % of that span and rounded outward, within the simulation (hours).
 */
export function eventWindow(sr: StormRouting): TimeWindow {
  const series = sr.result.series!;
  const simulated = series.time[series.time.length - 1] / 3600;
  // A rational storm routed over a range of durations: the governing duration's inflow.
  const inflow = routedInflow(sr.storm, sr.result);
  const spans = [
    above(inflow.times, inflow.flows, RUNNING),
    sr.storm.bypass ? above(sr.storm.bypass.times, sr.storm.bypass.flows, RUNNING) : null,
    above(series.time, series.outflow, RECEDED),
  ].filter((s): s is [number, number] => s !== null);
  if (spans.length === 0) return { start: 0, end: simulated, simulated };
  const start = Math.min(...spans.map((s) => s[0])) / 3600;
  const end = Math.max(...spans.map((s) => s[1])) / 3600;
  const pad = 0.05 * (end - start);
  return rounded(start - pad, end + pad, simulated);
}

/**
 * The peak detail: where the inflow is above half its peak and the outflow (and the flow at the point
 * of analysis) above four fifths of theirs, widened by half that span on each side and to at least
 * one hour; null when it would cover a third of the event or more (the event plot shows the peak then).
 */
export function peakWindow(sr: StormRouting, event: TimeWindow): TimeWindow | null {
  const series = sr.result.series!;
  const spans = [above(series.time, series.inflow, 0.5), above(series.time, series.outflow, 0.8)];
  if (series.bypass) spans.push(above(series.time, series.outflow.map((q, i) => q + series.bypass![i]), 0.8));
  const found = spans.filter((s): s is [number, number] => s !== null);
  if (found.length === 0) return null;
  let start = Math.min(...found.map((s) => s[0])) / 3600;
  let end = Math.max(...found.map((s) => s[1])) / 3600;
  const pad = Math.max(0.5 * (end - start), 0.5 - 0.5 * (end - start));
  start -= pad;
  end += pad;
  const window = rounded(Math.max(start, event.start), Math.min(end, event.end), event.simulated);
  return window.end - window.start < (event.end - event.start) / 3 ? window : null;
}
