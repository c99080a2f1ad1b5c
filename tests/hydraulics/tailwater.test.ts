// A tailwater rating makes the downstream level depend on the outflow itself; the solved outflow must
// satisfy O = discharge(WS, TW(O)). Reference: a brute-force scan of O for the sign change.
import { describe, expect, it } from "vitest";
import type { Outlet, Tailwater } from "../../src/model.js";
import { dischargeAtTailwater, outletDischarge } from "../../src/hydraulics/outlet.js";
import { tailwaterLevel } from "../../src/hydraulics/tailwater.js";

const outlet: Outlet = {
  elements: [
    { type: "orifice", shape: "circular", diameter: 0.2, count: 1, invert: 10.0, coefficient: 0.61, keep: false },
    { type: "weir", shape: "rectangular", length: 1.0, crest: 11.0, endContractions: 2, coefficient: 1.84, keep: false },
  ],
  spillway: { crest: 12.0, length: 5, sideSlope: 3, coefficient: 1.55, keep: false },
};
const tail: Tailwater = { kind: "rating", flows: [0, 0.5, 2, 6], elevations: [9.6, 10.3, 11.1, 12.2] };

function bruteForce(ws: number): number {
  const high = dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, 0));
  const n = 200_000;
  for (let i = 1; i <= n; i++) {
    const q = (high * i) / n;
    if (dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, q)) < q) return q - high / (2 * n);
  }
  return high;
}

describe("outflow against a downstream channel rating", () => {
  it.each([10.1, 10.5, 11.2, 11.8, 12.3])("stage %f m agrees with a brute-force scan within 0.01 %", (ws) => {
    const solved = outletDischarge(outlet, tail, ws);
    const reference = bruteForce(ws);
    expect(Math.abs(solved - reference)).toBeLessThan(1e-4 * reference + 1e-9);
    // And it is the fixed point: O = discharge(WS, TW(O)).
    expect(dischargeAtTailwater(outlet, ws, tailwaterLevel(tail, solved)) / solved).toBeCloseTo(1, 6);
  });
  it("a constant tailwater above the pond stage stops all outflow (no reverse flow)", () => {
    expect(outletDischarge(outlet, { kind: "elevation", elevation: 11.5 }, 11.4)).toBe(0);
  });
});
