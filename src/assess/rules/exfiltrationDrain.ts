// A pond that exfiltrates (an infiltration basin or underground system) drains within the hours its
// exfiltration allows after every storm's peak stage (pond.exfiltration.drainHours, 72 h when not
// given: common practice). The time is the routing's drawdown: outlet and exfiltration together, to
// the drained stage.
import { HAIR, makeCheck, type Rule } from "./rule.js";

export const exfiltrationDrain: Rule = {
  kind: "exfiltration-drain",
  quantity: "hours",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    const x = c.pond.exfiltration;
    if (!x) return;
    for (const { storm, result } of routings.design) {
      const value = result.drawdownTime === null ? null : result.drawdownTime / 3600;
      out.push(makeCheck("exfiltration-drain", storm.name, `${storm.name} drain time`, value, x.drainHours, value === null ? -1 : (x.drainHours - value) / x.drainHours, x.label));
    }
  },
  aim: () => HAIR,
  why: (check) => `the storage drains slowly into the ground after the ${check.storm} storm`,
  remedy: () => "no single elevation step helps; a low opening to drain what the ground cannot take in time, or a larger exfiltrating area",
  subject: (check) => check.storm,
  whyNothingComplies: () => "The storage does not drain in time after some storms: the ground takes the water too slowly, and a low opening to help it conflicts with the smallest storm's target.",
};
