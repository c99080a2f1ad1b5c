// An underground system holds no storm above its top (or above the surface ponding the case permits):
// above the top only declared structures and surface ponding hold water, and a stage there means the
// water stands in the manholes or at the surface. Where the water would appear is said by
// report/surcharge.ts from the routed stage.
import { systemTop, surchargeLimit } from "../../storage/underground.js";
import { formatter } from "../../format.js";
import { depthSlack, failingSubjects, HAIR, makeCheck, type Rule } from "./rule.js";

export const surcharge: Rule = {
  kind: "surcharge",
  quantity: "elevation",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    const s = c.pond.storage;
    if (s.kind !== "underground") return;
    const limit = surchargeLimit(s);
    for (const { storm, result } of routings.design) {
      out.push(makeCheck("surcharge", storm.name, `${storm.name} no surcharge`, result.maxStage, limit, depthSlack(result.maxStage, limit, c.pond.bottom)));
    }
  },
  aim: () => HAIR,
  why: (check) => `the ${check.storm} storm nearly fills the underground system to its top`,
  remedy: () => "no single elevation step helps; larger openings near the top, a larger system, or declared storage above it (structures, surface ponding)",
  subject: (check) => check.storm,
  whyNothingComplies: ({ case: c, failing }) => {
    const s = c.pond.storage;
    const top = s.kind === "underground" ? formatter(c.units).elevation(systemTop(s)) : "its top";
    return `The ${failingSubjects(failing)} storm${new Set(failing.map((x) => x.storm)).size > 1 ? "s fill" : " fills"} the underground system above its top (${top}) with every layout tried; allow larger openings, or enlarge the system.`;
  },
};
