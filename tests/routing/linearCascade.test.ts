// Two linear reservoirs in series against their closed form. A prismatic tank (vertical walls, storage
// S = A h) draining through an outlet whose flow is proportional to the head, O = c h, is a linear
// reservoir S = k O with k = A / c; the first tank's outlet drains into the second, set low enough
// that the second tank's level never reaches it (a free outfall into the second tank). For a constant
// inflow I from t = 0 to T into the first tank (both empty at the start) the cascade's outflow is, for
// t <= T (Nash 1957, "The form of the instantaneous unit hydrograph", IASH Publ. 45: a cascade of linear
// reservoirs; Chow, Maidment & Mays 1988, Applied Hydrology sec. 7.5, the linear reservoir):
//   O1(t) = I (1 - e^(-t/k1)),
//   O2(t) = I (1 - (k1 e^(-t/k1) - k2 e^(-t/k2)) / (k1 - k2))   (k1 != k2),
//   O2(t) = I (1 - (1 + t/k) e^(-t/k))                           (k1 = k2 = k),
// and after T, the system being linear, each less its value at t - T (superposition of the inflow
// stopping). The first tank peaks at T, the second later, where its outflow meets the first's. The
// outlet is a regulator rated by two points (a straight line through zero), which its monotone cubic
// keeps straight.
import { describe, expect, it } from "vitest";
import { routeSystemCase } from "../../src/routing/routeSystem.js";
import { FOOT } from "../../src/units.js";
import { systemOf } from "./support/systems.js";

const FT3 = FOOT ** 3;

/** Two tanks of plan areas a1, a2 (ft2), outlets of c1, c2 cfs per ft of head; inflow I cfs for T minutes. */
function cascade(a1: number, c1: number, a2: number, c2: number, inflow: number, minutes: number) {
  const tank = (bottom: number, area: number) => ({ bottom, top: bottom + 12, storage: { prismoid: { length: area / 50, width: 50, sideSlope: 0 } } });
  const outlet = (invert: number, c: number) => ({ elements: [{ type: "regulator", invert, rating: [[0, 0], [30, 30 * c]] }] });
  return systemOf({
    name: "Two linear reservoirs (invented)",
    units: "US",
    ponds: [
      { name: "first", pond: tank(120, a1), outlet: outlet(120, c1), to: "second" },
      { name: "second", pond: tank(100, a2), outlet: outlet(100, c2), to: "outfall" },
    ],
    storms: [{ name: "steady", returnPeriod: 1, inflows: { first: { series: [[0, inflow], [minutes, inflow]] } } }],
  });
}

describe("two linear reservoirs in series against the Nash cascade's closed form", () => {
  it.each([
    ["different time constants", 20000, 10, 30000, 6],
    ["equal time constants", 20000, 10, 20000, 10],
  ])("%s", (_name, a1, c1, a2, c2) => {
    const I = 12;
    const T = 180 * 60;
    const c = cascade(a1, c1, a2, c2, I, 180);
    const k1 = a1 / c1;
    const k2 = a2 / c2;
    const step1 = (t: number) => (t <= 0 ? 0 : I * (1 - Math.exp(-t / k1)));
    const step2 = (t: number) => (t <= 0 ? 0 : k1 === k2 ? I * (1 - (1 + t / k1) * Math.exp(-t / k1)) : I * (1 - (k1 * Math.exp(-t / k1) - k2 * Math.exp(-t / k2)) / (k1 - k2)));
    const o1 = (t: number) => step1(t) - step1(t - T);
    const o2 = (t: number) => step2(t) - step2(t - T);
    // The second tank's peak in the closed form: scanned at one second.
    let peak2 = 0;
    let time2 = 0;
    for (let t = T; t < 3 * T; t++) if (o2(t) > peak2) [peak2, time2] = [o2(t), t];
    expect(time2).toBeGreaterThan(T);
    const result = routeSystemCase(c, undefined, { record: true }).storms[0].result;
    const [first, second] = result.ponds;
    expect(Math.abs(first.peakOutflow / FT3 / o1(T) - 1)).toBeLessThan(0.005);
    expect(Math.abs(result.peakOutflow / FT3 / peak2 - 1)).toBeLessThan(0.005);
    expect(Math.abs(first.maxStage / FOOT - (120 + o1(T) / c1))).toBeLessThan(0.01);
    expect(Math.abs(second.maxStage / FOOT - (100 + peak2 / c2))).toBeLessThan(0.01);
    // Every recorded step, rising and falling.
    const s = result.series!;
    for (let j = 0; j < s.time.length; j++) {
      expect(Math.abs(s.outfall[j] / FT3 - o2(s.time[j]))).toBeLessThan(0.005 * I);
      expect(Math.abs(s.outflow[0][j] / FT3 - o1(s.time[j]))).toBeLessThan(0.005 * I);
    }
    expect(first.peakReverse).toBe(0);
    expect(Math.abs(result.massBalanceError)).toBeLessThan(1e-4);
  });
});
