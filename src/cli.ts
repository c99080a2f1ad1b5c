#!/usr/bin/env node
// Command-line wiring only: parse, call, print, exit code.
import { printErr } from "./io.js";
import { readFileSync } from "node:fs";
import { Command, CommanderError, Option } from "commander";
import { routeCommand } from "./commands/route.js";
import { rateCommand } from "./commands/rate.js";
import { hydrographCommand } from "./commands/hydrograph.js";
import { reportCommand } from "./commands/report.js";
import { drawingCommand } from "./commands/drawing.js";
import { schemaCommand } from "./commands/schema.js";
import { starterCommand } from "./commands/starter.js";
import { volumeCommand } from "./commands/volume.js";
import { pondCommand } from "./commands/pond.js";
import { isUserError } from "./commands/common.js";
import { designCommand } from "../search/command/command.js";
import { CAUTION } from "./report/caution.js";
import { formatHelpText, MIN_WIDTH } from "./report/terminal.js";
import { streamWidth } from "./terminalText.js";

// A reader that closes the pipe early (`outfit design --help | head`) has what it wanted: stop quietly,
// without a stack trace. Files are written whole (io.ts), so nothing is left half-written.
for (const stream of [process.stdout, process.stderr]) {
  stream.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code === "EPIPE") process.exit(0);
    throw error;
  });
}

const version = (JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { version: string }).version;

/** Runs a command and turns user errors into a message and exit code 2, never a stack trace. */
async function run(action: () => number | Promise<number>): Promise<void> {
  try {
    process.exitCode = await action();
  } catch (error) {
    if (isUserError(error)) {
      printErr(`outfit: error:\n${error.message.split("\n").map((line) => `  ${line}`).join("\n")}\n`);
      process.exitCode = 2;
    } else {
      const message = error instanceof Error ? error.message : String(error);
      printErr(`outfit: internal error: ${message}\n`);
      if (process.env.OUTFIT_DEBUG && error instanceof Error) printErr(`${error.stack}\n`);
      process.exitCode = 4;
    }
  }
}

/** Exit codes, the same in every command (route adds 1 for --check). */
const EXIT_CODES = "0 done; 2 bad input or a bad option (nothing is written); 4 internal error (a bug; OUTFIT_DEBUG=1 shows its stack)";

/** An option whose default the help prints as the number (or word) itself, not as a quoted string. */
function withDefault(flags: string, description: string, value: string): Option {
  return new Option(flags, description).default(value, value);
}

const WIDE = "keep every table whole whatever the terminal's width (the full form that piped output gets)";
const FITS = "Tables fit the terminal's width (COLUMNS, else the terminal); piped output keeps the full layout.";

/** Help is as wide as the terminal (or COLUMNS); piped, 80 columns, as commander's own help. */
function helpWidth(): number {
  return Math.max(MIN_WIDTH, streamWidth(process.stdout) ?? 80);
}

/** Text after a command's help, its paragraphs and examples fitted to the help's width when shown. */
function helpAfter(text: string): () => string {
  return () => formatHelpText(text, helpWidth());
}

const program = new Command();
program
  .configureOutput({ getOutHelpWidth: helpWidth, getErrHelpWidth: helpWidth })
  .name("outfit")
  .version(version)
  .description("Designs, checks and explains the outlet structures of stormwater detention ponds.")
  .addHelpText(
    "after",
    helpAfter(`
Examples:
  outfit design cases/demo/case.json      # propose outlets from the case's catalogue
  outfit route cases/demo/case.json       # route and check the case's own outlet
  outfit rate cases/demo/case.json        # the outlet's stage-discharge table
  outfit report cases/demo/case.json      # a review report (HTML)
  outfit starter my-pond.json             # a starter case file, every field explained
  outfit volume cases/demo/case.json      # storage each storm needs, by several methods
  outfit pond cases/site-only/case.json   # a pond's depth and footprint from the site limits
  outfit <command> --help                 # every option of a command, with examples

Exit codes: 0 done; 1 not compliant (route --check) or no pond fits (pond); ${EXIT_CODES.slice(8)}.

Caution: ${CAUTION}
`),
  )
  .showHelpAfterError()
  .exitOverride();

program
  .command("route")
  .description("route every storm of a case through its outlet and check the criteria")
  .argument("<case>", "case file (JSON)")
  .option("--json", "print the results as JSON (the case-format contract's fields)")
  .option("--step <minutes>", "fixed routing time step in minutes (default: automatic: each step changes the inflow by at most 1 % of its peak and spans at most 0.15 of the local dS/dO)")
  .option("-v, --verbose", "also say how the time step was chosen and refined for each storm")
  .option("--out <file>", "write the tables (or the JSON) to this file instead of the terminal")
  .option("--csv-dir <dir>", "also write each storm's routed series (time, inflow, outflow, stage, storage, each part's flow) as <storm>.csv in this directory")
  .option("--series", "with --json: include each storm's routed series")
  .option("--wide", WIDE)
  .option("--check", "exit with code 1 when the outlet is not compliant")
  .addHelpText(
    "after",
    helpAfter(`
${FITS}
Colour only on a terminal, never when NO_COLOR is set, with TERM=dumb or through a pipe; control
characters in a case's names are shown escaped.

A system of ponds (ponds): every pond is routed with the others at each step; the tables give the
flow reaching the outfall against each storm's target and, per pond, its maximum stage, the largest
flow forward through its outlet and back through it, the volume that flowed back, its drawdown and
mass balance; every check is named with its pond (or "outfall"); --json adds each storm's ponds.

Examples:
  outfit route cases/demo/case.json
  outfit route cases/demo/case.json --json --out results/route.json
  outfit route cases/demo/case.json --csv-dir results/series
  outfit route cases/demo/case.json --step 1 --verbose
  outfit route cases/two-ponds/case.json              # a system of two ponds

Exit codes: 0 done; 1 not compliant (only with --check); ${EXIT_CODES.slice(8)}.`),
  )
  .action((file: string, options) => run(() => routeCommand(file, options)));

program
  .command("rate")
  .description("print the outlet's stage-discharge table, part by part, with storage and the governing control")
  .argument("<case>", "case file (JSON)")
  .option("--stage-step <length>", 'stage interval of the table (a length, not a time), e.g. 0.25 or "0.1 m" (default: the pond\'s depth / 24 rounded to 1, 2, 2.5 or 5 x 10^n: 0.25 ft for a 6 ft deep pond)')
  .option("--csv", "print CSV instead of a table (every part's flow)")
  .option("--json", "print JSON instead of a table")
  .option("--pond <name>", "a system of ponds: only this pond (its link's table of both stages, or its rating at the outfall); needed with --csv")
  .option("--out <file>", "write the output to this file instead of the terminal")
  .option("--wide", WIDE)
  .addHelpText(
    "after",
    helpAfter(`
Narrow terminals get the parts grouped (openings, rim, spillway, total, the limiting part); --wide or
--csv adds each opening's flow, the barrel's, the chamber level and the barrel's HW/D.

A system of ponds (ponds): each pond that drains into another pond gets its outlet's flow as a table
of both ponds' stages (rows: its own stage; columns: the stage of the pond downstream; negative flow
runs back), as many columns as fit the terminal (--wide: one per stage step); a pond at the outfall
gets its rating as above.

Examples:
  outfit rate cases/demo/case.json
  outfit rate cases/demo/case.json --stage-step 0.5 --csv --out rating.csv
  outfit rate cases/two-ponds/case.json --pond upper --wide

Exit codes: ${EXIT_CODES}.`),
  )
  .action((file: string, options) => run(() => rateCommand(file, options)));

/** The search's options, shared by `design` and `gather` (a gather must repeat the shards' values). */
function searchOptions(command: Command, extra: (command: Command) => Command): Command {
  command
    .addOption(withDefault("--seed <text>", "seed of the search's random starts (same seed and budget, same ranking)", "outfit"))
    .addOption(withDefault("--budget <routings|time>", "storm routings the search may spend (e.g. 20000), or a time it spends widening the search (90s, 20m, 8h)", "20000"))
    .option("--time <seconds>", "safety stop after this many seconds (a run stopped by it is not reproducible; default: none)")
    .addOption(withDefault("--top <n>", "candidates to report, explain and write (the ranking does not depend on it; at most 40)", "5"))
    .addOption(withDefault("--margin <percent>", "aim this percentage of each target inside the edges of its band", "2"))
    .addOption(withDefault("--starts <n>", "seeded starts of the elevation fit per layout", "3"))
    .addOption(withDefault("--beam <n>", "options kept per control level when planning layouts (doubled while budget remains)", "3"))
    .option("--json", "print the results as JSON (each candidate's outlet in case-file form)")
    .option("--out <dir>", "a directory (unlike route's and rate's --out file): results.json, summary.txt, a journal and one ready-to-route case file per candidate")
    .option("--wide", WIDE)
    .addOption(withDefault("--vary <what>", "with an existing outlet: all (anything from the catalogue), openings (keep its riser and barrel) or elevations (keep every part's size, move inverts, crests and rim)", "all"))
    .option("--keep-riser", "keep the existing riser as it is (or keep the outlet without one)")
    .option("--keep-barrel", "keep the existing barrel as it is")
    .addOption(withDefault("--rank <order>", "cost (cheapest compliant first), change (with an existing outlet: the smallest change to it first) or robust (the largest reserve below the limit level with 10 and 20 % more inflow, the openings half clogged and, if any, the tailwater 0.5 ft / 0.15 m higher, first; no cost bar, so a longer budget explores further)", "cost"));
  return extra(command)
    .option("--workers <n>", "worker threads fitting layouts (default: the main thread for the first 2 s, then all cores once the routings the run may still spend would take at least 6 s at its rate so far, 30 s for a system of ponds; the ranking does not depend on it)")
    .option("--quiet", "no progress and no notes on stderr")
    .option("--check", "exit with code 1 when no compliant design is found");
}

searchOptions(
  program
    .command("design")
    .description("propose, rank and explain outlets built from the case's catalogue that meet every storm's target and rule")
    .argument("<case>", "case file (JSON) with a catalogue"),
  (command) =>
    command
      .option("--resume", "with --out: replay the layouts the directory's journal holds and go on")
      .option("--shard <k/n>", "with --out: fit only shard k of n of the layouts, an intermediate result (combine the shards with outfit gather, which adds the baseline, the moves that relax each binding check and the spread)")
      .option("--progress", "show progress on stderr (the default; --quiet turns it off)")
      .option("--size-pond", "also size the pond within the case's site limits: the depth outfit pond chooses, then the smallest pond on the site's size step for which an outlet complies (--budget is per size tried; --out writes pond-and-outlet.json)"),
)
  .addHelpText(
    "after",
    helpAfter(`
With an outlet in the case, design first routes and assesses it as row 0 (the baseline) and gives
each alternative its saving (cost proxy) and part-by-part changes against it.

Examples:
  outfit design cases/demo/case.json
  outfit design cases/demo/case.json --top 3 --out out/demo
  outfit route out/demo/candidate-01.json          # re-route a proposal
  outfit design cases/demo/case.json --budget 8h --out out/night
  outfit design cases/demo/case.json --budget 400000 --out out/night --resume
  outfit design cases/demo/case.json --budget 90000 --shard 2/3 --out out/shard-2
  outfit design cases/site-only/case.json --size-pond --budget 3000 --out out/site
  outfit route out/site/pond-and-outlet.json       # route the proposed pond and outlet
  outfit design cases/wet-value/case.json --rank change         # fixes of the existing outlet, smallest first
  outfit design cases/demo/case.json --rank robust --budget 200000   # the designs that keep most reserve
  outfit design cases/wet-value/case.json --vary elevations     # only move its inverts, crests and rim
  outfit design cases/two-ponds/case.json --out out/two-ponds   # a system of two ponds, designed together

A system of ponds (a case with ponds): the outlets of all ponds are designed together from the
catalogue, every design routed as the system (the ponds together, flow both ways) and judged by every
check (targets at the outfall, the rest per pond); an outlet that is a barrel alone (an equaliser
pipe) is sized from the catalogue's barrels; kept parts stay. The explanation names the pond and the
check that binds and what relaxes it; the existing system is row 0; --json gives each candidate's
ponds (name, outlet). Budgets, workers, --resume, --shard and gather work as for one pond (a storm
routed through a system counts one routing per pond). --size-pond sizes one pond only.

Exit codes: 0 done; 1 no compliant design (with --check); 2 bad input or a bad option (nothing is
written); 3 interrupted by SIGINT or SIGTERM (results of the work done are written; --resume goes on);
4 internal error (a bug; OUTFIT_DEBUG=1 shows its stack).`),
  )
  .action((file: string, options) => run(() => designCommand(file, options)));

searchOptions(
  program
    .command("gather")
    .description("combine the output directories of `design --shard k/n` runs into the ranking one run with the same seed and total budget gives")
    .argument("<case>", "case file (JSON) the shards were run on")
    .argument("<shards...>", "the shards' output directories (each holds journal.jsonl); give the shards' options and total --budget"),
  (command) => command,
)
  .addHelpText(
    "after",
    helpAfter(`
The shards' journals are replayed into the single run's schedule; a layout no shard reached is fitted
here (the summary says how many came from the journals). The gather then does what the shards left
to it: it routes and assesses the existing outlet (row 0), explains the candidates shown (the moves
that relax each binding check) and routes their spread.

Examples:
  outfit gather cases/demo/case.json out/shard-1 out/shard-2 out/shard-3 --budget 90000 --out out/all

Exit codes: 0 done, 1 no compliant design (with --check), 2 bad input, 3 interrupted, 4 internal error.`),
  )
  .action((file: string, shards: string[], options) => run(() => designCommand(file, { ...options, gather: shards })));

program
  .command("hydrograph")
  .description("derive each rainfall storm's runoff hydrograph per drainage area (NRCS or rational method) and write them as CSV")
  .argument("<case>", "case file (JSON) with a hydrology section and storms described by rainfall")
  .option("--out <dir|file>", "write the hydrographs as CSV (minutes,flow): a directory (one <storm>-<area>.csv per storm and area), or a name ending in .csv for a single selected hydrograph")
  .option("--json", "print the results as JSON instead of tables")
  .option("--storm <name>", "only this storm")
  .option("--area <pre|post|pond>", "only this drainage area: pre (before development; its peak is the target), post (after; the inflow), or in a system of ponds the name of a pond whose drainage area is under hydrology.ponds")
  .option("--wide", WIDE)
  .addHelpText(
    "after",
    helpAfter(`
For each storm given by its rainfall (storms[].rainfall) and each area of the hydrology section, prints
the rainfall, runoff depth, peak flow, time to peak, volume, the Tc used and the time step, and what the
routed case uses it for. The CSV files can be read back as a storm's inflow file.

${FITS}
Narrow terminals keep each hydrograph's storm, area, peak and volume on its row, and its other
values as room allows; the rest (the rainfall first) go on indented lines below the row.

Examples:
  outfit hydrograph cases/demo-rainfall/case.json
  outfit hydrograph cases/demo-rainfall/case.json --out hydrographs/
  outfit hydrograph cases/demo-rainfall/case.json --storm 10-yr --area post --out inflow-10yr.csv
  outfit hydrograph cases/demo-rainfall/case.json --json
  outfit hydrograph cases/two-ponds/case.json --storm 10-yr --area upper

Exit codes: ${EXIT_CODES}.`),
  )
  .action((file: string, options) => run(() => hydrographCommand(file, options)));

program
  .command("volume")
  .description("estimate the storage each storm needs before any outlet exists (TR-55 ch. 6, hydrograph difference, modified rational, routed through notional outlets), with the stage it reaches in the pond")
  .argument("<case>", "case file (JSON)")
  .option("--type <I|IA|II|III>", "NRCS storm type for the TR-55 ratio chart, for storms not given by a rainfall distribution")
  .option("--json", "print the results as JSON instead of a table")
  .option("--out <file>", "write the output to a file instead of the terminal")
  .option("--wide", WIDE)
  .addHelpText(
    "after",
    helpAfter(`
For every storm with a target: the TR-55 ch. 6 estimate (Figure 6-1, storm types I/IA or II/III;
flagged outside qo/qi 0.1-0.8), the volume of the inflow above a release rising linearly to the
target at the inflow's peak and the same with the release at the target throughout (lower bounds),
for rational-method storms the modified rational critical-duration volume, and the routed estimates:
the storm routed through a notional outlet of each usual kind (one orifice, one weir, an orifice and
a weir, a level per storm) sized so its peak meets the middle of the target band. Each with the stage
it reaches in the case's pond and whether that stays at or below the storm's limit level (the lower of
the freeboard level and, for a storm that keeps the spillway dry, the spillway crest; an underground
system's top).

A system of ponds: the estimates take all ponds' inflows together against the target at the outfall
and compare with all ponds' storage below their freeboard levels; a pond with its own target
(pondTargets) is also estimated on its own inflow (the output says how).

${FITS}
Narrow terminals keep each method's volume on its row, and the stage and the fit as room allows;
the rest (the storm's target and peak inflow, the notes) go on indented lines below the row.

Examples:
  outfit volume cases/demo/case.json --type II
  outfit volume cases/demo-rainfall/case.json --json
  outfit volume cases/demo/case.json --type II --out volume.txt
  outfit volume cases/two-ponds/case.json                  # a system of two ponds

Exit codes: ${EXIT_CODES}.`),
  )
  .action((file: string, options) => run(() => volumeCommand(file, options)));

program
  .command("pond")
  .description("choose a pond's depth and footprint from the case's site limits for the routed estimates, at the least cost proxy")
  .argument("<case>", "case file (JSON) with a site section (its pond may be left out)")
  .option("--type <I|IA|II|III>", "NRCS storm type for the TR-55 ratio chart, for storms not given by a rainfall distribution")
  .option("--json", "print the results as JSON instead of a table")
  .option("--out <file>", "write the output to a file instead of the terminal")
  .option("--write <file>", "also write the case file with the sized pond in it (inflow files are not copied: its relative paths are made to point at them from where it is written)")
  .option("--wide", WIDE)
  .addHelpText(
    "after",
    helpAfter(`
The pond is a prismoid (floor length = lengthToWidth x width, side slopes sideSlope) or the site's
stage-area shape scaled in plan. At each depth compared (site.maxDepth, a limit, down on
site.depthStep; the floor and top placed by the existing grade, the groundwater and outfall limits, the
highest embankment and the spillway crest), the smallest on the size step (site.step), within
maxTopLength, maxTopWidth and maxTopArea, that holds each storm's largest routed estimate and 15 %
more for catalogue sizes below its limit level; the depth whose pond costs least (excavation, fill,
land) is chosen. Prints the chosen pond, the trade-off of every depth (and why a depth cannot be
built), and every estimate in the chosen pond.

${FITS}
Narrow terminals wrap the labels and values within the width.

Examples:
  outfit pond cases/site-only/case.json
  outfit pond cases/site-only/case.json --json
  outfit pond cases/site-groundwater/case.json      # groundwater and the embankment limit the depth
  outfit pond cases/site-only/case.json --write sized.json && outfit volume sized.json

Exit codes: 0 a pond fits; 1 no pond within the limits holds the storage; ${EXIT_CODES.slice(8)}.`),
  )
  .action((file: string, options) => run(() => pondCommand(file, options)));

program
  .command("report")
  .description("write the review report of a case's outlet, or of a design run's candidates: one self-contained HTML file with plots")
  .argument("<input>", "case file (JSON), or the results directory of a design run (outfit design --out DIR)")
  .option("--out <file>", "where to write the report (default: CASE.report.html beside the case file, or DIR/report.html)")
  .addOption(withDefault("--format <format>", "html (one self-contained file) or md (Markdown, the plots as SVG files beside it)", "html"))
  .option("--step <minutes>", "fixed routing time step in minutes (default: automatic, as in route)")
  .option("--stage-step <length>", 'stage interval of the stage-storage-discharge table, a length (default: 0.1 ft in US cases, 0.02 m in SI)')
  .option("--hydrograph-interval <minutes>", "time interval of the hydrograph tables (default: the shortest of 5, 10, 15, 30, 60 or 120 min that keeps each table within 60 rows)")
  .addHelpText(
    "after",
    helpAfter(`
The report holds the case summary, for storms from rainfall the hydrology (areas, curve numbers,
Tc by segment, rainfall, runoff depths and volumes, methods), stage-storage (each storm's limit
level, the storage estimates, exfiltration), the outlet drawn to scale (also alone: outfit drawing),
its rating part by part with each storm's target band and routed peak, every storm's hydrographs
over its event with the peaks in detail (at the point of analysis where a storm has a bypass) and its
stage, the checks with their slack, the methods with their sources and the caution. For a design
run it compares the candidates
and explains the binding check of each; every candidate is routed again from its own case file.
It loads nothing from the network and prints on A4 or Letter. A system of ponds gets each pond's
storage, parts, outlet drawing and rating (a link's flow by both ponds' stages), each storm's stages
of every pond and flows through every link, a table per pond, and the checks per pond and at the
outfall; a design run on a system compares its candidates and reports the first in full.

Examples:
  outfit report cases/demo/case.json                       # writes cases/demo/case.report.html
  outfit report cases/demo/case.json --out review.html
  outfit report cases/demo/case.json --format md --out review/demo.md
  outfit report cases/two-ponds/case.json                  # a system of two ponds
  outfit report results/                                   # a design run: writes results/report.html

Exit codes: 0 written; ${EXIT_CODES.slice(8)}.`),
  )
  .action((input: string, options) => run(() => reportCommand(input, { ...options, version })));

program
  .command("drawing")
  .description("draw the outlet structure as an elevation, to scale, alone as an SVG file (the report's figure)")
  .argument("<case>", "case file (JSON) with an outlet, e.g. a candidate written by design --out")
  .option("--out <file>", "where to write the SVG (default: CASE.outlet.svg beside the case file); a system of ponds: a directory, or a .svg file with --pond")
  .option("--pond <name>", "a system of ponds: only this pond's outlet")
  .addHelpText(
    "after",
    helpAfter(`
The drawing: a section through the riser (or headwall) with the pond floor, the barrel leaving its
base, the top of embankment, the spillway crest and the freeboard line; the riser's wall developed
(its perimeter unrolled, seen from outside) with every opening at its elevation and at the place route
prints for it (a round riser from the barrel's centreline, 0 degrees at the left edge, angles marked;
a box riser from its downstream side's left end, sides named); each storm's peak stage, routed as in
route; one scale across and up.

A system of ponds: one drawing per pond's outlet, with that pond's levels and its peak stages in the
system routed together (CASE.<pond>.outlet.svg beside the case file, or <pond>.outlet.svg in the
directory --out names).

Examples:
  outfit drawing cases/demo/case.json                      # writes cases/demo/case.outlet.svg
  outfit drawing out/demo/candidate-01.json --out outlet.svg
  outfit drawing cases/two-ponds/case.json                 # case.upper.outlet.svg, case.lower.outlet.svg
  outfit drawing cases/two-ponds/case.json --pond lower --out lower.svg

Exit codes: 0 written; ${EXIT_CODES.slice(8)}.`),
  )
  .action((input: string, options) => run(() => drawingCommand(input, options)));

program
  .command("schema")
  .description("print the case file's JSON Schema (generated from outfit's own schema), for editor completion")
  .option("--out <file>", "write the schema to a file instead of the terminal")
  .addHelpText(
    "after",
    helpAfter(`
Name the written file in a case's "$schema" field and an editor that reads JSON Schemas completes
and checks the case's fields as you type:

Examples:
  outfit schema --out case.schema.json
  { "$schema": "./case.schema.json", "name": "...", ... }`),
  )
  .action((options: { out?: string }) => run(() => schemaCommand(options)));

program
  .command("starter")
  .description("write a starter case file, every field explained, that routes and designs as written")
  .argument("<file>", "the case file to write (JSON)")
  .addOption(withDefault("--units <system>", "US (ft, cfs) or SI (m, m3/s)", "US"))
  .option("--force", "overwrite the file if it exists")
  .addHelpText(
    "after",
    helpAfter(`
Comments in the file are fields whose name starts with "//"; outfit ignores them. The pond, storms
and outlet are an invented example: replace them with the site's own.

Examples:
  outfit starter my-pond.json
  outfit starter my-pond-si.json --units SI
  outfit route my-pond.json

Exit codes: ${EXIT_CODES}.`),
  )
  .action((file: string, options) => run(() => starterCommand(file, options)));

try {
  await program.parseAsync();
} catch (error) {
  if (error instanceof CommanderError) {
    // Help and version end with code 0; every usage error with 2.
    process.exitCode = error.exitCode === 0 ? 0 : 2;
  } else throw error;
}
