// `outfit route`: route every storm of a case through its outlet and check the criteria.
import { join } from "node:path";
import { existsSync, statSync } from "node:fs";
import { routeCase } from "../routing/routeCase.js";
import { assess } from "../assess/assess.js";
import { routeJson } from "../report/json.js";
import { routeReport, routingNotes } from "../report/console.js";
import { seriesCsv, seriesJson, stormSeries } from "../report/series.js";
import { layoutFor } from "../report/terminal.js";
import { CaseError } from "../case/errors.js";
import { printErr, writeFileAtomic } from "../io.js";
import { basename } from "node:path";
import type { Case } from "../model.js";
import { emit, load, positiveNumber, safeName, UsageError } from "./common.js";

export interface RouteCommandOptions {
  json?: boolean;
  step?: string;
  verbose?: boolean;
  out?: string;
  check?: boolean;
  wide?: boolean;
  /** Directory for one CSV of the routed series per storm. */
  csvDir?: string;
  /** With --json: include each storm's routed series. */
  series?: boolean;
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
  if (options.series && !options.json) throw new UsageError("--series", "without --json", "--json --series (the CSV form is --csv-dir DIR)");
  if (options.csvDir !== undefined && existsSync(options.csvDir) && !statSync(options.csvDir).isDirectory()) {
    throw new UsageError("--csv-dir", options.csvDir, "a directory for the CSV series (this is a file)");
  }
  const stepMinutes = positiveNumber("--step", options.step);
  const record = options.csvDir !== undefined || options.series === true;
  const routing = routeCase(c, c.outlet, { step: stepMinutes === undefined ? undefined : stepMinutes * 60, record });
  const assessment = assess(c, routing);
  const tables = record ? routing.storms.map((sr) => stormSeries(c, routing.outlet, sr)) : [];
  if (options.csvDir !== undefined) {
    // Every file is computed first, then each is written whole.
    const used = new Set<string>();
    const files = routing.storms.map((sr, i) => {
      let name = `${safeName(sr.storm.name)}.csv`;
      for (let n = 2; used.has(name); n++) name = `${safeName(sr.storm.name)}-${n}.csv`;
      used.add(name);
      return { file: join(options.csvDir!, name), text: seriesCsv(tables[i]) };
    });
    for (const { file, text } of files) writeFileAtomic(file, text);
    printErr(`outfit: wrote ${files.length} series to ${options.csvDir}: ${files.map((f) => basename(f.file)).join(", ")}\n`);
  }
  const code = options.check && !assessment.compliant ? 1 : 0;
  if (options.json) {
    const json = routeJson(c, routing, assessment);
    if (options.series) json.storms.forEach((s, i) => Object.assign(s, { series: seriesJson(tables[i]) }));
    return { text: JSON.stringify(json, null, 2), code };
  }
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  return { text: routeReport(c, routing, assessment, options.verbose ? routingNotes(c, routing) : [], layout), code };
}
