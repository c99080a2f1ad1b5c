// The stepper written out for two ponds in a chain (`PairStepper` in src/routing/systemRouter.ts) against
// the general stepper it stands in for: every result and every point of every series the same, bit
// for bit, on the bundled two-ponds demo and the invented chains of the routing tests (flow back
// through an orifice link and through an equaliser pipe), with the automatic step, fixed steps, and
// step limits that make the router redo steps and empty a pond (the paths of a step solved again and
// of a stage held at the floor). The general stepper's own accuracy is checked against odex in
// systemOde.test.ts; this file only holds the two to the same bits.
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { loadCase } from "../../src/case/load.js";
import type { Case } from "../../src/model.js";
import { stormInflows, systemPonds } from "../../src/routing/routeSystem.js";
import { routeSystem, type SystemRouteOptions } from "../../src/routing/systemRouter.js";
import { equaliserPipe, orificeLinkWithReverse, systemOf } from "./support/systems.js";

const demo = loadCase(fileURLToPath(new URL("../../cases/two-ponds/case.json", import.meta.url))).case;

/** Routes every storm of a case with each stepper; returns both results per storm and option set. */
function bothSteppers(c: Case, options: SystemRouteOptions) {
  const system = c.system!;
  const { ponds } = systemPonds(c, system, system.ponds.map((p) => p.outlet));
  return c.storms.map((storm) => {
    const inflows = stormInflows(storm, system);
    return {
      storm: storm.name,
      pair: routeSystem(ponds, inflows, { ...options, record: true }),
      general: routeSystem(ponds, inflows, { ...options, record: true, general: true }),
    };
  });
}

/** A chain with its upper pond shrunk to a 10 ft x 10 ft pit: it fills and empties within a step or two. */
function tinyUpper(json: unknown): unknown {
  const copy = structuredClone(json) as { ponds: { pond: { storage: { prismoid: object } } }[] };
  copy.ponds[0].pond.storage.prismoid = { length: 10, width: 10, sideSlope: 1 };
  return copy;
}

const cases: [string, Case][] = [
  ["the two-ponds demo", demo],
  ["an orifice link with flow back", systemOf(orificeLinkWithReverse)],
  ["an equaliser pipe", systemOf(equaliserPipe)],
  ["an orifice link from a pit", systemOf(tinyUpper(orificeLinkWithReverse))],
  ["an equaliser pipe from a pit", systemOf(tinyUpper(equaliserPipe))],
  ["an orifice link, the lower pond listed first", systemOf({ ...orificeLinkWithReverse, ponds: [...orificeLinkWithReverse.ponds].reverse() })],
];

const optionSets: [string, SystemRouteOptions][] = [
  ["automatic step", {}],
  ["fixed 1-min step", { step: 60 }],
  ["fixed 7-s step", { step: 7 }],
  ["fixed 30-min step", { step: 1800 }],
  ["fixed 1-h step", { step: 3600 }],
  ["automatic steps up to 1 h, 30 % of the inflow's peak a step", { maxStep: 3600, inflowFraction: 0.3 }],
];

describe("two ponds in a chain: the written-out stepper gives the general stepper's bits", () => {
  for (const [name, c] of cases) {
    for (const [label, options] of optionSets) {
      it(`${name}, ${label}`, () => {
        for (const { storm, pair, general } of bothSteppers(c, options)) {
          // Everything the router returns, series included, compared as its exact text.
          expect(JSON.stringify(pair), `${storm}`).toBe(JSON.stringify(general));
          expect(pair.steps).toBeGreaterThan(0);
        }
      });
    }
  }

  it("the comparison passes through steps solved again, steps not converged and stages held at the floor", () => {
    // Which of the option sets above exercise the two rarer paths of a step (counted over all runs),
    // so that the bit-for-bit comparison is known to cover them.
    let redone = 0;
    let clamped = 0;
    let unconverged = 0;
    let back = 0;
    for (const [, c] of cases)
      for (const [, options] of optionSets)
        for (const { pair } of bothSteppers(c, options)) {
          redone += pair.redoneSteps;
          clamped += pair.clampedSteps;
          unconverged += pair.unconverged;
          back += pair.ponds[0].volumeBack;
        }
    expect(redone).toBeGreaterThan(0);
    expect(clamped).toBeGreaterThan(0);
    expect(unconverged).toBeGreaterThan(0);
    expect(back).toBeGreaterThan(0);
  });
});
