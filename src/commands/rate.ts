// `outfit rate`: the outlet's stage-discharge table, part by part.
import { basename } from "node:path";
import { CaseError } from "../case/errors.js";
import { niceStep, ratingCsv, ratingJson, ratingRows, ratingText } from "../report/rating.js";
import { layoutFor } from "../report/terminal.js";
import { baseLength } from "../units.js";
import { emit, load, positiveLength } from "./common.js";

export interface RateCommandOptions {
  stageStep?: string;
  csv?: boolean;
  json?: boolean;
  out?: string;
  wide?: boolean;
}

export function rateCommand(path: string, options: RateCommandOptions): number {
  const { case: c } = load(path);
  if (!c.outlet) {
    throw new CaseError([{ where: `${basename(path)}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to rate" }]);
  }
  const L = baseLength(c.units);
  const step = positiveLength("--stage-step", options.stageStep, c.units) ?? niceStep((c.pond.top - c.pond.bottom) / L) * L;
  const rows = ratingRows(c, c.outlet, step);
  if (options.json) emit(JSON.stringify(ratingJson(c, c.outlet, rows), null, 2), options.out);
  else if (options.csv) emit(ratingCsv(c, c.outlet, rows), options.out);
  else emit(ratingText(c, c.outlet, rows, layoutFor({ wide: options.wide, toFile: options.out !== undefined })), options.out);
  return 0;
}
