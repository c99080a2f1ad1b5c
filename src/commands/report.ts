// `outfit report`: the review report of a case's outlet, or of a design run's candidates, as one
// self-contained HTML file (or Markdown with the plots as SVG files beside it).
import { basename, dirname, join } from "node:path";
import { existsSync } from "node:fs";
import { CaseError } from "../case/errors.js";
import { routeCase } from "../routing/routeCase.js";
import { assess } from "../assess/assess.js";
import { printErr, writeFileAtomic } from "../io.js";
import { caseReport } from "../report/review/caseReport.js";
import { designReport, type RoutedCandidate } from "../report/review/designReport.js";
import { isDirectory, loadDesignRun } from "../report/review/designRun.js";
import type { ReportDocument } from "../report/review/model.js";
import { renderHtml } from "../report/html/render.js";
import { renderMarkdown } from "../report/markdown.js";
import { load, positiveNumber, UsageError } from "./common.js";

export interface ReportCommandOptions {
  out?: string;
  format?: string;
  step?: string;
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
  let doc: ReportDocument;
  if (directory) {
    const run = loadDesignRun(input);
    for (const notice of run.notices) printErr(`outfit: note: ${notice}\n`);
    const routed: RoutedCandidate[] = run.candidates
      .map((candidate) => {
        const c = candidate.case;
        const routing = routeCase(c, c.outlet!, routeOptions);
        return { candidate, outlet: c.outlet!, routing, assessment: assess(c, routing) };
      })
      .sort((a, b) => a.candidate.reported.rank - b.candidate.reported.rank);
    doc = designReport(run, routed);
  } else {
    const { case: c } = load(input);
    if (!c.outlet) {
      throw new CaseError([{ where: `${basename(input)}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to report (elements, riser, barrel, spillway)" }]);
    }
    const routing = routeCase(c, c.outlet, routeOptions);
    doc = caseReport(c, { outlet: c.outlet, routing, assessment: assess(c, routing) }, input);
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
