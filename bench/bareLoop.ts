// FLOOR FOR THE BENCH ONLY: the storage-indication recurrence on a rating table with nothing else
// (no peaks, volumes, drawdown or stopping rule), for a fixed number of steps. What a JavaScript loop
// over the same arithmetic costs; the router's bookkeeping is the difference.
import type { Hydrograph } from "../src/model.js";
import type { RatingTable } from "../src/routing/ratingTable.js";

export function bareLoop(table: RatingTable, inflow: Hydrograph, step: number, steps: number): number {
  const S = table.storage;
  const O = table.outflow;
  const last = S.length - 1;
  const times = inflow.times;
  const flows = inflow.flows;
  const tLast = times[times.length - 1];
  const twoOverDt = 2 / step;
  let k = 0;
  let j = 0;
  let t = times[0];
  let s1 = 0;
  let o1 = 0;
  let i1 = flows[0];
  for (let n = 0; n < steps; n++) {
    const t2 = t + step;
    let i2 = 0;
    if (t2 <= tLast) {
      while (times[j + 1] < t2) j++;
      i2 = flows[j] + ((flows[j + 1] - flows[j]) * (t2 - times[j])) / (times[j + 1] - times[j]);
    }
    const N = i1 + i2 + twoOverDt * s1 - o1;
    while (k < last - 1 && twoOverDt * S[k + 1] + O[k + 1] < N) k++;
    while (k > 0 && twoOverDt * S[k] + O[k] > N) k--;
    const f0 = twoOverDt * S[k] + O[k];
    const u = (N - f0) / (twoOverDt * S[k + 1] + O[k + 1] - f0);
    s1 = S[k] + u * (S[k + 1] - S[k]);
    o1 = O[k] + u * (O[k + 1] - O[k]);
    i1 = i2;
    t = t2;
  }
  return o1;
}
