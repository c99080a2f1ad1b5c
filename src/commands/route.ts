// `outfit route`: route every storm of a case through its outlet and check the criteria.
import { join } from "node:path";
import { existsSync, statSync } from "node:fs";
import { routeCase } from "../routing/routeCase.js";
import { assess } from "../assess/assess.js";
import { routeJson } from "../report/json.js";
import { routeReport, routingNotes } from "../report/console.js";
import { seriesCsv, seriesJson, stormSeries, type SeriesTable } from "../report/series.js";
import { routeSystemCase } from "../routing/routeSystem.js";
import { assessSystem } from "../assess/systemAssess.js";
import { singlePondJson, systemRouteJson, systemRouteReport, systemRoutingNotes, systemSeries } from "../report/systemReport.js";
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
  if (c.system && c.system.ponds.length > 1) return systemRouteOutput(c, options);
  if (!c.outlet) {
    throw new CaseError([{ where: `${label}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to route (elements, riser, barrel, spillway)" }]);
  }
  const { step, record } = routeOptions(options);
  const routing = routeCase(c, c.outlet, { step, record });
  const assessment = assess(c, routing);
  const tables = record ? routing.storms.map((sr) => stormSeries(c, routing.outlet, sr)) : [];
  if (options.csvDir !== undefined) writeSeries(options.csvDir, routing.storms.map((s) => s.storm.name), tables);
  const code = options.check && !assessment.compliant ? 1 : 0;
  if (options.json) {
    const json = routeJson(c, routing, assessment);
    // A pond written as a `ponds` list of one: the single pond's results, and each storm's `ponds`.
    if (c.system) json.storms.forEach((s, i) => Object.assign(s, { ponds: singlePondJson(c, routing.storms[i]) }));
    if (options.series) json.storms.forEach((s, i) => Object.assign(s, { series: seriesJson(tables[i]) }));
    return { text: JSON.stringify(json, null, 2), code };
  }
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  return { text: routeReport(c, routing, assessment, options.verbose ? routingNotes(c, routing) : [], layout), code };
}

/** Checks the options every route takes: --series only with --json, --csv-dir a directory; the fixed step (s). */
function routeOptions(options: RouteCommandOptions): { step: number | undefined; record: boolean } {
  if (options.series && !options.json) throw new UsageError("--series", "without --json", "--json --series (the CSV form is --csv-dir DIR)");
  if (options.csvDir !== undefined && existsSync(options.csvDir) && !statSync(options.csvDir).isDirectory()) {
    throw new UsageError("--csv-dir", options.csvDir, "a directory for the CSV series (this is a file)");
  }
  const stepMinutes = positiveNumber("--step", options.step);
  return { step: stepMinutes === undefined ? undefined : stepMinutes * 60, record: options.csvDir !== undefined || options.series === true };
}

/** One CSV per storm in the directory: every file is computed first, then each is written whole. */
function writeSeries(directory: string, storms: readonly string[], tables: readonly SeriesTable[]): void {
  const used = new Set<string>();
  const files = storms.map((storm, i) => {
    let name = `${safeName(storm)}.csv`;
    for (let n = 2; used.has(name); n++) name = `${safeName(storm)}-${n}.csv`;
    used.add(name);
    return { file: join(directory, name), text: seriesCsv(tables[i]) };
  });
  for (const { file, text } of files) writeFileAtomic(file, text);
  printErr(`outfit: wrote ${files.length} series to ${directory}: ${files.map((f) => basename(f.file)).join(", ")}\n`);
}

/** `route` on a system of ponds: all ponds routed together, checked per pond and at the outfall. */
function systemRouteOutput(c: Case, options: RouteCommandOptions): { text: string; code: number } {
  const { step, record } = routeOptions(options);
  const routing = routeSystemCase(c, undefined, { step, record });
  const assessment = assessSystem(c, routing);
  const tables = record ? routing.storms.map((_, k) => systemSeries(c, routing, k)) : [];
  if (options.csvDir !== undefined) writeSeries(options.csvDir, routing.storms.map((s) => s.storm.name), tables);
  const code = options.check && !assessment.compliant ? 1 : 0;
  if (options.json) {
    const json = systemRouteJson(c, routing, assessment);
    if (options.series) json.storms.forEach((s, i) => Object.assign(s, { series: seriesJson(tables[i]) }));
    return { text: JSON.stringify(json, null, 2), code };
  }
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  return { text: systemRouteReport(c, routing, assessment, options.verbose ? systemRoutingNotes(routing) : [], layout), code };
}
