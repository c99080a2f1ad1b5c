// What the minimum opening costs a storm's target: the smallest permitted circular orifice alone at
// the lowest level (the pool, or the floor of a dry pond, where a design's lowest opening sits), with
// the design's barrel, must release no more than the storm's upper band. Openings only add flow, so
// when this fails no outlet of permitted openings can meet the target: the check says so plainly
// instead of leaving the search to fail on the peak.
import type { Case, Outlet } from "../../model.js";
import { partOf } from "../../parts/registry.js";
import { circularOrifice } from "../../parts/circularOrifice.js";
import { limitWords, targetBand } from "./band.js";
import { atPointWords, failingSubjects, makeCheck, POINT_OF_ANALYSIS, upperFlowSlack, type Rule } from "./rule.js";

export const SMALLEST_VARIANT = "smallest-permitted-opening";

/** The smallest permitted orifice alone at the lowest level, draining through the design's barrel. */
export function smallestPermittedOutlet(c: Case, outlet: Outlet, diameter: number): Outlet {
  // The design's own orifice coefficient, else the kind's default (Cd 0.61: the contract's).
  let coefficient = circularOrifice.defaultCoefficient(c.units)!;
  for (const e of outlet.elements) {
    const cd = partOf(e).dischargeCoefficient(e);
    if (cd !== null) {
      coefficient = cd;
      break;
    }
  }
  return { elements: [{ type: "orifice", shape: "circular", diameter, count: 1, invert: c.pond.pool, coefficient, keep: false }], barrel: outlet.barrel };
}

export const minimumOpeningRelease: Rule = {
  kind: "minimum-opening-release",
  quantity: "flow",
  comparison: "at most",
  routings: [SMALLEST_VARIANT],
  variants: { [SMALLEST_VARIANT]: (c, outlet) => (c.criteria.minimumOpening ? smallestPermittedOutlet(c, outlet, c.criteria.minimumOpening.size) : null) },
  evaluate({ case: c, routings }, out) {
    const rule = c.criteria.minimumOpening;
    const routed = routings[SMALLEST_VARIANT];
    if (!rule || !routed) return;
    for (const { storm, result } of routed) {
      if (storm.target === null) continue;
      const upper = targetBand(storm.target, c.criteria)[1];
      // At the point of analysis the bypass joins the smallest opening's release too.
      const peak = result.peakAtPoint;
      const check = makeCheck("minimum-opening-release", storm.name, `${storm.name} target${atPointWords(storm)} reachable with the minimum opening${limitWords(storm)}`, peak, upper, upperFlowSlack(peak, upper), rule.label);
      if (storm.bypass) check.point = POINT_OF_ANALYSIS;
      out.push(check);
    }
  },
  aim: () => 0,
  why: (check) => `even the smallest opening the rules permit, alone at the lowest level, releases about the ${check.storm} storm's allowable peak: the target cannot be met with openings of that size`,
  remedy: () => "no outlet change helps: more storage below the first opening, a permanent pool, a flow regulator where the rules allow it, or a variance from the minimum opening",
  subject: (check) => `${check.storm} peak through the smallest permitted opening`,
  whyNothingComplies: ({ failing }) =>
    `Even the smallest opening the rules permit, alone at the lowest level, releases more than the ${failingSubjects(failing)} storm's allowable peak, so no outlet of permitted openings meets it; add storage below the first opening, a permanent pool, a flow regulator where the rules allow it, or seek a variance from the minimum opening.`,
};
