// The pond's depth as a choice: an invented site (cases/site-groundwater) whose seasonal high
// groundwater and highest embankment limit the floor and the top gets a pond shallower than its
// maxDepth, and the trade-off says why; a variant where the outfall invert holds the floor up.
import { describe, expect, it } from "vitest";
import { loadCase } from "../../src/case/load.js";
import { choosePond, lowestFloor } from "../../src/sizing/pondChoice.js";
import { pondCostWeights } from "../../src/sizing/pondCost.js";
import type { Case } from "../../src/model.js";
import { caseProblems } from "../storage/support.js";
import { outfitWith } from "../cli/run.js";

const FT = 0.3048;
const choose = (c: Case) => choosePond({ site: c.site!, criteria: c.criteria, spillway: c.outlet?.spillway, tailwater: c.tailwater, storms: c.storms, costs: pondCostWeights(c.units, c.costs) });

describe("cases/site-groundwater: grade 100 ft, embankment at most 3 ft, groundwater 92 ft + 2 ft, spillway crest 101 ft", () => {
  const c = loadCase("cases/site-groundwater/case.json").case;
  const choice = choose(c);
  const depth = (o: { depth: number }) => Number((o.depth / FT).toFixed(6));

  it("chooses a pond shallower than maxDepth (10 ft): the cheapest of the depths that can be built", () => {
    expect(choice.chosen).not.toBeNull();
    expect(depth(choice.chosen!)).toBeLessThan(10);
    const feasible = choice.options.filter((o) => o.cost !== null);
    expect(feasible.length).toBeGreaterThan(1);
    for (const o of feasible) expect(choice.chosen!.cost!.total).toBeLessThanOrEqual(o.cost!.total);
  });

  it("the floor cannot go below 94 ft (groundwater 92 ft + 2 ft separation), so 10 ft would need a 4 ft embankment", () => {
    expect(lowestFloor(c.site!)).toEqual({ by: "groundwater", level: 94 * FT });
    const deepest = choice.options.find((o) => depth(o) === 10)!;
    expect(deepest.blocked).toMatchObject({ kind: "embankment", max: 3 * FT, floor: { by: "groundwater" } });
    expect((deepest.blocked as { height: number }).height / FT).toBeCloseTo(4, 9);
    // 9 ft: top 103 ft, the 3 ft embankment allowed; the floor held at 94 ft by the groundwater.
    const nine = choice.options.find((o) => depth(o) === 9)!;
    expect(nine.blocked).toBeNull();
    expect(nine.levels!.floor / FT).toBeCloseTo(94, 9);
    expect(nine.levels!.top / FT).toBeCloseTo(103, 9);
    expect(nine.floorAt?.by).toBe("groundwater");
    // Shallower than 8 ft the top falls below the spillway crest plus the freeboard (102 ft).
    for (const o of choice.options.filter((x) => depth(x) < 8)) expect(o.blocked?.kind).toBe("spillway");
  });

  it("a higher outfall invert (95 ft) holds the floor up instead: every depth's floor at 95 ft or above, and 9 ft needs too high an embankment", () => {
    const outfall = loadCase("cases/site-groundwater/case.json").case;
    outfall.site = { ...outfall.site!, outfallInvert: 95 * FT };
    expect(lowestFloor(outfall.site)).toEqual({ by: "outfall", level: 95 * FT });
    const k = choose(outfall);
    expect(k.options.find((o) => depth(o) === 9)!.blocked).toMatchObject({ kind: "embankment", floor: { by: "outfall" } });
    for (const o of k.options) if (o.levels) expect(o.levels.floor / FT).toBeGreaterThanOrEqual(95 - 1e-9);
    expect(depth(k.chosen!)).toBeLessThanOrEqual(8);
  });

  it("`outfit pond` shows the trade-off within 80 columns, and why each depth fails", () => {
    const run = outfitWith({ COLUMNS: "80" }, "pond", "cases/site-groundwater/case.json");
    expect(run.status).toBe(0);
    expect(Math.max(...run.stdout.split("\n").map((l) => l.length))).toBeLessThanOrEqual(80);
    expect(run.stdout).toMatch(/^10\.00( +-)+ +not possible$/m);
    expect(run.stdout).toMatch(/why: needs a 4\.00 ft embankment, more than the 3\.00 ft allowed: the floor\s+cannot go below 94\.00 ft: seasonal high groundwater 92\.00 ft \+ 2\.00 ft\s+separation/);
    expect(run.stdout).toMatch(/^ 8\.00 +94\.00 +102\.00 .* chosen$/m);
  });
});

describe("site fields checked like the rest", () => {
  it("a fixed floor (no existing grade) below the groundwater limit is refused, naming site.floor", () => {
    const json = { name: "x (invented)", units: "US", site: { floor: 20, maxDepth: 4, groundwater: { seasonalHigh: 19 } }, storms: [{ name: "s", returnPeriod: 2, target: 1, inflow: { series: [[0, 0], [10, 3], [40, 0]] } }] };
    // 19 ft + 2 ft separation (the default, common practice) = 21 ft > 20 ft.
    expect(caseProblems(json)).toMatch(/site\.floor: found 20, expected a floor at or above the seasonal high groundwater plus its separation, 21/);
  });
  it("neither floor nor existing grade: refused, naming site.floor", () => {
    const json = { name: "x (invented)", units: "US", site: { maxDepth: 4 }, storms: [{ name: "s", returnPeriod: 2, target: 1, inflow: { series: [[0, 0], [10, 3], [40, 0]] } }] };
    expect(caseProblems(json)).toMatch(/site\.floor: found nothing \(the field is missing\), expected the pond floor's elevation, or site\.existingGrade/);
  });
});
