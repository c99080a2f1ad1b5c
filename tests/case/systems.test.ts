// A system of ponds in the case file: what is accepted, and every error naming its JSON path, the value
// found and what was expected (the case-format contract's "Systems of ponds").
import { describe, expect, it } from "vitest";
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";
import { FOOT } from "../../src/units.js";

const pond = (bottom: number) => ({ bottom, top: bottom + 5, storage: { prismoid: { length: 80, width: 50, sideSlope: 3 } } });
const orifice = (invert: number) => ({ elements: [{ type: "orifice", shape: "circular", diameter: "8 in", invert }] });
const series = { series: [[0, 0], [30, 5], [90, 0]] };

function system(changes: (json: Record<string, any>) => void = () => {}): Record<string, any> {
  const json: Record<string, any> = {
    name: "A system (invented)",
    units: "US",
    ponds: [
      { name: "north", pond: pond(104), outlet: orifice(104), to: "middle" },
      { name: "middle", pond: pond(102), outlet: orifice(102), to: "south" },
      { name: "south", pond: pond(100), outlet: orifice(100), to: "outfall" },
    ],
    storms: [{ name: "10-yr", returnPeriod: 10, target: 4, inflows: { north: series, south: series } }],
  };
  changes(json);
  return json;
}

/** The problems of a case that must not load: "where: found ..., expected ...". */
function problems(json: unknown): string[] {
  try {
    parseCase(json, { label: "case.json" });
  } catch (error) {
    if (error instanceof CaseError) return error.problems.map((p) => `${p.where}: found ${p.found}, expected ${p.expected}`);
    throw error;
  }
  throw new Error("the case loaded");
}

describe("a system of ponds in the case file", () => {
  it("loads: ponds in SI, where each drains, upstream first, each pond's inflow and the system's (their sum)", () => {
    const c = parseCase(system(), { label: "case.json" }).case;
    const s = c.system!;
    expect(s.ponds.map((p) => [p.name, p.to])).toEqual([["north", 1], ["middle", 2], ["south", -1]]);
    expect(s.order).toEqual([0, 1, 2]);
    expect(s.ponds[1].pond.bottom).toBeCloseTo(102 * FOOT, 12);
    // The case's pond and outlet are the pond at the outfall.
    expect(c.pond).toBe(s.ponds[2].pond);
    expect(c.outlet).toBe(s.ponds[2].outlet);
    const storm = c.storms[0];
    expect(storm.inflows![1]).toBeNull();
    expect(Math.max(...storm.inflow.flows) / FOOT ** 3).toBeCloseTo(10, 9);
    expect(storm.pondTargets).toEqual([null, null, null]);
  });
  it("orders the ponds upstream first whatever the file's order", () => {
    const c = parseCase(system((j) => j.ponds.reverse()), { label: "case.json" }).case;
    expect(c.system!.order.map((i) => c.system!.ponds[i].name)).toEqual(["north", "middle", "south"]);
  });
  it("takes pond targets and a barrel's outlet entrance", () => {
    const c = parseCase(system((j) => {
      j.storms[0].pondTargets = { middle: "3 cfs" };
      j.ponds[0].outlet = { elements: [], barrel: { shape: "circular", diameter: "18 in", length: 40, inletInvert: 104, outletInvert: 103.8, manningN: 0.013, entrance: "concrete-groove-headwall", outletEntrance: "concrete-square-headwall" } };
    }), { label: "case.json" }).case;
    expect(c.storms[0].pondTargets![1]! / FOOT ** 3).toBeCloseTo(3, 12);
    expect(c.system!.ponds[0].outlet.barrel!.outletEntrance).toBe("concrete-square-headwall");
  });

  it.each([
    ["a `to` naming no pond", (j: any) => (j.ponds[1].to = "southh"), 'case.json: ponds[1].to: found "southh", expected another pond\'s name (north, south) or "outfall"'],
    ["a pond draining into itself", (j: any) => (j.ponds[1].to = "middle"), 'ponds[1].to: found "middle", expected another pond\'s name or "outfall" (a pond cannot drain into itself)'],
    ["a cycle", (j: any) => (j.ponds[2].to = "north"), "a chain of ponds that reaches \"outfall\" (north -> middle -> south -> north is a cycle)"],
    ["two ponds of one name", (j: any) => (j.ponds[2].name = "north"), 'ponds[2].name: found "north", expected a pond name not used by another pond'],
    ["a pond named outfall", (j: any) => (j.ponds[2].name = "outfall"), 'ponds[2].name: found "outfall", expected a pond name other than "outfall"'],
    ["an inflow to no pond", (j: any) => (j.storms[0].inflows.east = series), 'storms[0].inflows.east: found "east", expected the name of a pond (north, middle, south)'],
    ["a pond target of no pond", (j: any) => (j.storms[0].pondTargets = { east: 2 }), 'storms[0].pondTargets.east: found "east", expected the name of a pond (north, middle, south)'],
    ["a storm's single inflow", (j: any) => (j.storms[0].inflow = series), "storms[0].inflow: found one inflow in a system of ponds, expected each pond's inflow under inflows"],
    ["an outlet beside the ponds", (j: any) => (j.outlet = orifice(100)), "case.json: outlet: found an outlet beside ponds, expected each pond's outlet under ponds[i].outlet"],
    ["a pond beside the ponds", (j: any) => (j.pond = pond(100)), "case.json: pond: found a pond beside ponds, expected either pond (with outlet) or ponds, not both"],
    ["a pond's own bad field, at its path", (j: any) => (j.ponds[1].pond.top = 101), "case.json: ponds[1].pond.top: found 101, expected an elevation above pond.bottom (102)"],
    ["a pond's outlet's bad field, at its path", (j: any) => (j.ponds[0].outlet.elements[0].diameter = "eight"), "ponds[0].outlet.elements[0].diameter"],
    ["a tailwater rating with two ponds at the outfall", (j: any) => { j.ponds[1].to = "outfall"; j.tailwater = { rating: [[0, 99], [10, 100]] }; }, "tailwater.rating: found a tailwater rating with several ponds draining to the outfall"],
    ["exfiltration in a pond of a system (the system router has none)", (j: any) => (j.ponds[0].pond.exfiltration = { rate: "0.5 in/h" }), "ponds[0].pond.exfiltration: found exfiltration in a system of ponds, expected no exfiltration in a pond of a system"],
    ["a drainage area for no pond", (j: any) => (j.hydrology = { ponds: { east: { area: 3, curveNumber: 80, tc: 20 } } }), 'hydrology.ponds.east: found "east", expected the name of a pond (north, middle, south)'],
    ["inflows in a case with one pond", (j: any) => { j.pond = pond(100); j.outlet = orifice(100); delete j.ponds; j.storms[0].inflow = series; }, "storms[0].inflows: found a value per pond, expected no inflows in a case with one pond"],
  ])("refuses %s, naming the path", (_name, change, expected) => {
    const found = problems(system(change));
    expect(found.some((p) => p.includes(expected)), found.join("\n")).toBe(true);
  });

  it("refuses a system where no pond drains to the outfall", () => {
    const found = problems(system((j) => { j.ponds[2].to = "middle"; }));
    expect(found.some((p) => p.includes('ponds: found no pond whose to is "outfall", expected at least one pond draining to "outfall"')), found.join("\n")).toBe(true);
    expect(found.some((p) => p.includes("middle -> south -> middle is a cycle")), found.join("\n")).toBe(true);
  });

  it("a ponds list of one takes a single pond's inflow", () => {
    const c = parseCase({ name: "one (invented)", units: "US", ponds: [{ name: "only", pond: pond(100), outlet: orifice(100), to: "outfall" }], storms: [{ name: "s", returnPeriod: 1, inflow: series }] }, { label: "case.json" }).case;
    expect(c.storms[0].inflows![0]).toBe(c.storms[0].inflow);
  });
});

describe("a bare-number size in a pond's outlet", () => {
  it("is warned of under that pond's path in the system's checks (a 12 ft orifice was meant as 12 in)", async () => {
    const { routeSystemCase } = await import("../../src/routing/routeSystem.js");
    const { assessSystem } = await import("../../src/assess/systemAssess.js");
    const c = parseCase(
      system((json) => {
        json.ponds[1].outlet.elements[0].diameter = 12;
      }),
      { label: "case.json" },
    ).case;
    const warnings = assessSystem(c, routeSystemCase(c)).warnings.filter((w) => w.reason.includes("bare number"));
    expect(warnings.map((w) => w.part)).toEqual(["ponds[1].outlet.elements[0].diameter"]);
  });
});
