// The Cipolletti weir (src/parts/cipollettiWeir.ts): its formula against the published coefficient,
// its submergence, geometry, range of validity, file form and catalogue options, and a design of the
// invented case cases/cipolletti whose best compliant design uses one.
import { describe, expect, it } from "vitest";
import { parseCase, loadCase } from "../../src/case/load.js";
import { FOOT } from "../../src/units.js";
import { formatter } from "../../src/format.js";
import { partOf, elementToFile } from "../../src/parts/registry.js";
import { outlineHeight, outlineWidth } from "../../src/parts/outline.js";
import { cipollettiWeir, type CipollettiWeir } from "../../src/parts/cipollettiWeir.js";
import { outletWarnings } from "../../src/assess/warnings.js";
import { routeCase } from "../../src/routing/routeCase.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";

/** A case holding one element, in US or SI units. */
function caseWith(element: object, units: "US" | "SI" = "US") {
  return parseCase({
    name: "Cipolletti test pond (invented)",
    units,
    pond: { bottom: 100, top: 106, storage: { prismoid: { length: 100, width: 50, sideSlope: 3 } } },
    storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [60, 20], [180, 0]] } }],
    outlet: { elements: [element] },
  }).case;
}

const cfs = FOOT ** 3;

describe("Cipolletti weir", () => {
  // USBR Water Measurement Manual (3rd ed., 1997, rev. 2001) ch. 7 sec. 12, eq 7-7:
  // Q = 3.367 L h^1.5 (ft, cfs), velocity of approach neglected, sides 1 H : 4 V.
  it.each([
    [2, 0.2],
    [2, 0.5],
    [3, 1.0],
    [6, 2.0],
  ])("passes 3.367 L h^1.5 cfs (USBR WMM eq 7-7): L %f ft, h %f ft", (length, head) => {
    const c = caseWith({ type: "weir", shape: "cipolletti", length, crest: 103 });
    const e = c.outlet!.elements[0];
    const q = partOf(e).flow(e, (103 + head) * FOOT, -Infinity) / cfs;
    expect(q).toBeCloseTo(3.367 * length * head ** 1.5, 10);
  });

  it("in SI, C 1.859 is the published 3.367 ft^0.5/s converted (within 0.01 %)", () => {
    const us = caseWith({ type: "weir", shape: "cipolletti", length: 4, crest: 103 }).outlet!.elements[0] as CipollettiWeir;
    const si = caseWith({ type: "weir", shape: "cipolletti", length: 4 * FOOT, crest: 103 }, "SI").outlet!.elements[0] as CipollettiWeir;
    expect(Math.abs(si.coefficient / us.coefficient - 1)).toBeLessThan(1e-4);
    const head = 0.4;
    expect(partOf(si).flow(si, si.crest + head, -Infinity)).toBeCloseTo(1.859 * 4 * FOOT * head ** 1.5, 12);
  });

  it("is reduced by Villemonte's formula with n = 1.5, the exponent of its head law (Villemonte 1947)", () => {
    const e = caseWith({ type: "weir", shape: "cipolletti", length: 3, crest: 100 }, "SI").outlet!.elements[0];
    const free = partOf(e).flow(e, 100.5, -Infinity);
    for (const ratio of [0.2, 0.5, 0.9]) {
      expect(partOf(e).flow(e, 100.5, 100 + 0.5 * ratio) / free).toBeCloseTo((1 - ratio ** 1.5) ** 0.385, 12);
    }
    expect(partOf(e).flow(e, 100.5, 100.6)).toBe(0);
    expect(partOf(e).flow(e, 99.9, -Infinity)).toBe(0);
  });

  it("widens by a quarter of the head on each side (1 H : 4 V): its top width and its room on the wall", () => {
    const e = caseWith({ type: "weir", shape: "cipolletti", length: 2, crest: 100 }, "SI").outlet!.elements[0];
    const kind = partOf(e);
    expect(kind.widthAt(e, 100.8)).toBeCloseTo(2 + 2 * 0.8 / 4, 12);
    expect(kind.widthAt(e, 99.5)).toBe(0);
    // On its wall: 2.5 m wide 1 m above its crest, open to the top of its plate.
    expect(outlineWidth(kind.outline(e), 1)).toBeCloseTo(2.5, 12);
    expect(outlineHeight(kind.outline(e))).toBeNull();
    expect(kind.bottom(e)).toBe(100);
  });

  it("is flagged below 0.2 ft of head, above a third of its length, and with its crest less than two heads above the floor", () => {
    const f = formatter("US");
    const e = caseWith({ type: "weir", shape: "cipolletti", length: 3, crest: 103 }).outlet!.elements[0];
    const kind = partOf(e);
    const floor = 100 * FOOT;
    // Within range: head 0.9 ft <= 1 ft (L/3), crest 3 ft >= 2 x 0.9 ft above the floor, head >= 0.2 ft.
    expect(kind.warnings(e, { maxStage: 103.9 * FOOT, floor }, f)).toEqual([]);
    expect(kind.warnings(e, { maxStage: 103.1 * FOOT, floor }, f).join()).toMatch(/below 0\.20 ft/);
    expect(kind.warnings(e, { maxStage: 104.2 * FOOT, floor }, f).join()).toMatch(/exceeds a third of the crest length \(1\.00 ft\)/);
    expect(kind.warnings(e, { maxStage: 103.9 * FOOT, floor: 101.5 * FOOT }, f).join()).toMatch(/crest 1\.50 ft above the pond floor, less than twice the head of 0\.90 ft/);
    // The search's soft limit is the smaller of the two: L/3 = 1 ft, or half the crest's height, 1.5 ft.
    expect(kind.headLimit(e, floor)! / FOOT).toBeCloseTo(1, 12);
    expect(kind.headLimit(e, 101.5 * FOOT)! / FOOT).toBeCloseTo(0.75, 12);
  });

  it("the assessment names it in its warnings", () => {
    const c = caseWith({ type: "weir", shape: "cipolletti", length: 1, crest: 101 });
    const warnings = outletWarnings(c, c.outlet!, routeCase(c, c.outlet!));
    expect(warnings.some((w) => w.part === "outlet.elements[0] (1.00 ft Cipolletti weir)" && /a third of the crest length/.test(w.reason))).toBe(true);
  });

  it("is written back in the file's form, its coefficient explicit, and reads the same again", () => {
    const c = caseWith({ type: "weir", shape: "cipolletti", length: "18 in", crest: 102.5, keep: true });
    const file = elementToFile(c.outlet!.elements[0], "US");
    expect(file).toEqual({ type: "weir", shape: "cipolletti", length: 1.5, crest: 102.5, coefficient: 3.367, keep: true });
    expect(caseWith(file).outlet!.elements[0]).toEqual(c.outlet!.elements[0]);
  });

  it("is a catalogue shape: `shapes` must list it (not among the default shapes); its options step through the lengths", () => {
    const json = JSON.parse(JSON.stringify(loadCase("cases/cipolletti/case.json").json));
    const p = buildProblem(parseCase(json).case, parseCase(json).data);
    const options = p.parts.filter((o) => o.part === cipollettiWeir);
    expect(options.map((o) => o.key)).toEqual(["cipolletti 2", "cipolletti 3", "cipolletti 4", "cipolletti 5", "cipolletti 6"]);
    expect(options[2].words).toBe("4 ft Cipolletti weir");
    expect(cipollettiWeir.catalogue!.neighbours(options[2], options).map((o) => o.key)).toEqual(["cipolletti 3", "cipolletti 5"]);
    delete json.catalogue.weir.shapes;
    const defaults = buildProblem(parseCase(json).case, parseCase(json).data);
    expect(defaults.parts.some((o) => o.part === cipollettiWeir)).toBe(false);
  });

  it("a design of the invented case cases/cipolletti: its best compliant design uses a Cipolletti weir within the coefficient's range", async () => {
    const loaded = loadCase("cases/cipolletti/case.json");
    const p = buildProblem(loaded.case, loaded.data);
    const run = await runSearch(p, { seed: "cipolletti", budget: 6000, top: 3, starts: 3, beam: 3 });
    const best = run.candidates.find((c) => c.assessment.compliant);
    expect(best).toBeDefined();
    const weirs = best!.outlet.elements.filter((e) => partOf(e) === cipollettiWeir) as CipollettiWeir[];
    expect(weirs.length).toBe(1);
    // Routed through the route path: the highest stage over its crest stays within L/3 and half its height above the floor.
    const maxStage = Math.max(...best!.routing.storms.map((s) => s.result.maxStage));
    const head = maxStage - weirs[0].crest;
    expect(head).toBeGreaterThan(0);
    expect(head).toBeLessThanOrEqual(weirs[0].length / 3);
    expect(weirs[0].crest - loaded.case.pond.bottom).toBeGreaterThanOrEqual(2 * head);
    expect(best!.assessment.warnings).toEqual([]);
    expect(best!.file.elements!.some((e) => e.type === "weir" && e.shape === "cipolletti")).toBe(true);
  }, 120_000);
});
