// Storms up to spillway.dryThrough years stay below the spillway crest.
import { depthSlack, failingSubjects, HAIR, HIGH_STAGE_REMEDY, makeCheck, type Rule } from "./rule.js";

export const spillwayDry: Rule = {
  kind: "spillway-dry",
  quantity: "elevation",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, outlet, routings }, out) {
    if (!outlet.spillway) return;
    for (const { storm, result } of routings.design) {
      if (storm.returnPeriod > c.criteria.spillwayDryThrough) continue;
      out.push(makeCheck("spillway-dry", storm.name, `${storm.name} spillway dry`, result.maxStage, outlet.spillway.crest, depthSlack(result.maxStage, outlet.spillway.crest, c.pond.bottom), c.criteria.labels.spillway));
    }
  },
  aim: () => HAIR,
  why: (check) => `the ${check.storm} storm rises close to the spillway crest`,
  remedy: () => HIGH_STAGE_REMEDY,
  subject: (check) => check.storm,
  whyNothingComplies: ({ failing }) =>
    `The ${failingSubjects(failing)} storm${new Set(failing.map((x) => x.storm)).size > 1 ? "s rise" : " rises"} to the spillway crest with every layout tried; allow larger openings below the crest or a wider riser, raise the spillway crest, or add storage.`,
};
