// `outfit rate`: the outlet's stage-discharge table, part by part.
import { basename } from "node:path";
import { CaseError } from "../case/errors.js";
import { niceStep, ratingCsv, ratingJson, ratingRows, ratingText } from "../report/rating.js";
import { layoutFor } from "../report/terminal.js";
import { baseLength } from "../units.js";
import { emit, load, positiveLength, UsageError } from "./common.js";
import type { Case } from "../model.js";
import { pondCase } from "../assess/systemAssess.js";
import { chainWords } from "../report/systemReport.js";
import { downstreamStep, linkRating, linkRatingCsv, linkRatingJson, linkRatingText } from "../report/linkRating.js";
import { CAUTION, jsonHead } from "../report/caution.js";
import { wrap } from "../report/terminal.js";

export interface RateCommandOptions {
  /** A system of ponds: only this pond's rating (its link's table, or its rating at the outfall). */
  pond?: string;
  stageStep?: string;
  csv?: boolean;
  json?: boolean;
  out?: string;
  wide?: boolean;
}

export function rateCommand(path: string, options: RateCommandOptions): number {
  const { case: c } = load(path);
  if (c.system && c.system.ponds.length > 1) return rateSystem(c, options);
  if (options.pond !== undefined) throw new UsageError("--pond", options.pond, "a case with a system of ponds (ponds)");
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

/** `rate` on a system: each pond at the outfall as a single pond's rating, each link as a table of both stages. */
function rateSystem(c: Case, options: RateCommandOptions): number {
  const system = c.system!;
  const names = system.ponds.map((p) => p.name);
  if (options.pond !== undefined && !names.includes(options.pond)) throw new UsageError("--pond", options.pond, `the name of a pond (${names.join(", ")})`);
  const chosen = system.ponds.flatMap((p, i) => (options.pond === undefined || p.name === options.pond ? [i] : []));
  if (options.csv && chosen.length > 1) throw new UsageError("--csv", "a system of ponds", `--pond NAME with --csv (one table per file: ${names.join(", ")})`);
  const L = baseLength(c.units);
  const given = positiveLength("--stage-step", options.stageStep, c.units);
  const stepOf = (i: number) => given ?? niceStep((system.ponds[i].pond.top - system.ponds[i].pond.bottom) / L) * L;
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  const parts = chosen.map((i) => {
    const view = pondCase(c, system, i);
    const step = stepOf(i);
    if (system.ponds[i].to < 0) {
      const rows = ratingRows(view, view.outlet!, step);
      return { json: { name: names[i], to: "outfall", rating: ratingJson(view, view.outlet!, rows) }, csv: () => ratingCsv(view, view.outlet!, rows), text: () => ratingText(view, view.outlet!, rows, layout).replace(/^outfit rate: [^\n]*/, `Pond ${names[i]} (drains to the outfall):`) };
    }
    const downStep = options.json || options.csv ? given ?? stepOf(system.ponds[i].to) : downstreamStep(c, system, i, given ?? stepOf(system.ponds[i].to), layout);
    const rating = linkRating(system, i, step, downStep);
    return { json: linkRatingJson(c, system, i, rating), csv: () => linkRatingCsv(c, system, i, rating), text: () => linkRatingText(c, system, i, rating, layout) };
  });
  if (options.json) emit(JSON.stringify({ ...jsonHead("rate", c), ponds: parts.map((p) => p.json) }, null, 2), options.out);
  else if (options.csv) emit(parts[0].csv(), options.out);
  else {
    const head = wrap(`outfit rate: ${c.name} (${c.units} units), a system of ${names.length} ponds: ${chainWords(system)}`, layout.width);
    emit([head, ...parts.map((p) => ["", p.text()].join("\n"))].join("\n").replace(/\n\nCaution: [^]*?(?=\n\n|$)/g, "") + "\n\n" + wrap(`Caution: ${CAUTION}`, layout.width), options.out);
  }
  return 0;
}
