// The freeboard storm's maximum stage at most the top of embankment less the freeboard depth.
import { depthSlack, HAIR, HIGH_STAGE_REMEDY, highStageInfeasible, makeCheck, type Rule } from "./rule.js";

export const freeboard: Rule = {
  kind: "freeboard",
  quantity: "elevation",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    const s = routings.design.find((x) => x.storm.name === c.criteria.freeboardStorm);
    if (!s) return;
    const limit = c.pond.top - c.criteria.freeboardDepth;
    out.push(makeCheck("freeboard", s.storm.name, `${s.storm.name} freeboard`, s.result.maxStage, limit, depthSlack(s.result.maxStage, limit, c.pond.bottom), c.criteria.labels.freeboard));
  },
  aim: () => HAIR,
  why: (check) => `the ${check.storm} storm rises close to the top of embankment less the freeboard`,
  remedy: () => HIGH_STAGE_REMEDY,
  subject: (check) => check.storm,
  whyNothingComplies: highStageInfeasible,
};
