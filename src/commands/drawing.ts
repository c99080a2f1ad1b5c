// `outfit drawing`: the outlet's elevation drawing alone, as a standalone SVG file (the report's figure).
import { basename, dirname, join } from "node:path";
import { CaseError } from "../case/errors.js";
import { routeCase } from "../routing/routeCase.js";
import { casePlan } from "../assess/rules/walls.js";
import { drawingInput } from "../report/drawing/input.js";
import { outletDrawing } from "../report/drawing/outletDrawing.js";
import { standaloneSvg } from "../report/plot/svg.js";
import { printErr, writeFileAtomic } from "../io.js";
import { load } from "./common.js";

export interface DrawingCommandOptions {
  out?: string;
}

/** Default output: beside the case file, "case.outlet.svg". */
export function defaultDrawingOutput(input: string): string {
  return join(dirname(input), `${basename(input).replace(/\.json$/i, "")}.outlet.svg`);
}

export function drawingCommand(input: string, options: DrawingCommandOptions): number {
  const { case: c } = load(input);
  if (!c.outlet) {
    throw new CaseError([{ where: `${basename(input)}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to draw (elements, riser, barrel, spillway)" }]);
  }
  // The storms are routed for their peak stages, drawn across the structure; the openings are placed
  // on their wall as route and the rules place them.
  const routing = routeCase(c, c.outlet);
  const out = options.out ?? defaultDrawingOutput(input);
  const plan = casePlan(c, c.outlet, routing.storms);
  writeFileAtomic(out, standaloneSvg(outletDrawing("outlet", drawingInput(c, c.outlet, routing.storms, plan))));
  printErr(`outfit: wrote ${out}\n`);
  return 0;
}
