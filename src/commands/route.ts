// `outfit route`: route every storm of a case through its outlet and check the criteria.
import { routeCase } from "../routing/routeCase.js";
import { assess } from "../assess/assess.js";
import { routeJson } from "../report/json.js";
import { routeReport, routingNotes } from "../report/console.js";
import { CaseError } from "../case/errors.js";
import { basename } from "node:path";
import type { Case } from "../case/model.js";
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
  const { text, code } = routeOutput(c, basename(path), options);
  emit(text, options.out);
  return code;
}

/** What `route` prints for a loaded case, and its exit code (the loader fuzz runs this in process). */
export function routeOutput(c: Case, label: string, options: RouteCommandOptions): { text: string; code: number } {
  if (!c.outlet) {
    throw new CaseError([{ where: `${label}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to route (elements, riser, barrel, spillway)" }]);
  }
  const stepMinutes = positiveNumber("--step", options.step);
  const routing = routeCase(c, c.outlet, { step: stepMinutes === undefined ? undefined : stepMinutes * 60 });
  const assessment = assess(c, routing);
  const text = options.json
    ? JSON.stringify(routeJson(c, routing, assessment), null, 2)
    : routeReport(c, routing, assessment, options.verbose ? routingNotes(c, routing) : []);
  return { text, code: options.check && !assessment.compliant ? 1 : 0 };
}
