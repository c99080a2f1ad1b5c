// Clogging: the openings' open area reduced by the assumed blocked share (50 % is common practice, not
// a published constant). Checked by hand: an orifice's flow is Cd*A*sqrt(2gH), so halving the open
// area halves the flow at the same head; the clogged twins of the "at most" checks appear beside the
// unclogged ones, or only for the named kinds.
import { describe, expect, it } from "vitest";
import { cloggedOutlet } from "../../src/assess/rules/clogging.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import { outletDischarge } from "../../src/hydraulics/outlet.js";
import { parseCase } from "../../src/case/load.js";
import { NO_SPILLWAY, routed, storm, testCase } from "./support.js";

const pond = { bottom: 100, top: 106, storage: { prismoid: { length: 50, width: 30, sideSlope: 0 } } };
const orificeOutlet = parseCase({
  name: "clogging pond (invented)",
  units: "SI",
  pond,
  storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [60, 0.1], [120, 0]] } }],
  outlet: {
    elements: [
      { type: "orifice", shape: "circular", diameter: "200 mm", invert: 100 },
      { type: "weir", shape: "rectangular", length: 1, crest: 103 },
    ],
  },
}).case.outlet!;

describe("clogged outlet", () => {
  it("halves a submerged orifice's flow and a weir's flow at 50 % (Q proportional to open area)", () => {
    const clogged = cloggedOutlet(orificeOutlet, 0.5);
    for (const ws of [101.5, 104.0]) {
      expect(outletDischarge(clogged, { kind: "free" }, ws)).toBeCloseTo(0.5 * outletDischarge(orificeOutlet, { kind: "free" }, ws), 12);
    }
    // Hand value at 101.5: centre 100.1, H = 1.4 m; Q = 0.61 * pi/4 * 0.2^2 * sqrt(2 * 9.80665 * 1.4) = 0.1001 m3/s
    // (the integrated form differs from the centroid form by well under 0.1 % at this head).
    expect(outletDischarge(clogged, { kind: "free" }, 101.5)).toBeCloseTo(0.5 * 0.61 * (Math.PI / 4) * 0.04 * Math.sqrt(2 * 9.80665 * 1.4), 3);
    expect(orificeOutlet.elements[0]).toMatchObject({ coefficient: 0.61 }); // the design outlet is untouched
  });

  it("adds clogged twins of every 'at most' check, with their own keys and the share in the name", () => {
    const s = storm("10-yr", 10, 1.0);
    const c = testCase([s], { clogging: { fraction: 0.5, checks: null, label: "common practice" } });
    const checks = evaluateChecks(c, NO_SPILLWAY, [routed(s, 0.9, 102)], () => [routed(s, 0.5, 104)]);
    const twin = checks.find((k) => k.key === "overtopping:10-yr:clogged")!;
    expect(twin.value).toBe(104);
    expect(twin.slack).toBeCloseTo((6 - 4) / 6, 12);
    expect(twin.name).toBe("10-yr no overtopping (50 % clogged, common practice)");
    expect(twin.condition).toBe("clogged");
    expect(checks.find((k) => k.key === "overtopping:10-yr")!.value).toBe(102);
    // Peak upper is "at most": clogged peak 0.5 against 1.0, slack 0.5; peak lower ("at least") is not twinned.
    expect(checks.find((k) => k.key === "peak-upper:10-yr:clogged")!.slack).toBeCloseTo(0.5, 12);
    expect(checks.some((k) => k.key === "peak-lower:10-yr:clogged")).toBe(false);
  });

  it("applies only to the named kinds when given", () => {
    const s = storm("10-yr", 10, 1.0);
    const c = testCase([s], { clogging: { fraction: 0.5, checks: ["freeboard"], label: null } });
    const checks = evaluateChecks(c, NO_SPILLWAY, [routed(s, 0.9, 102)], () => [routed(s, 0.5, 105.9)]);
    expect(checks.filter((k) => k.condition === "clogged").map((k) => k.key)).toEqual(["freeboard:10-yr:clogged"]);
    expect(checks.find((k) => k.condition === "clogged")!.passed).toBe(false); // 105.9 above 106 - 0.3
  });

  it("rejects a share outside (0, 1)", () => {
    expect(() => parseCase({ name: "x", units: "SI", pond, storms: [{ name: "a", returnPeriod: 1, inflow: { series: [[0, 0], [1, 1]] } }], criteria: { clogging: { fraction: 50 } } })).toThrow(/criteria\.clogging\.fraction/);
  });
});
