// Seeded invented ponds with a barrel (randomPonds with a barrel drawn for each) plus the demo outlet
// on the demo pond's elevations, and the fit's pattern of moving one part at a time: the fixtures of
// the sweep-reuse and lazy-rating checks.
import seedrandom from "seedrandom";
import type { Case, Element, Outlet, Tailwater } from "../../../src/model.js";
import { parseCase } from "../../../src/case/load.js";
import { circularBarrel, demoOutlet } from "../../hydraulics/barrelFixtures.js";
import { randomPonds } from "./randomPonds.js";

export function barrelPonds(seed: string, count: number): { c: Case; outlet: Outlet }[] {
  const random = seedrandom(seed);
  const cases = randomPonds(seed, count).map((pond) => {
    const c = parseCase(pond.json).case;
    const largest = c.outlet!.elements.reduce((m, e) => Math.max(m, e.type === "orifice" && e.shape === "circular" ? e.diameter : 0.3), 0.3);
    const barrel = circularBarrel(Math.max(0.3, largest * (0.8 + random())), "concrete-square-headwall", 0.002 + 0.03 * random(), { outletInvert: c.pond.bottom - 0.3, length: 20 + 40 * random() });
    return { c, outlet: { ...c.outlet!, barrel } as Outlet };
  });
  const demo = parseCase(randomPonds("demo pond", 1)[0].json).case;
  const ft = 0.3048;
  cases.push({ c: { ...demo, pond: { ...demo.pond, bottom: 99.5 * ft, top: 106 * ft, pool: 99.5 * ft } }, outlet: demoOutlet(18) });
  return cases;
}

function moved(e: Element, by: number): Element {
  return e.type === "weir" ? { ...e, crest: e.crest + by } : { ...e, invert: e.invert + by };
}

/** The outlet with one part (element i, or the rim for i = elements.length) raised or lowered. */
export function withMove(outlet: Outlet, i: number, by: number): Outlet {
  if (i < outlet.elements.length) return { ...outlet, elements: outlet.elements.map((e, k) => (k === i ? moved(e, by) : e)) };
  return { ...outlet, riser: { ...outlet.riser!, crest: outlet.riser!.crest + by } };
}

/** Each pond's outlet under a free outfall, a fixed tailwater at 30 % of the depth and a channel
 * rating, and the outlet without its barrel under the rating. */
export function underEachTailwater(cases: { c: Case; outlet: Outlet }[]): { c: Case; outlet: Outlet; tail: Tailwater }[] {
  return cases.flatMap(({ c, outlet }) => {
    const depth = c.pond.top - c.pond.bottom;
    const low = c.pond.bottom - 0.1;
    const tails: Tailwater[] = [
      { kind: "free" },
      { kind: "elevation", elevation: c.pond.bottom + 0.3 * depth },
      { kind: "rating", flows: [0, 0.05, 0.5, 5], elevations: [low, low + 0.2 * depth, low + 0.5 * depth, low + depth] },
    ];
    const { barrel: _barrel, ...withoutBarrel } = outlet;
    return tails.flatMap((tail) => [{ c, outlet, tail }, ...(tail.kind === "rating" ? [{ c, outlet: withoutBarrel as Outlet, tail }] : [])]);
  });
}
