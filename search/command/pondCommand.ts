// `outfit design --size-pond`: pond and outlet designed together, written whole.
import { existsSync, statSync } from "node:fs";
import { join } from "node:path";
import { emit, load, positiveNumber, refuseSystem, UsageError } from "../../src/commands/common.js";
import { makeDirectory, printErr, writeFileAtomic } from "../../src/io.js";
import { designPondAndOutlet } from "../pond/pondDesign.js";
import { pondDesignCase, pondDesignJson, pondDesignText } from "../report/pondReport.js";
import { layoutFor, PLAIN } from "../../src/report/terminal.js";
import type { DesignCommandOptions } from "./commandOptions.js";

/** File name of the proposal in --out. */
export const POND_DESIGN_CASE = "pond-and-outlet.json";

export async function pondDesignCommand(path: string, options: DesignCommandOptions): Promise<number> {
  if (options.resume) throw new UsageError("--resume", "with --size-pond", "--resume only for an outlet search (without --size-pond)");
  const loaded = load(path, options.quiet === true);
  refuseSystem(loaded, path, "design --size-pond");
  const c = loaded.case;
  if (options.out && existsSync(options.out) && !statSync(options.out).isDirectory()) {
    throw new UsageError("--out", options.out, "a directory for the results (this is a file)");
  }
  const margin = positiveNumber("--margin", options.margin);
  const design = await designPondAndOutlet(loaded, margin === undefined ? undefined : margin / 100, {
    seed: options.seed ?? "outfit",
    budget: Math.round(positiveNumber("--budget", options.budget) ?? 20000),
    timeLimit: positiveNumber("--time", options.time),
    top: Math.round(positiveNumber("--top", options.top) ?? 5),
    starts: Math.round(positiveNumber("--starts", options.starts) ?? 3),
    beam: Math.round(positiveNumber("--beam", options.beam) ?? 3),
  });
  const json = pondDesignJson(c, design);
  const text = pondDesignText(c, design, layoutFor({ wide: options.wide }));
  if (options.out) {
    makeDirectory(options.out);
    if (design.chosen) writeFileAtomic(join(options.out, POND_DESIGN_CASE), JSON.stringify(pondDesignCase(design, options.out), null, 2) + "\n");
    writeFileAtomic(join(options.out, "results.json"), JSON.stringify(json, null, 2) + "\n");
    // The summary file: the full plain layout, whatever the terminal.
    writeFileAtomic(join(options.out, "summary.txt"), pondDesignText(c, design, PLAIN) + "\n");
    printErr(`outfit: wrote ${options.out}/results.json, summary.txt${design.chosen ? ` and ${POND_DESIGN_CASE}` : ""}\n`);
  }
  emit(options.json ? JSON.stringify(json, null, 2) : text, undefined);
  return 0;
}
