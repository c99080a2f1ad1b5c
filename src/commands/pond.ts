// `outfit pond`: the pond's depth and footprint chosen from the site limits for the routed estimates.
import { basename, dirname } from "node:path";
import { CaseError } from "../case/errors.js";
import { choosePond } from "../sizing/pondChoice.js";
import { pondCostWeights } from "../sizing/pondCost.js";
import { caseEstimates } from "../sizing/stormEstimates.js";
import { sizingJson, sizingText } from "../report/pondSizing.js";
import { pondFile } from "../report/pondFile.js";
import { printErr, writeFileAtomic } from "../io.js";
import { rebaseCase } from "../case/rebase.js";
import { estimateInputs, typeOption } from "./volume.js";
import { layoutFor } from "../report/terminal.js";
import { emit, load } from "./common.js";
import { sitePond } from "../case/site.js";

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
    throw new CaseError([{ where: `${basename(path)}: site`, found: "nothing (the field is missing)", expected: "site limits to size a pond from (maxDepth and floor or existingGrade, and optionally sideSlope, lengthToWidth, maxTopLength, maxTopWidth, maxTopArea, embankment, groundwater, outfallInvert, permanentPool, shape, step)" }]);
  }
  if (!c.storms.some((s) => s.target !== null)) throw new CaseError([{ where: `${basename(path)}: storms`, found: "no storm with a target", expected: "at least one storm with a target, to size the pond from" }]);
  const choice = choosePond({ site: c.site, criteria: c.criteria, spillway: c.outlet?.spillway, tailwater: c.tailwater, storms: c.storms, costs: pondCostWeights(c.units, c.costs) });
  const pond = sitePond(choice);
  // Every estimate in the chosen pond (the published methods beside the routed ones).
  const estimates = pond ? caseEstimates({ ...c, pond }, estimateInputs(path, c, type)) : [];
  if (options.write && pond) {
    const copy = JSON.parse(JSON.stringify(loaded.json)) as Record<string, unknown>;
    copy.pond = pondFile(pond, c.units);
    rebaseCase(copy, dirname(path), dirname(options.write));
    writeFileAtomic(options.write, JSON.stringify(copy, null, 2) + "\n");
    printErr(`outfit: wrote ${options.write} (the case with the chosen pond)\n`);
  }
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  emit(options.json ? JSON.stringify(sizingJson(c, choice, estimates), null, 2) : sizingText(c, choice, estimates, layout), options.out);
  return choice.chosen ? 0 : 1;
}
