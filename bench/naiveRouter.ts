// BASELINE FOR THE BENCH ONLY, not used by outfit: the storage-indication method done the naive way.
// At every step it solves 2 S(h)/dt + O(h) = N for the new stage h by bisection on the pond's
// storage curve (50 halvings), looking the outflow up in the rating table by binary search at each
// try. outfit's router instead walks a cursor along the table's 2S/dt + O column and interpolates
// once. Same step, same table, same stopping rule, so the ratio of the two is the router's gain.
import type { Hydrograph } from "../src/model.js";
import type { StorageCurve } from "../src/storage/curve.js";
import { interpolateAtStage, type RatingTable } from "../src/routing/ratingTable.js";

export interface NaiveResult {
  peakOutflow: number;
  maxStage: number;
  steps: number;
}

export function routeNaive(
  curve: StorageCurve,
  table: RatingTable,
  inflow: Hydrograph,
  step: number,
  startStage: number,
  drainedStage: number,
): NaiveResult {
  const times = inflow.times;
  const flows = inflow.flows;
  const tLast = times[times.length - 1];
  const tEnd = tLast + 10 * 86400;
  const low = table.stage[0];
  const high = table.stage[table.stage.length - 1];
  const outflowAt = (h: number) => interpolateAtStage(table, table.outflow, h);
  let t = times[0];
  let j = 0;
  let h = startStage;
  let S1 = curve.volume(h);
  let O1 = outflowAt(h);
  let I1 = flows[0];
  let peakOutflow = O1;
  let maxStage = h;
  let steps = 0;
  while (true) {
    const t2 = t + step;
    let I2 = 0;
    if (t2 <= tLast) {
      while (times[j + 1] < t2) j++;
      I2 = flows[j] + ((flows[j + 1] - flows[j]) * (t2 - times[j])) / (times[j + 1] - times[j]);
    }
    const N = I1 + I2 + (2 * S1) / step - O1;
    let a = low;
    let b = high;
    for (let i = 0; i < 50; i++) {
      const mid = 0.5 * (a + b);
      if ((2 * curve.volume(mid)) / step + outflowAt(mid) < N) a = mid;
      else b = mid;
    }
    h = 0.5 * (a + b);
    S1 = curve.volume(h);
    O1 = outflowAt(h);
    I1 = t2 >= tLast ? 0 : I2;
    t = t2;
    steps++;
    if (O1 > peakOutflow) peakOutflow = O1;
    if (h > maxStage) maxStage = h;
    if (t >= tLast && (h <= drainedStage || t >= tEnd)) break;
  }
  return { peakOutflow, maxStage, steps };
}
