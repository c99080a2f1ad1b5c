// `outfit report`: the review report of a case's outlet, or of a design run's candidates, as one
// self-contained HTML file (or Markdown with the plots as SVG files beside it).
import { basename, dirname, join, resolve } from "node:path";
import { existsSync, readFileSync } from "node:fs";
import { createHash } from "node:crypto";
import { CaseError } from "../case/errors.js";
import { routeCase } from "../routing/routeCase.js";
import { assess } from "../assess/assess.js";
import { printErr, writeFileAtomic } from "../io.js";
import { caseReport } from "../report/review/caseReport.js";
import { systemCaseReport } from "../report/review/systemReport.js";
import { routeSystemCase, type SystemRouting } from "../routing/routeSystem.js";
import { assessSystem, outfallRoutings } from "../assess/systemAssess.js";
import { designReport, systemDesignReport, type RoutedCandidate } from "../report/review/designReport.js";
import { isDirectory, loadDesignRun } from "../report/review/designRun.js";
import type { ReportDocument } from "../report/review/model.js";
import { renderHtml } from "../report/html/render.js";
import { renderMarkdown } from "../report/markdown.js";
import { load, positiveLength, positiveNumber, UsageError } from "./common.js";
import { loadCase, type LoadedCase } from "../case/load.js";
import type { Hydrograph } from "../model.js";
import { Converter } from "../case/normalize.js";
import { caseHydrology, type CaseHydrology } from "../case/hydrology.js";
import type { ReportInputs } from "../report/review/caseReport.js";
import { estimateInputs } from "./volume.js";
import type { RunFacts } from "../report/review/project.js";

export interface ReportCommandOptions {
  out?: string;
  format?: string;
  step?: string;
  stageStep?: string;
  hydrographInterval?: string;
  /** The tool's version, written into the report. */
  version: string;
}

const FORMATS = ["html", "md"] as const;
type Format = (typeof FORMATS)[number];

/** Default output: beside a case file ("case.report.html"), inside a results directory ("report.html"). */
export function defaultOutput(input: string, directory: boolean, format: Format): string {
  if (directory) return join(input, `report.${format}`);
  const name = basename(input).replace(/\.json$/i, "");
  return join(dirname(input), `${name}.report.${format}`);
}

export function reportCommand(input: string, options: ReportCommandOptions): number {
  const format = (options.format ?? "html").toLowerCase();
  if (!(FORMATS as readonly string[]).includes(format)) throw new UsageError("--format", options.format ?? "", "html or md");
  const stepMinutes = positiveNumber("--step", options.step);
  const routeOptions = { record: true, step: stepMinutes === undefined ? undefined : stepMinutes * 60 };
  if (!existsSync(input)) {
    throw new CaseError([{ where: input, found: "no such file or directory", expected: "a case file (JSON) or a design run's results directory (outfit design --out DIR)" }]);
  }
  const directory = isDirectory(input);
  const settings = (loaded: LoadedCase, inputFiles: string[]): ReportInputs => ({
    project: loaded.data.project,
    run: runFacts(options.version, inputFiles),
    ...derivedHydrology(loaded),
    stageStep: positiveLength("--stage-step", options.stageStep, loaded.case.units),
    hydrographInterval: positiveNumber("--hydrograph-interval", options.hydrographInterval),
    estimates: loaded.case.file ? estimateInputs(loaded.case.file, loaded.case, null) : undefined,
  });
  let doc: ReportDocument;
  if (directory) {
    const run = loadDesignRun(input);
    for (const notice of run.notices) printErr(`outfit: note: ${notice}\n`);
    const systems = new Map<RoutedCandidate, SystemRouting>();
    const routed: RoutedCandidate[] = run.candidates
      .map((candidate) => {
        const c = candidate.case;
        if (c.system && c.system.ponds.length > 1) {
          // A system's candidate: its ponds routed together; the flow reaching the outfall stands for its routing.
          const system = routeSystemCase(c, undefined, routeOptions);
          const main = system.ponds.findIndex((p) => p.to < 0);
          const r: RoutedCandidate = { candidate, outlet: system.outlets[main], routing: { outlet: system.outlets[main], table: system.tables[main]!, storms: outfallRoutings(system) }, assessment: assessSystem(c, system) };
          systems.set(r, system);
          return r;
        }
        const routing = routeCase(c, c.outlet!, routeOptions);
        return { candidate, outlet: c.outlet!, routing, assessment: assess(c, routing) };
      })
      .sort((a, b) => a.candidate.reported.rank - b.candidate.reported.rank);
    const best = loadCase(routed[0].candidate.file);
    const files = [join(input, "results.json"), ...run.candidates.flatMap((k) => inputFilesOf(loadCase(k.file)))];
    const system = systems.get(routed[0]);
    if (system) {
      const inputs = settings(best, files);
      doc = systemDesignReport(run, routed, systemCaseReport(best.case, system, routed[0].assessment, routed[0].candidate.file, inputs), inputs);
    } else doc = designReport(run, routed, settings(best, files));
  } else {
    const loaded = load(input);
    const c = loaded.case;
    if (c.system && c.system.ponds.length > 1) {
      const routing = routeSystemCase(c, undefined, routeOptions);
      doc = systemCaseReport(c, routing, assessSystem(c, routing), input, settings(loaded, inputFilesOf(loaded)));
    } else if (!c.outlet) {
      throw new CaseError([{ where: `${basename(input)}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to report (elements, riser, barrel, spillway)" }]);
    } else {
      const inputs = settings(loaded, inputFilesOf(loaded));
      const routing = routeCase(c, c.outlet, routeOptions);
      doc = caseReport(c, { outlet: c.outlet, routing, assessment: assess(c, routing) }, input, inputs);
    }
  }
  const out = options.out ?? defaultOutput(input, directory, format as Format);
  if (format === "md") {
    const stem = basename(out).replace(/\.md$/i, "");
    const md = renderMarkdown(doc, stem, options.version);
    for (const figure of md.figures) writeFileAtomic(join(dirname(out), figure.file), figure.svg);
    writeFileAtomic(out, md.text);
    printErr(`outfit: wrote ${out} and ${md.figures.length} SVG figures beside it\n`);
  } else {
    writeFileAtomic(out, renderHtml(doc, options.version));
    printErr(`outfit: wrote ${out}\n`);
  }
  return 0;
}

/** The case file and every hydrograph file it reads (inflows, bypasses, further points' runoff). */
function inputFilesOf(loaded: LoadedCase): string[] {
  const file = loaded.case.file;
  const named = (source: { file?: string } | undefined) => (source?.file ? [resolve(dirname(file), source.file)] : []);
  const inflows = loaded.data.storms.flatMap((s) => [
    ...named(s.inflow),
    ...Object.values(s.inflows ?? {}).flatMap(named),
    ...named(s.bypass),
    ...(s.points ?? []).flatMap((p) => named(p.bypass)),
    ...(s.releaseLimits ?? []).flatMap((r) => named(r.preHydrograph)),
  ]);
  return [file, ...inflows];
}

/**
 * Date of the run (SOURCE_DATE_EPOCH, in seconds, fixes it for reproducible builds), the version and
 * a SHA-256 over the input files' names and bytes, in a stable order.
 */
function runFacts(version: string, files: string[]): RunFacts {
  const epoch = process.env.SOURCE_DATE_EPOCH;
  const date = epoch !== undefined && /^\d+$/.test(epoch) ? new Date(Number(epoch) * 1000) : new Date();
  const unique = [...new Set(files.map((f) => resolve(f)))].sort();
  const hash = createHash("sha256");
  for (const file of unique) {
    hash.update(basename(file)).update("\0");
    hash.update(readFileSync(file)).update("\0");
  }
  return { date: date.toISOString(), version, inputHash: hash.digest("hex"), inputFiles: unique.length };
}

/** The case's hydrology as derived, and each storm's pre-development runoff from it (hydrology.pre). */
function derivedHydrology(loaded: LoadedCase): { hydrology: CaseHydrology | null; preDevelopment: (Hydrograph | null)[] } {
  const data = loaded.data;
  if (!data.hydrology) return { hydrology: null, preDevelopment: data.storms.map(() => null) };
  const hydrology = caseHydrology(data, new Converter(data.units, basename(loaded.case.file || "case")));
  return { hydrology, preDevelopment: hydrology.storms.map((s) => s?.pre?.hydrograph ?? null) };
}
