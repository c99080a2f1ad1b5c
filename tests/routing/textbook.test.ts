// Printed storage-indication routing examples reproduced with the example's own step (router `step`
// fixed) and the example's own table (`tableFromColumns`, linear interpolation between its rows).
// The router only adds, scales and interpolates, so each example is routed in its own units (ft, ft3,
// cfs or m, m3, m3/s; seconds).
import { describe, expect, it } from "vitest";
import { tableFromColumns, type RatingTable } from "../../src/routing/ratingTable.js";
import { route, type RouteResult } from "../../src/routing/router.js";

const MASS_BALANCE = 1e-4;

/** Routes an inflow given at every step from t = 0 with a fixed step (s). */
function routeEvery(table: RatingTable, inflow: number[], step: number, options: { startStage?: number; afterInflow?: number } = {}): RouteResult {
  const result = route(
    table,
    { times: Float64Array.from(inflow, (_, i) => i * step), flows: Float64Array.from(inflow) },
    {
      step,
      startStage: options.startStage ?? table.stage[0],
      drainedStage: options.startStage ?? table.stage[0],
      maxAfterInflow: options.afterInflow,
      record: true,
    },
  );
  expect(Math.abs(result.massBalanceError)).toBeLessThan(MASS_BALANCE);
  return result;
}

/** The outflow at the end of each step (the series starts with the initial state). */
const outflows = (r: RouteResult) => r.series!.outflow.slice(1);

describe("Chow, Maidment & Mays (1988), Applied Hydrology, Example 8.2.1 data", () => {
  // 1-acre (43,560 ft2) vertical-walled reservoir, 5-ft pipe outlet rated every 0.5 ft, 10-min step,
  // initially empty. Data as reproduced in university course material (references.md sec. 6.1).
  // The routed values are the references' [D] values (computed from that data with the same
  // method); the peak of about 270 cfs at 80 min is the book's Table 8.2.3 from memory (low
  // confidence), so the hard check is on the [D] series.
  const stage = Array.from({ length: 21 }, (_, i) => 0.5 * i);
  const outflow = [0, 3, 8, 17, 30, 43, 60, 78, 97, 117, 137, 156, 173, 190, 205, 218, 231, 242, 253, 264, 275];
  const table = tableFromColumns(stage, stage.map((h) => 43560 * h), outflow);
  const inflow = [0, 60, 120, 180, 240, 300, 360, 320, 280, 240, 200, 160, 120, 80, 40, 0];
  const routed = [2.4, 17.1, 61.1, 123.2, 182.2, 230.3, 259.3, 270.0, 267.4, 254.9, 235.2, 206.9, 168.5, 124.1, 79.8, 48.6, 32.7, 22.8];

  it("2S/dt + Q column (Chow Table 8.2.2, [D])", () => {
    const printed = [0, 75.6, 153.2, 234.8, 320.4, 406.0, 495.6, 586.2, 677.8, 770.4, 863.0, 954.6, 1044.2, 1133.8, 1221.4, 1307.0, 1392.6, 1476.2, 1559.8, 1643.4, 1727.0];
    printed.forEach((p, i) => expect(Math.abs((2 * table.storage[i]) / 600 + table.outflow[i] - p)).toBeLessThan(0.05));
  });

  it("outflow every 10 min to 0.1 cfs; peak 270.0 cfs at 80 min, stage 9.77 ft", () => {
    const r = routeEvery(table, inflow, 600);
    const o = outflows(r);
    routed.forEach((q, i) => expect(Math.abs(o[i] - q), `t = ${(i + 1) * 10} min`).toBeLessThan(0.05));
    expect(r.peakOutflow).toBeCloseTo(270.0, 1);
    expect(r.timeOfPeakOutflow).toBe(80 * 60);
    expect(Math.abs(r.maxStage - 9.77)).toBeLessThan(0.005);
  });
});

describe("Chow, Maidment & Mays (1988), Problem 8.2.2, university course solution", () => {
  // Storage 75, 81, 87.5, 100, 110.2 (10^6 m3) with outflow 57, 227, 519, 1330, 2270 m3/s; 2-h step;
  // inflow every 2 h from 0 h: 60 ... 650 m3/s at 18 h, then 0; starts at 75e6 m3 and 57 m3/s
  // (references.md sec. 6.1). The table has no stage column: storage (10^6 m3) serves as the stage,
  // which changes nothing since storage and outflow are interpolated along the same rows.
  const storage = [75, 81, 87.5, 100, 110.2];
  const table = tableFromColumns(storage, storage.map((s) => s * 1e6), [57, 227, 519, 1330, 2270]);
  const inflow = [60, 100, 232, 300, 520, 1310, 1930, 1460, 930, 650, 0, 0];
  const printed = [61.3, 80.6, 115.0, 169.6, 348.2, 768.3, 1119.2, 1147.9, 1012.3, 752.1, 481.0];

  it("outflow every 2 h; peak 1147.9 m3/s at 16 h; maximum storage 97.193e6 m3", () => {
    const r = routeEvery(table, inflow, 7200, { afterInflow: 0 });
    const o = outflows(r);
    // The course solution carries its columns rounded; every printed value is met to one unit of
    // its last digit (1012.38 is printed 1012.3), the peak and the storage to their rounding.
    printed.forEach((q, i) => expect(Math.abs(o[i] - q), `t = ${2 * (i + 1)} h`).toBeLessThan(0.1));
    expect(Math.abs(r.peakOutflow - 1147.9)).toBeLessThan(0.05);
    expect(r.timeOfPeakOutflow).toBe(16 * 3600);
    expect(Math.abs(r.maxStorage / 1e6 - 97.193)).toBeLessThan(0.001);
  });
});

describe("Bedient, Huber & Vieux, Hydrology and Floodplain Analysis, 5th ed. (2013), Example 4-5", () => {
  // Pond volumes by depth (printed), outflow from the example's own equations: an 18-in RCP as an
  // orifice, Cd 0.9, head measured from the pond bottom, plus an ogee spillway
  // Q = Ce (2/3) sqrt(2g) L (h - 5)^1.5, Ce 0.7, L 15 ft; g = 32.2 ft/s2 as in the example; 10-min step.
  const g = 32.2;
  const depth = [0, 1, 2, 3, 4, 5, 5.5, 6, 6.5, 7];
  const volume = [0, 6772, 15161, 25310, 37361, 51457, 59173, 67167, 75443, 84006];
  const q = depth.map(
    (h) => 0.9 * (Math.PI / 4) * 1.5 ** 2 * Math.sqrt(2 * g * h) + (h > 5 ? 0.7 * (2 / 3) * Math.sqrt(2 * g) * 15 * (h - 5) ** 1.5 : 0),
  );
  const table = tableFromColumns(depth, volume, q);

  it("rebuilds the printed Q and 2S/dt + Q columns to their rounding", () => {
    const printedQ = [13, 18, 22, 26, 29, 50, 87, 136, 193];
    const printedIndication = [35, 69, 106, 150, 200, 247, 311, 387, 473];
    for (let i = 1; i < depth.length; i++) {
      expect(Math.abs(q[i] - printedQ[i - 1])).toBeLessThanOrEqual(0.5);
      expect(Math.abs((2 * volume[i]) / 600 + q[i] - printedIndication[i - 1])).toBeLessThanOrEqual(0.5);
    }
  });

  it("outflow every 10 min to 0.1 cfs; peak 40.4 cfs at 50 min; maximum 2S/dt + Q 226.3, depth about 5.3 ft", () => {
    const r = routeEvery(table, [0, 20, 40, 60, 50, 40, 30, 20, 10, 0], 600);
    const printed = [7.2, 17.6, 24.0, 28.1, 40.4, 35.5, 28.2, 26.6, 23.5, 19.0, 13.5, 4.6, 1.3];
    const o = outflows(r);
    printed.forEach((p, i) => expect(Math.abs(o[i] - p), `t = ${(i + 1) * 10} min`).toBeLessThan(0.05));
    expect(Math.abs(r.peakOutflow - 40.4)).toBeLessThan(0.05);
    expect(r.timeOfPeakOutflow).toBe(50 * 60);
    expect(Math.abs((2 * r.maxStorage) / 600 + r.peakOutflow - 226.3)).toBeLessThan(0.05);
    expect(Math.abs(r.maxStage - 5.3)).toBeLessThan(0.05);
  });
});

describe("FHWA HEC-22 (3rd ed., 2009), Example 8-9, US units", () => {
  // The example's storage-indication table: rows at the stages printed in Table 8-3 (composite
  // rating), outflow from Table 8-3, storage at those stages by linear interpolation in Example 8-2's
  // stage-storage table; step 0.057 h; inflow at every step (references.md sec. 6.2).
  const dt = 0.057 * 3600;
  const storageStage = [32.8, 33.46, 34.12, 34.77, 35.43, 36.09, 36.75, 37.4, 38.06, 38.71, 39.37];
  const storageVolume = [0, 2567, 5425, 8774, 12455, 16548, 21074, 26052, 31503, 37413, 43906];
  const ratingStage = [32.8, 33.5, 34.1, 34.8, 35.4, 36.1, 36.7, 37.4, 38.1, 38.7, 39.4];
  const ratingFlow = [0, 0.4, 0.8, 1.1, 1.3, 10.7, 14.8, 17.7, 20.7, 62.5, 80.6];
  const linear = (xs: number[], ys: number[], x: number) => {
    let i = 0;
    while (i < xs.length - 2 && xs[i + 1] < x) i++;
    return ys[i] + ((ys[i + 1] - ys[i]) * (x - xs[i])) / (xs[i + 1] - xs[i]);
  };
  const table = tableFromColumns(ratingStage, ratingStage.map((z) => linear(storageStage, storageVolume, z)), ratingFlow);
  const inflow = [0, 1.4, 2.5, 4.2, 6.4, 11.7, 17.3, 23.7, 28.6, 31.1, 30.4, 27.9, 24.4, 20.1, 17.0, 13.8, 11.3, 9.2, 7.8, 6.4, 5.3, 3.9, 3.2, 1.8, 1.1, 0];
  const printed = [0, 0.1, 0.2, 0.3, 0.6, 1.0, 1.2, 7.5, 13.4, 15.7, 17.2, 18.0, 18.3, 18.3, 18.1, 17.7, 16.9, 16.0, 15.0, 13.7, 12.1, 10.2, 7.1, 5.0, 3.3, 2.1, 1.4];

  it("the router is HEC-22 eq 8-30 on this table: (I1+I2)/2 + (S1/dt - O1/2) = S2/dt + O2/2", () => {
    // An independent plain evaluation of the half form, interpolating O in the (S/dt + O/2, O) rows.
    const indication = Array.from(table.storage, (s, i) => s / dt + table.outflow[i] / 2);
    let s1 = 0;
    let o1 = 0;
    const plain: number[] = [];
    for (let n = 1; n < inflow.length; n++) {
      const x = (inflow[n - 1] + inflow[n]) / 2 + s1 / dt - o1 / 2;
      const o2 = linear(indication, Array.from(table.outflow), x);
      s1 = (x - o2 / 2) * dt;
      o1 = o2;
      plain.push(o2);
    }
    const o = outflows(routeEvery(table, inflow, dt));
    plain.forEach((p, i) => expect(o[i]).toBeCloseTo(p, 9));
  });

  // The printed results cannot all be reproduced from the printed tables, by any table built from
  // them: 18.3 cfs at 37.58 ft disagrees with Table 8-3 (18.47 cfs there), and 27,816 ft3 at 37.58 ft
  // disagrees with Example 8-2's table (27,538 ft3 there; 27,816 ft3 is at 37.61 ft). Table 8-3
  // itself disagrees with the component examples it sums (references.md sec. 6.2: the low-flow
  // orifice column is Example 8-5's rounded down, the spillway column is not Example 8-8's). So what
  // is matched, with the example's own table and step: the printed outflow at every step to 0.25 cfs,
  // the peak to 0.25 cfs (1.4 %), the peak stage to 0.03 ft and the peak storage to 0.5 %. With this
  // table the router gives 18.54 cfs at 37.60 ft and 27,686 ft3.
  it("the printed tables are inconsistent with the printed peak (why the match below is not exact)", () => {
    expect(linear(ratingStage, ratingFlow, 37.58) - 18.3).toBeGreaterThan(0.15);
    expect(linear(storageStage, storageVolume, 37.58) / 27816 - 1).toBeLessThan(-0.009);
  });

  it("peak 18.3 cfs at stage 37.58 ft, storage 27,816 ft3, at 0.74 to 0.80 h: matched within the tolerances explained above", () => {
    const r = routeEvery(table, inflow, dt);
    const o = outflows(r);
    printed.forEach((p, i) => expect(Math.abs(o[i] - p), `step ${i + 1}`).toBeLessThan(0.25));
    expect(Math.abs(r.peakOutflow - 18.3)).toBeLessThan(0.25);
    expect(Math.abs(r.maxStage - 37.58)).toBeLessThan(0.03);
    expect(Math.abs(r.maxStorage / 27816 - 1)).toBeLessThan(0.005);
    expect(r.timeOfPeakOutflow / 3600).toBeGreaterThanOrEqual(0.74 - 1e-9);
    expect(r.timeOfPeakOutflow / 3600).toBeLessThanOrEqual(0.8 + 1e-9);
  });
});
