// Blocked principal outlet: with every opening, the riser and the barrel out of service, the spillway
// alone passes the named storm with at least the given freeboard below the top of embankment.
import type { Outlet } from "../../model.js";
import { depthSlack, failingSubjects, HAIR, makeCheck, type Rule } from "./rule.js";

export const BLOCKED_VARIANT = "principal-outlet-blocked";

/** The outlet with the principal outlet removed: the spillway alone (nothing at all without one). */
export function spillwayAlone(outlet: Outlet): Outlet {
  return { elements: [], spillway: outlet.spillway };
}

export const blockedOutlet: Rule = {
  kind: "blocked-outlet",
  quantity: "elevation",
  comparison: "at most",
  routings: [BLOCKED_VARIANT],
  variants: { [BLOCKED_VARIANT]: (c, outlet) => (c.criteria.blockedOutlet ? spillwayAlone(outlet) : null) },
  evaluate({ case: c, routings }, out) {
    const rule = c.criteria.blockedOutlet;
    const routed = routings[BLOCKED_VARIANT];
    if (!rule || !routed) return;
    const s = routed.find((x) => x.storm.name === rule.storm);
    if (!s) return;
    const limit = c.pond.top - rule.freeboard;
    out.push(makeCheck("blocked-outlet", s.storm.name, `${s.storm.name} spillway alone (principal outlet blocked) freeboard`, s.result.maxStage, limit, depthSlack(s.result.maxStage, limit, c.pond.bottom), rule.label));
  },
  aim: () => HAIR,
  why: (check) => `with the principal outlet blocked, the spillway alone barely passes the ${check.storm} storm below the freeboard level`,
  remedy: () => "no elevation step of the principal outlet helps (it is blocked in this check); a longer or lower spillway, a higher embankment, or more storage",
  subject: (check) => `${check.storm} with the principal outlet blocked`,
  whyNothingComplies: ({ failing }) =>
    `With the principal outlet blocked, the spillway alone cannot pass the ${failingSubjects(failing)} storm below its freeboard level, whatever the principal outlet; a longer or lower spillway, a higher embankment, or more storage.`,
};
