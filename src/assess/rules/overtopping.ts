// No storm's maximum stage above the top of embankment.
import { depthSlack, HAIR, HIGH_STAGE_REMEDY, highStageInfeasible, makeCheck, type Rule } from "./rule.js";

export const overtopping: Rule = {
  kind: "overtopping",
  quantity: "elevation",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    for (const { storm, result } of routings.design) {
      out.push(makeCheck("overtopping", storm.name, `${storm.name} no overtopping`, result.maxStage, c.pond.top, depthSlack(result.maxStage, c.pond.top, c.pond.bottom), c.criteria.labels.overtopping));
    }
  },
  aim: () => HAIR,
  why: (check) => `the ${check.storm} storm nearly overtops the embankment`,
  remedy: () => HIGH_STAGE_REMEDY,
  subject: (check) => check.storm,
  whyNothingComplies: highStageInfeasible,
};
