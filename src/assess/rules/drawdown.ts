// After its peak stage, every storm drains within drawdown.hours.
import { HAIR, makeCheck, type Rule } from "./rule.js";

export const drawdown: Rule = {
  kind: "drawdown",
  quantity: "hours",
  comparison: "at most",
  routings: ["design"],
  evaluate({ case: c, routings }, out) {
    const hours = c.criteria.drawdownHours;
    if (hours === null) return;
    for (const { storm, result } of routings.design) {
      const value = result.drawdownTime === null ? null : result.drawdownTime / 3600;
      out.push(makeCheck("drawdown", storm.name, `${storm.name} drawdown`, value, hours, value === null ? -1 : (hours - value) / hours, c.criteria.labels.drawdown));
    }
  },
  aim: () => HAIR,
  why: (check) => `the pond drains slowly after the ${check.storm} storm`,
  remedy: () => "no single elevation step helps; a larger low-flow opening at the floor",
  subject: (check) => check.storm,
  whyNothingComplies: () => "The pond drains too slowly after some storms; a larger low-flow opening conflicts with the smallest storm's target.",
};
