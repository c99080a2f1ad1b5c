// The peak at each further point of analysis of a storm (a site that drains two ways) at most the
// upper edge of that point's target band. At a point the pond's outflow reaches, the flow is the
// outflow plus the runoff joining there (the router tracks the sum); at a point it does not reach,
// the runoff alone, which no outlet changes (the check then says so, and is not twinned when clogged).
import type { AnalysisPoint, Case, Storm } from "../../model.js";
import type { RouteResult } from "../../routing/router.js";
import { formatter } from "../../format.js";
import { narrowed, targetBand } from "./band.js";
import { aimMargin } from "./peakUpper.js";
import { failingSubjects, makeCheck, upperFlowSlack, type Check, type Rule } from "./rule.js";

const KIND = "further-point-peak";

/** The largest flow at a further point in one routing of the storm (m3/s). */
export function furtherPointPeak(storm: Storm, point: AnalysisPoint, result: RouteResult): number {
  if (point.pond) {
    const index = storm.points.filter((p) => p.pond).indexOf(point);
    return result.downstream?.[index]?.peak ?? result.peakOutflow;
  }
  let peak = 0;
  if (point.bypass) for (const q of point.bypass.flows) if (q > peak) peak = q;
  return peak;
}

/** The point a check of this rule is about. */
function pointOf(c: Case, check: Check): AnalysisPoint | undefined {
  return c.storms.find((s) => s.name === check.storm)?.points.find((p) => p.name === check.point);
}

export const furtherPointPeakRule: Rule = {
  kind: KIND,
  quantity: "flow",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings, condition }, out) {
    for (const { storm, result } of routings.design) {
      for (const point of storm.points ?? []) {
        if (point.target === null || (condition === "clogged" && !point.pond)) continue;
        const upper = targetBand(point.target, c.criteria)[1];
        const peak = furtherPointPeak(storm, point, result);
        const check = makeCheck(KIND, storm.name, `${storm.name} peak at ${point.name} within upper band`, peak, upper, upperFlowSlack(peak, upper), point.label);
        check.key += `:${point.name}`;
        check.point = point.name;
        out.push(check);
      }
    }
  },
  aim(c, check, margin) {
    const point = pointOf(c, check);
    if (!point?.target) return 0;
    const high = targetBand(point.target, narrowed(c.criteria, aimMargin(c.criteria, margin)))[1];
    return (check.limit - high) / check.limit;
  },
  why: (check) => `the ${check.storm} flow at ${check.point} comes close to its allowable peak`,
  remedy: () => "no single elevation step helps at a point the pond's outflow reaches: a smaller opening at the level that holds this storm, or more storage; at a point it does not reach, only detaining or redirecting the area draining there",
  subject: (check) => `${check.storm} peak at ${check.point}`,
  whyNothingComplies: ({ case: c, failing }) => {
    const undetained = failing.filter((check) => pointOf(c, check)?.pond === false);
    const f = formatter(c.units);
    if (undetained.length > 0) {
      const first = undetained[0];
      return (
        `The runoff reaching ${first.point} does not pass through the pond and alone exceeds its allowable peak in the ${failingSubjects(undetained)} storm ` +
        `(${f.flow(first.value ?? 0)} against ${f.flow(first.limit)}); no outlet changes it: detain or redirect the area draining there, or review that point's target.`
      );
    }
    return `Some storms exceed the allowable peak at a further point of analysis the pond's outflow reaches (${failingSubjects(failing)}) with every layout tried; allow smaller openings or more control levels, or add storage.`;
  },
};
