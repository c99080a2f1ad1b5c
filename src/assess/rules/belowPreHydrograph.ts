// The outflow hydrograph never above the pre-development hydrograph, at any instant of the latter's
// span (a release-limit form). The router reports the closest approach (RouteOptions.ceiling); the
// slack is that least margin as a fraction of the pre-development peak.
import { failingSubjects, HAIR, makeCheck, POINT_OF_ANALYSIS, type Rule } from "./rule.js";

export const belowPreHydrograph: Rule = {
  kind: "below-pre-hydrograph",
  quantity: "flow",
  comparison: "at most",
  routings: ["design"],
  evaluate({ routings }, out) {
    for (const { storm, result } of routings.design) {
      if (!storm.ceiling || !result.ceiling) continue;
      let peak = 0;
      for (const q of storm.ceiling.hydrograph.flows) if (q > peak) peak = q;
      const slack = peak > 0 ? result.ceiling.margin / peak : result.ceiling.margin >= 0 ? 0 : -1;
      // With a bypass the router compares the flow at the point of analysis (outflow plus bypass).
      const what = storm.bypass ? `flow at the ${POINT_OF_ANALYSIS}` : "outflow";
      const check = makeCheck("below-pre-hydrograph", storm.name, `${storm.name} ${what} ${storm.ceiling.statement} at every instant`, result.ceiling.outflow, result.ceiling.limit, slack, storm.ceiling.label);
      if (storm.bypass) check.point = POINT_OF_ANALYSIS;
      out.push(check);
    }
  },
  aim: () => HAIR,
  why: (check) => `the ${check.storm} outflow comes close to the pre-development hydrograph at some instant`,
  remedy: () => "no single elevation step helps; a smaller opening at the level active when the pre-development hydrograph is low (often its rising limb or tail), or more storage",
  subject: (check) => `${check.storm} closest outflow to the pre-development hydrograph`,
  whyNothingComplies: ({ failing }) =>
    `The ${failingSubjects(failing)} outflow rises above the pre-development hydrograph at some instant with every layout tried; allow smaller openings at the levels active on its rising limb or tail, or add storage.`,
};
