// A link's table over both ponds' stages (routing/linkTable.ts) against the direct evaluation of the
// link (`linkFlow`: every part's formula, barrels by their pointwise HDS-5 forms), on seeded random
// pairs of stages over both ponds' ranges (each from its floor to its top plus half its depth, the
// table's range), half of them with the levels within a foot of each other
// (where the flow changes sign). And the reverse-flow physics by hand: a drowned orifice both ways,
// a weir drowned from the lower side, a level pipe alike both ways.
import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import { buildLinkTable } from "../../src/routing/linkTable.js";
import { linkFlow } from "../../src/hydraulics/link.js";
import { FOOT, GRAVITY } from "../../src/units.js";
import { systemOf } from "./support/systems.js";

const upper = { bottom: 102, top: 107, storage: { prismoid: { length: 90, width: 60, sideSlope: 3 } } };
const lower = { bottom: 100, top: 106, storage: { prismoid: { length: 120, width: 70, sideSlope: 3 } } };
function link(outlet: unknown) {
  const c = systemOf({
    name: "link (invented)",
    units: "US",
    ponds: [
      { name: "upper", pond: upper, outlet, to: "lower" },
      { name: "lower", pond: lower, outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "8 in", invert: 100 }] }, to: "outfall" },
    ],
    storms: [{ name: "s", returnPeriod: 1, inflows: { upper: { series: [[0, 0], [60, 1], [120, 0]] } } }],
  });
  return { outlet: c.system!.ponds[0].outlet, up: c.system!.ponds[0].pond, down: c.system!.ponds[1].pond };
}

const barrel = (diameter: string, inlet: number, outlet: number) => ({ shape: "circular", diameter, length: 80, inletInvert: inlet, outletInvert: outlet, manningN: 0.013, entrance: "concrete-square-headwall" });
/** Links, and whether their direct evaluation jumps somewhere in the ponds' range. */
const LINKS: [string, unknown, boolean][] = [
  ["orifices, a weir and a spillway", { elements: [{ type: "orifice", shape: "circular", diameter: "12 in", count: 2, invert: 102 }, { type: "weir", shape: "rectangular", length: 3, crest: 104.5 }], spillway: { crest: 106, length: 10, sideSlope: 3 } }, false],
  ["a level equaliser pipe", { elements: [], barrel: barrel("24 in", 102, 102) }, false],
  // Sloped, the pipe is adverse in reverse, where HDS-5's outlet-control approximation (ho = (dc + D)/2,
  // HW >= 0.75 D) holds still water up to 1.5 ft above its low end: the direct evaluation jumps there.
  ["a sloped equaliser pipe", { elements: [], barrel: barrel("24 in", 102, 101.5) }, true],
  ["openings in a riser over a barrel", { elements: [{ type: "orifice", shape: "circular", diameter: "6 in", invert: 102 }, { type: "orifice", shape: "circular", diameter: "10 in", invert: 103.5 }], riser: { shape: "circular", diameter: 4, crest: 105 }, barrel: barrel("18 in", 101.8, 101.2) }, false],
];

/** Errors of the table at seeded points: against the direct value (or a thousandth of the link's largest flow where that is larger), and against the largest flow. */
function errors(name: string, outlet: unknown): { relative: number[]; ofLargest: number } {
  const l = link(outlet);
  const table = buildLinkTable(l.outlet, l.up, l.down);
  const random = seedrandom(`link table ${name}`);
  const out: number[] = [];
  let ofLargest = 0;
  for (let k = 0; k < 600; k++) {
    // Within the table: each pond from its floor to its top plus half its depth.
    const x = (102 + 7.5 * random()) * FOOT;
    const y = k % 2 === 0 ? (100 + 9 * random()) * FOOT : Math.min(109 * FOOT, x + (random() - 0.5) * 2 * FOOT);
    const exact = linkFlow(l.outlet, x, y);
    const error = Math.abs(table.flow(x, y) - exact);
    out.push(error / Math.max(Math.abs(exact), 1e-3 * table.largestFlow));
    ofLargest = Math.max(ofLargest, error / table.largestFlow);
  }
  return { relative: out.sort((a, b) => a - b), ofLargest };
}

describe("a link's table against the direct evaluation", () => {
  // Stated accuracy (README, "Systems of ponds"): 95 % of points within 1 % of the direct value (or a
  // thousandth of the link's largest flow), 99 % within 3 % where the direct evaluation does not jump;
  // everywhere within 0.5 % of the link's largest flow (where it jumps, the table spreads the jump
  // over one cell).
  it.each(LINKS)("%s", (name, outlet, jumps) => {
    const { relative, ofLargest } = errors(name, outlet);
    expect(relative[Math.floor(0.95 * relative.length)]).toBeLessThan(0.01);
    if (!jumps) expect(relative[Math.floor(0.99 * relative.length)]).toBeLessThan(0.03);
    expect(ofLargest).toBeLessThan(0.005);
  }, 60_000);
});

describe("reverse flow by the parts' own formulas with the levels swapped", () => {
  it("an orifice drowned on both sides passes Cd A sqrt(2g |h1 - h2|) towards the lower level (HEC-22 eq 8-17, head the difference of the levels)", () => {
    const l = link({ elements: [{ type: "orifice", shape: "circular", diameter: "12 in", invert: 102 }] });
    const expected = 0.61 * (Math.PI / 4) * FOOT ** 2 * Math.sqrt(2 * GRAVITY * 0.3 * FOOT);
    expect(linkFlow(l.outlet, 104 * FOOT, 103.7 * FOOT) / expected).toBeCloseTo(1, 9);
    expect(linkFlow(l.outlet, 103.7 * FOOT, 104 * FOOT) / -expected).toBeCloseTo(1, 9);
  });
  it("a rectangular weir drowned from the lower side: Francis with Villemonte's reduction (HEC-22 eqs 8-19, 8-21)", () => {
    const l = link({ elements: [{ type: "weir", shape: "rectangular", length: 3, crest: 104 }] });
    const h = 0.8;
    const hd = 0.5;
    const expected = 3.33 * 3 * h ** 1.5 * (1 - (hd / h) ** 1.5) ** 0.385 * FOOT ** 3;
    expect(linkFlow(l.outlet, (104 + hd) * FOOT, (104 + h) * FOOT) / -expected).toBeCloseTo(1, 9);
    expect(linkFlow(l.outlet, (104 + h) * FOOT, (104 + hd) * FOOT) / expected).toBeCloseTo(1, 9);
  });
  it("a level pipe between the ponds passes the same flow either way for the same two levels", () => {
    const l = link({ elements: [], barrel: barrel("24 in", 102, 102) });
    for (const [a, b] of [[104, 103.5], [105, 104.9], [103, 102.2], [106.5, 103]]) {
      expect(linkFlow(l.outlet, a * FOOT, b * FOOT) / -linkFlow(l.outlet, b * FOOT, a * FOOT)).toBeCloseTo(1, 9);
    }
  });
});
