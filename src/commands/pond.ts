// `outfit pond`: pond dimensions from the site limits that hold the largest storage estimate.
import { basename, dirname } from "node:path";
import { CaseError } from "../case/errors.js";
import { sizePond } from "../storage/sizing.js";
import { governingVolume } from "../storage/stormEstimates.js";
import type { SiteSizing } from "../case/site.js";
import { sizingJson, sizingText } from "../report/pondSizing.js";
import { pondFile } from "../report/pondFile.js";
import { printErr, writeFileAtomic } from "../io.js";
import { rebaseCase } from "../case/rebase.js";
import { caseEstimates, typeOption } from "./volume.js";
import { layoutFor } from "../report/terminal.js";
import { emit, load } from "./common.js";

export interface PondCommandOptions {
  type?: string;
  json?: boolean;
  out?: string;
  write?: string;
  wide?: boolean;
}

export function pondCommand(path: string, options: PondCommandOptions): number {
  const type = typeOption(options.type);
  const loaded = load(path);
  const c = loaded.case;
  if (!c.site) {
    throw new CaseError([{ where: `${basename(path)}: site`, found: "nothing (the field is missing)", expected: "site limits to size a pond from (floor, maxDepth, and optionally sideSlope, lengthToWidth, maxTopLength, maxTopWidth, maxTopArea, permanentPool, shape, step)" }]);
  }
  const governing = governingVolume(caseEstimates(path, c, type));
  if (!governing) throw new CaseError([{ where: `${basename(path)}: storms`, found: "no storm with a target", expected: "at least one storm with a target, to size the pond from" }]);
  const sizing: SiteSizing = { ...sizePond(c.site, c.criteria.freeboardDepth, governing.volume), storm: governing.storm, method: governing.method };
  if (options.write) {
    const chosen = sizing.pond ?? sizing.largest;
    if (chosen) {
      const copy = JSON.parse(JSON.stringify(loaded.json)) as Record<string, unknown>;
      copy.pond = pondFile(chosen.pond, c.units);
      rebaseCase(copy, dirname(path), dirname(options.write));
      writeFileAtomic(options.write, JSON.stringify(copy, null, 2) + "\n");
      printErr(`outfit: wrote ${options.write} (the case with the sized pond)\n`);
    }
  }
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  emit(options.json ? JSON.stringify(sizingJson(c, sizing), null, 2) : sizingText(c, sizing, layout), options.out);
  return sizing.pond ? 0 : 1;
}
