// Extended detention: a named storm's stored volume, or a water-quality volume, takes at least N hours
// to release a given share of itself (the whole of it, by default: "at least N hours to drain"; a
// share s below 1 states "no more than s within N hours"). Distinct from drawdown, which is an upper
// limit on the drain time of every storm. The time is the level-pool drain from the storm's peak stage
// (or the stage holding the water-quality volume above the pool) with no further inflow: for a storm
// this leaves out the inflow still arriving after the peak, which would only lengthen the time, so
// the check errs on the safe side.
import { drainedStage } from "../../routing/routeCase.js";
import { drainTime, stageOfVolume } from "../../routing/drainTime.js";
import { storageCurve } from "../../storage/curve.js";
import { failingSubjects, HAIR, makeCheck, type Check, type Rule, type RuleInput } from "./rule.js";

export const WATER_QUALITY = "water-quality volume";

export const extendedDetention: Rule = {
  kind: "extended-detention",
  quantity: "hours",
  comparison: "at least",
  routings: ["design"],
  evaluate(input, out) {
    evaluateForms(input, out, false);
  },
  // More flow at every stage lowers a storm's peak stage and drains any start faster, so a full
  // drain only gets shorter as openings are added; a share below 1 is left out (its end stage moves
  // with the start).
  boundFirstLevel(input, out) {
    evaluateForms(input, out, true);
  },
  aim: () => HAIR,
  why: (check) => `the ${check.storm} is released faster than the extended-detention rule allows`,
  remedy: () => "no single elevation step helps; a smaller opening at the lowest level (or fewer of them), or raise the openings above it",
  subject: (check) => `${check.storm} release time`,
  whyNothingComplies: ({ failing }) =>
    `The ${failingSubjects(failing)} is released faster than the extended-detention rule allows with every layout tried; allow a smaller lowest opening (or a flow regulator), or raise the openings above it.`,
};

function evaluateForms({ case: c, outlet, routings, direct }: RuleInput, out: Check[], fullOnly: boolean): void {
  if (c.criteria.extendedDetention.length === 0) return;
  const storage = storageCurve(c.pond);
  const poolVolume = storage.volume(c.pond.pool);
  for (const rule of c.criteria.extendedDetention) {
    if (fullOnly && rule.share < 1) continue;
    let from: number;
    if (rule.storm !== null) {
      const s = routings.design.find((x) => x.storm.name === rule.storm);
      if (!s) continue;
      from = s.result.maxStage;
    } else from = stageOfVolume(storage, c.pond, poolVolume + rule.volume!);
    const full = rule.share >= 1;
    const stored = storage.volume(from) - poolVolume;
    const to = full ? Math.max(drainedStage(c), c.pond.pool) : stageOfVolume(storage, c.pond, poolVolume + (1 - rule.share) * stored);
    const hours = Math.min(drainTime(storage, outlet, c.tailwater, from, to, direct), 1e12) / 3600;
    const subject = rule.storm ?? WATER_QUALITY;
    const what = full ? "to drain" : `to release ${+(100 * rule.share).toPrecision(6)} % of its volume`;
    out.push(makeCheck("extended-detention", subject, `${subject} takes at least ${rule.hours} h ${what}`, hours, rule.hours, (hours - rule.hours) / rule.hours, rule.label));
  }
}
