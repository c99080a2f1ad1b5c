#!/usr/bin/env node
// Command-line wiring only: parse, call, print, exit code.
import { readFileSync } from "node:fs";
import { Command, CommanderError } from "commander";
import { routeCommand } from "./commands/route.js";
import { rateCommand } from "./commands/rate.js";
import { reportCommand } from "./commands/report.js";
import { isUserError } from "./commands/common.js";
import { CAUTION } from "./report/caution.js";

const version = (JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { version: string }).version;

/** Runs a command and turns user errors into a message and exit code 2, never a stack trace. */
function run(action: () => number): void {
  try {
    process.exitCode = action();
  } catch (error) {
    if (isUserError(error)) {
      process.stderr.write(`outfit: error:\n${error.message.split("\n").map((line) => `  ${line}`).join("\n")}\n`);
      process.exitCode = 2;
    } else {
      const message = error instanceof Error ? error.message : String(error);
      process.stderr.write(`outfit: internal error: ${message}\n`);
      if (process.env.OUTFIT_DEBUG && error instanceof Error) process.stderr.write(`${error.stack}\n`);
      process.exitCode = 1;
    }
  }
}

const program = new Command();
program
  .name("outfit")
  .version(version)
  .description("Designs, checks and explains the outlet structures of stormwater detention ponds.")
  .addHelpText("after", `\nCaution: ${CAUTION}\n`)
  .showHelpAfterError()
  .exitOverride();

program
  .command("route")
  .description("route every storm of a case through its outlet and check the criteria")
  .argument("<case>", "case file (JSON)")
  .option("--json", "print the results as JSON (the case-format contract's fields)")
  .option("--step <minutes>", "fixed routing time step in minutes (default: chosen and refined automatically)")
  .option("-v, --verbose", "also say how the time step was chosen and refined for each storm")
  .option("--out <file>", "write the output to a file instead of the terminal")
  .option("--check", "exit with code 1 when the outlet is not compliant")
  .addHelpText(
    "after",
    `
Examples:
  outfit route cases/demo/case.json
  outfit route cases/demo/case.json --json --out results/route.json
  outfit route cases/demo/case.json --step 1 --verbose

Exit codes: 0 done, 1 not compliant (with --check), 2 bad input.`,
  )
  .action((file: string, options) => run(() => routeCommand(file, options)));

program
  .command("rate")
  .description("print the outlet's stage-discharge table, part by part, with storage and the governing control")
  .argument("<case>", "case file (JSON)")
  .option("--step <length>", 'stage interval of the table, e.g. 0.25 or "0.1 m" (default: about 24 rows)')
  .option("--csv", "print CSV instead of a table")
  .option("--json", "print JSON instead of a table")
  .option("--out <file>", "write the output to a file instead of the terminal")
  .addHelpText(
    "after",
    `
Examples:
  outfit rate cases/demo/case.json
  outfit rate cases/demo/case.json --step 0.5 --csv --out rating.csv`,
  )
  .action((file: string, options) => run(() => rateCommand(file, options)));

program
  .command("report")
  .description("write the review report of a case's outlet, or of a design run's candidates: one self-contained HTML file with plots")
  .argument("<input>", "case file (JSON), or the results directory of a design run (outfit design --out DIR)")
  .option("--out <file>", "where to write the report (default: CASE.report.html beside the case file, or DIR/report.html)")
  .option("--format <format>", "html (one self-contained file) or md (Markdown, the plots as SVG files beside it)", "html")
  .option("--step <minutes>", "fixed routing time step in minutes (default: chosen and refined automatically)")
  .addHelpText(
    "after",
    `
The report holds the case summary, stage-storage, the outlet's rating part by part with each
storm's target band and routed peak, every storm's hydrographs and stage, the checks with their
slack, the methods with their sources and the caution. For a design run it compares the candidates
and explains the binding check of each; every candidate is routed again from its own case file.
It loads nothing from the network and prints on A4 or Letter.

Examples:
  outfit report cases/demo/case.json                       # writes cases/demo/case.report.html
  outfit report cases/demo/case.json --out review.html
  outfit report cases/demo/case.json --format md --out review/demo.md
  outfit report results/                                   # a design run: writes results/report.html

Exit codes: 0 written, 2 bad input (nothing is written).`,
  )
  .action((input: string, options) => run(() => reportCommand(input, { ...options, version })));

try {
  program.parse();
} catch (error) {
  if (error instanceof CommanderError) {
    // Help and version end with code 0; every usage error with 2.
    process.exitCode = error.exitCode === 0 ? 0 : 2;
  } else throw error;
}
