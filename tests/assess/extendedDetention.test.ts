// Extended detention against Torricelli's closed form: a vertical-walled pond of plan area A draining
// through a small orifice of area a (head h above its centre) takes t = 2A/(Cd a sqrt(2g)) * (sqrt(h0)
// - sqrt(h1)) to fall from h0 to h1 (integral of A dh / (Cd a sqrt(2 g h))). The orifice's head stays
// above 7 diameters, where the contract's integrated orifice form and the centroid form agree to well
// under 0.1 %.
import { describe, expect, it } from "vitest";
import { extendedDetention } from "../../src/assess/rules/extendedDetention.js";
import { parseCase } from "../../src/case/load.js";
import type { Check } from "../../src/assess/rules/rule.js";
import { routed } from "./support.js";

const G = 9.80665;
const A = 50 * 30;
const C = 0.61 * (Math.PI / 4) * 0.025 ** 2 * Math.sqrt(2 * G); // Cd 0.61 (contract default), 25 mm orifice
const torricelliHours = (h0: number, h1: number) => ((2 * A) / C) * (Math.sqrt(h0) - Math.sqrt(h1)) / 3600;
const CENTRE = 0.0125; // the orifice's centre above the floor

function pond(rules: unknown[]) {
  return parseCase({
    name: "extended detention pond (invented)",
    units: "SI",
    pond: { bottom: 100, top: 106, storage: { prismoid: { length: 50, width: 30, sideSlope: 0 } } },
    storms: [{ name: "water quality", returnPeriod: 1, inflow: { series: [[0, 0], [60, 0.1], [120, 0]] } }],
    criteria: { drawdown: { depth: "0.2 m" }, extendedDetention: rules },
    outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "25 mm", invert: 100 }] },
  }).case;
}

function run(rules: unknown[], maxStage = 101): Check[] {
  const c = pond(rules);
  const out: Check[] = [];
  extendedDetention.evaluate({ case: c, outlet: c.outlet!, routings: { design: [routed(c.storms[0], 0.01, maxStage)] } }, out);
  return out;
}

describe("extended detention", () => {
  const toDrain = torricelliHours(1 - CENTRE, 0.2 - CENTRE); // about 352 h
  const toHalf = torricelliHours(1 - CENTRE, 0.5 - CENTRE);

  it("a water-quality volume (1500 m3 = 1 m over the floor) takes Torricelli's time to drain", () => {
    const [check] = run([{ volume: 1500, hours: 24, source: "county ordinance 5.3" }]);
    expect(check.value! / toDrain).toBeCloseTo(1, 2);
    expect(check.slack).toBeCloseTo((check.value! - 24) / 24, 12);
    expect(check.passed).toBe(true);
    expect(check.key).toBe("extended-detention:water-quality volume");
    expect(check.label).toBe("county ordinance 5.3");
  });

  it("the same volume as a depth over an area: 15 mm over 10 ha = 1500 m3", () => {
    const [check] = run([{ depth: "15 mm", area: "10 ha", hours: 24 }]);
    expect(check.value! / toDrain).toBeCloseTo(1, 2);
  });

  it("'no more than half within N hours' is the time to release half the volume, and fails when shorter", () => {
    const [check] = run([{ volume: 1500, hours: 400, share: 0.5 }]);
    expect(check.value! / toHalf).toBeCloseTo(1, 2);
    expect(check.value!).toBeLessThan(400);
    expect(check.slack).toBeCloseTo((check.value! - 400) / 400, 12);
    expect(check.passed).toBe(false);
    expect(check.name).toBe("water-quality volume takes at least 400 h to release 50 % of its volume");
  });

  it("a named storm drains from its routed peak stage; the edge passes", () => {
    const [first] = run([{ storm: "water quality", hours: 24 }], 101);
    expect(first.value! / toDrain).toBeCloseTo(1, 2);
    const [edge] = run([{ storm: "water quality", hours: first.value! }], 101);
    expect(edge.slack).toBeCloseTo(0, 12);
    expect(edge.passed).toBe(true);
  });

  it("needs exactly one of storm, volume or depth, a depth with its area, and a known storm", () => {
    expect(() => pond([{ hours: 24 }])).toThrow(/exactly one of storm, volume, depth/);
    expect(() => pond([{ depth: "15 mm", hours: 24 }])).toThrow(/area/);
    expect(() => pond([{ storm: "nope", hours: 24 }])).toThrow(/criteria\.extendedDetention\[0\]\.storm/);
  });
});
