// `outfit route`: route every storm of a case through its outlet and check the criteria.
import { routeCase } from "../routing/routeCase.js";
import { assess } from "../assess/assess.js";
import { routeJson } from "../report/json.js";
import { routeReport, routingNotes } from "../report/console.js";
import { CaseError } from "../case/errors.js";
import { basename } from "node:path";
import { emit, load, positiveNumber } from "./common.js";

export interface RouteCommandOptions {
  json?: boolean;
  step?: string;
  verbose?: boolean;
  out?: string;
  check?: boolean;
}

export function routeCommand(path: string, options: RouteCommandOptions): number {
  const { case: c } = load(path);
  if (!c.outlet) {
    throw new CaseError([{ where: `${basename(path)}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to route (elements, riser, barrel, spillway)" }]);
  }
  const stepMinutes = positiveNumber("--step", options.step);
  const routing = routeCase(c, c.outlet, { step: stepMinutes === undefined ? undefined : stepMinutes * 60 });
  const assessment = assess(c, routing);
  if (options.json) emit(JSON.stringify(routeJson(c, routing, assessment), null, 2), options.out);
  else emit(routeReport(c, routing, assessment, options.verbose ? routingNotes(c, routing) : []), options.out);
  return options.check && !assessment.compliant ? 1 : 0;
}
