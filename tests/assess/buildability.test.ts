// The buildability rules, each against a hand computation: value, limit and slack (a fraction of the
// limit, both signs, the edge), the labels of limits from common practice, and the cases where a rule
// does not apply. SI, invented outlets; the limits are the support's defaults (web 0.15 m, level
// spacing and rim clearance 0.075 m) unless a test states others.
import { describe, expect, it } from "vitest";
import type { Outlet } from "../../src/model.js";
import type { Check, Rule } from "../../src/assess/rules/rule.js";
import { levelCount, levelSpacing } from "../../src/assess/rules/levelSpacing.js";
import { rimClearance } from "../../src/assess/rules/rimClearance.js";
import { notchWidth } from "../../src/assess/rules/notchWidth.js";
import { openingWeb } from "../../src/assess/rules/openingWeb.js";
import { barrelFit } from "../../src/assess/rules/barrelFit.js";
import { barrelCapacity } from "../../src/assess/rules/barrelCapacity.js";
import { minimumOpening } from "../../src/assess/rules/minimumOpening.js";
import { evaluateChecks } from "../../src/assess/checks.js";
import { exactBarrelFlow } from "../../src/hydraulics/barrel.js";
import { chordArc } from "../../src/parts/wall.js";
import { routed, storm, testCase } from "./support.js";

const G = 9.80665;
const INCH = 0.0254;
const two = storm("2-yr", 2, 0.1);
const c = testCase([two]);

const orifice = (diameter: number, invert: number, count = 1) => ({ type: "orifice", shape: "circular", diameter, count, invert, coefficient: 0.61, keep: false });
const rectangularWeir = (length: number, crest: number) => ({ type: "weir", shape: "rectangular", length, crest, endContractions: 2, coefficient: 1.84, keep: false });
const vNotch = (angle: number, crest: number) => ({ type: "weir", shape: "v-notch", angle, crest, coefficient: 1.38, keep: false });
const cipolletti = (length: number, crest: number) => ({ type: "weir", shape: "cipolletti", length, crest, coefficient: 1.859, keep: false });
const riser = (diameter: number, crest: number) => ({ shape: "circular", diameter, crest, coefficient: 1.66, orificeCoefficient: 0.6, keep: false });
const barrel = (diameter: number, inletInvert = 99.5) => ({ shape: "circular", diameter, length: 30, inletInvert, outletInvert: 99.2, manningN: 0.013, entrance: "concrete-square-headwall", keep: false });
const outletOf = (elements: object[], r?: object, b?: object) => ({ elements, ...(r ? { riser: r } : {}), ...(b ? { barrel: b } : {}) }) as unknown as Outlet;

function checksOf(rule: Rule, outlet: Outlet, maxStage = 101, kase = c): Check[] {
  const out: Check[] = [];
  rule.evaluate({ case: kase, outlet, routings: { design: [routed(two, 0.1, maxStage)] } }, out);
  return out;
}

describe("control levels at least the level spacing apart", () => {
  it("the smallest gap between distinct inverts and crests: 0.05 m against 0.075 m fails by a third", () => {
    const [check] = checksOf(levelSpacing, outletOf([orifice(0.15, 100), orifice(0.3, 100.05), rectangularWeir(1, 100.5)], riser(1.2, 101.5)));
    expect(check.value).toBeCloseTo(0.05, 12);
    expect(check.limit).toBe(0.075);
    expect(check.slack).toBeCloseTo((0.05 - 0.075) / 0.075, 12);
    expect(check.passed).toBe(false);
    expect(check.label).toBe("common practice");
    expect(check.name).toContain("0.075 m");
  });
  it("the edge passes; openings at one elevation are one level (no gap to judge)", () => {
    expect(checksOf(levelSpacing, outletOf([orifice(0.15, 100), orifice(0.3, 100.075)]))[0].passed).toBe(true);
    expect(checksOf(levelSpacing, outletOf([orifice(0.15, 100), orifice(0.3, 100)]))).toEqual([]);
  });
  it("counts openings closer than the spacing as one level, each group from its lowest", () => {
    // 0 and 0.05 together; 0.1 is 0.1 above 0, a level of its own; 0.3 another: three.
    expect(levelCount([0, 0.05, 0.1, 0.3], 0.075)).toBe(3);
    expect(levelCount([0, 0.05, 0.1], 0.25)).toBe(1);
    expect(levelCount([], 0.25)).toBe(0);
  });
});

describe("crests and tops at least the rim clearance below the rim", () => {
  it("a weir crest 0.05 m below the rim fails by a third; the highest top governs", () => {
    const [check] = checksOf(rimClearance, outletOf([orifice(0.3, 100), rectangularWeir(1, 100.95)], riser(1.2, 101)));
    expect(check.value).toBeCloseTo(0.05, 12);
    expect(check.slack).toBeCloseTo((0.05 - 0.075) / 0.075, 12);
    expect(check.name).toMatch(/^E2 crest/);
  });
  it("an orifice's top, not its invert: 0.3 m at 100.6 under a rim at 101 leaves 0.1 m", () => {
    const [check] = checksOf(rimClearance, outletOf([orifice(0.3, 100.6)], riser(1.2, 101)));
    expect(check.value).toBeCloseTo(0.1, 12);
    expect(check.slack).toBeCloseTo((0.1 - 0.075) / 0.075, 12);
  });
  it("the barrel's crown too, and nothing without a riser", () => {
    const [check] = checksOf(rimClearance, outletOf([orifice(0.15, 100)], riser(1.2, 100.5), barrel(0.9, 99.55)));
    expect(check.name).toMatch(/^barrel crown/);
    expect(check.value).toBeCloseTo(100.5 - 100.45, 12);
    expect(checksOf(rimClearance, outletOf([orifice(0.15, 100)]))).toEqual([]);
  });
});

describe("a notch or weir within the usable width of its wall", () => {
  it("a 90 degree v-notch 1.366 m below the rim of a 1.22 m riser: 2.73 m wide at the rim against 0.92 m", () => {
    // The reported case in feet: 4.48 ft of head, 90 degrees, 4.0 ft riser: 2 x 4.48 tan 45 = 8.96 ft
    // wide at the rim against 4.0 - 2 x 0.5 = 3.0 ft usable.
    const FOOT = 0.3048;
    const kase = testCase([two], { buildability: { ...c.criteria.buildability, web: 0.5 * FOOT } });
    const [check] = checksOf(notchWidth, outletOf([vNotch(90, 100)], riser(4 * FOOT, 100 + 4.48 * FOOT)), 102, kase);
    expect(check.value! / FOOT).toBeCloseTo(8.96, 9);
    expect(check.limit / FOOT).toBeCloseTo(3, 9);
    expect(check.slack).toBeCloseTo((3 - 8.96) / 3, 9);
    expect(check.passed).toBe(false);
  });
  it("a rectangular weir's length, a Cipolletti weir's width at the rim (its length plus a quarter of the height each side)", () => {
    expect(checksOf(notchWidth, outletOf([rectangularWeir(0.9, 100)], riser(1.2, 100.5)))[0].slack).toBeCloseTo((0.9 - 0.9) / 0.9, 12);
    const [check] = checksOf(notchWidth, outletOf([cipolletti(0.6, 100)], riser(1.2, 100.4)));
    expect(check.value).toBeCloseTo(0.6 + 0.4 / 2, 12);
    expect(check.slack).toBeCloseTo((0.9 - 0.8) / 0.9, 12);
  });
  it("a box riser's longest side; a headwall's stated width up to the highest stage; none of unstated width", () => {
    const box = { shape: "box", length: 2, width: 1, crest: 101, coefficient: 1.66, orificeCoefficient: 0.6, keep: false };
    expect(checksOf(notchWidth, outletOf([rectangularWeir(1.5, 100)], box))[0].limit).toBeCloseTo(2 - 0.3, 12);
    const kase = testCase([two], { buildability: { ...c.criteria.buildability, headwallWidth: 1.5 } });
    // No riser: the notch's plate reaches the highest stage routed, 100.5: 2 x 0.5 tan 60 = 1.732 m.
    const [check] = checksOf(notchWidth, outletOf([vNotch(120, 100)]), 100.5, kase);
    expect(check.value).toBeCloseTo(2 * 0.5 * Math.tan(Math.PI / 3), 12);
    expect(check.limit).toBeCloseTo(1.2, 12);
    expect(checksOf(notchWidth, outletOf([vNotch(120, 100)]), 100.5)).toEqual([]);
  });
});

describe("a clear web between the holes of a wall", () => {
  it("two 0.5 m orifices at one invert on a 1.2 m riser: 120 degrees apart (the nearest 5 degrees with twice the web)", () => {
    const [check] = checksOf(openingWeb, outletOf([orifice(0.5, 100, 2)], riser(1.2, 101)));
    // Twice the web (0.30 m, less a twentieth of the web) needs 0.6 dtheta - 1.2 asin(0.5/1.2) >= 0.2925, dtheta >= 77.2 degrees: 80.
    const web = 0.6 * ((80 * Math.PI) / 180) - chordArc(1.2, 0.5);
    expect(check.value).toBeCloseTo(web, 12);
    expect(check.slack).toBeCloseTo((web - 0.15) / 0.15, 12);
    expect(check.label).toBe("common practice");
  });
  it("fails when the openings of one level cannot keep the web around the riser: four 0.5 m orifices on a 0.9 m riser", () => {
    // Four arcs of 0.9 asin(0.5/0.9) = 0.5303 m leave 2.827 - 2.121 = 0.706 m, a quarter of it each: 0.177 m at best.
    const [check] = checksOf(openingWeb, outletOf([orifice(0.5, 100, 4)], riser(0.9, 101)));
    expect(check.value).toBeLessThanOrEqual((Math.PI * 0.9 - 4 * chordArc(0.9, 0.5)) / 4 + 1e-9);
    const [five] = checksOf(openingWeb, outletOf([orifice(0.5, 100, 5)], riser(0.9, 101)));
    expect(five.value).toBeLessThan(0.15);
    expect(five.passed).toBe(false);
  });
  it("not judged on a headwall of unstated width", () => {
    expect(checksOf(openingWeb, outletOf([orifice(0.5, 100, 4)]))).toEqual([]);
  });
});

describe("the barrel fits its riser and passes the riser's flow", () => {
  it("its width within the riser's diameter less a web each side: 0.6 m in a 0.9 m riser is the edge, 0.75 m fails by a quarter", () => {
    expect(checksOf(barrelFit, outletOf([], riser(0.9, 101), barrel(0.6)))[0].passed).toBe(true);
    const [check] = checksOf(barrelFit, outletOf([], riser(0.9, 101), barrel(0.75)));
    expect(check.slack).toBeCloseTo((0.6 - 0.75) / 0.6, 12);
  });
  it("full to the rim, the barrel carries at least the openings' flow at the rim", () => {
    // A 0.1 m orifice 1 m under the rim: Cd A sqrt(2 g h) at its centre, h = 0.95 m (the wetted-circle
    // integral is within 0.1 % of it this deep); the barrel's flow at a headwater of the rim from HDS-5's
    // exact headwater (the tabulated curve is within 0.015 %).
    const outlet = outletOf([orifice(0.1, 100)], riser(1.2, 101), barrel(0.3, 99.5));
    const [check] = checksOf(barrelCapacity, outlet);
    const orificeFlow = 0.61 * ((Math.PI * 0.1 * 0.1) / 4) * Math.sqrt(2 * G * 0.95);
    expect(check.limit / orificeFlow).toBeCloseTo(1, 3);
    expect(check.value! / exactBarrelFlow(outlet.barrel!, 101, -Infinity)).toBeCloseTo(1, 3);
    expect(check.passed).toBe(true);
    // Twelve 0.3 m orifices let in more than a 0.3 m barrel carries: the chamber fills before the rim works.
    const [full] = checksOf(barrelCapacity, outletOf([orifice(0.3, 100, 12)], riser(1.8, 101), barrel(0.3, 99.5)));
    expect(full.passed).toBe(false);
    expect(full.slack).toBeCloseTo((full.value! - full.limit) / full.limit, 12);
  });
  it("lists the barrel's checks with the outlet's (no storm), and does not twin them with clogging", () => {
    const clogged = testCase([two], { clogging: { fraction: 0.5, checks: ["barrel-fit", "barrel-capacity", "level-spacing"], label: null } });
    const outlet = outletOf([orifice(0.1, 100), orifice(0.1, 100.5)], riser(1.2, 101), barrel(0.3, 99.5));
    const checks = evaluateChecks(clogged, outlet, [routed(two, 0.1, 100.8)], () => [routed(two, 0.1, 100.8)]);
    const kinds = checks.map((k) => k.key);
    for (const key of ["barrel-fit:outlet", "barrel-capacity:outlet", "level-spacing:outlet"]) expect(kinds.filter((k) => k.startsWith(key))).toEqual([key]);
  });
});

describe("the minimum opening binds every opening kind", () => {
  const kase = testCase([two], { minimumOpening: { size: 3 * INCH, label: null } });
  it("a v-notch's width one minimum above its vertex: 2 m tan(angle/2); 45 degrees fails a 3 in minimum, 60 passes", () => {
    const [narrow] = checksOf(minimumOpening, outletOf([vNotch(45, 100)]), 101, kase);
    expect(narrow.value! / INCH).toBeCloseTo(2 * 3 * Math.tan(Math.PI / 8), 9);
    expect(narrow.value! / INCH).toBeCloseTo(2.485, 3);
    expect(narrow.passed).toBe(false);
    expect(checksOf(minimumOpening, outletOf([vNotch(60, 100)]), 101, kase)[0].value! / INCH).toBeCloseTo(3.464, 3);
  });
  it("a weir's crest length; the smallest of the outlet governs", () => {
    const [check] = checksOf(minimumOpening, outletOf([orifice(4 * INCH, 100), rectangularWeir(2.5 * INCH, 100.5), cipolletti(0.3, 100.8)]), 101, kase);
    expect(check.value).toBeCloseTo(2.5 * INCH, 12);
    expect(check.name).toContain("E2");
  });
});
